// One flat part → one DXF file through dxflib (Debian libdxflib-dev), in the order dxflib's own
// documentation writes a file: header, tables, blocks, entities, objects.
//
// Conventions for cutting (TOOLCHAIN.md "DXF for cutting"): 1:1 millimetres; cut contours on
// layer CUT as closed LWPOLYLINEs (R12: closed POLYLINEs) with arcs as bulges and round holes as
// CIRCLEs; bend and roll lines on BEND, centre marks on MARK, text on NOTES; no title block.
// Reproducible bytes: dxflib writes no clock time, its handles count up from fixed seeds and
// its numbers are printed with "%.16f" in the C locale.
#include <cmath>
#include <cstdio>
#include <memory>
#include <string>
#include <vector>

#include <dxflib/dl_attributes.h>
#include <dxflib/dl_codes.h>
#include <dxflib/dl_dxf.h>
#include <dxflib/dl_entities.h>
#include <dxflib/dl_writer_ascii.h>

#include "geometry/flat_internal.hpp"
#include "src/errors.hpp"

namespace bandforge::geom {
namespace {

struct Layer {
  const char* name;
  int colour;  // AutoCAD colour index
};

// Every file declares the same layers, so that one CAM template fits all of them.
constexpr Layer layers[] = {
    {"0", 7}, {"CUT", 7}, {"BEND", 1}, {"MARK", 3}, {"NOTES", 5},
};

constexpr double text_height = 3.5;   // [mm]
constexpr double line_spacing = 6.0;  // [mm]

// Coordinates to a 1e-9 mm grid and bulges to 1e-12: the read-back from the solids leaves
// round-off such as 810.0000000000001 or -3.7e-15, which dxflib would print in full. "+ 0.0"
// turns a negative zero into zero.
double mm9(double v) { return std::round(v * 1e9) / 1e9 + 0.0; }
double bulge12(double v) { return std::round(v * 1e12) / 1e12 + 0.0; }

DL_Attributes on(const char* layer) {
  // Colour, line weight and line type by layer.
  return DL_Attributes(layer, DL_Codes::bylayer, -1, -1, "BYLAYER");
}

void write_tables(DL_Dxf& dxf, DL_WriterA& dw, bool r2000) {
  dw.sectionTables();
  dxf.writeVPort(dw);

  dw.tableLinetypes(3);
  dxf.writeLinetype(dw, DL_LinetypeData("BYBLOCK", "", 0, 0, 0.0));
  dxf.writeLinetype(dw, DL_LinetypeData("BYLAYER", "", 0, 0, 0.0));
  dxf.writeLinetype(dw, DL_LinetypeData("CONTINUOUS", "Solid line", 0, 0, 0.0));
  dw.tableEnd();

  dw.tableLayers(static_cast<int>(std::size(layers)));
  for (const Layer& l : layers) {
    dxf.writeLayer(dw, DL_LayerData(l.name, 0),
                   DL_Attributes("", l.colour, -1, -3 /* default line weight */, "CONTINUOUS"));
  }
  dw.tableEnd();

  dw.tableStyle(1);
  dxf.writeStyle(dw, DL_StyleData("Standard", 0, 0.0, 1.0, 0.0, 0, text_height, "txt", ""));
  dw.tableEnd();

  dxf.writeView(dw);
  dxf.writeUcs(dw);
  dw.tableAppid(1);
  dxf.writeAppid(dw, "ACAD");
  dw.tableEnd();
  dxf.writeDimStyle(dw, 2.5, 0.625, 0.625, 0.625, text_height);
  // Block records and the *Model_Space / *Paper_Space blocks belong to R2000; an R12 reader
  // takes the entities section as model space.
  if (r2000) {
    dxf.writeBlockRecord(dw);
    dw.tableEnd();
  }
  dw.sectionEnd();

  dw.sectionBlocks();
  if (r2000) {
    for (const char* name : {"*Model_Space", "*Paper_Space", "*Paper_Space0"}) {
      dxf.writeBlock(dw, DL_BlockData(name, 0, 0.0, 0.0, 0.0));
      dxf.writeEndBlock(dw, name);
    }
  }
  dw.sectionEnd();
}

void write_contour(DL_Dxf& dxf, DL_WriterA& dw, const std::vector<FlatVertex>& c, bool r2000) {
  dxf.writePolyline(dw, DL_PolylineData(static_cast<int>(c.size()), 0, 0, 1 /* closed */),
                    on("CUT"));
  for (const FlatVertex& v : c) {
    if (r2000) {
      // dxflib's writeVertex adds a group 30 to each LWPOLYLINE vertex, a code the LWPOLYLINE
      // entity does not have (its vertices are 10/20 with 42 for the bulge; strict readers
      // reject unknown codes), so the vertex groups are written here through dxflib's writer.
      dw.dxfReal(10, mm9(v.x));
      dw.dxfReal(20, mm9(v.y));
      if (bulge12(v.bulge) != 0) dw.dxfReal(42, bulge12(v.bulge));
    } else {
      // R12 VERTEX: 10/20/30/42
      dxf.writeVertex(dw, DL_VertexData(mm9(v.x), mm9(v.y), 0.0, bulge12(v.bulge)));
    }
  }
  dxf.writePolylineEnd(dw);
}

// DXF R12/R2000 text is in the drawing's code page, not UTF-8: characters beyond ASCII (a
// title's "Ø" or "é") are written as \U+XXXX escapes, which CAD readers decode.
std::string ascii(const std::string& utf8) {
  std::string out;
  for (std::size_t i = 0; i < utf8.size();) {
    const unsigned char c = static_cast<unsigned char>(utf8[i]);
    if (c < 0x80) {
      out += static_cast<char>(c);
      ++i;
      continue;
    }
    const int extra = c >= 0xf0 ? 3 : c >= 0xe0 ? 2 : c >= 0xc0 ? 1 : 0;
    unsigned code = extra == 3 ? c & 0x07u : extra == 2 ? c & 0x0fu : c & 0x1fu;
    std::size_t k = 1;
    for (; k <= static_cast<std::size_t>(extra) && i + k < utf8.size(); ++k) {
      code = (code << 6) | (static_cast<unsigned char>(utf8[i + k]) & 0x3fu);
    }
    char buf[16];
    std::snprintf(buf, sizeof buf, "\\U+%04X", extra == 0 ? 0xfffdu : code);
    out += buf;
    i += k;
  }
  return out;
}

void write_text(DL_Dxf& dxf, DL_WriterA& dw, double x, double y, double height,
                const std::string& text) {
  dxf.writeText(dw,
                DL_TextData(mm9(x), mm9(y), 0.0, mm9(x), mm9(y), 0.0, height, 1.0, 0, 0, 0,
                            ascii(text), "Standard", 0.0),
                on("NOTES"));
}

void write_line(DL_Dxf& dxf, DL_WriterA& dw, const FlatLine& l, const char* layer) {
  dxf.writeLine(dw, DL_LineData(mm9(l.x1), mm9(l.y1), 0.0, mm9(l.x2), mm9(l.y2), 0.0), on(layer));
}

}  // namespace

void write_dxf(const FlatPart& part, DxfVersion version, const std::string& path) {
  const bool r2000 = version == DxfVersion::r2000;
  DL_Dxf dxf;
  DL_WriterA* opened = dxf.out(path.c_str(), r2000 ? DL_Codes::AC1015 : DL_Codes::AC1009);
  if (opened == nullptr) throw IoError("cannot write " + path + ": the file cannot be created");
  std::unique_ptr<DL_WriterA> dw(opened);

  dxf.writeHeader(*dw);
  if (r2000) {
    dw->dxfString(9, "$INSUNITS");
    dw->dxfInt(70, 4);  // millimetres
    dw->dxfString(9, "$MEASUREMENT");
    dw->dxfInt(70, 1);  // metric
  }
  dw->sectionEnd();
  write_tables(dxf, *dw, r2000);

  dw->sectionEntities();
  for (const auto& c : part.contours) write_contour(dxf, *dw, c, r2000);
  for (const FlatCircle& h : part.holes) {
    dxf.writeCircle(*dw, DL_CircleData(mm9(h.x), mm9(h.y), 0.0, mm9(h.radius)), on("CUT"));
  }
  for (const FlatLine& l : part.bend_lines) write_line(dxf, *dw, l, "BEND");
  for (const FlatLine& l : part.marks) write_line(dxf, *dw, l, "MARK");
  for (const FlatText& t : part.tags) write_text(dxf, *dw, t.x, t.y, t.height, t.text);

  // The notes stand below the part, first line on top.
  std::vector<std::string> notes = part.notes;
  notes.push_back(r2000 ? "units: millimetres, scale 1:1 ($INSUNITS = 4); cut layer CUT, marks "
                          "BEND and MARK, text NOTES"
                        : "units: millimetres, scale 1:1 (DXF R12 has no $INSUNITS: import as "
                          "millimetres); cut layer CUT, marks BEND and MARK, text NOTES");
  double y = part.y_min - 2 * line_spacing;
  for (const std::string& line : notes) {
    write_text(dxf, *dw, part.x_min, y, text_height, line);
    y -= line_spacing;
  }
  dw->sectionEnd();

  if (r2000) {
    dxf.writeObjects(*dw);
    dxf.writeObjectsEnd(*dw);
  }
  dw->dxfEOF();
  const bool failed = dw->openFailed();  // the stream's fail bit after every write
  dw->close();
  if (failed || dw->openFailed()) throw IoError("cannot write " + path + ": write failed");
}

}  // namespace bandforge::geom

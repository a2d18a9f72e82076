// write_step(): the assembly as an AP214 STEP file through XCAF (TOOLCHAIN.md "STEP through
// XCAF"; REFERENCE §6): one product per distinct part, named instances, sRGB colours,
// millimetres, a header from the design's [project] block, reproducible bytes.
#include <array>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include <APIHeaderSection_MakeHeader.hxx>
#include <Interface_Static.hxx>
#include <Quantity_Color.hxx>
#include <STEPCAFControl_Writer.hxx>
#include <STEPControl_Controller.hxx>
#include <STEPControl_Writer.hxx>
#include <Standard_Failure.hxx>
#include <TCollection_ExtendedString.hxx>
#include <TCollection_HAsciiString.hxx>
#include <TDF_Label.hxx>
#include <TDataStd_Name.hxx>
#include <TDocStd_Document.hxx>
#include <TopLoc_Location.hxx>
#include <XCAFApp_Application.hxx>
#include <XCAFDoc_ColorTool.hxx>
#include <XCAFDoc_DocumentTool.hxx>
#include <XCAFDoc_ShapeTool.hxx>

#include "geometry/occt_guard.hpp"
#include "geometry/occt_model.hpp"
#include "geometry/step_canonical.hpp"
#include "geometry/step_header.hpp"
#include "src/errors.hpp"

namespace bandforge::geom {
namespace {

Handle(TCollection_HAsciiString) ascii(const std::string& s) {
  return new TCollection_HAsciiString(s.c_str());
}

TCollection_ExtendedString utf8(const std::string& s) {
  return TCollection_ExtendedString(s.c_str(), Standard_True);
}

// The XCAF document: an assembly named after the design, one shape label per part, one
// component per instance. `doc` is closed by its owner (a DocumentScope).
void make_document(const BrakeModel::Impl& m, const std::string& name,
                   const Handle(TDocStd_Document)& doc) {
  XCAFDoc_DocumentTool::SetLengthUnit(doc, 1.0, UnitsMethods_LengthUnit_Millimeter);
  Handle(XCAFDoc_ShapeTool) shapes = XCAFDoc_DocumentTool::ShapeTool(doc->Main());
  Handle(XCAFDoc_ColorTool) colours = XCAFDoc_DocumentTool::ColorTool(doc->Main());
  const TDF_Label assembly = shapes->NewShape();
  TDataStd_Name::Set(assembly, utf8(name));
  std::vector<TDF_Label> labels;
  for (std::size_t i = 0; i < m.parts.size(); ++i) {
    const TDF_Label label = shapes->AddShape(m.parts[i].shape, Standard_False);
    TDataStd_Name::Set(label, utf8(m.infos[i].name));
    const Rgb c = m.infos[i].colour;
    colours->SetColor(label, Quantity_Color(c.r, c.g, c.b, Quantity_TOC_sRGB), XCAFDoc_ColorSurf);
    labels.push_back(label);
  }
  for (const auto& in : m.instances) {
    const TDF_Label comp =
        shapes->AddComponent(assembly, labels[in.part], TopLoc_Location(in.placement));
    TDataStd_Name::Set(comp, utf8(in.name));
  }
  shapes->UpdateAssemblies();
}

std::string read_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream ss;
  ss << in.rdbuf();
  if (!in && !in.eof()) throw IoError("cannot read back " + path);
  return ss.str();
}

void write_file(const std::string& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  out << text;
  out.close();
  if (!out) throw IoError("cannot write " + path);
}

}  // namespace

void write_step(const BrakeModel& model, const Design& design, const std::string& path) {
  const BrakeModel::Impl& m = model.impl();
  const StepHeader header = step_header(design, std::filesystem::path(path).filename().string());
  const std::string partial = path + ".partial";
  QuietOcct quiet;
  try {
    const DocumentScope scope;
    const Handle(TDocStd_Document)& doc = scope.doc;
    make_document(m, header.assembly, doc);
    StaticSettings settings;
    // The schema must be set after Init() and before the writer exists (TOOLCHAIN.md).
    STEPControl_Controller::Init();
    settings.set("write.step.schema", "AP214IS");
    settings.set("write.step.unit", "MM");
    settings.set("write.step.assembly", "On");
    STEPCAFControl_Writer writer;
    writer.SetColorMode(Standard_True);
    writer.SetNameMode(Standard_True);
    writer.SetLayerMode(Standard_False);
    if (!writer.Transfer(doc, STEPControl_AsIs)) {
      throw BuildError("while writing the STEP file: the assembly did not transfer");
    }
    APIHeaderSection_MakeHeader mh(writer.ChangeWriter().Model());
    mh.SetName(ascii(header.file_name));
    mh.SetTimeStamp(ascii(header.time_stamp));
    mh.SetDescriptionValue(1, ascii(header.description));
    mh.SetAuthorValue(1, ascii(header.author));
    mh.SetOrganizationValue(1, ascii(header.organization));
    mh.SetPreprocessorVersion(ascii(header.system));
    mh.SetOriginatingSystem(ascii(header.system));
    mh.SetAuthorisation(ascii(header.authorisation));
    if (writer.Write(partial.c_str()) != IFSelect_RetDone) {
      std::remove(partial.c_str());
      throw IoError("cannot write " + partial);
    }
  } catch (const Standard_Failure& e) {
    std::remove(partial.c_str());
    throw BuildError(std::string("while writing the STEP file: ") + e.GetMessageString());
  }
  try {
    std::vector<std::array<double, 3>> colours;
    for (const PartInfo& p : m.infos) colours.push_back({p.colour.r, p.colour.g, p.colour.b});
    std::string text = read_file(partial);
    text = encode_non_ascii(text);          // names and header: Part 21 \X2\ strings
    text = exact_colours(text, colours);    // the sRGB values chosen, not float round-off
    text = occurrence_ids_from_one(text);   // as a first export in a fresh process
    write_file(partial, canonical_step(text));  // entity order from content, not addresses
  } catch (...) {
    std::remove(partial.c_str());
    throw;
  }
  std::error_code ec;
  std::filesystem::rename(partial, path, ec);
  if (ec) {
    std::remove(partial.c_str());
    throw IoError("cannot write " + path + ": " + ec.message());
  }
}

}  // namespace bandforge::geom

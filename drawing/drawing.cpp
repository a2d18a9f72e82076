#include "drawing/drawing.hpp"

#include "drawing/detail_sheet.hpp"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <optional>

#include "drawing/assembly_sheet.hpp"
#include "drawing/calc_sheet.hpp"
#include "drawing/canvas.hpp"
#include "drawing/flow.hpp"
#include "drawing/sheet.hpp"
#include "drawing/text_fit.hpp"
#include "src/errors.hpp"

namespace bandforge::drawing {
namespace {

// The title block's units field: dimensions; forces, torques, stresses.
std::string units_text(UnitSystem u) {
  std::string s = display_unit(Quantity::length, u);
  s += "; ";
  s += display_unit(Quantity::force, u);
  s += ", ";
  s += display_unit(Quantity::torque, u);
  s += ", ";
  s += display_unit(Quantity::stress, u);
  return s;
}

TitleData title_data(const Design& d, UnitSystem u) {
  TitleData t;
  const Project& p = d.project;
  t.owner = p.owner;
  t.title = p.title;
  t.number = p.number;
  t.revision = p.revision;
  t.date = p.date;
  t.creator = p.creator;
  t.approver = p.approver;
  t.units = units_text(u);
  t.third_angle = d.drawing.projection == Projection::third;
  return t;
}

// Columns of the calculation sheet: two on the landscape sheets, one on A4; the column over the
// title block stops above it and the caution note.
std::vector<Box> calc_columns(const SheetSize& s, const Box& caution) {
  const Box f = frame_box(s);
  const double m = 5;
  const double top = f.y1 - m;
  const double bottom = caution.y1 + m;
  if (s.width < s.height) return {{f.x0 + m, bottom, f.x1 - m, top}};
  // The left column runs down to the frame; the right one stops above the caution.
  const double w = (f.width() - 3 * m) / 2;
  return {{f.x0 + m, f.y0 + m, f.x0 + m + w, top}, {f.x0 + 2 * m + w, bottom, f.x1 - m, top}};
}

struct Planned {
  SheetPlan plan;
  std::optional<AssemblyPlan> assembly;
};

// The set as the plan lays it out: the assembly sheet, a detail sheet per made part in
// detail_parts() order, the calculation sheets; all on the design's sheet size.
std::vector<SheetEntry> lay_out_set(const SheetSize& s, const std::vector<std::string>& detail_names,
                                    bool assembly, int calc_pages) {
  std::vector<SheetEntry> out;
  auto add = [&](std::string title) {
    out.push_back({static_cast<int>(out.size()) + 1, std::move(title), s.name});
  };
  if (assembly) add("Assembly drawing");
  for (const std::string& name : detail_names) add("Detail drawing: " + name);
  for (int p = 0; p < calc_pages; ++p) add(p == 0 ? "Calculation sheet" : "Calculation sheet, cont.");
  return out;
}

// Page 1 is the assembly drawing when there are solids and pins (not a concept design).
bool has_assembly(const Solution& solution, const geom::BrakeModel* model) {
  return model != nullptr && solution.layout.from_pins;
}

Planned plan_all(const Canvas& c, const Design& design, const Solution& solution,
                 const geom::BrakeModel* model, const std::vector<SheetEntry>& set) {
  const SheetSize s = sheet_size(design.drawing.sheet);
  Planned out;
  SheetPlan& plan = out.plan;
  plan.sheet_list = set;
  plan.pages = static_cast<int>(set.size());
  plan.sheet = s.name;
  plan.width_mm = s.width;
  plan.height_mm = s.height;
  const Box tb = title_block_box(s);
  plan.title_block[0] = tb.x0;
  plan.title_block[1] = tb.y0;
  plan.title_block[2] = tb.x1;
  plan.title_block[3] = tb.y1;
  if (has_assembly(solution, model)) {
    out.assembly = plan_assembly(c, design, solution, *model, s, set);
    const AssemblyPlan& a = *out.assembly;
    plan.assembly = true;
    plan.scale_num = a.scale.num;
    plan.scale_den = a.scale.den;
    plan.drum_x_mm = a.drum_centre.x;
    plan.side_x_mm = a.side_origin.x;
    plan.side_y_mm = a.side_origin.y;
    plan.third_angle = design.drawing.projection == Projection::third;
    plan.drum_y_mm = a.drum_centre.y;
    plan.views_box[0] = a.views_box.x0;
    plan.views_box[1] = a.views_box.y0;
    plan.views_box[2] = a.views_box.x1;
    plan.views_box[3] = a.views_box.y1;
    plan.hlr_ms = a.hlr_ms;
    plan.iso_hlr_ms = a.iso_ms;
    const Box boxes[] = {a.zones.title_block, a.zones.caution, a.zones.parts, a.zones.results, a.zones.sheets};
    const char* names[] = {"title block", "caution", "parts list", "results", "sheet list"};
    for (std::size_t i = 0; i < std::size(boxes); ++i) {
      if (boxes[i].width() > 0) plan.page1_boxes.push_back({names[i], {boxes[i].x0, boxes[i].y0, boxes[i].x1, boxes[i].y1}});
    }
    const double k = a.scale.factor();
    plan.page1_boxes.push_back({"front view", {a.front_origin.x + a.front.min.x * k, a.front_origin.y + a.front.min.y * k,
                                               a.front_origin.x + a.front.max.x * k, a.front_origin.y + a.front.max.y * k}});
    plan.page1_boxes.push_back({"side view", {a.side_origin.x + a.side.min.x * k, a.side_origin.y + a.side.min.y * k,
                                              a.side_origin.x + a.side.max.x * k, a.side_origin.y + a.side.max.y * k}});
  }
  return out;
}

// What draw_assembly placed while drawing, into the plan.
void record(SheetPlan& plan, const AssemblyDrawn& drawn) {
  auto add = [&](const char* what, const Box& b) { plan.page1_boxes.push_back({what, {b.x0, b.y0, b.x1, b.y1}}); };
  add("notes", drawn.notes_box);
  if (drawn.detail_x) add("detail X", drawn.detail_x_box);
  if (drawn.iso) {
    add("isometric view", drawn.iso_box);
    plan.iso_box[0] = drawn.iso_box.x0;
    plan.iso_box[1] = drawn.iso_box.y0;
    plan.iso_box[2] = drawn.iso_box.x1;
    plan.iso_box[3] = drawn.iso_box.y1;
    plan.iso_scale_num = drawn.iso_scale.num;
    plan.iso_scale_den = drawn.iso_scale.den;
  }
}

}  // namespace

SheetPlan plan_drawing(const Design& design, const Solution& solution, const geom::BrakeModel* model,
                       const CutList& cut_list, UnitSystem units) {
  const Canvas measure;  // text widths only
  const SheetSize s = sheet_size(design.drawing.sheet);
  const Box caution = caution_box(measure, s);
  int pages = 0;
  flow(measure, calculation_blocks(design, solution, cut_list, units), calc_columns(s, caution), &pages);
  const bool assembly = has_assembly(solution, model);
  const std::vector<std::string> detail_names = assembly ? detail_parts(*model) : std::vector<std::string>{};
  Planned p = plan_all(measure, design, solution, model, lay_out_set(s, detail_names, assembly, pages));
  p.plan.detail_sheets = static_cast<int>(detail_names.size());
  return p.plan;
}

std::string render_drawing(const Design& design, const Solution& solution,
                           const geom::BrakeModel* model, const geom::BrakeModel* released,
                           const CutList& cut_list, UnitSystem units, SheetPlan* plan_out,
                           std::vector<std::string>* sheets) {
  const SheetSize s = sheet_size(design.drawing.sheet);
  Canvas c(sheets != nullptr);
  c.set_title(design.project.title, design.project.creator,
              design.project.number + " band brake: assembly drawing and calculation sheet");

  // Lay out the calculation sheet first: its page count goes into every title block and the
  // list of sheets on the assembly sheet.
  const Box caution = caution_box(c, s);
  const std::vector<Block> blocks = calculation_blocks(design, solution, cut_list, units);
  int calc_pages = 0;
  const std::vector<Placed> placed = flow(c, blocks, calc_columns(s, caution), &calc_pages);
  // Assembly sheet, the detail sheets of the made parts, the calculation.
  const bool assembly = has_assembly(solution, model);
  const std::vector<std::string> detail_names = assembly ? detail_parts(*model) : std::vector<std::string>{};
  Planned planned = plan_all(c, design, solution, model, lay_out_set(s, detail_names, assembly, calc_pages));
  SheetPlan& plan = planned.plan;
  const int details = static_cast<int>(detail_names.size());
  const int first_calc = (plan.assembly ? 2 : 1) + details;
  plan.detail_sheets = details;

  TitleData t = title_data(design, units);
  t.sheets = plan.pages;
  if (planned.assembly) {
    const AssemblyPlan& a = *planned.assembly;
    c.new_page(s.width, s.height);
    draw_frame(c, s);
    record(plan, draw_assembly(c, a, design, solution, *model, released, units, plan.notes));
    draw_caution(c, caution);
    t.doc_type = "Assembly drawing";
    t.supplementary = assembly_subtitle(design, solution, units);
    t.scale = a.scale.text();
    t.sheet = 1;
    draw_title_block(c, s, t);
    for (std::size_t i = 0; i < detail_names.size(); ++i) {
      TitleData detail = t;
      detail.sheet = 2 + static_cast<int>(i);
      const std::string kind = detail_kind(*model, detail_names[i]);
      if (kind == "drum") {
        const DrumSheetMarks m = draw_drum_sheet(c, s, design, *model, units, detail);
        plan.drum_page = detail.sheet;
        plan.drum_texture_symbol = {m.texture_symbol.x0, m.texture_symbol.y0, m.texture_symbol.x1, m.texture_symbol.y1};
        plan.drum_runout_frame = {m.runout_frame.x0, m.runout_frame.y0, m.runout_frame.x1, m.runout_frame.y1};
        plan.drum_datum = {m.datum.x0, m.datum.y0, m.datum.x1, m.datum.y1};
      } else if (kind == "band") {
        draw_band_sheet(c, s, design, solution, *model, units, detail);
        plan.band_page = detail.sheet;
      } else {
        const auto holes = draw_detail_sheet(c, s, design, *model, detail_names[i], units, detail);
        if (kind == "lever") {
          for (const DetailHole& h : holes) plan.lever_holes.push_back({h.x, h.y, h.diameter});
        }
      }
    }
  }
  for (int p = 0; p < calc_pages; ++p) {
    c.new_page(s.width, s.height);
    draw_frame(c, s);
    for (const Placed& pl : placed) {
      if (pl.page == p) pl.block.draw(c, pl.top_left, pl.width);
    }
    draw_caution(c, caution);
    t.doc_type = "Calculation sheet";
    t.supplementary = "Band brake calculation: method, inputs, results for both rotations over the friction range, checks";
    t.scale = "—";
    t.projection_symbol = false;
    t.sheet = first_calc + p;
    draw_title_block(c, s, t);
  }
  const std::vector<unsigned char> bytes = c.finish();
  if (sheets) {
    sheets->clear();
    for (const auto& one : c.finish_sheets()) sheets->emplace_back(one.begin(), one.end());
  }
  if (plan_out) *plan_out = plan;
  return std::string(bytes.begin(), bytes.end());
}

SheetPlan write_drawing(const Design& design, const Solution& solution,
                        const geom::BrakeModel* model, const geom::BrakeModel* released,
                        const CutList& cut_list, UnitSystem units, const std::string& path) {
  SheetPlan plan;
  const std::string bytes = render_drawing(design, solution, model, released, cut_list, units, &plan);
  // Written beside the target and renamed only when complete: a failed run leaves no PDF.
  const std::string tmp = path + ".tmp";
  {
    std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
    if (!out) throw IoError("cannot write " + tmp + ": " + std::strerror(errno));
    out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
    out.close();
    if (!out) {
      std::remove(tmp.c_str());
      throw IoError("cannot write " + tmp + " (disk full?)");
    }
  }
  std::error_code ec;
  std::filesystem::rename(tmp, path, ec);
  if (ec) {
    std::remove(tmp.c_str());
    throw IoError("cannot rename " + tmp + " to " + path + ": " + ec.message());
  }
  return plan;
}

}  // namespace bandforge::drawing

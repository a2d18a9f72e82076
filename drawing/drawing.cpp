#include "drawing/drawing.hpp"

#include "drawing/detail_sheet.hpp"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
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

Planned plan_all(const Canvas& c, const Design& design, const Solution& solution,
                 const geom::BrakeModel* model) {
  const SheetSize s = sheet_size(design.drawing.sheet);
  Planned out;
  SheetPlan& plan = out.plan;
  plan.sheet = s.name;
  plan.width_mm = s.width;
  plan.height_mm = s.height;
  const Box tb = title_block_box(s);
  plan.title_block[0] = tb.x0;
  plan.title_block[1] = tb.y0;
  plan.title_block[2] = tb.x1;
  plan.title_block[3] = tb.y1;
  if (model && solution.layout.from_pins) {
    out.assembly = plan_assembly(c, design, solution, *model, s);
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
  }
  return out;
}

}  // namespace

SheetPlan plan_drawing(const Design& design, const Solution& solution, const geom::BrakeModel* model,
                       const CutList& cut_list, UnitSystem units) {
  const Canvas measure;  // text widths only
  Planned p = plan_all(measure, design, solution, model);
  const Box caution = caution_box(measure, sheet_size(design.drawing.sheet));
  int pages = 0;
  flow(measure, calculation_blocks(design, solution, cut_list, units),
       calc_columns(sheet_size(design.drawing.sheet), caution), &pages);
  p.plan.detail_sheets = p.plan.assembly && model != nullptr ? static_cast<int>(detail_parts(*model).size()) : 0;
  p.plan.pages = (p.plan.assembly ? 1 : 0) + p.plan.detail_sheets + pages;
  return p.plan;
}

std::string render_drawing(const Design& design, const Solution& solution,
                           const geom::BrakeModel* model, const geom::BrakeModel* released,
                           const CutList& cut_list, UnitSystem units, SheetPlan* plan_out) {
  const SheetSize s = sheet_size(design.drawing.sheet);
  Canvas c;
  Planned planned = plan_all(c, design, solution, model);
  SheetPlan& plan = planned.plan;
  c.set_title(design.project.title, design.project.creator,
              design.project.number + " band brake: assembly drawing and calculation sheet");

  // Lay out the calculation sheet first: its page count goes into every title block.
  const Box caution = caution_box(c, s);
  const std::vector<Block> blocks = calculation_blocks(design, solution, cut_list, units);
  int calc_pages = 0;
  const std::vector<Placed> placed = flow(c, blocks, calc_columns(s, caution), &calc_pages);
  // Assembly sheet, the detail sheets of the made parts (so far the lever), the calculation.
  const std::vector<std::string> detail_names =
      plan.assembly && model != nullptr ? detail_parts(*model) : std::vector<std::string>{};
  const int details = static_cast<int>(detail_names.size());
  const int first_calc = (plan.assembly ? 2 : 1) + details;
  plan.pages = first_calc - 1 + calc_pages;
  plan.detail_sheets = details;

  TitleData t = title_data(design, units);
  t.sheets = plan.pages;
  if (planned.assembly) {
    const AssemblyPlan& a = *planned.assembly;
    c.new_page(s.width, s.height);
    draw_frame(c, s);
    draw_assembly(c, a, design, solution, *model, released, units, plan.notes);
    draw_caution(c, caution);
    t.doc_type = "Assembly drawing";
    t.supplementary = assembly_subtitle(design, solution, units);
    t.scale = a.scale.text();
    t.sheet = 1;
    draw_title_block(c, s, t);
    for (std::size_t i = 0; i < detail_names.size(); ++i) {
      TitleData detail = t;
      detail.sheet = 2 + static_cast<int>(i);
      const auto holes = draw_detail_sheet(c, s, design, *model, detail_names[i], units, detail);
      if (i == 0) {
        for (const DetailHole& h : holes) plan.lever_holes.push_back({h.x, h.y, h.diameter});
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

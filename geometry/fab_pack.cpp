// The fab/ folder: one DXF per flat part and cutlist.csv, computed in full before anything is
// written, then written through a staging folder that is renamed only when every file exists.
#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <numbers>
#include <string>
#include <vector>

#include "geometry/flat_internal.hpp"
#include "src/apply.hpp"
#include "src/errors.hpp"
#include "src/hardware.hpp"
#include "src/staging.hpp"

namespace bandforge::geom {
namespace {

namespace fs = std::filesystem;
constexpr double mm_per_m = 1000.0;

std::string fixed(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

std::string joined(const std::vector<std::string>& names) {
  std::string s;
  for (const std::string& n : names) s += (s.empty() ? "" : ", ") + n;
  return s;
}

bool same_point(double x, double y, Vec2 p) { return std::hypot(x - p.x, y - p.y) < 1e-6; }

// The lever plate: its holes named after the pins the design puts there, the grip marked.
FlatPart lever_plate(const Design& d, const BrakeModel& model, std::size_t lever) {
  FlatPart f = plate_from_solid(model, lever);
  f.name = "LEVER-PLATE";
  f.file = "lever-plate.dxf";
  // The lever solid's part coordinates put the pivot at the origin (geometry/assemble.cpp).
  const Vec2 pivot{d.lever.pivot.x * mm_per_m, d.lever.pivot.y * mm_per_m};
  auto rel = [&](Vec2 p) { return Vec2{p.x * mm_per_m - pivot.x, p.y * mm_per_m - pivot.y}; };
  std::vector<std::string> named;
  for (const FlatCircle& h : f.holes) {
    std::string tag;
    if (same_point(h.x, h.y, {0, 0})) tag = "PIVOT";
    if (d.band.end_a.mount == Mount::lever && same_point(h.x, h.y, rel(d.band.end_a.at))) {
      tag += tag.empty() ? "PIN A" : " + PIN A";
    }
    if (d.band.end_b.mount == Mount::lever && same_point(h.x, h.y, rel(d.band.end_b.at))) {
      tag += tag.empty() ? "PIN B" : " + PIN B";
    }
    if (tag.empty()) tag = "HOLE";
    f.tags.push_back({h.x + h.radius + 1.5, h.y + h.radius + 1.5, 3.5, tag});
    named.push_back(tag + " dia " + num(2 * h.radius, 2) + " at (" + num(h.x, 2) + ", " +
                    num(h.y, 2) + ")");
  }
  f.notes = {
      "LEVER PLATE  " + d.project.number + "  " + d.project.title,
      f.material + " plate " + num(f.thickness, 2) + " thick, outline " + num(f.length, 2) + " x " +
          num(f.width, 2) + ", quantity " + std::to_string(f.quantity) +
          "; the face the LEVER solid is extruded from",
      "origin at the pivot centre, the plate as in the front view of the applied state",
      "holes: " + joined(named),
  };
  const std::size_t grip = find_part(model, "grip");
  if (grip < model.parts().size()) {
    const BarSize g = bar_size(model, grip);
    const Vec2 h = rel(d.lever.handle);
    const double a = g.diameter / 2;
    f.marks.push_back({h.x - a, h.y, h.x + a, h.y});
    f.marks.push_back({h.x, h.y - a, h.x, h.y + a});
    f.notes.push_back("grip " + model.parts()[grip].name + ": round bar dia " + num(g.diameter, 2) +
                      " x " + num(g.length, 2) + " welded on the front face, centred on the MARK "
                      "cross at the handle point (" + num(h.x, 2) + ", " + num(h.y, 2) + ")");
  }
  return f;
}

FlatPart anchor_plate(const Design& d, const BrakeModel& model, std::size_t anchor, int count) {
  FlatPart f = plate_from_solid(model, anchor);
  const PartInfo& info = model.parts()[anchor];
  const std::string suffix = count > 1 ? "-" + info.name : "";
  f.name = "ANCHOR-PLATE" + suffix;
  f.file = "anchor-plate" + suffix + ".dxf";
  for (const FlatCircle& h : f.holes) {
    f.tags.push_back({h.x + h.radius + 1.5, h.y + h.radius + 1.5, 3.5, "PIN"});
  }
  f.notes = {
      "FRAME ANCHOR PLATE  " + d.project.number + "  " + d.project.title,
      f.material + " plate " + num(f.thickness, 2) + " thick, outline " + num(f.length, 2) + " x " +
          num(f.width, 2) + ", quantity " + std::to_string(f.quantity) + " (" +
          joined(info.instance_names) + ")",
      "origin at the pin centre; the lug end fixes to the frame (fixing not designed here)",
  };
  return f;
}

CutListRow row_of(const FlatPart& f, const std::string& stock, const std::string& note) {
  return {f.name, f.file, f.material, stock, f.thickness, f.length, f.width, f.quantity, f.mass,
          note};
}

std::string developed_note(const FlatPart& f) {
  std::string s = "developed length " + num(f.length, 3) + " =";
  for (std::size_t i = 0; i < f.developed.size(); ++i) {
    s += (i ? " + " : " ") + f.developed[i].what + " " + num(f.developed[i].length, 3);
  }
  return s;
}

std::string csv_field(const std::string& s) {
  if (s.find_first_of(",\"\r\n") == std::string::npos) return s;
  std::string q = "\"";
  for (char c : s) q += c == '"' ? std::string("\"\"") : std::string(1, c);
  return q + "\"";
}

void write_text_file(const std::string& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
  out.close();
  if (!out) throw IoError("cannot write " + path);
}

}  // namespace

FabPack make_fab_pack(const Design& design, const Solution& solution, const BrakeModel& model) {
  if (!solution.layout.from_pins) {
    throw BuildError("cannot flatten a [concept] design: it has no pin layout and no solids");
  }
  const std::vector<PartInfo>& infos = model.parts();
  const std::size_t none = infos.size();
  FabPack pack;

  const std::size_t band = find_part(model, "band");
  if (band == none) throw BuildError("cannot flatten the band: the model has no band solid");
  pack.parts.push_back(band_blank(design, solution, infos[band]));
  pack.rows.push_back(row_of(pack.parts.back(), "strip",
                             developed_note(pack.parts.back()) + "; becomes " + infos[band].name +
                                 " (rolled, eyes formed)"));

  const std::size_t lining = find_part(model, "lining");
  if (lining != none) {
    if (auto f = lining_blank(design, solution, infos[lining])) {
      pack.parts.push_back(*f);
      pack.rows.push_back(row_of(*f, "sheet",
                                 developed_note(*f) + "; becomes " + infos[lining].name +
                                     " (rolled with the band)"));
    }
  }

  const std::size_t lever = find_part(model, "lever");
  if (lever != none) {
    pack.parts.push_back(lever_plate(design, model, lever));
    pack.rows.push_back(row_of(pack.parts.back(), "plate",
                               "becomes " + infos[lever].name + "; outline and holes of the solid"));
  }

  const std::vector<std::size_t> anchors = parts_of_kind(model, "anchor");
  for (std::size_t a : anchors) {
    pack.parts.push_back(anchor_plate(design, model, a, static_cast<int>(anchors.size())));
    pack.rows.push_back(row_of(pack.parts.back(), "plate",
                               "becomes " + joined(infos[a].instance_names)));
  }

  // Welded end blocks (src/hardware.hpp): the profile with the band slot and the pin bore, cut
  // from plate as thick as the band is wide (flame cut and bored, or milled from bar).
  for (std::size_t i : parts_of_kind(model, "block")) {
    FlatPart f = plate_from_solid(model, i);
    f.name = infos[i].name;
    std::string file = infos[i].name;
    std::transform(file.begin(), file.end(), file.begin(),
                   [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    f.file = file + ".dxf";
    const bool a = infos[i].name.back() == 'A';
    const JointPlan& j = a ? solution.hardware.joint_a : solution.hardware.joint_b;
    f.notes = {
        "WELDED END BLOCK " + std::string(a ? "A" : "B") + "  " + design.project.number + "  " +
            design.project.title,
        f.material + " " + num(f.thickness, 2) + " thick (= band width), outline " +
            num(f.length, 2) + " x " + num(f.width, 2) + ", quantity " + std::to_string(f.quantity),
        "origin at the pin bore; the band slot " + num(design.band.thickness * 1000, 2) + " wide, " +
            num(j.slot_depth * 1000, 2) + " deep, opens toward the drum",
        "weld the band end in the slot: fillet leg " + num(j.weld_leg * 1000, 1) +
            " on both faces across the band width (welded-block joint; checks on the "
            "calculation sheet)",
    };
    pack.parts.push_back(f);
    pack.rows.push_back(row_of(f, "plate", "becomes " + joined(infos[i].instance_names) +
                                               "; bore for the pin, slot for the band end"));
  }

  // Bought parts (clevis pins, washers, split pins, joint rivets): their standard designations,
  // masses the solids' (a rivet's as set, heads formed).
  for (const char* kind : {"pin", "washer", "split-pin", "rivet"}) {
    for (std::size_t i : parts_of_kind(model, kind)) {
      pack.rows.push_back({infos[i].name, "", infos[i].material, "bought", 0, 0, 0,
                           static_cast<int>(infos[i].instance_names.size()), infos[i].mass,
                           infos[i].designation + "; for " + joined(infos[i].instance_names)});
    }
  }
  // Spacer sleeves are sawn from tube.
  for (std::size_t i : parts_of_kind(model, "sleeve")) {
    const BarSize s = bar_size(model, i);
    pack.rows.push_back({infos[i].name, "", infos[i].material, "tube", s.diameter, s.length, s.diameter,
                         static_cast<int>(infos[i].instance_names.size()), infos[i].mass,
                         infos[i].designation + "; becomes " + joined(infos[i].instance_names)});
  }
  // The grip is sawn from round bar; its size and mass are the solid's.
  for (const char* kind : {"grip"}) {
    for (std::size_t i : parts_of_kind(model, kind)) {
      const BarSize s = bar_size(model, i);
      // Mass from the bar size and the solid's density, so it holds without the model's checks.
      const double mass = std::numbers::pi * s.diameter * s.diameter / 4 * s.length * 1e-9 *
                          infos[i].density;
      pack.rows.push_back({infos[i].name, "", infos[i].material, "round bar", s.diameter, s.length,
                           s.diameter, static_cast<int>(infos[i].instance_names.size()), mass,
                           "becomes " + joined(infos[i].instance_names)});
    }
  }
  // The applying element (src/apply.hpp): the spring is bought to its specification; seats,
  // weight block and hanger are turned or sawn from round bar, sizes from the plan.
  const ElementMount& mount = solution.apply.mount;
  for (std::size_t i : parts_of_kind(model, "spring")) {
    pack.rows.push_back({infos[i].name, "", infos[i].material, "bought", 0, 0, 0,
                         static_cast<int>(infos[i].instance_names.size()), infos[i].mass,
                         infos[i].designation + "; to the specification on the calculation sheet"});
  }
  auto bar_row = [&](std::size_t i, double diameter, double length, const std::string& how) {
    pack.rows.push_back({infos[i].name, "", infos[i].material, "round bar", diameter * 1000,
                         length * 1000, diameter * 1000, static_cast<int>(infos[i].instance_names.size()),
                         infos[i].mass, infos[i].designation + "; " + how});
  };
  for (std::size_t i : parts_of_kind(model, "seat")) {
    const SeatPlan& st = infos[i].name == "SEAT-LEVER" ? mount.lever_seat : mount.frame_seat;
    bar_row(i, st.diameter, st.thickness + st.spigot_height, "turned: plate and spigot in one");
  }
  for (std::size_t i : parts_of_kind(model, "weight")) {
    bar_row(i, mount.weight.block_diameter, mount.weight.block_height, "sawn and bored through");
  }
  for (std::size_t i : parts_of_kind(model, "hanger")) {
    bar_row(i, mount.weight.rod_diameter, mount.weight.rod_length + 0.005,
            "sawn 5 mm over length, the top fitted to the lever's edge");
  }
  return pack;
}

std::vector<CutListRow> cut_list(const Design& design, const Solution& solution,
                                 const BrakeModel& model) {
  return make_fab_pack(design, solution, model).rows;
}

std::string cutlist_csv(const std::vector<CutListRow>& rows) {
  std::string s =
      "part,file,material,stock,thickness_mm,length_mm,width_mm,quantity,mass_each_kg,"
      "mass_total_kg,note\n";
  for (const CutListRow& r : rows) {
    s += csv_field(r.part) + ',' + csv_field(r.file) + ',' + csv_field(r.material) + ',' +
         csv_field(r.stock) + ',' + fixed(r.thickness, 2) + ',' + fixed(r.length, 2) + ',' +
         fixed(r.width, 2) + ',' + std::to_string(r.quantity) + ',' + fixed(r.mass, 3) + ',' +
         fixed(r.mass * r.quantity, 3) + ',' + csv_field(r.note) + '\n';
  }
  return s;
}

void write_fab_files(const FabPack& pack, DxfVersion version,
                     const std::function<std::string(const std::string&)>& path_for) {
  for (const FlatPart& f : pack.parts) write_dxf(f, version, path_for(f.file));
  write_text_file(path_for("cutlist.csv"), cutlist_csv(pack.rows));
}

void remove_stale_fab_files(const std::string& fab_dir, const FabPack& pack) {
  std::error_code ec;
  std::vector<fs::path> stale;
  for (const auto& e : fs::directory_iterator(fab_dir, ec)) {
    const std::string name = e.path().filename().string();
    const bool ours = e.path().extension() == ".dxf" || name == "cutlist.csv";
    const bool current = name == "cutlist.csv" ||
                         std::any_of(pack.parts.begin(), pack.parts.end(),
                                     [&](const FlatPart& f) { return f.file == name; });
    if (ours && !current) stale.push_back(e.path());
  }
  for (const fs::path& p : stale) {
    if (!fs::remove(p, ec) && ec) throw IoError("cannot remove " + p.string() + ": " + ec.message());
  }
}

void write_fab_pack(const Design& design, const Solution& solution, const BrakeModel& model,
                    const std::string& outdir, DxfVersion version) {
  // Everything that can refuse (BuildError) runs before the disk is touched.
  const FabPack pack = make_fab_pack(design, solution, model);

  StagedOutputs staging(outdir, "fab");
  write_fab_files(pack, version, [&](const std::string& name) { return staging.path("fab/" + name); });
  staging.commit();
  remove_stale_fab_files((fs::path(outdir) / "fab").string(), pack);
}

}  // namespace bandforge::geom

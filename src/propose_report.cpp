// The text outputs of `propose`: each proposal's design file with its comment header, and
// proposals.csv. (The review sheet, proposals.pdf, is drawn by drawing/proposal_sheet.cpp.)
#include <cmath>
#include <cstdio>
#include <numbers>
#include <sstream>

#include "src/design_writer.hpp"
#include "src/propose.hpp"
#include "src/version.hpp"

namespace bandforge {
namespace {

std::string fmt(const char* f, double v) {
  char buf[96];
  std::snprintf(buf, sizeof buf, f, v);
  return buf;
}

}  // namespace

std::string proposal_toml(const Brief& brief, const Proposal& p, int rank) {
  std::ostringstream h;
  h << "bandforge " << version() << " proposal " << rank << " for the brief " << brief.project.number
    << " (" << brief.project.title << ").\n";
  h << "Why: " << p.reason << ".\n";
  h << "Margins (worst case over f_min…f_max" << (brief.both_directions ? ", both rotations" : "")
    << "):\n";
  for (const std::string& m : p.margins) h << "  - " << m << '\n';
  h << "Run `bandforge solve` on this file for every check, `bandforge build` for the parts.\n";
  h << "CAUTION: a proposal is a design aid, not an approved design. A brake holds loads over\n"
       "people: check it against the applicable codes and have it approved by a licensed engineer.";
  return design_toml(p.design, h.str());
}

std::string proposals_csv(const std::vector<Proposal>& proposals) {
  std::ostringstream o;
  o << "rank,number,kind,drum_diameter_mm,band_sense,end_a_mount,end_a_x_mm,end_a_y_mm,"
       "end_b_mount,end_b_x_mm,end_b_y_mm,pivot_x_mm,pivot_y_mm,handle_x_mm,handle_y_mm,"
       "band_width_mm,band_thickness_mm,pin_diameter_mm,lever_width_mm,lever_thickness_mm,"
       "wrap_deg,operator_force_N,lining_pressure_MPa,band_stress_MPa,pin_shear_MPa,"
       "lever_stress_MPa,self_lock_friction,band_mass_kg,handle_travel_mm,lever_length_mm\n";
  int rank = 0;
  for (const Proposal& p : proposals) {
    const Design& d = p.design;
    const Figures& f = p.figures;
    const auto mm = [](double m) { return fmt("%.10g", m * 1000.0); };
    o << ++rank << ',' << d.project.number << ',' << to_string(p.kind) << ',' << mm(d.drum.diameter) << ','
      << to_string(d.band.sense) << ',' << to_string(d.band.end_a.mount) << ',' << mm(d.band.end_a.at.x)
      << ',' << mm(d.band.end_a.at.y) << ',' << to_string(d.band.end_b.mount) << ','
      << mm(d.band.end_b.at.x) << ',' << mm(d.band.end_b.at.y) << ',' << mm(d.lever.pivot.x) << ','
      << mm(d.lever.pivot.y) << ',' << mm(d.lever.handle.x) << ',' << mm(d.lever.handle.y) << ','
      << mm(d.band.width) << ',' << mm(d.band.thickness) << ',' << mm(d.band.pin_diameter) << ','
      << mm(d.lever.width) << ',' << mm(d.lever.thickness) << ','
      << fmt("%.4f", f.wrap * 180.0 / std::numbers::pi) << ',' << fmt("%.4f", f.force) << ','
      << fmt("%.6f", f.pressure / 1e6) << ',' << fmt("%.6f", f.band_stress / 1e6) << ','
      << fmt("%.6f", f.pin_shear / 1e6) << ',' << fmt("%.6f", f.lever_stress / 1e6) << ','
      << (std::isfinite(f.self_lock_friction) ? fmt("%.6f", f.self_lock_friction) : std::string("none"))
      << ',' << fmt("%.6f", f.band_mass) << ',' << fmt("%.4f", f.travel * 1000.0) << ','
      << fmt("%.4f", f.size * 1000.0) << '\n';
  }
  return o.str();
}

}  // namespace bandforge

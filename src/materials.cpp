#include "src/materials.hpp"

#include <algorithm>

namespace bandforge {
namespace {

// Table values are stored in the units the source prints and converted here with exact
// factors (NIST SP 811), so that each number can be compared with the page it came from.
constexpr double kPsi = 4.4482216152605 / (0.0254 * 0.0254);  // Pa
constexpr double kWattPerMm2 = 1e6;                           // W/m² per W/mm²
constexpr double kPoundPerCubicInch = 0.45359237 / (0.0254 * 0.0254 * 0.0254);  // kg/m³
// 1 ft·lbf/(lbm·°F) in J/(kg·K): ft·lbf = 0.3048 × 4.4482216152605 J, lbm = 0.45359237 kg,
// 1 °F difference = 5/9 K.
constexpr double kFtLbfPerLbmF = 0.3048 * 4.4482216152605 / (0.45359237 * 5.0 / 9.0);

constexpr double fahrenheit_to_celsius(double f) { return (f - 32.0) * 5.0 / 9.0; }

const std::string kJuv5 =
    "Juvinall & Marshek, Fundamentals of Machine Component Design, 5th ed., Table 18.1 (dry)";
const std::string kNeale74 =
    "Neale (ed.), The Tribology Handbook, Table 7.4 (dry clutch facings)";

struct JuvinallRow {
  const char* key;
  const char* description;
  const char* friction_text;  // range as printed
  double f_min, f_max;
  const char* pressure_text;  // range as printed, psi
  double p_low_psi;
  const char* temperature_text;  // as printed, °F
  double t_low_f;
  const char* power_text;  // Neale Table 7.4 facing and range as printed; nullptr = no match
  double power_low_w_per_mm2;
};

LiningMaterial make_lining(const JuvinallRow& r) {
  LiningMaterial m;
  m.key = r.key;
  m.description = r.description;
  m.friction_min = r.f_min;
  m.friction_max = r.f_max;
  m.friction = 0.5 * (r.f_min + r.f_max);
  m.pressure_limit = r.p_low_psi * kPsi;
  m.temperature_limit = fahrenheit_to_celsius(r.t_low_f);
  m.power_limit = r.power_low_w_per_mm2 * kWattPerMm2;
  m.friction_source = kJuv5 + ", dynamic f " + r.friction_text +
                      "; nominal = middle of the range";
  m.pressure_source = kJuv5 + ", lower end of the max-pressure range " + r.pressure_text +
                      " (footnote c: lower values give longer life)";
  m.temperature_source = kJuv5 + ", lower end of the max bulk temperature " + r.temperature_text;
  if (r.power_text != nullptr) {
    m.power_source = kNeale74 + ", " + r.power_text;
  }
  return m;
}

std::vector<LiningMaterial> build_linings() {
  // REFERENCE.md §2.4 Table A (Juv5 Table 18.1, against smooth cast iron or steel) and the
  // Neale Table 7.4 power ratings for the facings that match by name.
  const JuvinallRow rows[] = {
      {"woven", "woven lining (resin-impregnated fabric)", "0.25–0.45", 0.25, 0.45,
       "50–100 psi", 50, "400–500 °F", 400, "woven facing, lower end of 0.3–0.6 W/mm²", 0.3},
      {"molded", "molded lining", "0.25–0.45", 0.25, 0.45, "150–300 psi", 150, "400–500 °F",
       400, "moulded facing, lower end of 0.6–1.2 W/mm²", 0.6},
      {"sintered", "sintered metal", "0.15–0.45", 0.15, 0.45, "150–300 psi", 150,
       "450–1250 °F", 450, "sintered facing, 1.7 W/mm²", 1.7},
      {"cork", "cork", "0.30–0.50", 0.30, 0.50, "8–14 psi", 8, "180 °F (single value)", 180,
       nullptr, 0},
      {"wood", "wood", "0.20–0.30", 0.20, 0.30, "50–90 psi", 50, "200 °F (single value)", 200,
       nullptr, 0},
      {"iron", "cast iron or hard steel (metal on metal)", "0.15–0.25", 0.15, 0.25,
       "100–250 psi", 100, "500 °F (single value)", 500, nullptr, 0},
  };
  std::vector<LiningMaterial> out;
  for (const JuvinallRow& r : rows) out.push_back(make_lining(r));
  return out;
}

std::vector<DrumMaterial> build_drums() {
  std::vector<DrumMaterial> out;
  {
    DrumMaterial m;
    m.key = "cast-iron";
    m.description = "grey cast iron";
    m.density = 0.253 * kPoundPerCubicInch;
    m.specific_heat = 101.0 * kFtLbfPerLbmF;
    m.density_source =
        "Faires & Wingren, Problems on the Design of Machine Elements, Problem 881 solution: "
        "0.253 lb/in³ (converted exactly)";
    m.specific_heat_source =
        "Faires & Wingren, Problems on the Design of Machine Elements, Problem 881 solution: "
        "101 ft·lbf/(lbm·°F) (converted exactly, about 544 J/(kg·K))";
    out.push_back(m);
  }
  {
    DrumMaterial m;
    m.key = "steel";
    m.description = "carbon steel";
    m.density = 7850.0;
    m.specific_heat = 460.0;
    m.density_source = "7850 kg/m³, handbook value, from memory (no verified source)";
    m.specific_heat_source =
        "460 J/(kg·K): Bhandari, Design of Machine Elements, Example 12.14; Jindal, Machine "
        "Design, Example 23-5";
    out.push_back(m);
  }
  return out;
}

}  // namespace

const std::vector<LiningMaterial>& lining_materials() {
  static const std::vector<LiningMaterial> table = build_linings();
  return table;
}

const std::vector<DrumMaterial>& drum_materials() {
  static const std::vector<DrumMaterial> table = build_drums();
  return table;
}

const LiningMaterial* find_lining(std::string_view key) {
  const auto& t = lining_materials();
  const auto it = std::find_if(t.begin(), t.end(), [&](const auto& m) { return m.key == key; });
  return it == t.end() ? nullptr : &*it;
}

const DrumMaterial* find_drum_material(std::string_view key) {
  const auto& t = drum_materials();
  const auto it = std::find_if(t.begin(), t.end(), [&](const auto& m) { return m.key == key; });
  return it == t.end() ? nullptr : &*it;
}

}  // namespace bandforge

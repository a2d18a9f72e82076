#include "src/units.hpp"

#include <udunits2.h>

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <memory>
#include <mutex>
#include <numbers>
#include <optional>
#include <vector>

#include "src/errors.hpp"

namespace bandforge {
namespace {

// Exact conversion factors (NIST SP 811, Appendix B). Display uses these directly rather than
// udunits so that the printed numbers do not depend on the installed unit database; the unit
// test checks both against each other.
constexpr double kInch = 0.0254;                   // m, exact
constexpr double kFoot = 0.3048;                   // m, exact
constexpr double kPound = 0.45359237;              // kg, exact
constexpr double kPoundForce = 4.4482216152605;    // N, exact (lb × standard gravity)
constexpr double kHorsepower = 550.0 * kFoot * kPoundForce;  // W: 550 ft·lbf/s

struct QuantityInfo {
  Quantity q;
  const char* name;        // "a length"
  const char* si_parse;    // SI unit as udunits text
  int radians;             // power of rad in the unit: udunits treats rad as dimensionless
  const char* si_example;  // unit put after the user's own number in a hint
  const char* us_example;  // a second, complete example
  const char* accepted;    // the units we document for this quantity
};

// One row per Quantity, in enum order.
constexpr std::array<QuantityInfo, 16> kInfo{{
    {Quantity::length, "a length", "m", 0, "mm", "0.125 in", "mm, cm, m, in, ft"},
    {Quantity::force, "a force", "N", 0, "N", "500 lbf", "N, kN, lbf"},
    {Quantity::torque, "a torque", "N.m", 0, "N*m", "300 lbf*ft", "N*m, N·m, kN*m, lbf*ft, lbf*in"},
    {Quantity::stress, "a stress or pressure", "Pa", 0, "MPa", "10000 psi", "Pa, kPa, MPa, psi"},
    {Quantity::angle, "an angle", "rad", 1, "°", "4.5 rad", "°, deg, degree, rad"},
    {Quantity::angular_speed, "an angular speed", "rad/s", 1, "rpm", "31.4 rad/s", "rpm, rad/s"},
    {Quantity::linear_speed, "a linear speed", "m/s", 0, "m/s", "100 ft/min", "m/s, ft/min"},
    {Quantity::mass, "a mass", "kg", 0, "kg", "550 lb", "kg, lb"},
    {Quantity::inertia, "a moment of inertia", "kg.m2", 0, "kg*m^2", "12 lb*ft^2",
     "kg*m^2, lb*ft^2"},
    {Quantity::energy, "an energy", "J", 0, "J", "750 ft*lbf", "J, kJ, ft*lbf"},
    {Quantity::power, "a power", "W", 0, "W", "2 hp", "W, kW, hp"},
    {Quantity::power_density, "a power per area", "W/m2", 0, "W/mm^2", "200 W/in^2",
     "W/mm^2, W/in^2"},
    {Quantity::temperature, "a temperature", "K", 0, "°C", "104 °F", "°C, degC, K, °F"},
    {Quantity::temperature_difference, "a temperature difference", "K", 0, "K", "36 °F",
     "K, °C, °F"},
    {Quantity::rate, "a rate (per time)", "s-1", 0, "/h", "1 /min", "/h, /min, /s"},
    {Quantity::dimensionless, "a plain number", "1", 0, "", "0.35", "no unit"},
}};

const QuantityInfo& info(Quantity q) { return kInfo[static_cast<std::size_t>(q)]; }

// Other measures a user might give by mistake, so that the message can name them.
struct OtherMeasure {
  const char* name;
  const char* si;
  int radians;
};
constexpr std::array<OtherMeasure, 6> kOther{{
    {"a time", "s", 0},
    {"an area", "m2", 0},
    {"a volume", "m3", 0},
    {"a density", "kg/m3", 0},
    {"an acceleration", "m/s2", 0},
    {"a solid angle", "sr", 2},
}};

struct UnitFree {
  void operator()(ut_unit* u) const { ut_free(u); }
};
struct ConverterFree {
  void operator()(cv_converter* c) const { cv_free(c); }
};
using UnitPtr = std::unique_ptr<ut_unit, UnitFree>;
using ConverterPtr = std::unique_ptr<cv_converter, ConverterFree>;

// udunits keeps a global status and is not documented as thread-safe: every call goes through
// this lock. The unit system is read once and kept for the life of the process.
std::mutex& udunits_lock() {
  static std::mutex m;
  return m;
}

ut_system* unit_system() {
  static ut_system* const system = [] {
    ut_set_error_message_handler(ut_ignore);  // otherwise it prints its XML warnings to stderr
    return ut_read_xml(nullptr);
  }();
  if (system == nullptr) {
    throw Error(Exit::internal,
                "the udunits2 unit database could not be read (is the udunits-bin/libudunits2 "
                "data installed, or UDUNITS2_XML_PATH set wrongly?)");
  }
  return system;
}

UnitPtr parse_unit(const std::string& text) {
  return UnitPtr(ut_parse(unit_system(), text.c_str(), UT_UTF8));
}

// Power of `rad` in the unit's definition ("0.0174 rad" → 1, "s-1.rad" → 1, "sr" → "rad2" → 2).
int radian_power(const ut_unit* unit) {
  char buf[256];
  const int n = ut_format(unit, buf, sizeof buf, UT_ASCII | UT_DEFINITION);
  if (n <= 0 || n >= static_cast<int>(sizeof buf)) return 0;
  const std::string_view def(buf, static_cast<std::size_t>(n));
  int power = 0;
  std::size_t i = 0;
  while (i < def.size()) {
    const std::size_t j = def.find_first_of(" .", i);
    const std::string_view tok = def.substr(i, j == std::string_view::npos ? def.npos : j - i);
    if (tok.substr(0, 3) == "rad") {
      const std::string_view exp = tok.substr(3);
      int e = 1;
      if (!exp.empty()) {
        auto [p, ec] = std::from_chars(exp.data(), exp.data() + exp.size(), e);
        if (ec != std::errc() || p != exp.data() + exp.size()) e = 0;
      }
      power += e;
    }
    if (j == std::string_view::npos) break;
    i = j + 1;
  }
  return power;
}

// udunits also calls reciprocal units convertible ("s" and "Hz", "mm" and "1/m"): demand that
// the ratio to the SI unit is a pure number, and that both carry the same power of radians.
bool same_measure(const ut_unit* unit, const char* si_text, int radians) {
  UnitPtr si = parse_unit(si_text);
  if (!si || !ut_are_convertible(unit, si.get()) || radian_power(unit) != radians) return false;
  UnitPtr ratio(ut_divide(unit, si.get()));
  UnitPtr one = parse_unit("1");
  return ratio && one && ut_are_convertible(ratio.get(), one.get());
}

std::string_view trim(std::string_view s) {
  const auto is_space = [](char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r'; };
  while (!s.empty() && is_space(s.front())) s.remove_prefix(1);
  while (!s.empty() && is_space(s.back())) s.remove_suffix(1);
  return s;
}

// Builds a new string rather than replacing in place: GCC 12 warns falsely (-Wrestrict) on
// std::string::replace here.
void replace_all(std::string& s, std::string_view from, std::string_view to) {
  std::string out;
  std::size_t done = 0;
  for (std::size_t i = s.find(from); i != std::string::npos; i = s.find(from, done)) {
    out.append(s, done, i - done).append(to);
    done = i + from.size();
  }
  out.append(s, done);
  s = std::move(out);
}

bool is_letter(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z'); }
bool is_digit(char c) { return c >= '0' && c <= '9'; }

// Spellings people type that udunits does not read: "deg", "/h", "℃", no-break spaces.
std::string normalise_unit(std::string_view unit) {
  std::string u(unit);
  replace_all(u, "\u00A0", " ");  // no-break space
  replace_all(u, "\u202F", " ");  // narrow no-break space
  replace_all(u, "\u2009", " ");  // thin space
  replace_all(u, "\u2103", "°C");  // ℃
  replace_all(u, "\u2109", "°F");  // ℉
  replace_all(u, "\u00BA", "°");  // º, the masculine ordinal often typed for a degree sign
  replace_all(u, "\u02DA", "°");  // ˚, ring above
  // Whole words only: "deg"/"degs" (udunits knows "degree", "degC" and "degF" but not "deg"), and
  // "hp", which udunits defines as 745.6999 W, a rounded value: 550 ft·lbf/s is exact.
  std::string out;
  for (std::size_t i = 0; i < u.size();) {
    if (!is_letter(u[i])) {
      out += u[i++];
      continue;
    }
    std::size_t j = i;
    while (j < u.size() && is_letter(u[j])) ++j;
    const std::string_view word(u.data() + i, j - i);
    if (word == "deg" || word == "degs") {
      out += "degree";
    } else if (word == "hp") {
      out += "(550 ft*lbf/s)";
    } else {
      out.append(word);
    }
    i = j;
  }
  u = std::move(out);
  const std::string_view t = trim(u);
  if (!t.empty() && t.front() == '/') return std::string("1").append(t);  // "/h" means 1/h
  return std::string(t);
}

// udunits would multiply a second number into the unit ("mm 5" = 5 mm) or read "@ 273.15" as an
// offset: a unit written after the value must not contain a free-standing number.
bool has_stray_number(std::string_view unit) {
  std::size_t start = 0;
  if (unit.substr(0, 2) == "1/") start = 2;
  bool token_start = true;
  for (std::size_t i = start; i < unit.size(); ++i) {
    const char c = unit[i];
    if (c == '@') return true;
    if (c == ' ' || c == '*' || c == '/' || c == '(' || c == ')') {
      token_start = true;
      continue;
    }
    if (token_start && (is_digit(c) || c == '.' || c == '+' || c == '-')) return true;
    token_start = false;
  }
  return false;
}

// "J" and "N·m" have the same dimension; only the spelling tells an energy from a torque.
bool spelled_as_energy(std::string_view unit) {
  constexpr std::array<std::string_view, 11> kEnergy{"J",   "kJ",   "MJ",  "mJ",  "Btu", "BTU",
                                                     "cal", "kcal", "Wh",  "kWh", "erg"};
  std::size_t i = 0;
  while (i < unit.size()) {
    if (!is_letter(unit[i])) {
      ++i;
      continue;
    }
    std::size_t j = i;
    while (j < unit.size() && is_letter(unit[j])) ++j;
    const std::string_view word = unit.substr(i, j - i);
    if (std::find(kEnergy.begin(), kEnergy.end(), word) != kEnergy.end()) return true;
    i = j;
  }
  return false;
}

std::string in_quotes(std::string_view s) {
  std::string out;  // built by append: GCC 12 warns falsely (-Wrestrict) on "literal" + string
  out.reserve(s.size() + 2);
  out.append(1, '"').append(s).append(1, '"');
  return out;
}

// "400 mm", but "270°" (SI brochure: no space before the degree of angle).
std::string with_unit(std::string_view number, std::string_view unit) {
  if (unit.empty()) return std::string(number);
  if (unit == "°") return std::string(number) + std::string(unit);
  return std::string(number) + " " + std::string(unit);
}

std::string expected(Quantity q, std::string_view number) {
  const QuantityInfo& qi = info(q);
  const std::string first = with_unit(number.empty() ? "1" : number, qi.si_example);
  return "expected " + std::string(qi.name) + " such as " + in_quotes(first) + " or " +
         in_quotes(qi.us_example);
}

// The measure a unit belongs to, as "a force"; empty when not one we name.
std::string measure_of(const ut_unit* unit, std::string_view unit_text) {
  for (const QuantityInfo& qi : kInfo) {
    if (qi.q == Quantity::temperature_difference || qi.q == Quantity::dimensionless) continue;
    if (qi.q == Quantity::energy) continue;  // decided by spelling below
    if (same_measure(unit, qi.si_parse, qi.radians)) {
      if (qi.q == Quantity::torque && spelled_as_energy(unit_text)) return "an energy";
      return qi.name;
    }
  }
  for (const OtherMeasure& o : kOther) {
    if (same_measure(unit, o.si, o.radians)) return o.name;
  }
  if (same_measure(unit, "1", 0)) return "a plain ratio";
  return {};
}

std::string value_parse_error(std::string_view text, Quantity q, std::string_view why) {
  return in_quotes(text) + ": " + std::string(why) + "; " + expected(q, {});
}

}  // namespace

double parse_quantity(std::string_view text, Quantity q) {
  std::string normal(text);
  replace_all(normal, "\u00A0", " ");
  replace_all(normal, "\u202F", " ");
  replace_all(normal, "\u2009", " ");
  std::string_view s = trim(normal);
  if (s.empty()) throw UnitParseError("empty text; " + expected(q, {}));

  // The number: optional sign, digits, decimal point, exponent. No "inf", "nan", hex.
  std::string_view rest = s;
  bool negative = false;
  if (rest.front() == '+' || rest.front() == '-') {
    negative = rest.front() == '-';
    rest.remove_prefix(1);
  }
  if (rest.empty() || !(is_digit(rest.front()) || rest.front() == '.')) {
    throw UnitParseError(in_quotes(text) + " has no number: " + expected(q, {}));
  }
  double magnitude = 0.0;
  const auto [end, ec] = std::from_chars(rest.data(), rest.data() + rest.size(), magnitude);
  if (ec == std::errc::result_out_of_range) {
    throw UnitParseError(value_parse_error(text, q, "the number is out of range"));
  }
  if (ec != std::errc()) throw UnitParseError(value_parse_error(text, q, "no number"));
  const std::string_view number(s.data(), static_cast<std::size_t>(end - s.data()));
  const double value = negative ? -magnitude : magnitude;
  if (!std::isfinite(value)) {
    throw UnitParseError(value_parse_error(text, q, "the number is not finite"));
  }
  const std::string_view unit_raw =
      trim(std::string_view(end, static_cast<std::size_t>(rest.data() + rest.size() - end)));

  if (!unit_raw.empty() && unit_raw.front() == ',' && unit_raw.size() > 1 &&
      is_digit(unit_raw[1])) {
    throw UnitParseError(in_quotes(text) + ": use a decimal point, not a comma; " +
                         expected(q, {}));
  }
  if (unit_raw.empty()) {
    if (q == Quantity::dimensionless) return value;
    throw UnitParseError(in_quotes(text) + " has no unit: " + expected(q, number));
  }

  if (has_stray_number(unit_raw)) {
    throw UnitParseError(in_quotes(text) + ": the unit " + in_quotes(unit_raw) +
                         " contains a second number; " + expected(q, number));
  }
  const std::string unit_text = normalise_unit(unit_raw);

  std::lock_guard<std::mutex> lock(udunits_lock());
  UnitPtr unit = parse_unit(unit_text);
  if (!unit) {
    throw UnitParseError(in_quotes(text) + ": unknown unit " + in_quotes(unit_raw) + "; " +
                         expected(q, number) + " (units: " + info(q).accepted + ")");
  }

  const QuantityInfo& qi = info(q);
  const bool convertible =
      same_measure(unit.get(), qi.si_parse, qi.radians) &&
      !(q == Quantity::torque && spelled_as_energy(unit_text));
  if (!convertible) {
    const std::string measure = measure_of(unit.get(), unit_text);
    if (!measure.empty()) {
      throw UnitParseError(in_quotes(text) + " is " + measure + ", " + expected(q, number));
    }
    throw UnitParseError(in_quotes(text) + ": " + in_quotes(unit_raw) + " is not a unit of " +
                         qi.name + "; " + expected(q, number) + " (units: " + qi.accepted + ")");
  }

  // Absolute temperatures go to °C with the offset; differences take the scale only.
  const char* target = q == Quantity::temperature ? "degC" : qi.si_parse;
  UnitPtr si = parse_unit(target);
  ConverterPtr conv(si ? ut_get_converter(unit.get(), si.get()) : nullptr);
  if (!conv) {
    throw UnitParseError(value_parse_error(text, q, "the unit cannot be converted"));
  }
  double result = cv_convert_double(conv.get(), value);
  if (q == Quantity::temperature_difference) result -= cv_convert_double(conv.get(), 0.0);
  if (!std::isfinite(result)) {
    throw UnitParseError(value_parse_error(text, q, "the value is out of range"));
  }
  if (q == Quantity::temperature && result < -273.15) {
    throw UnitParseError(in_quotes(text) + " is below absolute zero; " + expected(q, {}));
  }
  return result;
}

namespace {

struct Display {
  const char* unit;
  double factor;  // display value = factor·SI (+ offset)
  double offset;
};

Display display(Quantity q, UnitSystem system) {
  const bool si = system == UnitSystem::si;
  constexpr double deg = 180.0 / std::numbers::pi;
  constexpr double rpm = 60.0 / (2.0 * std::numbers::pi);
  switch (q) {
    case Quantity::length: return si ? Display{"mm", 1e3, 0} : Display{"in", 1 / kInch, 0};
    case Quantity::force: return si ? Display{"N", 1, 0} : Display{"lbf", 1 / kPoundForce, 0};
    case Quantity::torque:
      return si ? Display{"N·m", 1, 0} : Display{"lbf·ft", 1 / (kPoundForce * kFoot), 0};
    case Quantity::stress:
      return si ? Display{"MPa", 1e-6, 0}
                : Display{"psi", kInch * kInch / kPoundForce, 0};
    case Quantity::angle: return Display{"°", deg, 0};
    case Quantity::angular_speed: return Display{"rpm", rpm, 0};
    case Quantity::linear_speed:
      return si ? Display{"m/s", 1, 0} : Display{"ft/min", 60 / kFoot, 0};
    case Quantity::mass: return si ? Display{"kg", 1, 0} : Display{"lb", 1 / kPound, 0};
    case Quantity::inertia:
      return si ? Display{"kg·m²", 1, 0} : Display{"lb·ft²", 1 / (kPound * kFoot * kFoot), 0};
    case Quantity::energy:
      return si ? Display{"J", 1, 0} : Display{"ft·lbf", 1 / (kFoot * kPoundForce), 0};
    case Quantity::power: return si ? Display{"W", 1, 0} : Display{"hp", 1 / kHorsepower, 0};
    case Quantity::power_density:
      return si ? Display{"W/mm²", 1e-6, 0} : Display{"W/in²", kInch * kInch, 0};
    case Quantity::temperature:
      return si ? Display{"°C", 1, 0} : Display{"°F", 1.8, 32};
    case Quantity::temperature_difference:
      return si ? Display{"K", 1, 0} : Display{"°F", 1.8, 0};
    case Quantity::rate: return Display{"/h", 3600, 0};
    case Quantity::dimensionless: return Display{"", 1, 0};
  }
  return Display{"", 1, 0};
}

// Significant figures without locale: std::to_chars rounds the binary value correctly, and the
// digits are then laid out in fixed notation by hand so that no "e+05" appears in a report.
std::string format_number(double v, int digits) {
  if (std::isnan(v)) return "n/a";
  if (std::isinf(v)) return v > 0 ? "inf" : "-inf";
  if (v == 0.0) return "0";  // also −0
  digits = std::clamp(digits, 1, 17);
  char buf[64];
  const auto res = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::scientific, digits - 1);
  std::string sci(buf, res.ptr);
  const std::size_t e_pos = sci.find('e');
  int exponent = 0;
  std::from_chars(sci.data() + e_pos + 1 + (sci[e_pos + 1] == '+' ? 1 : 0),
                  sci.data() + sci.size(), exponent);
  const bool negative = sci.front() == '-';
  std::string mantissa;
  for (std::size_t i = negative ? 1 : 0; i < e_pos; ++i) {
    if (sci[i] != '.') mantissa += sci[i];
  }
  std::string out;
  if (exponent < -5 || exponent > 14) {
    // Far outside engineering ranges: keep scientific, without padding in the exponent.
    out = mantissa.substr(0, 1);
    std::string frac = mantissa.substr(1);
    while (!frac.empty() && frac.back() == '0') frac.pop_back();
    if (!frac.empty()) out.append(".").append(frac);
    out.append("e").append(std::to_string(exponent));
  } else if (exponent < 0) {
    out.append("0.").append(static_cast<std::size_t>(-exponent - 1), '0').append(mantissa);
  } else if (static_cast<std::size_t>(exponent) + 1 >= mantissa.size()) {
    out = mantissa + std::string(static_cast<std::size_t>(exponent) + 1 - mantissa.size(), '0');
  } else {
    const std::size_t int_digits = static_cast<std::size_t>(exponent) + 1;
    out.append(mantissa, 0, int_digits).append(".").append(mantissa, int_digits);
  }
  if (out.find('.') != std::string::npos && out.find('e') == std::string::npos) {
    while (out.back() == '0') out.pop_back();
    if (out.back() == '.') out.pop_back();
  }
  if (negative) out.insert(out.begin(), '-');
  return out;
}

}  // namespace

std::string display_unit(Quantity q, UnitSystem system) { return display(q, system).unit; }

double to_display(double value, Quantity q, UnitSystem system) {
  const Display d = display(q, system);
  return value * d.factor + d.offset;
}

std::string format_quantity(double value, Quantity q, UnitSystem system, int digits) {
  const std::string number = format_number(to_display(value, q, system), digits);
  return with_unit(number, display_unit(q, system));
}

Quantity quantity_of_unit(std::string_view u) {
  if (u == "Pa") return Quantity::stress;
  if (u == "N") return Quantity::force;
  if (u == "N·m" || u == "N*m") return Quantity::torque;
  if (u == "m") return Quantity::length;
  if (u == "°C") return Quantity::temperature;
  if (u == "K") return Quantity::temperature_difference;
  if (u == "W/m²" || u == "W/m^2") return Quantity::power_density;
  if (u == "W") return Quantity::power;
  if (u == "J") return Quantity::energy;
  if (u == "kg") return Quantity::mass;
  if (u == "rad") return Quantity::angle;
  return Quantity::dimensionless;
}

std::string quantity_name(Quantity q) { return info(q).name; }

std::string quantity_examples(Quantity q) {
  const QuantityInfo& qi = info(q);
  if (q == Quantity::dimensionless) return "0.35";
  const char* typical = "1";
  switch (q) {
    case Quantity::length: typical = "400"; break;
    case Quantity::force: typical = "200"; break;
    case Quantity::torque: typical = "400"; break;
    case Quantity::stress: typical = "60"; break;
    case Quantity::angle: typical = "270"; break;
    case Quantity::angular_speed: typical = "300"; break;
    case Quantity::linear_speed: typical = "0.5"; break;
    case Quantity::mass: typical = "250"; break;
    case Quantity::inertia: typical = "2.5"; break;
    case Quantity::energy: typical = "1000"; break;
    case Quantity::power: typical = "500"; break;
    case Quantity::power_density: typical = "0.3"; break;
    case Quantity::temperature: typical = "40"; break;
    case Quantity::temperature_difference: typical = "20"; break;
    case Quantity::rate: typical = "20"; break;
    case Quantity::dimensionless: break;
  }
  return in_quotes(with_unit(typical, qi.si_example)) + " or " + in_quotes(qi.us_example);
}

}  // namespace bandforge

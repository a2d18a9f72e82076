#include "drawing/format.hpp"

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <numbers>

namespace bandforge::drawing {

std::string sig_figs(double v, int sig) {
  if (!std::isfinite(v)) return "—";
  if (v == 0) return "0";
  const int magnitude = static_cast<int>(std::floor(std::log10(std::abs(v))));
  int decimals = std::max(0, sig - 1 - magnitude);
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  // Rounding can carry into a new digit (9.9996 → "10.000"): print once more with one decimal fewer.
  const double printed = std::strtod(buf, nullptr);
  if (decimals > 0 && printed != 0 &&
      static_cast<int>(std::floor(std::log10(std::abs(printed)))) > magnitude) {
    std::snprintf(buf, sizeof buf, "%.*f", decimals - 1, v);
  }
  std::string s = buf;
  if (s == "-0") s = "0";
  return s;
}

std::string qty_value(double si, Quantity q, UnitSystem u, int sig) {
  return sig_figs(to_display(si, q, u), sig);
}

std::string qty(double si, Quantity q, UnitSystem u, int sig) {
  const std::string unit = display_unit(q, u);
  return qty_value(si, q, u, sig) + (unit.empty() ? "" : " " + unit);
}

std::string dim_length(double metres, UnitSystem u) {
  char buf[64];
  if (u == UnitSystem::us) {
    const double in = std::abs(metres) / 0.0254;
    std::snprintf(buf, sizeof buf, "%.*f", in < 1.0 ? 3 : 2, in);
    return buf;
  }
  const double mm = std::round(std::abs(metres) * 1e4) / 10.0;
  std::snprintf(buf, sizeof buf, "%.1f", mm);
  std::string s = buf;
  if (s.size() > 2 && s.compare(s.size() - 2, 2, ".0") == 0) s.resize(s.size() - 2);
  return s;
}

std::string degrees(double rad, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f°", decimals, rad * 180.0 / std::numbers::pi);
  return buf;
}

std::string deviation_mm(double metres) {
  if (metres == 0) return "0";
  char buf[32];
  std::snprintf(buf, sizeof buf, "%+.3f", metres * 1000.0);
  return buf;
}

}  // namespace bandforge::drawing

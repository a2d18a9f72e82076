#include "src/fits.hpp"

#include <array>
#include <cmath>
#include <cstdio>

namespace bandforge::fits {
namespace {

// Ranges "over lo up to hi" [mm].
struct Range {
  double lo, hi;
};

// ISO 286-1 standard tolerance grades IT6…IT11 [µm] (REFERENCE §5.8 table; from memory, high
// confidence: the ISO 286-1 table as widely reproduced).
constexpr std::array<Range, 8> kItRanges{{{3, 6}, {6, 10}, {10, 18}, {18, 30}, {30, 50}, {50, 80}, {80, 120}, {120, 180}}};
constexpr int kIt[8][6] = {
    {8, 12, 18, 30, 48, 75},     {9, 15, 22, 36, 58, 90},      {11, 18, 27, 43, 70, 110},
    {13, 21, 33, 52, 84, 130},   {16, 25, 39, 62, 100, 160},   {19, 30, 46, 74, 120, 190},
    {22, 35, 54, 87, 140, 220},  {25, 40, 63, 100, 160, 250}};

// ISO 286-2 shaft fundamental deviations es [µm] for c, d, f, g, h (REFERENCE §5.8; from memory,
// high confidence for c, d, f, h).
constexpr std::array<Range, 10> kShaftRanges{{{3, 6}, {6, 10}, {10, 18}, {18, 30}, {30, 40}, {40, 50},
                                              {50, 65}, {65, 80}, {80, 100}, {100, 120}}};
constexpr int kEs[10][5] = {
    {-70, -30, -10, -4, 0},    {-80, -40, -13, -5, 0},    {-95, -50, -16, -6, 0},
    {-110, -65, -20, -7, 0},   {-120, -80, -25, -9, 0},   {-130, -80, -25, -9, 0},
    {-140, -100, -30, -10, 0}, {-150, -100, -30, -10, 0}, {-170, -120, -36, -12, 0},
    {-180, -120, -36, -12, 0}};

// Shaft k, lower deviation ei [µm] for grades 4…7 (REFERENCE §5.8, from memory, medium).
int k_ei(double mm) { return mm <= 18 ? 1 : (mm <= 80 ? 2 : 3); }

// "Over lo up to and including hi", with the size taken to the nanometre so that 18 mm given in
// metres (0.018 → 18.000000000000004 mm) falls in 10–18 as written.
template <std::size_t N>
int range_index(const std::array<Range, N>& ranges, double mm) {
  const double nm = std::round(mm * 1e6);
  for (std::size_t i = 0; i < N; ++i)
    if (nm > ranges[i].lo * 1e6 && nm <= ranges[i].hi * 1e6) return static_cast<int>(i);
  return -1;
}

std::string number(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%g", v);
  return buf;
}

}  // namespace

std::optional<double> standard_tolerance(double size, int grade) {
  const int i = range_index(kItRanges, size * 1000.0);
  if (i < 0 || grade < 6 || grade > 11) return std::nullopt;
  return kIt[i][grade - 6] * 1e-6;
}

std::optional<Zone> hole(double size, char letter, int grade) {
  if (letter != 'H') return std::nullopt;
  const auto it = standard_tolerance(size, grade);
  if (!it) return std::nullopt;
  return Zone{*it, 0.0};
}

std::optional<Zone> shaft(double size, char letter, int grade) {
  const double mm = size * 1000.0;
  const auto it = standard_tolerance(size, grade);
  const int i = range_index(kShaftRanges, mm);
  if (!it || i < 0) return std::nullopt;
  if (letter == 'k') {
    if (grade > 7) return std::nullopt;
    const double ei = k_ei(mm) * 1e-6;
    return Zone{ei + *it, ei};
  }
  const char letters[] = {'c', 'd', 'f', 'g', 'h'};
  for (int k = 0; k < 5; ++k) {
    if (letters[k] != letter) continue;
    const double es = kEs[i][k] * 1e-6;
    return Zone{es, es - *it};
  }
  return std::nullopt;
}

std::string Fit::designation() const {
  return "Ø" + number(std::round(size * 1e4) / 10.0) + " " + hole_code + "/" + shaft_code;
}

std::optional<Fit> fit(double size, const std::string& hole_code, const std::string& shaft_code) {
  if (hole_code.size() < 2 || shaft_code.size() < 2) return std::nullopt;
  const auto h = hole(size, hole_code[0], std::atoi(hole_code.c_str() + 1));
  const auto s = shaft(size, shaft_code[0], std::atoi(shaft_code.c_str() + 1));
  if (!h || !s) return std::nullopt;
  return Fit{size, hole_code, shaft_code, *h, *s};
}

std::optional<double> general_linear(double size, char cls) {
  // ISO 2768-1 table 1, ± mm (REFERENCE §5.8; from memory, high confidence).
  static constexpr std::array<Range, 7> kRanges{{{0.5, 3}, {3, 6}, {6, 30}, {30, 120}, {120, 400}, {400, 1000}, {1000, 2000}}};
  static constexpr double kTol[7][4] = {{0.05, 0.1, 0.2, -1}, {0.05, 0.1, 0.3, 0.5}, {0.1, 0.2, 0.5, 1},
                                        {0.15, 0.3, 0.8, 1.5}, {0.2, 0.5, 1.2, 2.5}, {0.3, 0.8, 2, 4},
                                        {0.5, 1.2, 3, 6}};
  const int i = range_index(kRanges, size * 1000.0);
  const int c = cls == 'f' ? 0 : cls == 'm' ? 1 : cls == 'c' ? 2 : cls == 'v' ? 3 : -1;
  if (i < 0 || c < 0 || kTol[i][c] < 0) return std::nullopt;
  return kTol[i][c] * 1e-3;
}

}  // namespace bandforge::fits

#include "src/standard_parts.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <iterator>

namespace bandforge::standard {
namespace {

constexpr double mm = 1e-3;

// ISO 2341 form B: d, d_k, k, d_1, l_e [mm]. d_k, k and d_1 of 8, 10, 12, 14, 16, 18, 20, 24 and
// 30 mm are REFERENCE §5.9's; the other rows and every l_e (least hole-to-end distance) are from
// memory.
struct PinRow {
  double d, dk, k, d1, le;
};
constexpr PinRow kPins[] = {
    {3, 5, 1, 0.8, 1.6},    {4, 6, 1, 1, 2.2},       {5, 8, 1.6, 1.2, 2.9},  {6, 10, 2, 1.6, 3.2},
    {8, 14, 3, 2, 3.5},     {10, 18, 4, 3.2, 4.5},   {12, 20, 4, 3.2, 5.5},  {14, 22, 4, 4, 6},
    {16, 25, 4.5, 4, 6},    {18, 28, 5, 5, 7},       {20, 30, 5, 5, 8},      {22, 33, 5.5, 5, 8},
    {24, 36, 6, 6.3, 9},    {27, 40, 6, 6.3, 9},     {30, 44, 8, 8, 10},     {33, 47, 9, 8, 10},
    {36, 50, 9, 8, 10},     {40, 55, 10, 8, 12},     {45, 60, 10, 10, 12},   {50, 66, 12, 10, 14},
};

// ISO 8738 plain washers for clevis pins: pin d, bore d_1, outside d_2, thickness h [mm] (from
// memory).
struct WasherRow {
  double pin, d1, d2, h;
};
constexpr WasherRow kWashers[] = {
    {3, 3, 6, 0.8},    {4, 4, 8, 0.8},    {5, 5, 10, 1},     {6, 6, 12, 1.6},   {8, 8, 15, 2},
    {10, 10, 18, 2.5}, {12, 12, 20, 3},   {14, 14, 22, 3},   {16, 16, 24, 3},   {18, 18, 28, 4},
    {20, 20, 30, 4},   {22, 22, 34, 4},   {24, 24, 37, 4},   {27, 27, 39, 5},   {30, 30, 44, 5},
    {33, 33, 47, 5},   {36, 36, 50, 6},   {40, 40, 56, 6},   {45, 45, 60, 6},   {50, 50, 66, 8},
};

// ISO 1234 split pins: nominal (hole), d max, c max [mm] (from memory).
struct SplitRow {
  double nominal, d, c;
};
constexpr SplitRow kSplits[] = {
    {0.8, 0.7, 1.6}, {1, 0.9, 1.8},   {1.2, 1.0, 2.0}, {1.6, 1.4, 2.8}, {2, 1.8, 3.6},
    {2.5, 2.3, 4.6}, {3.2, 2.9, 5.8}, {4, 3.7, 7.4},   {5, 4.6, 9.2},   {6.3, 5.9, 11.8},
    {8, 7.5, 15},    {10, 9.5, 19},   {13, 12.4, 24.8},
};

// Round-head rivets: d, d_k, k [mm]. 1–8 mm: DIN 660:2012-01 Table 1 (d_k nominal, k js14), as
// tabulated by fasten.it (DIN 660 norm page) and vidasan.com (DIN 660 / ISO 1051 round head
// rivets), both read for this table. 10–36 mm: DIN 124 (round head rivets for steel
// construction), from memory, not checked against the standard.
struct RivetRow {
  double d, dk, k;
  const char* standard;
};
constexpr RivetRow kRivets[] = {
    {1, 1.8, 0.6, "DIN 660"},    {1.2, 2.1, 0.7, "DIN 660"},  {1.4, 2.4, 0.8, "DIN 660"},
    {1.6, 2.8, 1, "DIN 660"},    {2, 3.5, 1.2, "DIN 660"},    {2.5, 4.4, 1.5, "DIN 660"},
    {3, 5.2, 1.8, "DIN 660"},    {3.5, 6.2, 2.1, "DIN 660"},  {4, 7, 2.4, "DIN 660"},
    {5, 8.8, 3, "DIN 660"},      {6, 10.5, 3.6, "DIN 660"},   {7, 12.2, 4.2, "DIN 660"},
    {8, 14, 4.8, "DIN 660"},
    {10, 16, 6.5, "DIN 124"},    {12, 19, 7.5, "DIN 124"},    {14, 22, 9, "DIN 124"},
    {16, 25, 10, "DIN 124"},     {18, 28, 11.5, "DIN 124"},   {20, 32, 13, "DIN 124"},
    {22, 36, 14, "DIN 124"},     {24, 40, 16, "DIN 124"},     {27, 43, 17, "DIN 124"},
    {30, 48, 19, "DIN 124"},     {33, 53, 21, "DIN 124"},     {36, 58, 23, "DIN 124"},
};

std::vector<double> scaled(std::initializer_list<double> values) {
  std::vector<double> out;
  for (double v : values) out.push_back(v * mm);
  return out;
}

// "16", "6.3", "4.5": the shortest form of a size in millimetres.
std::string size_text(double metres) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f", metres / mm);
  std::string s = buf;
  if (s.size() > 2 && s.compare(s.size() - 2, 2, ".0") == 0) s.resize(s.size() - 2);
  return s;
}

const PinRow& pin_row(double nominal) {
  for (const PinRow& r : kPins) {
    if (r.d * mm >= nominal - 1e-9) return r;
  }
  return kPins[std::size(kPins) - 1];
}

/// The nominal diameters of a table's rows [m].
template <class Row, std::size_t N>
std::vector<double> nominals(const Row (&rows)[N]) {
  std::vector<double> out;
  for (const Row& r : rows) out.push_back(r.d * mm);
  return out;
}

}  // namespace

const std::vector<double>& clevis_pin_series() {
  static const std::vector<double> s = nominals(kPins);
  return s;
}

// ISO 2341 lengths 6…200 mm (from memory).
const std::vector<double>& clevis_pin_lengths() {
  static const std::vector<double> s =
      scaled({6, 8, 10, 12, 14, 16, 18, 20, 22, 24, 26, 28, 30, 32, 35, 40, 45, 50, 55, 60, 65,
              70, 75, 80, 85, 90, 95, 100, 120, 140, 160, 180, 200});
  return s;
}

// ISO 1234 lengths 4…280 mm (from memory).
const std::vector<double>& split_pin_lengths() {
  static const std::vector<double> s =
      scaled({4, 5, 6, 8, 10, 12, 14, 16, 18, 20, 22, 25, 28, 32, 36, 40, 45, 50, 56, 63, 71, 80,
              90, 100, 112, 125, 140, 160, 180, 200, 224, 250, 280});
  return s;
}

double clevis_nominal(double diameter) {
  for (double d : clevis_pin_series()) {
    if (d >= diameter - 1e-6) return d;
  }
  return diameter;
}

ClevisPinSize clevis_pin(double nominal) {
  const PinRow& r = pin_row(nominal);
  if (std::abs(r.d * mm - nominal) < 1e-9) return {r.d * mm, r.dk * mm, r.k * mm, r.d1 * mm, r.le * mm};
  // Above the series: the largest size's proportions.
  const double f = nominal / (r.d * mm);
  return {nominal, r.dk * mm * f, r.k * mm * f, r.d1 * mm, r.le * mm * f};
}

WasherSize washer_for(double nominal) {
  for (const WasherRow& r : kWashers) {
    if (std::abs(r.pin * mm - nominal) < 1e-9) return {nominal, r.d1 * mm, r.d2 * mm, r.h * mm};
  }
  const WasherRow& r = kWashers[std::size(kWashers) - 1];
  const double f = nominal / (r.pin * mm);
  return {nominal, nominal, r.d2 * mm * f, r.h * mm * f};
}

SplitPinSize split_pin(double hole) {
  for (const SplitRow& r : kSplits) {
    if (r.nominal * mm >= hole - 1e-9) return {r.nominal * mm, r.d * mm, r.c * mm};
  }
  const SplitRow& r = kSplits[std::size(kSplits) - 1];
  return {r.nominal * mm, r.d * mm, r.c * mm};
}

double PinSet::tail_radius() const {
  // The split pin as fitted: its legs bent back round the pin's end, its eye standing off the
  // pin by at most its width c.
  return std::max(washer.d2 / 2, pin.d / 2 + split.c);
}

std::string PinSet::pin_designation() const {
  return "Clevis pin ISO 2341 - B - " + size_text(pin.d) + " × " + size_text(length) + " - St" +
         (standard_diameter && standard_length ? "" : " (special)");
}

std::string PinSet::washer_designation() const {
  return "Washer ISO 8738 - " + size_text(washer.pin) + " - 160 HV";
}

std::string PinSet::split_designation() const {
  return "Split pin ISO 1234 - " + size_text(split.nominal) + " × " + size_text(split_length) + " - St";
}

const std::vector<double>& rivet_series() {
  static const std::vector<double> s = nominals(kRivets);
  return s;
}

// Lengths 2…28 mm: the rows of DIN 660:2012-01's mass table (fasten.it); longer ones from memory.
const std::vector<double>& rivet_lengths() {
  static const std::vector<double> s =
      scaled({2, 3, 4, 5, 6, 8, 10, 12, 14, 16, 18, 20, 22, 25, 28, 30, 32, 35, 38, 40, 42, 45,
              48, 50, 55, 60, 65, 70, 75, 80, 85, 90, 95, 100, 110, 120, 130, 140, 150, 160});
  return s;
}

RivetSize round_head_rivet(double nominal) {
  for (const RivetRow& r : kRivets) {
    if (r.d * mm >= nominal - 1e-6) return {r.d * mm, r.dk * mm, r.k * mm, r.standard};
  }
  const RivetRow& r = kRivets[std::size(kRivets) - 1];
  const double f = nominal / (r.d * mm);
  return {nominal, r.dk * mm * f, r.k * mm * f, r.standard};
}

double rivet_allowance(double nominal, RivetClosing closing) {
  return (closing == RivetClosing::round ? 1.5 : 0.8) * nominal;
}

RivetSet choose_rivet(double nominal, double clamp, RivetClosing closing) {
  RivetSet s;
  s.size = round_head_rivet(nominal);
  s.standard_size = nominal <= rivet_series().back() + 1e-9;
  s.clamp = clamp;
  s.closing = closing;
  s.allowance = rivet_allowance(s.size.d, closing);
  const double need = clamp + s.allowance;
  for (double l : rivet_lengths()) {
    if (l >= need - 1e-9) {
      s.length = l;
      break;
    }
  }
  if (s.length == 0) {
    s.length = rivet_lengths().back();
    while (s.length < need - 1e-9) s.length += 5 * mm;
    s.standard_length = false;
  }
  return s;
}

std::string RivetSet::designation() const {
  return std::string("Round head rivet ") + size.standard + " - " + size_text(size.d) + " × " +
         size_text(length) + " - St" + (closing == RivetClosing::flush ? ", closed flush" : "") +
         (standard_size && standard_length ? "" : " (special)");
}

PinSet choose_pin(double diameter, double grip) {
  PinSet s;
  s.design_diameter = diameter;
  const double nominal = clevis_nominal(diameter);
  s.standard_diameter = nominal <= clevis_pin_series().back() + 1e-9;
  s.pin = clevis_pin(nominal);
  s.washer = washer_for(nominal);
  s.split = split_pin(s.pin.d1);
  s.grip = grip;
  const double need = grip + s.washer.h + s.pin.d1 / 2;  // least l_h
  double length = 0;
  for (double l : clevis_pin_lengths()) {
    if (l - s.pin.le >= need - 1e-9) {
      length = l;
      break;
    }
  }
  if (length == 0) {
    // Beyond the series: a special length in 20 mm steps above its longest.
    length = clevis_pin_lengths().back();
    while (length - s.pin.le < need - 1e-9) length += 20 * mm;
    s.standard_length = false;
  }
  s.length = length;
  s.hole_at = length - s.pin.le;
  s.play = s.hole_at - s.pin.d1 / 2 - grip - s.washer.h;
  const double split_need = s.pin.d + 2 * s.split.nominal;
  s.split_length = split_pin_lengths().back();
  for (double l : split_pin_lengths()) {
    if (l >= split_need - 1e-9) {
      s.split_length = l;
      break;
    }
  }
  return s;
}

}  // namespace bandforge::standard

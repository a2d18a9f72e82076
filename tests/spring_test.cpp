// Helical compression springs (src/spring.hpp) against published worked examples, the tables of
// Shigley's Mechanical Engineering Design and an exhaustive search written here.
#include "src/spring.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdint>
#include <limits>

namespace bandforge {
namespace {

constexpr double kPi = 3.14159265358979323846;
// Exact unit definitions (NIST SP 811): inch, pound-force, psi.
constexpr double kInch = 0.0254;
constexpr double kLbf = 4.4482216152605;
constexpr double kPsi = kLbf / (kInch * kInch);
constexpr double kMm = 1e-3;

#define EXPECT_REL(actual, expected, tol) \
  EXPECT_NEAR((actual), (expected), (tol) * std::abs(static_cast<double>(expected)))

constexpr double kRecomputed = 0.005;  // REFERENCE §4: ±0.5 % against a recomputed value
constexpr double kPrinted = 0.005;     // a solution printed to four significant figures

const SpringWire& wire(const char* key) {
  const SpringWire* w = find_spring_wire(key);
  EXPECT_NE(w, nullptr) << key;
  return *w;
}

// ---------------------------------------------------------------------------- worked examples

// Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed., Example 10-1: music wire
// d = 0.037 in, outside diameter 7/16 in, ends squared (not ground), 12.5 total turns. The
// recomputed figures are those of REFERENCE §8.2.
TEST(SpringExample, Shigley9thExample10_1) {
  const double d = 0.037 * kInch;
  const double D = 7.0 / 16.0 * kInch - d;
  const SpringWire& music = wire("music-wire");
  EXPECT_REL(D, 0.4005 * kInch, 1e-9);                         // REFERENCE §8.2: D = 0.4005 in
  EXPECT_REL(wire_strength(music, d), 324e3 * kPsi, kRecomputed);  // S_ut = 324 kpsi
  EXPECT_REL(allowable_shear(music, d), 146e3 * kPsi, kRecomputed);  // S_sy = 0.45·S_ut = 146 kpsi
  EXPECT_REL(D / d, 10.82, 0.001);                              // C = 10.82
  EXPECT_REL(bergstrasser(D / d), 1.124, 0.001);                // K_B = 1.124
  // Load at yield: τ(F) = S_sy, F = S_sy/τ(1 N) = 6.45 lbf (book about 6.46 lbf).
  const double f_yield = allowable_shear(music, d) / spring_stress(1.0, D, d);
  EXPECT_REL(f_yield, 6.45 * kLbf, kRecomputed);
  const double n_a = 12.5 - 2.0;                                // squared ends: N_t = N_a + 2
  EXPECT_DOUBLE_EQ(total_coils(SpringEnds::squared, n_a), 12.5);
  EXPECT_REL(shear_modulus(music, d), 11.85e6 * kPsi, 0.001);   // Table 10-5: 11.85 Mpsi
  const double k = spring_rate(d, D, n_a, shear_modulus(music, d));
  EXPECT_REL(k, 4.12 * kLbf / kInch, kRecomputed);              // k = 4.12 lbf/in (book 4.13)
  EXPECT_REL(f_yield / k, 1.57 * kInch, kRecomputed);           // deflection at yield 1.57 in
  const double ls = solid_length(SpringEnds::squared, d, 12.5);
  EXPECT_REL(ls, 0.50 * kInch, 0.002);                          // L_s = d·(N_t + 1) = 0.4995 in
  EXPECT_REL(ls + f_yield / k, 2.07 * kInch, kRecomputed);      // free length ≈ 2.07 in
}

// Budynas & Nisbett, Shigley's Mechanical Engineering Design, 10th ed., Chapter 10 solutions
// (instructor's manual), Problem 10-3: music wire d = 2.5 mm, OD = 31 mm, plain and ground ends,
// N_t = 14. Printed answers: N_a = 13, D = 28.5 mm, C = 11.4, G = 81.0 GPa, k = 1.314 N/mm,
// L_s = 35 mm, S_ut = 1936 MPa, S_sy = 871.2 MPa, K_B = 1.117, F_s = 167.9 N, L_0 = 162.8 mm,
// (L_0)cr = 149.9 mm with α = 0.5.
TEST(SpringExample, Shigley10thProblem10_3) {
  const double d = 2.5 * kMm, D = 31.0 * kMm - d;
  const SpringWire& music = wire("music-wire");
  const double n_a = 13.0;
  EXPECT_DOUBLE_EQ(total_coils(SpringEnds::plain_ground, n_a), 14.0);  // N_a = N_t − 1
  EXPECT_REL(D / d, 11.4, 1e-12);
  EXPECT_REL(shear_modulus(music, d), 81.0e9, 1e-12);
  const double k = spring_rate(d, D, n_a, shear_modulus(music, d));
  EXPECT_REL(k, 1.314e3, kPrinted);
  const double ls = solid_length(SpringEnds::plain_ground, d, 14.0);
  EXPECT_REL(ls, 35.0 * kMm, 1e-12);
  EXPECT_REL(wire_strength(music, d), 1936e6, kPrinted);
  EXPECT_REL(allowable_shear(music, d), 871.2e6, kPrinted);
  EXPECT_REL(bergstrasser(D / d), 1.117, 0.001);
  const double f_s = allowable_shear(music, d) / spring_stress(1.0, D, d);
  EXPECT_REL(f_s, 167.9, kPrinted);
  EXPECT_REL(ls + f_s / k, 162.8 * kMm, kPrinted);
  EXPECT_REL(buckling_free_length(D, SpringSeats::flat_flat), 149.9 * kMm, kPrinted);
}

// ---------------------------------------------------------------------------- tables

// Table 10-4 (A in MPa·mm^m, m), as REFERENCE §8.2 lists it: music wire A = 2211, m = 0.145;
// oil-tempered A = 1855, m = 0.187. At d = 1 mm, S_ut = A.
TEST(SpringTables, WireStrengthFollowsTable10_4) {
  EXPECT_REL(wire_strength(wire("music-wire"), 1.0 * kMm), 2211e6, 1e-12);
  EXPECT_REL(wire_strength(wire("music-wire"), 5.0 * kMm), 2211e6 / std::pow(5.0, 0.145), 1e-12);
  EXPECT_REL(wire_strength(wire("music-wire"), 5.0 * kMm), 1750.8e6, 1e-4);  // by hand: 5^0.145 = 1.26286, 2211/1.26286
  EXPECT_REL(wire_strength(wire("oil-tempered"), 1.0 * kMm), 1855e6, 1e-12);
  EXPECT_REL(wire_strength(wire("oil-tempered"), 10.0 * kMm), 1206.0e6, 1e-3);  // 1855/10^0.187
  // Hard-drawn A = 1783, m = 0.190; chrome-vanadium A = 2005, m = 0.168; chrome-silicon
  // A = 1974, m = 0.108 (Table 10-4).
  EXPECT_REL(wire_strength(wire("hard-drawn"), 1.0 * kMm), 1783e6, 1e-12);
  EXPECT_REL(wire_strength(wire("chrome-vanadium"), 1.0 * kMm), 2005e6, 1e-12);
  EXPECT_REL(wire_strength(wire("chrome-silicon"), 1.0 * kMm), 1974e6, 1e-12);
  // Table 10-6, before set removal: 45 % for music wire and cold-drawn (hard-drawn) carbon steel,
  // 50 % for hardened and tempered carbon and low-alloy steels.
  EXPECT_DOUBLE_EQ(wire("music-wire").allowable_fraction, 0.45);
  EXPECT_DOUBLE_EQ(wire("hard-drawn").allowable_fraction, 0.45);
  EXPECT_DOUBLE_EQ(wire("oil-tempered").allowable_fraction, 0.50);
  for (const SpringWire& w : spring_wires()) {
    EXPECT_FALSE(w.strength_source.empty());
    EXPECT_NE(w.allowable_source.find("Table 10-6"), std::string::npos);
  }
}

// Table 10-5 (Shigley 9th ed., as printed): G of music wire 81.7 GPa for 0.033–0.063 in,
// 80.0 GPa above 0.125 in; hard-drawn 79.3 GPa for 0.064–0.125 in, 78.6 GPa above; oil-tempered
// 77.2 GPa.
TEST(SpringTables, ShearModulusFollowsTable10_5) {
  EXPECT_DOUBLE_EQ(shear_modulus(wire("music-wire"), 0.05 * kInch), 81.7e9);
  EXPECT_DOUBLE_EQ(shear_modulus(wire("music-wire"), 0.2 * kInch), 80.0e9);
  EXPECT_DOUBLE_EQ(shear_modulus(wire("hard-drawn"), 0.1 * kInch), 79.3e9);
  EXPECT_DOUBLE_EQ(shear_modulus(wire("hard-drawn"), 0.2 * kInch), 78.6e9);
  EXPECT_DOUBLE_EQ(shear_modulus(wire("oil-tempered"), 5 * kMm), 77.2e9);
}

// Eq. 10-13: L_0 < 2.63·D/α; α = 0.5 both ends flat (squared and ground), 0.707 one flat one
// pivoted, 1 both pivoted (REFERENCE §8.2). D = 28.5 mm (Problem 10-3): 149.9 mm printed for
// α = 0.5; 2.63·28.5/0.707 = 106.02 mm and 2.63·28.5 = 74.955 mm by hand.
TEST(SpringTables, BucklingLimitByEndCondition) {
  EXPECT_REL(buckling_free_length(28.5 * kMm, SpringSeats::flat_flat), 149.9 * kMm, kPrinted);
  EXPECT_REL(buckling_free_length(28.5 * kMm, SpringSeats::flat_pivoted), 106.02 * kMm, 1e-4);
  EXPECT_REL(buckling_free_length(28.5 * kMm, SpringSeats::pivoted_pivoted), 74.955 * kMm, 1e-9);
}

// Table 10-1 (Shigley 9th ed.; the plain row from memory): end coils and solid length.
TEST(SpringTables, EndsAndSolidLength) {
  const double d = 2 * kMm;
  EXPECT_DOUBLE_EQ(total_coils(SpringEnds::plain, 8), 8);
  EXPECT_DOUBLE_EQ(solid_length(SpringEnds::plain, d, 8), d * 9);
  EXPECT_DOUBLE_EQ(total_coils(SpringEnds::plain_ground, 8), 9);
  EXPECT_DOUBLE_EQ(solid_length(SpringEnds::plain_ground, d, 9), d * 9);
  EXPECT_DOUBLE_EQ(total_coils(SpringEnds::squared, 8), 10);
  EXPECT_DOUBLE_EQ(solid_length(SpringEnds::squared, d, 10), d * 11);
  EXPECT_DOUBLE_EQ(total_coils(SpringEnds::squared_ground, 8), 10);
  EXPECT_DOUBLE_EQ(solid_length(SpringEnds::squared_ground, d, 10), d * 10);
}

// ---------------------------------------------------------------------------- the design

/// Every requirement of a designed spring, recomputed here from its d, D, N_a and free length.
void expect_passes(const SpringResult& s, const SpringDemand& q) {
  const SpringWire& w = wire(q.material.c_str());
  bool in_series = false;
  for (double d : wire_diameters()) in_series = in_series || d == s.wire_diameter;
  EXPECT_TRUE(in_series) << s.wire_diameter;
  EXPECT_GE(s.wire_diameter, w.d_min - 1e-12);
  EXPECT_LE(s.wire_diameter, w.d_max + 1e-12);
  const double d = s.wire_diameter, D = s.mean_diameter, C = D / d;
  EXPECT_GE(C, 4.0);   // Shigley §10-9: 4 ≤ C ≤ 12
  EXPECT_LE(C, 12.0);
  EXPECT_EQ(s.index, C);
  EXPECT_GE(s.active_coils, 3.0);
  EXPECT_DOUBLE_EQ(std::fmod(s.active_coils, 0.5), 0.0);  // half turns
  // k = d⁴G/(8D³N_a), written out (Shigley eq. 10-9).
  const double k = std::pow(d, 4) * shear_modulus(w, d) / (8 * std::pow(D, 3) * s.active_coils);
  EXPECT_REL(s.rate, k, 1e-12);
  const double l_worn = q.installed_length + q.wear_travel;
  const double l_rel = q.installed_length - q.release_travel;
  EXPECT_GE(k * (s.free_length - l_worn), q.force_worn * (1 - 1e-12));
  const double f_rel = k * (s.free_length - l_rel);
  const double kb = (4 * C + 2) / (4 * C - 3);
  EXPECT_LE(kb * 8 * f_rel * D / (kPi * d * d * d), w.allowable_fraction * w.a_mpa * 1e6 / std::pow(d / kMm, w.m) * (1 + 1e-9));
  const double n_t = s.active_coils + (q.ends == SpringEnds::plain ? 0 : q.ends == SpringEnds::plain_ground ? 1 : 2);
  const double ls = d * (q.ends == SpringEnds::squared || q.ends == SpringEnds::plain ? n_t + 1 : n_t);
  EXPECT_REL(s.solid_length, ls, 1e-12);
  EXPECT_GE((s.free_length - ls) / (s.free_length - l_rel) - 1, 0.15 - 1e-12);  // ξ ≥ 0.15
  const double alpha = q.seats == SpringSeats::flat_flat ? 0.5 : q.seats == SpringSeats::flat_pivoted ? 0.707 : 1.0;
  EXPECT_LE(s.free_length, 2.63 * D / alpha * (1 + 1e-12));  // eq. 10-13
  if (q.max_outer_diameter > 0) {
    EXPECT_LE(D + d, q.max_outer_diameter * (1 + 1e-12));
  }
  if (q.max_force_applied > 0) {
    EXPECT_LE(k * (s.free_length - q.installed_length), q.max_force_applied * (1 + 1e-9));
  }
}

/// The lightest spring of the search space that passes every requirement, by exhaustive search
/// written here (the series, D in 0.5 mm steps up to 1 m with 4 ≤ C ≤ 12, N_a in half turns from 3 to 80),
/// each requirement written out; infinity when none passes.
double brute_lightest(const SpringDemand& q) {
  const SpringWire& w = wire(q.material.c_str());
  const double alpha = q.seats == SpringSeats::flat_flat ? 0.5 : q.seats == SpringSeats::flat_pivoted ? 0.707 : 1.0;
  const double ends = q.ends == SpringEnds::plain ? 0 : q.ends == SpringEnds::plain_ground ? 1 : 2;
  const bool ground = q.ends == SpringEnds::plain_ground || q.ends == SpringEnds::squared_ground;
  double lightest = std::numeric_limits<double>::infinity();
  for (double d : wire_diameters()) {
    if (d < w.d_min - 1e-12 || d > w.d_max + 1e-12) continue;
    const double g = shear_modulus(w, d);
    const double allow = w.allowable_fraction * w.a_mpa * 1e6 / std::pow(d / kMm, w.m);
    for (int i = 1; i <= 2000; ++i) {
      const double D = 0.5 * kMm * i;
      const double C = D / d, kb = (4 * C + 2) / (4 * C - 3);
      if (C < 4 || C > 12) continue;
      if (q.max_outer_diameter > 0 && D + d > q.max_outer_diameter * (1 + 1e-12)) continue;
      for (double n = 3; n <= 80; n += 0.5) {
        const double k = std::pow(d, 4) * g / (8 * std::pow(D, 3) * n);
        const double l0 = q.installed_length + q.wear_travel + q.force_worn / k;
        const double l_rel = q.installed_length - q.release_travel;
        if (kb * 8 * k * (l0 - l_rel) * D / (kPi * d * d * d) > allow) continue;
        if (q.max_force_applied > 0 && k * (l0 - q.installed_length) > q.max_force_applied) continue;
        const double ls = d * (ground ? n + ends : n + ends + 1);
        if ((l0 - ls) / (l0 - l_rel) - 1 < 0.15 || ls >= l_rel) continue;
        if (l0 > 2.63 * D / alpha) continue;
        lightest = std::min(lightest, 7850 * kPi * d * d / 4 * kPi * D * (n + ends));
      }
    }
  }
  return lightest;
}

// Generated requirements (fixed seed): the design passes every requirement whenever it finds a
// spring (the lightest there is), and says what binds when it does not (and then there is none).
TEST(SpringDesign, GeneratedDemandsGiveSpringsThatPass) {
  std::uint64_t state = 20261130;
  auto uniform = [&](double lo, double hi) {
    state = state * 6364136223846793005ull + 1442695040888963407ull;  // Knuth's MMIX LCG
    return lo + (hi - lo) * static_cast<double>(state >> 11) / 9007199254740992.0;
  };
  const char* materials[] = {"music-wire", "hard-drawn", "oil-tempered", "chrome-vanadium", "chrome-silicon"};
  const SpringEnds ends[] = {SpringEnds::squared_ground, SpringEnds::squared, SpringEnds::plain_ground, SpringEnds::plain};
  const SpringSeats seats[] = {SpringSeats::flat_flat, SpringSeats::flat_pivoted, SpringSeats::pivoted_pivoted};
  int found = 0, refused = 0;
  int bindings[7] = {};
  for (int i = 0; i < 300; ++i) {
    SpringDemand q;
    q.force_worn = uniform(20, 4000);
    q.wear_travel = uniform(0, 0.03);
    q.release_travel = uniform(0.002, 0.04);
    // Room in proportion to the travel, as a designer gives it, plus the coils' own length.
    q.installed_length = (q.wear_travel + q.release_travel) * uniform(3, 10) + uniform(0.02, 0.1);
    q.max_outer_diameter = uniform(0, 1) < 0.3 ? uniform(0.02, 0.15) : 0.0;
    q.max_force_applied = uniform(0, 1) < 0.3 ? q.force_worn * uniform(0.9, 3.0) : 0.0;
    q.material = materials[static_cast<int>(uniform(0, 4.999))];
    q.ends = ends[static_cast<int>(uniform(0, 3.999))];
    q.seats = seats[static_cast<int>(uniform(0, 2.999))];
    const SpringResult s = design_spring(q);
    if (s.found) {
      ++found;
      EXPECT_EQ(s.binding, SpringLimit::none);
      expect_passes(s, q);
      // And it is the lightest: the exhaustive search finds none lighter (the first 40).
      if (found <= 40) {
        EXPECT_LE(s.mass, brute_lightest(q) * (1 + 1e-9));
      }
    } else {
      ++refused;
      EXPECT_NE(s.binding, SpringLimit::none);
      ++bindings[static_cast<int>(s.binding)];
      // The refusal is right: the exhaustive search finds no spring either (the first 40).
      if (refused <= 40) {
        EXPECT_FALSE(std::isfinite(brute_lightest(q))) << to_string(s.binding);
      }
    }
  }
  int kinds = 0;
  for (int b : bindings) kinds += b > 0 ? 1 : 0;
  EXPECT_GE(kinds, 3) << "the refusals should cover several requirements";
  EXPECT_GE(found, 75) << refused << " refused";
  EXPECT_GE(refused, 10) << "the sweep should also reach requirements no spring meets";
}

// No spring of the search space (the series, D in 0.5 mm steps, N_a in half turns up to 60) that
// passes every requirement is lighter than the one chosen: an exhaustive search written here.
TEST(SpringDesign, NoLighterSpringPasses) {
  SpringDemand q;
  q.force_worn = 600;
  q.installed_length = 0.16;
  q.wear_travel = 0.012;
  q.release_travel = 0.009;
  q.max_outer_diameter = 0.07;
  const SpringResult s = design_spring(q);
  ASSERT_TRUE(s.found);
  const double lightest = brute_lightest(q);
  EXPECT_LE(s.mass, lightest * (1 + 1e-9));
  EXPECT_GE(s.mass, lightest * (1 - 1e-9));  // and the design passes (it is one of them)
}

// Impossible requirements: each names its binding requirement, and relaxing by the amount it
// gives lets a spring through that stage.
TEST(SpringDesign, ImpossibleDemandsNameWhatBinds) {
  SpringDemand q;
  q.force_worn = 400;
  q.installed_length = 0.15;
  q.wear_travel = 0.01;
  q.release_travel = 0.008;

  SpringDemand strong = q;
  strong.material = "music-wire";
  strong.force_worn = 1e6;  // no music wire (at most 6.5 mm, Table 10-4) carries a meganewton
  SpringResult s = design_spring(strong);
  EXPECT_FALSE(s.found);
  EXPECT_EQ(s.binding, SpringLimit::strength);
  EXPECT_GT(s.needed, 1.0);

  SpringDemand narrow = q;
  narrow.max_outer_diameter = 0.002;  // below 5 × the thinnest oil-tempered wire (0.5 mm)
  s = design_spring(narrow);
  EXPECT_EQ(s.binding, SpringLimit::diameter);
  EXPECT_REL(s.needed, 5 * 0.5 * kMm, 1e-9);

  SpringDemand band = q;
  band.max_force_applied = 300;  // below the worn force itself
  s = design_spring(band);
  EXPECT_EQ(s.binding, SpringLimit::band);
  EXPECT_REL(s.needed, 400.0 / 300.0, 1e-12);

  SpringDemand cramped = q;
  cramped.installed_length = 0.03;
  s = design_spring(cramped);
  EXPECT_EQ(s.binding, SpringLimit::solid);
  ASSERT_GT(s.needed, 0.0);
  cramped.installed_length += s.needed + 1e-9;
  s = design_spring(cramped);
  EXPECT_TRUE(s.found || s.binding == SpringLimit::buckling) << to_string(s.binding);

  SpringDemand tall = q;
  tall.force_worn = 100;
  tall.wear_travel = 0.002;
  tall.release_travel = 0.002;
  tall.installed_length = 1.5;
  tall.seats = SpringSeats::pivoted_pivoted;
  s = design_spring(tall);
  EXPECT_EQ(s.binding, SpringLimit::buckling);
  ASSERT_GT(s.needed, 0.0);
  tall.installed_length -= s.needed;
  s = design_spring(tall);
  EXPECT_TRUE(s.found) << to_string(s.binding);
}

}  // namespace
}  // namespace bandforge

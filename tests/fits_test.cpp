// Limits and fits (ISO 286) and general tolerances (ISO 2768-1) against the standards' values as
// REFERENCE §5.8 gives them (the ISO 286-1/-2 and ISO 2768-1 tables, from memory, high confidence)
// and against ISO 286-1's formula for the standard tolerance factor.
#include <gtest/gtest.h>

#include <cmath>

#include "src/fits.hpp"

namespace fits = bandforge::fits;

namespace {
constexpr double um = 1e-6;
constexpr double mm = 1e-3;
}  // namespace

TEST(Iso286, StandardToleranceGradesFromTheTable) {
  // REFERENCE §5.8, ISO 286-1 table: 10–18 mm IT7 18 µm, IT11 110 µm; 18–30 mm IT9 52 µm;
  // 50–80 mm IT7 30 µm; 3–6 mm IT6 8 µm; 120–180 mm IT11 250 µm.
  EXPECT_NEAR(*fits::standard_tolerance(16 * mm, 7), 18 * um, 1e-12);
  EXPECT_NEAR(*fits::standard_tolerance(16 * mm, 11), 110 * um, 1e-12);
  EXPECT_NEAR(*fits::standard_tolerance(20 * mm, 9), 52 * um, 1e-12);
  EXPECT_NEAR(*fits::standard_tolerance(60 * mm, 7), 30 * um, 1e-12);
  EXPECT_NEAR(*fits::standard_tolerance(5 * mm, 6), 8 * um, 1e-12);
  EXPECT_NEAR(*fits::standard_tolerance(150 * mm, 11), 250 * um, 1e-12);
  // Range limits: "over 10 up to and including 18".
  EXPECT_NEAR(*fits::standard_tolerance(18 * mm, 11), 110 * um, 1e-12);
  EXPECT_NEAR(*fits::standard_tolerance(18.001 * mm, 11), 130 * um, 1e-12);
  EXPECT_FALSE(fits::standard_tolerance(200 * mm, 7));
  EXPECT_FALSE(fits::standard_tolerance(16 * mm, 12));
}

TEST(Iso286, GradesFollowTheStandardToleranceFactor) {
  // ISO 286-1 (REFERENCE §5.8): i = 0.45·∛D + 0.001·D [µm], D the geometric mean of the range;
  // IT7 = 16 i, IT9 = 40 i, IT11 = 100 i before the standard's rounding (which moves a value by
  // less than 5 %: 10–18 mm IT11 = 108 → 110, IT7 = 17.3 → 18).
  struct Row { double lo, hi, size; };
  for (const Row r : {Row{10, 18, 16}, Row{18, 30, 20}, Row{30, 50, 40}, Row{50, 80, 60}}) {
    const double D = std::sqrt(r.lo * r.hi);
    const double i = 0.45 * std::cbrt(D) + 0.001 * D;
    for (const auto& [grade, k] : {std::pair{7, 16.0}, std::pair{9, 40.0}, std::pair{11, 100.0}}) {
      const double table = *fits::standard_tolerance(r.size * mm, grade) / um;
      EXPECT_NEAR(table, k * i, 0.05 * k * i) << r.lo << "–" << r.hi << " IT" << grade;
    }
  }
}

TEST(Iso286, WorkedFitsOfThePinsAndTheBore) {
  // REFERENCE §5.8 worked values: Ø16 H11/c11 hole 0/+110 µm, pin −95/−205 µm, clearance
  // 95…315 µm; Ø16 H9/d9 hole 0/+43, pin −50/−93; Ø60 H7/k6 hole 0/+30, shaft +2/+21.
  const auto pin = fits::fit(16 * mm, "H11", "c11");
  ASSERT_TRUE(pin);
  EXPECT_NEAR(pin->hole.upper, 110 * um, 1e-12);
  EXPECT_NEAR(pin->hole.lower, 0, 1e-12);
  EXPECT_NEAR(pin->shaft.upper, -95 * um, 1e-12);
  EXPECT_NEAR(pin->shaft.lower, -205 * um, 1e-12);
  EXPECT_NEAR(pin->clearance_min(), 95 * um, 1e-12);
  EXPECT_NEAR(pin->clearance_max(), 315 * um, 1e-12);
  EXPECT_EQ(pin->designation(), "Ø16 H11/c11");
  const auto close = fits::fit(16 * mm, "H9", "d9");
  ASSERT_TRUE(close);
  EXPECT_NEAR(close->hole.upper, 43 * um, 1e-12);
  EXPECT_NEAR(close->shaft.upper, -50 * um, 1e-12);
  EXPECT_NEAR(close->shaft.lower, -93 * um, 1e-12);
  const auto bore = fits::fit(60 * mm, "H7", "k6");
  ASSERT_TRUE(bore);
  EXPECT_NEAR(bore->hole.upper, 30 * um, 1e-12);
  EXPECT_NEAR(bore->shaft.lower, 2 * um, 1e-12);
  EXPECT_NEAR(bore->shaft.upper, 21 * um, 1e-12);
  EXPECT_LT(bore->clearance_min(), 0);  // a transition fit: up to 21 µm interference
  EXPECT_FALSE(fits::fit(16 * mm, "G7", "h6"));  // only hole-basis H
  EXPECT_FALSE(fits::fit(150 * mm, "H7", "k6"));  // beyond the shaft table
}

TEST(Iso2768, GeneralLinearTolerances) {
  // REFERENCE §5.8, ISO 2768-1 table: class m 6–30 ±0.2, 30–120 ±0.3, 120–400 ±0.5,
  // 400–1000 ±0.8; class f 3–6 ±0.05; class v 0.5–3 none.
  EXPECT_NEAR(*fits::general_linear(16 * mm, 'm'), 0.2 * mm, 1e-12);
  EXPECT_NEAR(*fits::general_linear(30 * mm, 'm'), 0.2 * mm, 1e-12);  // "up to and including"
  EXPECT_NEAR(*fits::general_linear(100 * mm, 'm'), 0.3 * mm, 1e-12);
  EXPECT_NEAR(*fits::general_linear(400 * mm, 'm'), 0.5 * mm, 1e-12);
  EXPECT_NEAR(*fits::general_linear(700 * mm, 'm'), 0.8 * mm, 1e-12);
  EXPECT_NEAR(*fits::general_linear(5 * mm, 'f'), 0.05 * mm, 1e-12);
  EXPECT_FALSE(fits::general_linear(2 * mm, 'v'));
  EXPECT_FALSE(fits::general_linear(3000 * mm, 'm'));
}

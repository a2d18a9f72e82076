// The bought parts that hold the pins (issue 10): ISO 2341 B clevis pins, ISO 8738 washers,
// ISO 1234 split pins, and the choice of size and length for a grip.
#include "src/standard_parts.hpp"

#include <gtest/gtest.h>

namespace bandforge::standard {
namespace {

constexpr double mm = 1e-3;

TEST(ClevisPins, RowsOfTheReferenceTable) {
  // REFERENCE §5.9 (ISO 2341 form B): d → d_k / k / d_1.
  struct Row {
    double d, dk, k, d1;
  };
  for (const Row& r : {Row{8, 14, 3, 2}, Row{10, 18, 4, 3.2}, Row{16, 25, 4.5, 4}, Row{20, 30, 5, 5},
                       Row{24, 36, 6, 6.3}, Row{30, 44, 8, 8}}) {
    SCOPED_TRACE(r.d);
    const ClevisPinSize p = clevis_pin(r.d * mm);
    EXPECT_NEAR(p.d, r.d * mm, 1e-12);
    EXPECT_NEAR(p.dk, r.dk * mm, 1e-12);
    EXPECT_NEAR(p.k, r.k * mm, 1e-12);
    EXPECT_NEAR(p.d1, r.d1 * mm, 1e-12);
    // ISO 1234: the split pin's nominal size is the hole diameter d_1 (REFERENCE §5.9).
    EXPECT_NEAR(split_pin(p.d1).nominal, p.d1, 1e-12);
  }
}

TEST(ClevisPins, NominalIsTheSmallestOfTheSeriesAtLeastTheDesignDiameter) {
  // Series of REFERENCE §5.9: …, 12, 14, 16, 18, 20, 22, 24, 27, 30, …
  EXPECT_NEAR(clevis_nominal(16 * mm), 16 * mm, 1e-12);
  EXPECT_NEAR(clevis_nominal(15 * mm), 16 * mm, 1e-12);
  EXPECT_NEAR(clevis_nominal(25 * mm), 27 * mm, 1e-12);
  EXPECT_NEAR(clevis_nominal(60 * mm), 60 * mm, 1e-12);  // above the series: a special pin
  const PinSet special = choose_pin(60 * mm, 0.1);
  EXPECT_FALSE(special.standard_diameter);
  EXPECT_NE(special.pin_designation().find("(special)"), std::string::npos);
}

TEST(ClevisPins, LengthLeavesTheHoleBeyondTheWasher) {
  // Ø16, grip 104 mm: l_h = l − l_e must reach 104 + h (3 mm, ISO 8738 from memory) + d_1/2
  // (2 mm) = 109 mm; l_e = 6 mm (from memory): l = 100 gives 94, l = 120 gives 114 → 120 mm
  // (ISO 2341 length series …, 95, 100, 120, … from memory).
  const PinSet s = choose_pin(16 * mm, 104 * mm);
  EXPECT_NEAR(s.length, 120 * mm, 1e-12);
  EXPECT_NEAR(s.hole_at, 114 * mm, 1e-12);
  EXPECT_NEAR(s.play, (114 - 2 - 104 - 3) * mm, 1e-12);
  EXPECT_TRUE(s.standard_length);
  // Designation in the form of REFERENCE §5.9's example "Clevis pin ISO 2341 - B - 16 × 60 - St".
  EXPECT_EQ(s.pin_designation(), "Clevis pin ISO 2341 - B - 16 × 120 - St");
  EXPECT_EQ(s.washer_designation(), "Washer ISO 8738 - 16 - 160 HV");
  // Split pin: at least d + 2 × 4 = 24 mm (common practice, no source) → 25 mm in ISO 1234's
  // series (…, 22, 25, 28, … from memory).
  EXPECT_EQ(s.split_designation(), "Split pin ISO 1234 - 4 × 25 - St");
}

TEST(ClevisPins, EveryGripGetsAPinThatHoldsIt) {
  // For every size of the series and grips 5–400 mm: the hole lies beyond grip + washer, the
  // play stays below one step of the length series (or 20 mm beyond it), and the head and the
  // washer are wider than the pin.
  const std::vector<double>& lengths = clevis_pin_lengths();
  for (double d : clevis_pin_series()) {
    for (double grip = 5 * mm; grip <= 0.4; grip += 1.7 * mm) {
      const PinSet s = choose_pin(d, grip);
      ASSERT_GE(s.play, -1e-12) << d << " " << grip;
      ASSERT_GE(s.hole_at - s.pin.d1 / 2, grip + s.washer.h - 1e-12);
      double step = 20 * mm;
      for (std::size_t i = 1; i < lengths.size(); ++i) {
        if (std::abs(lengths[i] - s.length) < 1e-12) step = lengths[i] - lengths[i - 1];
      }
      ASSERT_LT(s.play, step + 1e-12) << d << " " << grip;
      ASSERT_GT(s.pin.dk, s.pin.d);
      ASSERT_GT(s.washer.d2, s.pin.d);
      ASSERT_LT(s.pin.d1, s.pin.d / 2);
    }
  }
}

TEST(Rivets, RoundHeadRowsOfDin660AndDin124) {
  // d → d_k / k [mm]. 5, 6, 8: DIN 660:2012-01 Table 1 as tabulated by fasten.it (DIN 660) and
  // vidasan.com (DIN 660 / ISO 1051): 8.8 / 3, 10.5 / 3.6, 14 / 4.8. 10, 16, 20: DIN 124, from
  // memory (not checked against the standard): 16 / 6.5, 25 / 10, 32 / 13.
  struct Row {
    double d, dk, k;
    const char* standard;
  };
  for (const Row& r : {Row{5, 8.8, 3, "DIN 660"}, Row{6, 10.5, 3.6, "DIN 660"}, Row{8, 14, 4.8, "DIN 660"},
                       Row{10, 16, 6.5, "DIN 124"}, Row{16, 25, 10, "DIN 124"}, Row{20, 32, 13, "DIN 124"}}) {
    SCOPED_TRACE(r.d);
    const RivetSize s = round_head_rivet(r.d * mm);
    EXPECT_NEAR(s.d, r.d * mm, 1e-12);
    EXPECT_NEAR(s.dk, r.dk * mm, 1e-12);
    EXPECT_NEAR(s.k, r.k * mm, 1e-12);
    EXPECT_STREQ(s.standard, r.standard);
  }
}

TEST(Rivets, EveryNominalOfTheJointSeriesIsTabled) {
  // The joints' series (src/hardware.cpp kRivetSeries): 5, 6, 8, 10, 12, 14, 16, 20 mm; every
  // head wider than its shank and lower than it is wide (a round head, not a pin head).
  for (double d : {5.0, 6.0, 8.0, 10.0, 12.0, 14.0, 16.0, 20.0}) {
    const RivetSize s = round_head_rivet(d * mm);
    EXPECT_NEAR(s.d, d * mm, 1e-12) << d;
    EXPECT_GT(s.dk, 1.5 * s.d) << d;
    EXPECT_LT(s.k, s.dk / 2) << d;
    EXPECT_TRUE(choose_rivet(d * mm, 10 * mm, RivetClosing::round).standard_size) << d;
  }
}

TEST(Rivets, LengthIsClampPlusTheClosingAllowanceRoundedUpTheSeries) {
  // The example's joints (examples/bin-hoist.toml): Ø6 rivets through tail and run of a 3 mm band,
  // clamp 6 mm. Round closing head: 6 + 1.5 × 6 = 15 mm (allowance 1.5 d, common practice, from
  // memory) → 16 mm, the next of DIN 660's lengths …, 14, 16, … (DIN 660:2012-01 mass table,
  // fasten.it). Flush: 6 + 0.8 × 6 = 10.8 → 12 mm.
  const RivetSet round = choose_rivet(6 * mm, 6 * mm, RivetClosing::round);
  EXPECT_NEAR(round.allowance, 9 * mm, 1e-12);
  EXPECT_NEAR(round.length, 16 * mm, 1e-12);
  EXPECT_NEAR(round.closing_height(), 3.6 * mm, 1e-12);
  EXPECT_EQ(round.designation(), "Round head rivet DIN 660 - 6 × 16 - St");
  const RivetSet flush = choose_rivet(6 * mm, 6 * mm, RivetClosing::flush);
  EXPECT_NEAR(flush.length, 12 * mm, 1e-12);
  EXPECT_EQ(flush.closing_height(), 0);
  EXPECT_EQ(flush.designation(), "Round head rivet DIN 660 - 6 × 12 - St, closed flush");
  // Ø16 through 2 × 10 mm: 20 + 24 = 44 → 45 mm (series …, 42, 45, …, from memory), DIN 124.
  EXPECT_EQ(choose_rivet(16 * mm, 20 * mm, RivetClosing::round).designation(),
            "Round head rivet DIN 124 - 16 × 45 - St");
  // Beyond the series (160 mm, from memory): 5 mm steps, marked special.
  const RivetSet longest = choose_rivet(20 * mm, 150 * mm, RivetClosing::round);
  EXPECT_NEAR(longest.length, 180 * mm, 1e-12);
  EXPECT_FALSE(longest.standard_length);
  EXPECT_NE(longest.designation().find("(special)"), std::string::npos);
}

}  // namespace
}  // namespace bandforge::standard

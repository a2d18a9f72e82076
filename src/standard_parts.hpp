// Bought standard parts that hold the band-end and pivot pins (issue 10): clevis pins with head
// and split-pin hole (ISO 2341 form B), plain washers for clevis pins (ISO 8738) and split pins
// (ISO 1234); and the solid round-head rivets of the riveted band ends (DIN 660, DIN 124); from
// tables that carry the standards' values with their sources (REFERENCE §5.9 and,
// where it gives none, from memory: said beside each row). Core only, no I/O; sizes in metres.
//
// A pin is chosen from the design's pin diameter (the smallest nominal of the series at least as
// large) and the grip it must pass through (outer face to outer face of the plates it holds):
//
//   head │ grip (plates)        │ washer │ split pin │ end
//   ─────┼──────────────────────┼────────┼─────(o)───┼────
//        0                   grip     grip+h    l_h      l      (along the pin, from under the head)
//
// The split-pin hole's centre l_h = l − l_e must lie at least grip + h + d₁/2 from under the head,
// so that the split pin passes beyond the washer; l is the shortest length of the series that
// gives that.
#pragma once

#include <string>
#include <vector>

namespace bandforge::standard {

/// ISO 2341 form B clevis pin proportions for one nominal diameter [m].
struct ClevisPinSize {
  double d = 0;    ///< nominal (shank) diameter
  double dk = 0;   ///< head diameter d_k
  double k = 0;    ///< head height
  double d1 = 0;   ///< split-pin hole diameter d₁ (= the split pin's nominal size)
  double le = 0;   ///< least distance from the hole's centre to the pin's end l_e
};

/// ISO 8738 plain washer for a clevis pin of nominal diameter `pin` [m].
struct WasherSize {
  double pin = 0;  ///< the clevis pin's nominal diameter it is for
  double d1 = 0;  ///< bore
  double d2 = 0;  ///< outside diameter
  double h = 0;   ///< thickness
};

/// ISO 1234 split pin of nominal size `nominal` (= the hole it goes through) [m].
struct SplitPinSize {
  double nominal = 0;  ///< hole diameter it is for
  double d = 0;        ///< largest diameter of the two legs together (d max)
  double c = 0;        ///< largest width of the eye (c max)
};

/// Nominal diameters of ISO 2341 (3…50 mm).
const std::vector<double>& clevis_pin_series();
/// Lengths l of ISO 2341 [m]; beyond its last length a pin is a special length (20 mm steps).
const std::vector<double>& clevis_pin_lengths();
/// Lengths of ISO 1234 split pins [m].
const std::vector<double>& split_pin_lengths();

/// Smallest nominal of the ISO 2341 series ≥ `diameter` (less 1 µm); `diameter` itself when it
/// is above the series (a special pin to the largest size's proportions).
double clevis_nominal(double diameter);

/// ISO 2341 B proportions of `nominal` (one of clevis_pin_series(), else the proportions of the
/// largest size scaled by nominal/50 mm, marked special by choose_pin()).
ClevisPinSize clevis_pin(double nominal);
WasherSize washer_for(double nominal);
SplitPinSize split_pin(double hole);

/// One pin as bought: the clevis pin, its washer and split pin, lengths and designations.
struct PinSet {
  ClevisPinSize pin;
  WasherSize washer;
  SplitPinSize split;
  double design_diameter = 0;  ///< the design's pin_diameter it was chosen for
  double grip = 0;             ///< plates it holds, outer face to outer face
  double length = 0;           ///< l: under the head to the end
  double hole_at = 0;          ///< l_h: under the head to the split-pin hole's centre
  double play = 0;             ///< axial play left: l_h − d₁/2 − grip − h (≥ 0)
  double split_length = 0;     ///< the split pin's length l (under the eye to the short leg's end)
  bool standard_diameter = true;  ///< nominal is in ISO 2341's series
  bool standard_length = true;    ///< l is in ISO 2341's length series
  /// Beyond the grip on the head's side: the head height k.
  double head_reach() const { return pin.k; }
  /// Beyond the grip on the other side: washer, split pin and the pin's end, l − grip.
  double tail_reach() const { return length - grip; }
  /// Radius of what stands beyond the grip on the tail side: the washer, or the split pin's eye
  /// (legs bent back round the pin), whichever reaches further from the pin's axis.
  double tail_radius() const;
  /// "Clevis pin ISO 2341 - B - 16 × 60 - St" (ISO 2341's designation form).
  std::string pin_designation() const;
  /// "Washer ISO 8738 - 16 - 160 HV".
  std::string washer_designation() const;
  /// "Split pin ISO 1234 - 4 × 25 - St".
  std::string split_designation() const;
};

/// The set for a pin of the design's `diameter` holding plates `grip` thick (both [m]).
PinSet choose_pin(double diameter, double grip);

/// Solid round-head rivet for a band-end joint (src/hardware.hpp): DIN 660 for 1–8 mm, DIN 124
/// (steel construction) for 10–36 mm [m]. The head is a spherical cap of diameter d_k, height k.
struct RivetSize {
  double d = 0;               ///< nominal (shank) diameter d₁
  double dk = 0;              ///< head diameter d_k
  double k = 0;               ///< head height k
  const char* standard = "";  ///< "DIN 660" or "DIN 124"
};

/// How the closing head is formed on the far side of the clamp.
enum class RivetClosing {
  round,  ///< a round (snap) head like the manufactured one, d_k × k
  flush,  ///< closed into a countersink, flush with the far face (no head standing out)
};

/// One joint's rivets as bought and set.
struct RivetSet {
  RivetSize size;
  double clamp = 0;       ///< plates it joins (tail and run: 2t)
  RivetClosing closing = RivetClosing::round;
  double allowance = 0;   ///< shank beyond the clamp before closing (the length rule)
  double length = 0;      ///< l as bought: under the head to the end, before closing
  bool standard_size = true;    ///< nominal is in the table
  bool standard_length = true;  ///< l is in the length series
  /// Beyond the far face as set: the closing head's height (0 when flush).
  double closing_height() const { return closing == RivetClosing::round ? size.k : 0; }
  /// "Round head rivet DIN 660 - 6 × 12 - St" (the standards' designation form).
  std::string designation() const;
};

/// Nominal diameters of the table (DIN 660 5–8, DIN 124 10–36 mm) [m].
const std::vector<double>& rivet_series();
/// Lengths l of round-head rivets [m]; beyond the last one a special length (5 mm steps).
const std::vector<double>& rivet_lengths();
/// Proportions of the smallest tabled nominal ≥ `nominal` (less 1 µm); above the table the
/// largest row scaled by nominal / 36 mm (special).
RivetSize round_head_rivet(double nominal);
/// Allowance beyond the clamp for a closing form (fraction of d): 1.5 d round, 0.8 d flush.
double rivet_allowance(double nominal, RivetClosing closing);
/// The rivet of `nominal` for a `clamp` [m] closed as `closing`: the shortest length of the
/// series ≥ clamp + allowance.
RivetSet choose_rivet(double nominal, double clamp, RivetClosing closing);

/// Where the tables come from, for the calculation sheet and the README.
inline constexpr const char* kPinSource =
    "ISO 2341 form B (d, d_k, k, d_1 for 8–30 mm: REFERENCE §5.9; other sizes, l_e and the "
    "length series from memory)";
inline constexpr const char* kWasherSource = "ISO 8738 (from memory)";
inline constexpr const char* kSplitPinSource = "ISO 1234 (from memory)";
inline constexpr const char* kRivetSource =
    "round-head rivets: DIN 660:2012-01 Table 1 for 5–8 mm (d_k, k as tabulated by fasten.it "
    "and vidasan.com), DIN 124 for 10–36 mm and the length series (from memory)";
inline constexpr const char* kRivetLengthRule =
    "rivet length at least clamp + 1.5 d for a round closing head, + 0.8 d for a flush "
    "(countersunk) one (common practice, from memory)";
inline constexpr const char* kSplitLengthRule =
    "split pin at least pin diameter + 2 × its size long, so that both legs reach past the pin "
    "to be bent back (common practice, no source)";

}  // namespace bandforge::standard

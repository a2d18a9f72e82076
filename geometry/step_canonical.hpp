// A post-write pass that makes STEP bytes reproducible. OCCT numbers entity instances in the
// order its maps hand them out, and some of those maps are keyed by memory address (colours),
// so two processes can write the same model with different numbering. This pass renumbers the
// DATA section in an order that depends only on the content. Plain text, no OCCT.
#pragma once

#include <array>
#include <string>
#include <string_view>
#include <vector>

namespace bandforge::geom {

/// Rewrites an ISO 10303-21 clear-text file: the header is kept as it is; the DATA section's
/// entity instances are renumbered #1, #2, ... in a depth-first order from the unreferenced
/// instances (sorted by a content hash), each written on one line. Throws BuildError when the
/// text is not a Part 21 file this pass understands.
std::string canonical_step(std::string_view text);

/// Writes each COLOUR_RGB whose components all lie within 1e-6 of one of `exact` (sRGB, 0..1)
/// with that colour's exact values. OCCT 7.6 keeps colours as 32-bit floats in linear RGB and
/// writes them back as e.g. 0.750000000934; the file should carry the values the design chose.
std::string exact_colours(std::string_view text, const std::vector<std::array<double, 3>>& exact);

/// Renumbers the ids of NEXT_ASSEMBLY_USAGE_OCCURRENCE ('1', '2', ... by rank of the numeric id
/// written). OCCT counts these ids across exports in one process, so the second export of the
/// same model would otherwise say '11'..'20' where the first said '1'..'10'.
std::string occurrence_ids_from_one(std::string_view text);

/// Encodes every non-ASCII UTF-8 character as \X2\hhhh\X0\ (ISO 10303-21 §6.4.3.3; UTF-16
/// code units in hex). OCCT writes names and header strings as raw bytes; ASCII, including the
/// backslashes OCCT has already doubled, passes through unchanged.
std::string encode_non_ascii(std::string_view text);

/// A Part 21 REAL: shortest round-trip decimal with a decimal point ("0.75", "1.", "1.5E-07").
std::string part21_real(double v);

}  // namespace bandforge::geom

// Fitting text into a width: libharu cannot measure wrapped text (TOOLCHAIN.md), so lines are
// broken and shortened here from measured advance widths.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "drawing/canvas.hpp"

namespace bandforge::drawing {

/// The largest ISO 3098 height ≤ `h` (down to 1.8 mm) at which `text` fits in `width`.
double fitted_height(const Canvas& c, std::string_view text, double h, double width);

/// `text`, cut at a character boundary and ended with "…" if it is wider than `width`.
std::string ellipsize(const Canvas& c, std::string_view text, double h, double width);

/// Breaks `text` at '\n' and at spaces into lines no wider than `width` (a single long word stays whole).
std::vector<std::string> wrap_lines(const Canvas& c, std::string_view text, double h, double width);

}  // namespace bandforge::drawing

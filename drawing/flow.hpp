// Flowing blocks of content (headings, paragraphs, tables, plots) down the columns of one or
// more sheets. Layout first (measure only), draw second, so that the title blocks can say
// "sheet n of m" before anything is drawn.
#pragma once

#include <functional>
#include <vector>

#include "drawing/canvas.hpp"

namespace bandforge::drawing {

struct Block {
  std::function<double(const Canvas&, double width)> height;
  std::function<void(Canvas&, Pt top_left, double width)> draw;
  bool keep_with_next = false;  ///< a heading: never the last block in a column
  double space_after = 2.5;     ///< [mm]
};

struct Placement {
  size_t block = 0;
  int page = 0;
  Pt top_left;
  double width = 0;
};

/// Places blocks in `columns` (the same on every page), top to bottom then left to right,
/// starting a new page when the columns are full. A block taller than a column is placed alone
/// at the top of a column and allowed to run over (there is no better place for it).
std::vector<Placement> flow(const Canvas& c, const std::vector<Block>& blocks,
                            const std::vector<Box>& columns, int* pages);

}  // namespace bandforge::drawing

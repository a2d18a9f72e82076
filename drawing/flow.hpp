// Flowing blocks of content (headings, paragraphs, tables, plots) down the columns of one or
// more sheets. Layout first (measure only), draw second, so that the title blocks can say
// "sheet n of m" before anything is drawn.
#pragma once

#include <functional>
#include <optional>
#include <utility>
#include <vector>

#include "drawing/canvas.hpp"

namespace bandforge::drawing {

struct Block {
  std::function<double(const Canvas&, double width)> height;
  std::function<void(Canvas&, Pt top_left, double width)> draw;
  /// Splits the block so that the first part is at most `avail` tall; nullopt when no useful
  /// first part fits (a table splits between rows and repeats its header).
  std::function<std::optional<std::pair<Block, Block>>(const Canvas&, double width, double avail)> split;
  bool keep_with_next = false;  ///< a heading: never the last block in a column
  double space_after = 2.5;     ///< [mm]
};

struct Placed {
  Block block;
  int page = 0;
  Pt top_left;
  double width = 0;
};

/// Places blocks in `columns` (the same on every page, all of the same width), top to bottom
/// then left to right, starting a new page when the columns are full. A block taller than a
/// whole column that cannot split is placed at the top of one and allowed to run over.
std::vector<Placed> flow(const Canvas& c, std::vector<Block> blocks, const std::vector<Box>& columns,
                         int* pages);

}  // namespace bandforge::drawing

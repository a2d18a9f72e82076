#include "drawing/flow.hpp"

namespace bandforge::drawing {

std::vector<Placement> flow(const Canvas& c, const std::vector<Block>& blocks,
                            const std::vector<Box>& columns, int* pages) {
  std::vector<Placement> out;
  std::vector<double> heights;
  for (const Block& b : blocks) heights.push_back(b.height(c, columns.at(0).width()));
  int page = 0;
  size_t col = 0;
  double y = columns[0].y1;
  auto advance = [&] {
    if (++col == columns.size()) {
      col = 0;
      ++page;
    }
    y = columns[col].y1;
  };
  for (size_t i = 0; i < blocks.size(); ++i) {
    const Box& box = columns[col];
    double need = heights[i];
    // A heading goes with the block after it.
    if (blocks[i].keep_with_next && i + 1 < blocks.size()) need += blocks[i].space_after + heights[i + 1];
    const bool at_top = y >= columns[col].y1 - 1e-9;
    if (y - need < box.y0 && !at_top) advance();
    const Box& dest = columns[col];
    out.push_back({i, page, {dest.x0, y}, dest.width()});
    y -= heights[i] + blocks[i].space_after;
  }
  if (pages) *pages = page + 1;
  return out;
}

}  // namespace bandforge::drawing

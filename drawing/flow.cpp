#include "drawing/flow.hpp"

#include <deque>

namespace bandforge::drawing {

std::vector<Placed> flow(const Canvas& c, std::vector<Block> blocks, const std::vector<Box>& columns,
                         int* pages) {
  std::vector<Placed> out;
  std::deque<Block> queue(blocks.begin(), blocks.end());
  const double width = columns.at(0).width();
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
  while (!queue.empty()) {
    Block b = std::move(queue.front());
    queue.pop_front();
    const double h = b.height(c, width);
    const double avail = y - columns[col].y0;
    const bool at_top = y >= columns[col].y1 - 1e-9;
    // A heading goes with (the first part of) the block after it.
    double need = h;
    if (b.keep_with_next && !queue.empty()) {
      const Block& next = queue.front();
      double next_h = next.height(c, width);
      if (next.split && next_h > avail - h - b.space_after) {
        if (auto parts = next.split(c, width, avail - h - b.space_after)) next_h = parts->first.height(c, width);
      }
      need = h + b.space_after + next_h;
    }
    if (need > avail && !at_top) {
      if (!b.keep_with_next && b.split) {
        if (auto parts = b.split(c, width, avail)) {
          out.push_back({parts->first, page, {columns[col].x0, y}, width});
          queue.push_front(std::move(parts->second));
          advance();
          continue;
        }
      }
      advance();
      queue.push_front(std::move(b));
      continue;
    }
    if (h > avail && b.split) {  // taller than a whole column
      if (auto parts = b.split(c, width, avail)) {
        out.push_back({parts->first, page, {columns[col].x0, y}, width});
        queue.push_front(std::move(parts->second));
        advance();
        continue;
      }
    }
    out.push_back({b, page, {columns[col].x0, y}, width});
    y -= h + b.space_after;
  }
  if (pages) *pages = page + 1;
  return out;
}

}  // namespace bandforge::drawing

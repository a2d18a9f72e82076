// The design the geometry and drawing benchmarks time: the bundled example, read and solved once,
// so that both measure the same brake.
#pragma once

#include <string>

#include "src/design_reader.hpp"
#include "src/mechanics.hpp"

namespace bandforge::bench {

inline const Design& example() {
  static const Design d =
      read_design_file(std::string(BANDFORGE_SOURCE_DIR) + "/examples/bin-hoist.toml");
  return d;
}

inline const Solution& solution() {
  static const Solution s = solve(example());
  return s;
}

}  // namespace bandforge::bench

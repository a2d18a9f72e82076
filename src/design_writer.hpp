// Writes a Design back as a design file that reads back to the same values (used by `propose`).
// Lengths in mm, stresses in MPa, with enough digits that read → write → read is exact to 1e-9.
#pragma once

#include <string>

#include "src/design.hpp"

namespace bandforge {

/// The design file's text (sections [project] … [drawing]); `header` is written first, each line
/// prefixed with "# ". Lining values equal to the material table's are left to the table, so
/// their sources stay the table's.
std::string design_toml(const Design& design, const std::string& header);

}  // namespace bandforge

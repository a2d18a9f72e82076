// The version of bandforge: CMake's project version, set once in the top CMakeLists.txt. It is
// printed by `bandforge --version` and written into the STEP header's originating system and
// the PDF's producer field (a constant, so the outputs stay byte-reproducible).
#pragma once

namespace bandforge {

/// "MAJOR.MINOR.PATCH", e.g. "0.2.0".
const char* version();

}  // namespace bandforge

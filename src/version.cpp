#include "src/version.hpp"

namespace bandforge {

const char* version() { return BANDFORGE_VERSION; }

}  // namespace bandforge

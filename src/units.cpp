#include "src/units.hpp"

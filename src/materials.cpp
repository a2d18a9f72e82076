#include "src/materials.hpp"

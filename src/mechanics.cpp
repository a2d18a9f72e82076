#include "src/mechanics.hpp"

#include "src/design_reader.hpp"

#include "src/report.hpp"

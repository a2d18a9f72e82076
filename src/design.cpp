#include "src/design.hpp"

#include "src/errors.hpp"

namespace bandforge {

const char* to_string(Turn t) { return t == Turn::cw ? "cw" : "ccw"; }

const char* to_string(Mount m) { return m == Mount::lever ? "lever" : "frame"; }

const char* to_string(BrakeKind k) {
  switch (k) {
    case BrakeKind::simple: return "simple";
    case BrakeKind::differential: return "differential";
    case BrakeKind::summing: return "summing";
  }
  return "?";
}

void design_fail(const Design& design, const std::string& key, const std::string& value,
                 const std::string& problem) {
  SourcePos pos;
  if (auto it = design.where.find(key); it != design.where.end()) pos = it->second;
  throw DesignError(design.file, pos.line, pos.column, key, value, problem);
}

}  // namespace bandforge

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

const char* to_string(ApplyBy b) {
  switch (b) {
    case ApplyBy::hand: return "hand";
    case ApplyBy::weight: return "weight";
    case ApplyBy::spring: return "spring";
  }
  return "?";
}

const char* to_string(SpringEnds e) {
  switch (e) {
    case SpringEnds::plain: return "plain";
    case SpringEnds::plain_ground: return "plain-ground";
    case SpringEnds::squared: return "squared";
    case SpringEnds::squared_ground: return "squared-ground";
  }
  return "?";
}

const char* to_string(SpringSeats s) {
  switch (s) {
    case SpringSeats::flat_flat: return "flat-flat";
    case SpringSeats::flat_pivoted: return "flat-pivoted";
    case SpringSeats::pivoted_pivoted: return "pivoted-pivoted";
  }
  return "?";
}

const char* to_string(HoistDrive d) {
  switch (d) {
    case HoistDrive::unspecified: return "";
    case HoistDrive::powered: return "powered";
    case HoistDrive::manual: return "manual";
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

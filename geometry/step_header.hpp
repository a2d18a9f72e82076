// The STEP header and assembly name taken from the design's [project] block. No OCCT.
#pragma once

#include <string>

#include "src/design.hpp"

namespace bandforge::geom {

/// Header strings as UTF-8 text (control characters replaced by spaces). OCCT quotes them;
/// the post-write pass (step_canonical.hpp) encodes non-ASCII characters for Part 21.
struct StepHeader {
  std::string assembly;       ///< top assembly product name: "<number> <title>"
  std::string file_name;      ///< FILE_NAME.name
  std::string time_stamp;     ///< ISO 8601, never the clock (see step_time_stamp)
  std::string description;    ///< FILE_DESCRIPTION: title and revision
  std::string author;         ///< [project] creator
  std::string organization;   ///< [project] owner
  std::string authorisation;  ///< [project] approver
  std::string system;         ///< "bandforge <version>"
};

StepHeader step_header(const Design& design, const std::string& file_name);

/// The header time: the design's [project] date at T00:00:00 when it is an ISO date, else
/// SOURCE_DATE_EPOCH (seconds, UTC), else 1970-01-01T00:00:00. Never the clock, so that the
/// same design gives the same bytes.
std::string step_time_stamp(const std::string& project_date, const char* source_date_epoch);

}  // namespace bandforge::geom

#include "geometry/step_header.hpp"

#include <cctype>
#include <cstdlib>
#include <ctime>

#include "src/version.hpp"

namespace bandforge::geom {
namespace {

bool is_iso_date(const std::string& s) {
  if (s.size() != 10 || s[4] != '-' || s[7] != '-') return false;
  for (std::size_t i : {0u, 1u, 2u, 3u, 5u, 6u, 8u, 9u}) {
    if (!std::isdigit(static_cast<unsigned char>(s[i]))) return false;
  }
  const int month = std::atoi(s.substr(5, 2).c_str()), day = std::atoi(s.substr(8, 2).c_str());
  return month >= 1 && month <= 12 && day >= 1 && day <= 31;
}

// Header strings are single-line: control characters (a title with a tab) become spaces.
std::string one_line(const std::string& s) {
  std::string out = s;
  for (char& c : out) {
    if (static_cast<unsigned char>(c) < 0x20 || c == 0x7f) c = ' ';
  }
  return out;
}

}  // namespace

std::string step_time_stamp(const std::string& project_date, const char* source_date_epoch) {
  if (is_iso_date(project_date)) return project_date + "T00:00:00";
  if (source_date_epoch != nullptr && *source_date_epoch != '\0') {
    char* end = nullptr;
    const long long secs = std::strtoll(source_date_epoch, &end, 10);
    if (end != nullptr && *end == '\0' && secs >= 0) {
      const std::time_t t = static_cast<std::time_t>(secs);
      std::tm tm{};
      if (gmtime_r(&t, &tm) != nullptr) {
        char buf[32];
        std::strftime(buf, sizeof buf, "%Y-%m-%dT%H:%M:%S", &tm);
        return buf;
      }
    }
  }
  return "1970-01-01T00:00:00";
}

StepHeader step_header(const Design& design, const std::string& file_name) {
  const Project& p = design.project;
  StepHeader h;
  h.assembly = p.number.empty() ? p.title : p.number + " " + p.title;
  h.file_name = one_line(file_name);
  h.time_stamp = step_time_stamp(p.date, std::getenv("SOURCE_DATE_EPOCH"));
  h.description = one_line(p.revision.empty() ? p.title : p.title + ", revision " + p.revision);
  h.author = one_line(p.creator);
  h.organization = one_line(p.owner);
  h.authorisation = one_line(p.approver);
  h.system = std::string("bandforge ") + version();
  return h;
}

}  // namespace bandforge::geom

#include "geometry/step_header.hpp"

#include <cctype>
#include <cstdio>
#include <cstdlib>
#include <ctime>

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

// Decodes one UTF-8 sequence at s[i]; invalid bytes become U+FFFD.
char32_t next_code_point(const std::string& s, std::size_t& i) {
  const unsigned char c = static_cast<unsigned char>(s[i++]);
  int extra = c >= 0xf0 ? 3 : c >= 0xe0 ? 2 : c >= 0xc0 ? 1 : 0;
  char32_t cp = extra == 3 ? c & 0x07 : extra == 2 ? c & 0x0f : extra == 1 ? c & 0x1f : c;
  if (c >= 0x80 && extra == 0) return 0xfffd;
  for (; extra > 0; --extra) {
    if (i >= s.size() || (static_cast<unsigned char>(s[i]) & 0xc0) != 0x80) return 0xfffd;
    cp = (cp << 6) | (static_cast<unsigned char>(s[i++]) & 0x3f);
  }
  return cp;
}

}  // namespace

std::string part21_text(const std::string& utf8) {
  std::string out;
  std::string wide;  // pending \X2\ run, UTF-16 hex
  auto flush = [&] {
    if (wide.empty()) return;
    out.append("\\X2\\").append(wide).append("\\X0\\");
    wide.clear();
  };
  for (std::size_t i = 0; i < utf8.size();) {
    const char32_t cp = next_code_point(utf8, i);
    if (cp >= 0x20 && cp < 0x7f) {
      flush();
      if (cp == '\\') out += "\\\\";
      else out += static_cast<char>(cp);
      continue;
    }
    char buf[16];
    if (cp < 0x20 || cp == 0x7f) continue;  // control characters have no place in a header
    if (cp > 0xffff) {
      const char32_t v = cp - 0x10000;
      std::snprintf(buf, sizeof buf, "%04X%04X", static_cast<unsigned>(0xd800 + (v >> 10)),
                    static_cast<unsigned>(0xdc00 + (v & 0x3ff)));
    } else {
      std::snprintf(buf, sizeof buf, "%04X", static_cast<unsigned>(cp));
    }
    wide += buf;
  }
  flush();
  return out;
}

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
  h.file_name = part21_text(file_name);
  h.time_stamp = step_time_stamp(p.date, std::getenv("SOURCE_DATE_EPOCH"));
  h.description = part21_text(p.revision.empty() ? p.title : p.title + ", revision " + p.revision);
  h.author = part21_text(p.creator);
  h.organization = part21_text(p.owner);
  h.authorisation = part21_text(p.approver);
  h.system = std::string("bandforge ") + BANDFORGE_VERSION;
  return h;
}

}  // namespace bandforge::geom

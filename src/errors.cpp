#include "src/errors.hpp"

namespace bandforge {
namespace {

std::string compose(const std::string& file, int line, int column, const std::string& key,
                    const std::string& value, const std::string& problem) {
  std::string out = file.empty() ? std::string("<design>") : file;
  if (line > 0) {
    out.append(":").append(std::to_string(line));
    if (column > 0) out.append(":").append(std::to_string(column));
  }
  out.append(": ");
  if (!key.empty()) {
    out.append(key);
    if (!value.empty()) out.append(" = ").append(value);
    out.append(": ");
  }
  out.append(problem);
  return out;
}

}  // namespace

DesignError::DesignError(std::string file, int line, int column, std::string key,
                         std::string value, std::string problem)
    : Error(Exit::bad_design, compose(file, line, column, key, value, problem)),
      key_(std::move(key)),
      line_(line) {}

}  // namespace bandforge

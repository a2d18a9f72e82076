// One error family for the whole tool. Each error carries the exit status that main() returns,
// so every failure path ends in the same place (src/cli/main.cpp) with a documented code.
#pragma once

#include <stdexcept>
#include <string>

namespace bandforge {

/// Exit statuses (documented in README.md, "Exit status").
enum class Exit : int {
  ok = 0,
  usage = 1,         ///< bad command line
  bad_design = 2,    ///< the design file is unreadable, malformed or describes an impossible brake
  cannot_build = 3,  ///< the parts, drawing or flat patterns cannot be made from a valid design
  io = 4,            ///< an input cannot be read or an output cannot be written
  internal = 5,      ///< a defect in bandforge: please report it
  checks_failed = 6, ///< with --strict: the design solved but at least one check fails
  no_proposal = 7,   ///< propose: no layout in the brief's space passes every check and builds
};

class Error : public std::runtime_error {
 public:
  Error(Exit code, const std::string& message) : std::runtime_error(message), code_(code) {}
  Exit code() const { return code_; }

 private:
  Exit code_;
};

/// A mistake in the design file. The message names file, line, column, key, the value given
/// and what would be valid: `brake.toml:12:9: [band] thickness = "3 N": expected a length ...`.
class DesignError : public Error {
 public:
  DesignError(std::string file, int line, int column, std::string key, std::string value,
              std::string problem);
  const std::string& key() const { return key_; }
  int line() const { return line_; }

 private:
  std::string key_;
  int line_ = 0;
};

/// A valid design whose parts (or drawing, or flat patterns) cannot be made.
class BuildError : public Error {
 public:
  explicit BuildError(const std::string& message) : Error(Exit::cannot_build, message) {}
};

class IoError : public Error {
 public:
  explicit IoError(const std::string& message) : Error(Exit::io, message) {}
};

}  // namespace bandforge

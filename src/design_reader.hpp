// Reads a design file (TOML, toml++) into a Design. Every dimensioned value is a string with its
// unit; all conversion to SI happens here. Every mistake becomes a DesignError naming the file,
// line, column, key, the value given and what would be valid.
#pragma once

#include <string>
#include <string_view>

#include "src/design.hpp"

namespace bandforge {

/// The path that means standard input (the Unix convention), and the name messages use for it.
inline constexpr const char* kStdinPath = "-";
inline constexpr const char* kStdinName = "<stdin>";

/// Reads and validates `path` ("-": standard input, named "<stdin>" in messages). Throws
/// DesignError (exit 2) or IoError (exit 4, unreadable file).
Design read_design_file(const std::string& path);

/// The name messages use for `path`: the path itself, or "<stdin>" for "-".
inline std::string design_display_name(const std::string& path) {
  return path == kStdinPath ? kStdinName : path;
}

/// Same, from text already in memory; `name` is used in messages in place of a path.
Design read_design_text(std::string_view text, const std::string& name);

/// A commented starter design (the `new` command's output). It must read back without error.
std::string starter_design();

}  // namespace bandforge

// Reads a design file (TOML, toml++) into a Design. Every dimensioned value is a string with its
// unit; all conversion to SI happens here. Every mistake becomes a DesignError naming the file,
// line, column, key, the value given and what would be valid.
#pragma once

#include <string>
#include <string_view>

#include "src/design.hpp"

namespace bandforge {

/// Reads and validates `path`. Throws DesignError (exit 2) or IoError (exit 4, unreadable file).
Design read_design_file(const std::string& path);

/// Same, from text already in memory; `name` is used in messages in place of a path.
Design read_design_text(std::string_view text, const std::string& name);

/// A commented starter design (the `new` command's output). It must read back without error.
std::string starter_design();

}  // namespace bandforge

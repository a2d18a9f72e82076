// Scope guards for OpenCASCADE's process-wide state (OCCT types: geometry/*.cpp only).
// OCCT prints through Message::DefaultMessenger() (the STEP writer sends transfer statistics to
// stdout) and keeps its translation options in Interface_Static. Both are global: every change
// goes through a guard that puts the previous state back, so a library user sees no side effect.
#pragma once

#include <string>
#include <utility>
#include <vector>

#include "geometry/brake_model.hpp"  // QuietOcct

namespace bandforge::geom {

/// Interface_Static settings changed for one translation and restored on destruction.
class StaticSettings {
 public:
  StaticSettings() = default;
  ~StaticSettings();
  StaticSettings(const StaticSettings&) = delete;
  StaticSettings& operator=(const StaticSettings&) = delete;

  /// Sets `name` to `value`; throws BuildError when OCCT refuses it (SetCVal fails silently on
  /// unknown values, so every call is checked).
  void set(const std::string& name, const std::string& value);

 private:
  std::vector<std::pair<std::string, std::string>> saved_;
};

}  // namespace bandforge::geom

// Outputs that appear all together or not at all. Files are written into a hidden folder inside
// the output folder and moved into place by commit() only when every one of them exists; if
// commit() is never reached (an error), the hidden folder is removed and the output folder is as
// it was. Used by `build` for all its files and by geom::write_fab_pack for fab/ alone.
#pragma once

#include <filesystem>
#include <string>
#include <vector>

namespace bandforge {

class StagedOutputs {
 public:
  /// Creates `out_dir` if needed and an empty `out_dir/.<tag>.partial/`. Throws IoError.
  StagedOutputs(const std::filesystem::path& out_dir, const std::string& tag);
  ~StagedOutputs();
  StagedOutputs(const StagedOutputs&) = delete;
  StagedOutputs& operator=(const StagedOutputs&) = delete;

  /// Where to write `name` now ("model.step", or "fab/band-blank.dxf": folders are created).
  /// Not thread-safe: take every path on one thread before handing them out.
  std::string path(const std::string& name);

  /// Moves every staged file to the same name in the output folder, replacing a file of that
  /// name; returns the final paths in the order the names were taken. Throws IoError.
  std::vector<std::string> commit();

 private:
  std::filesystem::path out_;
  std::filesystem::path dir_;
  std::vector<std::string> names_;
};

}  // namespace bandforge

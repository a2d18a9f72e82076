#include "src/staging.hpp"

#include <system_error>

#include "src/errors.hpp"

namespace bandforge {

namespace fs = std::filesystem;

StagedOutputs::StagedOutputs(const fs::path& out_dir, const std::string& tag) : out_(out_dir) {
  std::error_code ec;
  fs::create_directories(out_, ec);
  if (ec || !fs::is_directory(out_)) {
    throw IoError("cannot create the output directory " + out_.string() +
                  (ec ? ": " + ec.message() : ": a file of that name is in the way"));
  }
  dir_ = out_ / ("." + tag + ".partial");
  fs::remove_all(dir_, ec);
  if (!fs::create_directory(dir_, ec)) {
    throw IoError("cannot write in " + out_.string() + ": " + ec.message());
  }
}

StagedOutputs::~StagedOutputs() {
  std::error_code ec;
  fs::remove_all(dir_, ec);
}

std::string StagedOutputs::path(const std::string& name) {
  const fs::path p = dir_ / name;
  std::error_code ec;
  fs::create_directories(p.parent_path(), ec);
  names_.push_back(name);
  return p.string();
}

std::vector<std::string> StagedOutputs::commit() {
  std::vector<std::string> done;
  for (const std::string& name : names_) {
    const fs::path to = out_ / name;
    std::error_code ec;
    fs::create_directories(to.parent_path(), ec);
    fs::rename(dir_ / name, to, ec);
    if (ec) throw IoError("cannot write " + to.string() + ": " + ec.message());
    done.push_back(to.string());
  }
  return done;
}

}  // namespace bandforge

// What the test programs share: one scratch folder per test program, removed when the program
// ends; a file read whole; a shell command run with its exit status and output.
// BANDFORGE_TEST_PROGRAM (the program's name) comes from bandforge_test() in tests/CMakeLists.txt.
#pragma once

#include <sys/wait.h>
#include <unistd.h>

#include <atomic>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <system_error>

#include <gtest/gtest.h>

namespace bandforge::test {

namespace detail {

// Named after the program and its process so that programs (and ctest's parallel runs of one
// program) never share a folder.
inline const std::filesystem::path& scratch_location() {
  static const std::filesystem::path p =
      std::filesystem::temp_directory_path() /
      ("bandforge-" + std::string(BANDFORGE_TEST_PROGRAM) + "-" + std::to_string(::getpid()));
  return p;
}

class RemoveScratch : public testing::Environment {
 public:
  void TearDown() override {
    std::error_code ec;
    std::filesystem::remove_all(scratch_location(), ec);
  }
};

inline testing::Environment* const remove_scratch_at_exit =
    testing::AddGlobalTestEnvironment(new RemoveScratch);

}  // namespace detail

/// This program's scratch folder, created on first use and removed when the tests end.
inline std::filesystem::path scratch_root() {
  std::filesystem::create_directories(detail::scratch_location());
  return detail::scratch_location();
}

/// An empty folder `name` in the scratch folder (whatever an earlier test left there is removed).
inline std::filesystem::path fresh_dir(const std::string& name) {
  const std::filesystem::path p = detail::scratch_location() / name;
  std::filesystem::remove_all(p);
  std::filesystem::create_directories(p);
  return p;
}

/// The file's bytes ("" when it cannot be read).
inline std::string slurp(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

struct Shell {
  int status = -1;  ///< exit status; -1 when the command could not start or did not exit
  std::string out;  ///< stdout
};

/// Runs `cmd` with /bin/sh, capturing stdout; stderr goes where the test program's goes.
inline Shell run(const std::string& cmd) {
  Shell r;
  FILE* p = ::popen(cmd.c_str(), "r");
  if (p == nullptr) return r;
  char buf[4096];
  std::size_t n;
  while ((n = std::fread(buf, 1, sizeof buf, p)) > 0) r.out.append(buf, n);
  const int status = ::pclose(p);
  r.status = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return r;
}

struct ShellWithErr {
  int status = -1;
  std::string out;
  std::string err;  ///< stderr
};

/// run() with stderr captured as well, through a file in the scratch folder.
inline ShellWithErr run_capturing_stderr(const std::string& cmd) {
  static std::atomic<int> calls{0};
  const std::filesystem::path err = scratch_root() / ("stderr-" + std::to_string(++calls) + ".txt");
  Shell r = run(cmd + " 2>'" + err.string() + "'");
  ShellWithErr out{r.status, std::move(r.out), slurp(err)};
  std::error_code ec;
  std::filesystem::remove(err, ec);
  return out;
}

}  // namespace bandforge::test

// src/cli/child_job: work in a forked child with its result or error carried back to the parent.
// The expected values are the contract in child_job.hpp and the exit statuses of src/errors.hpp.
#include <chrono>
#include <csignal>
#include <cstdlib>
#include <functional>
#include <stdexcept>
#include <string>
#include <thread>

#include <gtest/gtest.h>

#include "src/cli/child_job.hpp"
#include "src/errors.hpp"

namespace bandforge::cli {
namespace {

TEST(ChildJob, ReturnsTheChildsText) {
  ChildJob job([] { return std::string("11"); });
  EXPECT_EQ(job.wait(), "11");
}

TEST(ChildJob, ALongReportDoesNotBlockTheChild) {
  // Far more than a pipe holds (64 KiB on Linux): the parent must read while the child writes.
  const std::string big(1 << 20, 'x');
  ChildJob job([&] { return big; });
  EXPECT_EQ(job.wait(), big);
}

// wait() on a child running `work`, which fails: the error is caught as E, with `code` and a
// message containing `text`.
template <class E>
void expect_rethrown(const std::function<std::string()>& work, Exit code, const std::string& text) {
  ChildJob job(work);
  try {
    job.wait();
    ADD_FAILURE() << "no error";
  } catch (const E& e) {
    EXPECT_EQ(e.code(), code);
    EXPECT_NE(std::string(e.what()).find(text), std::string::npos) << e.what();
  }
}

TEST(ChildJob, ABuildErrorComesBackAsABuildErrorWithItsMessage) {
  expect_rethrown<BuildError>([]() -> std::string { throw BuildError("while building the band: no"); },
                              Exit::cannot_build, "while building the band: no");
}

TEST(ChildJob, AnIoErrorKeepsItsExitStatus) {
  expect_rethrown<IoError>([]() -> std::string { throw IoError("cannot write x.pdf"); }, Exit::io,
                           "cannot write x.pdf");
}

TEST(ChildJob, AnyOtherExceptionIsAnInternalError) {
  expect_rethrown<Error>([]() -> std::string { throw std::runtime_error("vector::at"); }, Exit::internal,
                         "vector::at");
}

TEST(ChildJob, AChildKilledByASignalIsAnInternalErrorNamingIt) {
  expect_rethrown<Error>(
      []() -> std::string {
        std::signal(SIGABRT, SIG_DFL);
        std::abort();
      },
      Exit::internal, "signal " + std::to_string(SIGABRT));
}

TEST(ChildJob, NotWaitedForTheChildIsStoppedAtOnce) {
  const auto t0 = std::chrono::steady_clock::now();
  {
    ChildJob job([] {
      std::this_thread::sleep_for(std::chrono::seconds(30));
      return std::string();
    });
  }  // the destructor kills and reaps it
  const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  EXPECT_LT(s, 10.0);  // far below the child's 30 s
}

}  // namespace
}  // namespace bandforge::cli

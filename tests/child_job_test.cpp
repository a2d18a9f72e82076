// src/cli/child_job: work in a forked child with its result or error carried back to the parent.
// The expected values are the contract in child_job.hpp and the exit statuses of src/errors.hpp.
#include <chrono>
#include <csignal>
#include <cstdlib>
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

TEST(ChildJob, ABuildErrorComesBackAsABuildErrorWithItsMessage) {
  ChildJob job([]() -> std::string { throw BuildError("while building the band: no"); });
  try {
    job.wait();
    FAIL() << "no error";
  } catch (const BuildError& e) {
    EXPECT_EQ(e.code(), Exit::cannot_build);
    EXPECT_STREQ(e.what(), "while building the band: no");
  }
}

TEST(ChildJob, AnIoErrorKeepsItsExitStatus) {
  ChildJob job([]() -> std::string { throw IoError("cannot write x.pdf"); });
  try {
    job.wait();
    FAIL() << "no error";
  } catch (const IoError& e) {
    EXPECT_EQ(e.code(), Exit::io);
    EXPECT_STREQ(e.what(), "cannot write x.pdf");
  }
}

TEST(ChildJob, AnyOtherExceptionIsAnInternalError) {
  ChildJob job([]() -> std::string { throw std::runtime_error("vector::at"); });
  try {
    job.wait();
    FAIL() << "no error";
  } catch (const Error& e) {
    EXPECT_EQ(e.code(), Exit::internal);
    EXPECT_NE(std::string(e.what()).find("vector::at"), std::string::npos);
  }
}

TEST(ChildJob, AChildKilledByASignalIsAnInternalErrorNamingIt) {
  ChildJob job([]() -> std::string {
    std::signal(SIGABRT, SIG_DFL);
    std::abort();
  });
  try {
    job.wait();
    FAIL() << "no error";
  } catch (const Error& e) {
    EXPECT_EQ(e.code(), Exit::internal);
    EXPECT_NE(std::string(e.what()).find("signal " + std::to_string(SIGABRT)), std::string::npos) << e.what();
  }
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

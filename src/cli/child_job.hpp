// Work run in a child process (fork) beside the parent, with its error carried back. `build` runs
// the drawing and the STEP export this way while it checks the model: OpenCASCADE's algorithms on
// two threads of one process slowed each other by 30–45 % (a process-wide mutex taken by every
// error handler OCCT opens, and shared cache lines), on two processes not at all (README
// "Performance"). The parent must be single-threaded when it forks (no thread of its own).
// POSIX only.
#pragma once

#include <functional>
#include <string>

namespace bandforge::cli {

class ChildJob {
 public:
  /// Forks; the child runs `work`, sends back what it returns (a short text) or the error it
  /// throws, and ends with _exit (no destructors, no flushing of the parent's buffers). Throws
  /// Error(internal) when the process cannot be made.
  explicit ChildJob(const std::function<std::string()>& work);
  /// If wait() was not called (the parent is leaving on an error), kills the child and reaps
  /// it, so that nothing writes into a staging folder being removed; never throws.
  ~ChildJob();
  ChildJob(const ChildJob&) = delete;
  ChildJob& operator=(const ChildJob&) = delete;

  /// Waits for the child and returns its text, or throws its error again: an Error with the
  /// child's exit status and message (BuildError and IoError keep their kind); a child that died
  /// of a signal is Error(internal).
  std::string wait();

 private:
  int pid_ = -1;
  int fd_ = -1;  ///< read end of the pipe the child reports on
};

}  // namespace bandforge::cli

#include "src/cli/child_job.hpp"

#include <sys/types.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <csignal>
#include <cstring>
#include <exception>

#include "src/errors.hpp"

namespace bandforge::cli {
namespace {

void write_all(int fd, const std::string& s) {
  std::size_t done = 0;
  while (done < s.size()) {
    const ssize_t n = ::write(fd, s.data() + done, s.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) return;  // the parent is gone: nothing to tell
    done += static_cast<std::size_t>(n);
  }
}

std::string read_all(int fd) {
  std::string out;
  char buf[4096];
  for (;;) {
    const ssize_t n = ::read(fd, buf, sizeof buf);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) break;
    out.append(buf, static_cast<std::size_t>(n));
  }
  return out;
}

}  // namespace

ChildJob::ChildJob(const std::function<std::string()>& work) {
  int fds[2];
  if (::pipe(fds) != 0) {
    throw Error(Exit::internal, std::string("cannot make a pipe for a child process: ") + std::strerror(errno));
  }
  const pid_t pid = ::fork();
  if (pid < 0) {
    const int e = errno;
    ::close(fds[0]);
    ::close(fds[1]);
    throw Error(Exit::internal, std::string("cannot start a child process: ") + std::strerror(e));
  }
  if (pid == 0) {
    ::close(fds[0]);
    // Report: the exit status as a number, a newline, then the text or the message.
    int code = 0;
    std::string text;
    try {
      text = work();
    } catch (const Error& e) {
      code = static_cast<int>(e.code());
      text = e.what();
    } catch (const std::exception& e) {
      code = static_cast<int>(Exit::internal);
      text = std::string("internal error: ") + e.what();
    } catch (...) {
      code = static_cast<int>(Exit::internal);
      text = "internal error: an unknown exception";
    }
    write_all(fds[1], std::to_string(code) + "\n" + text);
    ::close(fds[1]);
    ::_exit(code == 0 ? 0 : 1);
  }
  ::close(fds[1]);
  pid_ = pid;
  fd_ = fds[0];
}

std::string ChildJob::wait() {
  if (pid_ < 0) throw Error(Exit::internal, "a child process was waited for twice");
  // Read first: a report longer than the pipe holds would otherwise block the child.
  const std::string report = read_all(fd_);
  ::close(fd_);
  fd_ = -1;
  int status = 0;
  while (::waitpid(pid_, &status, 0) < 0 && errno == EINTR) {
  }
  pid_ = -1;
  if (WIFSIGNALED(status)) {
    throw Error(Exit::internal, std::string("a child process of bandforge ended by signal ") +
                                    std::to_string(WTERMSIG(status)) + " (" + strsignal(WTERMSIG(status)) +
                                    "): please report it");
  }
  const std::size_t nl = report.find('\n');
  if (nl == std::string::npos) {
    throw Error(Exit::internal, "a child process of bandforge ended without a report: please report it");
  }
  const int code = std::stoi(report.substr(0, nl));
  std::string text = report.substr(nl + 1);
  if (code == 0) return text;
  switch (static_cast<Exit>(code)) {
    case Exit::cannot_build: throw BuildError(text);
    case Exit::io: throw IoError(text);
    default: throw Error(static_cast<Exit>(code), text);
  }
}

ChildJob::~ChildJob() {
  if (pid_ < 0) return;
  // Not waited for: the parent is leaving on an error and its staged files go with it, so the
  // child's work is not needed. Stop it before the staging folder is removed.
  ::kill(pid_, SIGKILL);
  if (fd_ >= 0) ::close(fd_);
  int status = 0;
  while (::waitpid(pid_, &status, 0) < 0 && errno == EINTR) {
  }
}

}  // namespace bandforge::cli

// SPDX-License-Identifier: Apache-2.0
#include "gnuplot.h"

#include <cerrno>
#include <cstring>
#include <fcntl.h>
#include <filesystem>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>
#include <vector>

extern char** environ;

namespace quantacal::cli {
namespace {

/** Closes both ends of a pipe on scope exit. */
struct Pipe {
  int fd[2] = {-1, -1};
  ~Pipe() {
    for (int f : fd)
      if (f >= 0)
        ::close(f);
  }
  void close_end(int i) {
    if (fd[i] >= 0)
      ::close(fd[i]);
    fd[i] = -1;
  }
};

/** Everything the child writes to its standard error (read until end of file). */
std::string read_all(int fd) {
  std::string text;
  char buffer[4096];
  for (;;) {
    const ssize_t n = ::read(fd, buffer, sizeof buffer);
    if (n > 0)
      text.append(buffer, static_cast<std::size_t>(n));
    else if (n == 0 || errno != EINTR)
      break;
  }
  return text;
}

std::string first_line(const std::string& text) {
  const auto end = text.find('\n');
  return text.substr(0, end);
}

} // namespace

std::string run_gnuplot(const std::string& script_path) {
  namespace fs = std::filesystem;
  const fs::path script = fs::absolute(script_path);
  Pipe errors;
  if (::pipe2(errors.fd, O_CLOEXEC) != 0)
    return std::string("cannot start gnuplot: ") + std::strerror(errno);

  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, STDOUT_FILENO, "/dev/null", O_WRONLY, 0);
  posix_spawn_file_actions_adddup2(&actions, errors.fd[1], STDERR_FILENO);
  posix_spawn_file_actions_addchdir_np(&actions, script.parent_path().c_str());

  std::string program = "gnuplot";
  std::string argument = script.filename().string();
  std::vector<char*> argv{program.data(), argument.data(), nullptr};
  pid_t child = 0;
  const int spawned =
      ::posix_spawnp(&child, "gnuplot", &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  errors.close_end(1);
  if (spawned != 0)
    return spawned == ENOENT
               ? std::string("gnuplot not found")
               : std::string("cannot start gnuplot: ") + std::strerror(spawned);

  const std::string error_output = read_all(errors.fd[0]);
  int status = 0;
  while (::waitpid(child, &status, 0) < 0 && errno == EINTR) {
  }
  if (WIFEXITED(status) && WEXITSTATUS(status) == 0)
    return "";
  const std::string line = first_line(error_output);
  const std::string how = WIFEXITED(status)
                              ? "exit status " + std::to_string(WEXITSTATUS(status))
                              : std::string("killed by a signal");
  return "gnuplot failed (" + how + ")" + (line.empty() ? std::string() : ": " + line);
}

} // namespace quantacal::cli

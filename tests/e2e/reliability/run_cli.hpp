#pragma once
// The rimline binary run as a child process, and a synthetic network big enough that a run takes
// a noticeable time (so it can be interrupted part way). Values invented for the tests.
// clang-format off
// rimline headers first: <signal.h> defines a macro si_value that clashes with their parameter names.
#include "e2e/badinput/fixture.hpp"

#include <fcntl.h>
#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <string>
#include <thread>
#include <vector>
// clang-format on

namespace rimline::reliability {

inline std::string rimline_binary() { return std::string(test::binary_dir) + "/rimline"; }

// Starts `rimline args...` with stdout/stderr to /dev/null; returns the child's pid.
inline pid_t spawn_rimline(const std::vector<std::string>& args) {
  std::vector<std::string> all = {rimline_binary()};
  all.insert(all.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (auto& a : all) argv.push_back(a.data());
  argv.push_back(nullptr);
  const pid_t pid = ::fork();
  if (pid == 0) {
    const int devnull = ::open("/dev/null", O_WRONLY);
    ::dup2(devnull, 1);
    ::dup2(devnull, 2);
    ::execv(argv[0], argv.data());
    ::_exit(127);
  }
  return pid;
}

// Waits for the child; its exit code, or 128 + signal when a signal ended it.
inline int wait_child(pid_t pid) {
  int status = 0;
  while (::waitpid(pid, &status, 0) < 0) {
  }
  if (WIFEXITED(status)) return WEXITSTATUS(status);
  if (WIFSIGNALED(status)) return 128 + WTERMSIG(status);
  return -1;
}

inline int run_rimline(const std::vector<std::string>& args) { return wait_child(spawn_rimline(args)); }

// `trunks` straight trunks of `length` pipes each (50 m, 375 mm, 0.5 %), one outfall per trunk,
// 10 L/s into every manhole, written into the case directory with the fixture's project file.
inline void write_big_network(const badinput::Case& c, int trunks, int length) {
  using namespace badinput;
  std::vector<std::string> pipes, structures;
  for (int t = 0; t < trunks; ++t) {
    const double y = oy + 100.0 * t;
    const std::string tp = "T" + std::to_string(t) + "-";
    structures.push_back(structure(tp + "OF", "OUTFALL", ox, y, 4.0, 2.0, 0.0));
    for (int k = 1; k <= length; ++k) {
      const double x = ox - 50.0 * k, inv = 2.0 + 0.25 * k;
      structures.push_back(structure(tp + "M" + std::to_string(k), "MH", x, y, inv + 3.0, inv, 10.0));
      pipes.push_back(pipe(tp + "P" + std::to_string(k), x, y, x + 50.0, y, 375, inv, inv - 0.25));
    }
  }
  c.write_network(pipes, structures);
}

}  // namespace rimline::reliability

#pragma once
// The rimline executable run as a child for the catalogue's cases that are about exit codes and
// what is printed: stdout and stderr together, under a time limit so a case that hangs (a FIFO
// source before issue 18) fails instead of stopping the suite.
// clang-format off
// rimline headers first: <signal.h> (through <sys/wait.h>) defines a macro si_value that clashes with their parameter names.
#include "e2e/badinput/fixture.hpp"

#include <sys/wait.h>

#include <cstdio>
#include <string>
#include <vector>
// clang-format on

namespace rimline::badinput {

struct Ran {
  int code = -1;    // the exit code; 128 + N when signal N ended it (124 from `timeout`: it hung)
  std::string out;  // stdout and stderr together
};

inline std::string shell_quoted(const std::string& s) {
  std::string out = "'";
  for (char c : s) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}

// `rimline args...` from `cwd` (the test's working directory when empty), killed after `limit_s`.
inline Ran run_cli(const std::vector<std::string>& args, int limit_s = 60, const std::string& cwd = "") {
  std::string cmd = (cwd.empty() ? "" : "cd " + shell_quoted(cwd) + " && ") + "timeout -s KILL " +
                    std::to_string(limit_s) + " " + shell_quoted(std::string(test::binary_dir) + "/rimline");
  for (const auto& a : args) cmd += " " + shell_quoted(a);
  cmd += " 2>&1";
  Ran r;
  FILE* p = popen(cmd.c_str(), "r");
  REQUIRE(p != nullptr);
  char buf[4096];
  std::size_t n = 0;
  while ((n = std::fread(buf, 1, sizeof buf, p)) > 0) r.out.append(buf, n);
  const int status = pclose(p);
  r.code = WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
  if (r.code == 137) r.code = 124;  // timeout -s KILL
  return r;
}

}  // namespace rimline::badinput

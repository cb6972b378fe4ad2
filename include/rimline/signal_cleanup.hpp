#pragma once
// Paths a run creates and must not leave behind when it is stopped by SIGINT or SIGTERM: the
// staging folder of the outputs, private copies of inputs. The library registers and releases
// them; the command line's signal watcher (src/cli/main.cpp) removes what is registered, then ends
// the process. A library user without such a watcher loses nothing: the destructors clean up.
#include <string>

namespace rimline {

void register_for_cleanup(const std::string& path);  // a file, or a folder removed with its content
void release_from_cleanup(const std::string& path);  // the owner removed it (or keeps it) itself

// Removes every registered path (folders first renamed aside, so a writer still running cannot
// add to them), then forgets them. Called by the signal watcher; safe to call from any thread.
void remove_registered_paths() noexcept;

}  // namespace rimline

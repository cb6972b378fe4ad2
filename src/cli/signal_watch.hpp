#pragma once
// SIGINT and SIGTERM end a run without leaving its temporaries behind (the staging folder of the
// outputs, private copies of inputs: rimline/signal_cleanup.hpp). The signals are blocked in every
// thread and taken by one watcher thread with sigwait, so the cleanup runs as ordinary code, not
// in a signal handler; the watcher then ends the process by the same signal (exit status 128 + N).
namespace rimline::cli {

// Call at the start of main, before any thread exists (threads inherit the blocked signals).
void watch_stop_signals();

}  // namespace rimline::cli

#include "cli/signal_watch.hpp"

#include <pthread.h>
#include <signal.h>

#include <thread>

#include "rimline/signal_cleanup.hpp"

namespace rimline::cli {

void watch_stop_signals() {
  sigset_t stop;
  sigemptyset(&stop);
  sigaddset(&stop, SIGINT);
  sigaddset(&stop, SIGTERM);
  if (pthread_sigmask(SIG_BLOCK, &stop, nullptr) != 0) return;  // the defaults stay: no cleanup, no harm
  std::thread([stop] {
    int sig = 0;
    if (sigwait(&stop, &sig) != 0) return;
    remove_registered_paths();
    // Ended by the signal itself, as without the watcher: the shell sees 128 + N.
    ::signal(sig, SIG_DFL);
    sigset_t one;
    sigemptyset(&one);
    sigaddset(&one, sig);
    pthread_sigmask(SIG_UNBLOCK, &one, nullptr);
    ::raise(sig);
  }).detach();
}

}  // namespace rimline::cli

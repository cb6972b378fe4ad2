#pragma once
// Large pages for the heap of a whole-network check (see heap_pages.cpp).
namespace rimline::cli {

// On glibc >= 2.35 with transparent huge pages available, restarts the process once (same pid,
// same arguments) with glibc's malloc told to ask for them. Returns when it does not restart:
// another C library, the tunable already set by the user, no huge pages, or exec failing.
void restart_with_huge_pages(char** argv);

}  // namespace rimline::cli

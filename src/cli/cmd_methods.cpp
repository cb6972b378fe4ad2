// `rimline methods`: the methods and default criteria with their sources.
#include <iostream>

#include "cli/commands.hpp"
#include "rimline/method_registry.hpp"

namespace rimline::cli {

std::function<int()> setup_methods(CLI::App& app, const GlobalOptions&) {
  app.footer("Example:\n  rimline methods");
  return [] {
    std::string_view group;
    for (const auto& r : method_rows()) {
      if (r.group != group) {
        group = r.group;
        std::cout << "\n" << group << ":\n";
      }
      std::cout << "  " << r.id << "  " << r.name << "\n      " << r.description << "\n      source: " << r.source
                << "\n";
    }
    return static_cast<int>(exit_ok);
  };
}

}  // namespace rimline::cli

#include "report/sheet_text.hpp"

#include <cstdlib>
#include <ctime>
#include <sstream>

namespace rimline::report {

std::string flow_case_text(const run::CheckRun& run) {
  if (run.catchment_flows) return run.catchment_flows->method;
  return run.project.flow_mode == config::FlowMode::pipe_field
             ? "design flows from the pipe layer"
             : "local inflows at structures, accumulated downstream";
}

std::string units_text(units::System system) {
  using units::Dimension;
  auto sym = [&](Dimension d) { return std::string(units::unit_symbol(units::display_unit(d, system))); };
  return std::string(system == units::System::us ? "US customary" : "SI") + ": " + sym(Dimension::length) + ", " +
         sym(Dimension::flow) + ", " + sym(Dimension::velocity);
}

std::string report_date() {
  std::time_t t = std::time(nullptr);
  if (const char* epoch = std::getenv("SOURCE_DATE_EPOCH")) {
    char* end = nullptr;
    const long long v = std::strtoll(epoch, &end, 10);
    if (end != epoch && *end == '\0' && v >= 0) t = static_cast<std::time_t>(v);
  }
  std::tm tm{};
  gmtime_r(&t, &tm);
  char buf[16];
  std::strftime(buf, sizeof buf, "%Y-%m-%d", &tm);
  return buf;
}

std::vector<std::string> wrap_words(const std::string& text, std::size_t chars) {
  std::vector<std::string> lines;
  std::istringstream in(text);
  std::string word, line;
  while (in >> word) {
    if (!line.empty() && line.size() + 1 + word.size() > chars) {
      lines.push_back(line);
      line.clear();
    }
    line += (line.empty() ? "" : " ") + word;
  }
  if (!line.empty()) lines.push_back(line);
  return lines;
}

}  // namespace rimline::report

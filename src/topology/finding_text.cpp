#include "rimline/topology/finding_text.hpp"

#include <cstdio>

namespace rimline::topology {

std::string fixed(double value, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, value);
  return buf;
}

Finding conduit_finding(const model::Conduit& c, std::string code, Severity severity, std::string message) {
  Finding f;
  f.code = std::move(code);
  f.severity = severity;
  f.layer = LayerRole::conduits;
  f.feature_id = c.id;
  f.fid = c.fid;
  f.message = std::move(message);
  return f;
}

Finding structure_finding(const model::Structure& s, std::string code, Severity severity, std::string message) {
  Finding f;
  f.code = std::move(code);
  f.severity = severity;
  f.layer = LayerRole::structures;
  f.feature_id = s.id;
  f.fid = s.fid;
  f.message = std::move(message);
  return f;
}

namespace {
std::string label_of(const std::string& id, std::int64_t fid, std::size_t index) {
  if (!id.empty()) return id;
  if (fid >= 0) return "fid " + std::to_string(fid);
  return "#" + std::to_string(index);
}
}  // namespace

std::string label(const model::Conduit& c, std::size_t index) { return label_of(c.id, c.fid, index); }
std::string label(const model::Structure& s, std::size_t index) { return label_of(s.id, s.fid, index); }

}  // namespace rimline::topology

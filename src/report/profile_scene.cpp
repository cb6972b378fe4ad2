#include "report/profile_scene.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <optional>
#include <set>
#include <string_view>
#include <unordered_set>

#include "rimline/report/outputs.hpp"

namespace rimline::report {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

struct Converter {
  units::System sys;
  double operator()(double si) const {
    return std::isfinite(si) ? to_report(si, units::Dimension::length, sys) : nan;
  }
};

std::string size_text(const hydraulics::Section& s, units::System sys) {
  const auto u = sys == units::System::us ? units::Unit::in : units::Unit::mm;
  char buf[64];
  if (s.shape != hydraulics::Shape::circular)  // box, egg, table: width x height, and the shape unless a box
    std::snprintf(buf, sizeof buf, "%s%.0f x %.0f %s", s.shape == hydraulics::Shape::box ? "" : (s.shape == hydraulics::Shape::egg ? "egg " : "table "),
                  units::from_si(s.width_m, u), units::from_si(s.height_m, u), std::string(units::unit_symbol(u)).c_str());
  else
    std::snprintf(buf, sizeof buf, "%.0f %s", units::from_si(s.diameter_m, u), std::string(units::unit_symbol(u)).c_str());
  return buf;
}

// A polyline that starts a new part at a non-finite point.
struct LineBuilder {
  SceneLine line;
  bool open = false;
  void add(double x, double y) {
    if (!std::isfinite(x) || !std::isfinite(y)) {
      open = false;
      return;
    }
    if (!open) line.parts.emplace_back();
    open = true;
    line.parts.back().push_back({x, y});
  }
  void gap() { open = false; }
};

// Inverts of a pipe as the march used them, else as mapped, else the structures' inverts.
std::pair<double, double> pipe_inverts(const model::Network& net, const solve::ConduitResult& r, std::size_t ci) {
  const auto& c = net.conduits[ci];
  if (r.solved) return {r.invert_down_m, r.invert_up_m};
  const double down = c.invert_down_m.value_or(net.structures[c.to].invert_m.value_or(nan));
  const double up = c.invert_up_m.value_or(net.structures[c.from].invert_m.value_or(nan));
  return {down, up};
}

void extend(ProfileScene& s, double y) {
  if (!std::isfinite(y)) return;
  s.y_min = std::min(s.y_min, y);
  s.y_max = std::max(s.y_max, y);
}

}  // namespace

namespace {

std::string feature_key(LayerRole layer, const std::string& id) {
  return std::string(1, static_cast<char>('0' + static_cast<int>(layer))) + id;
}

// Where a finding is drawn: structures at their station, conduits mid-pipe. False when the
// feature is not on the path.
bool place(const ProfileScene& scene, const Finding& f, units::System system, SceneMarker& m) {
  m = SceneMarker{0, nan, nan, f.severity, f.code, f.feature_id, ""};
  if (f.layer == LayerRole::structures) {
    const auto it = std::find_if(scene.structures.begin(), scene.structures.end(),
                                 [&](const SceneStructure& s) { return s.id == f.feature_id; });
    if (it == scene.structures.end()) return false;
    m.station = it->station;
    for (double v : {it->hgl, it->rim, it->crown, it->bottom}) {
      if (std::isfinite(v)) {
        m.elevation = v;
        break;
      }
    }
  } else if (f.layer == LayerRole::conduits || f.layer == LayerRole::force_mains) {
    const auto it = std::find_if(scene.pipes.begin(), scene.pipes.end(),
                                 [&](const ScenePipe& p) { return p.id == f.feature_id; });
    if (it == scene.pipes.end()) return false;
    m.station = 0.5 * (it->station_down + it->station_up);
    m.elevation = 0.5 * (it->invert_down + it->invert_up) + it->rise;
  } else {
    return false;
  }
  if (!std::isfinite(m.elevation)) m.elevation = scene.y_min;
  m.text = render_message(f.message, system);  // only for findings that are drawn
  return true;
}

std::vector<SceneMarker> number_markers(std::vector<SceneMarker> out) {
  std::stable_sort(out.begin(), out.end(), [](const SceneMarker& a, const SceneMarker& b) {
    return a.station != b.station ? a.station < b.station : a.severity > b.severity;
  });
  for (std::size_t i = 0; i < out.size(); ++i) out[i].number = static_cast<int>(i + 1);
  return out;
}

}  // namespace

FindingIndex::FindingIndex(const run::CheckRun& run, const std::vector<ProfileSheet>* sheets) {
  // Ids on the sheets (structures, and conduits or force mains by the conduit's id): a superset
  // of what build_scene asks for, matched by id whatever the layer.
  std::unordered_set<std::string_view> wanted;
  if (sheets) {
    const auto& net = run.read.network;
    for (const auto& sheet : *sheets) {
      for (std::size_t s : sheet.path.structures) wanted.insert(net.structures[s].id);
      for (std::size_t c : sheet.path.conduits) wanted.insert(net.conduits[c].id);
    }
  }
  auto add = [&](const Finding& f, std::size_t list, std::size_t i) {
    if (sheets && !wanted.count(f.feature_id)) return;
    by_feature_[feature_key(f.layer, f.feature_id)].push_back({list, i, &f});
  };
  for (std::size_t k = 0; k < run.cases.size(); ++k)
    for (std::size_t i = 0; i < run.cases[k].findings.size(); ++i) add(run.cases[k].findings[i], k, i);
  for (std::size_t i = 0; i < run.data_findings.size(); ++i) add(run.data_findings[i], data_list, i);
}

std::vector<FindingIndex::Entry> FindingIndex::concerning(std::size_t case_index, LayerRole layer,
                                                           const std::string& id) const {
  std::vector<Entry> out;
  const auto it = by_feature_.find(feature_key(layer, id));
  if (it == by_feature_.end()) return out;
  for (const auto& e : it->second)
    if (e.list == case_index || e.list == data_list) out.push_back(e);
  return out;
}

ProfileScene build_scene(const run::CheckRun& run, const ProfilePath& path, std::size_t case_index, int number,
                         const FindingIndex* index) {
  const auto& net = run.read.network;
  const auto& kase = run.cases.at(case_index);
  const Converter cv{run.report_units};
  ProfileScene s;
  s.system = run.report_units;
  s.length_unit = std::string(units::unit_symbol(units::display_unit(units::Dimension::length, s.system)));
  s.metres_per_unit = units::to_si(1.0, units::display_unit(units::Dimension::length, s.system));
  s.freeboard = cv(run.criteria.freeboard_m);
  s.number = number;
  s.case_label = render_message(kase.label, s.system);
  s.outfall_id = net.structures.at(path.structures.front()).id;
  s.head_id = net.structures.at(path.structures.back()).id;
  s.y_min = std::numeric_limits<double>::infinity();
  s.y_max = -std::numeric_limits<double>::infinity();

  for (std::size_t i = 0; i < path.structures.size(); ++i) {
    const std::size_t si = path.structures[i];
    const auto& st = net.structures[si];
    const auto& r = kase.march.structures[si];
    SceneStructure ss{st.id, cv(path.station_m[i]), cv(st.rim_m.value_or(nan)), cv(st.invert_m.value_or(nan)),
                      r.solved ? cv(r.hgl_m) : nan, nan, nan, i == 0};
    extend(s, ss.rim);
    extend(s, ss.invert);
    extend(s, ss.hgl);
    s.structures.push_back(ss);
  }
  for (std::size_t i = 0; i < path.conduits.size(); ++i) {
    const std::size_t ci = path.conduits[i];
    const auto& c = net.conduits[ci];
    const auto& r = kase.march.conduits[ci];
    const auto [down, up] = pipe_inverts(net, r, ci);
    ScenePipe p{c.id, cv(path.station_m[i]), cv(path.station_m[i + 1]), cv(down), cv(up),
                cv(hydraulics::rise_m(c.section)), size_text(c.section, s.system), "", r.solved, nan, nan, "", "", ""};
    if (r.solved) {
      p.flow_text = display_number(r.flow_m3_s, units::Dimension::flow, s.system);
      double v = 0.0;
      for (const auto& pt : r.profile.points) v = std::max(v, pt.velocity_m_s);
      p.velocity_text = display_number(v, units::Dimension::velocity, s.system);
    }
    if (c.length_m > 0.0) p.length_text = distance_number(c.length_m, s.system);
    if (c.length_m > 0.0 && std::isfinite(up - down)) {
      char buf[32];
      std::snprintf(buf, sizeof buf, "%.2f %%", 100.0 * (up - down) / (p.station_up - p.station_down));
      p.slope_text = buf;
    }
    extend(s, p.invert_down);
    extend(s, p.invert_up);
    extend(s, p.invert_up + p.rise);
    extend(s, p.invert_down + p.rise);
    s.pipes.push_back(p);
  }

  // Where a structure's own levels are missing, the pipes meeting it still place it.
  for (std::size_t i = 0; i < s.structures.size(); ++i) {
    auto& st = s.structures[i];
    double low = st.invert, high = nan;
    auto meet = [&](double invert, double rise) {
      if (!std::isfinite(invert)) return;
      low = std::isfinite(low) ? std::min(low, invert) : invert;
      high = std::isfinite(high) ? std::max(high, invert + rise) : invert + rise;
    };
    if (i > 0) meet(s.pipes[i - 1].invert_up, s.pipes[i - 1].rise);
    if (i < s.pipes.size()) meet(s.pipes[i].invert_down, s.pipes[i].rise);
    st.bottom = std::isfinite(st.invert) ? st.invert : low;
    st.crown = high;
  }

  // Ground and freeboard lines join the rims; inverts and crowns follow each pipe.
  LineBuilder ground{{Stroke::ground, {}}}, freeboard{{Stroke::freeboard, {}}};
  for (const auto& st : s.structures) {
    ground.add(st.station, st.rim);
    freeboard.add(st.station, st.rim - s.freeboard);
  }
  LineBuilder invert{{Stroke::invert, {}}}, crown{{Stroke::crown, {}}};
  for (const auto& p : s.pipes) {
    invert.gap();
    crown.gap();
    invert.add(p.station_down, p.invert_down);
    invert.add(p.station_up, p.invert_up);
    crown.add(p.station_down, p.invert_down + p.rise);
    crown.add(p.station_up, p.invert_up + p.rise);
  }

  // HGL and EGL through every step point; at a structure the line steps from the pipe below's
  // inlet to the pool level and on to the outlet of the pipe above (exit and structure losses).
  LineBuilder hgl{{Stroke::hgl, {}}}, egl{{Stroke::egl, {}}};
  for (std::size_t i = 0; i < path.structures.size(); ++i) {
    const auto& st = s.structures[i];
    const auto& sr = kase.march.structures[path.structures[i]];
    hgl.add(st.station, sr.solved ? cv(sr.hgl_m) : nan);
    egl.add(st.station, sr.solved ? cv(sr.egl_m) : nan);
    if (i + 1 == path.structures.size()) break;
    const std::size_t ci = path.conduits[i];
    const auto& r = kase.march.conduits[ci];
    if (!r.solved || r.profile.points.empty()) {
      hgl.gap();
      egl.gap();
      continue;
    }
    // Step stations run over the length the march used; scale them onto the drawn pipe.
    const double drawn = s.pipes[i].station_up - s.pipes[i].station_down;
    const double marched = cv(r.profile.inlet().station_m);
    const double k = marched > 0.0 ? drawn / marched : 0.0;
    auto& pipe = s.pipes[i];
    if (r.profile.jump_station_m) {
      pipe.jump_station = pipe.station_down + k * cv(*r.profile.jump_station_m);
      double nearest = std::numeric_limits<double>::infinity();
      for (const auto& pt : r.profile.points) {
        const double d = std::fabs(pt.station_m - *r.profile.jump_station_m);
        if (d < nearest) {
          nearest = d;
          pipe.jump_elevation = cv(pt.hgl_m);
        }
      }
    }
    for (const auto& pt : r.profile.points) {
      const double x = s.pipes[i].station_down + k * cv(pt.station_m);
      hgl.add(x, cv(pt.hgl_m));
      egl.add(x, cv(pt.egl_m));
      extend(s, cv(pt.hgl_m));
      extend(s, cv(pt.egl_m));
    }
  }
  s.lines = {ground.line, freeboard.line, invert.line, crown.line, hgl.line, egl.line};
  if (!std::isfinite(s.y_min)) {
    s.y_min = 0.0;
    s.y_max = 1.0;
  }
  s.x_min = 0.0;
  s.x_max = std::max(s.structures.back().station, 1e-3);

  // The same order as placing the case's findings, then the run's data findings, one by one.
  std::optional<FindingIndex> local;
  if (!index) index = &local.emplace(run);
  std::vector<FindingIndex::Entry> hits;
  auto gather = [&](LayerRole layer, const std::string& id) {
    for (const auto& e : index->concerning(case_index, layer, id)) hits.push_back(e);
  };
  std::set<std::string> seen;  // an id twice on a path (duplicate ids) is gathered once
  for (const auto& st : s.structures)
    if (seen.insert("s" + st.id).second) gather(LayerRole::structures, st.id);
  for (const auto& p : s.pipes) {
    if (!seen.insert("c" + p.id).second) continue;
    gather(LayerRole::conduits, p.id);
    gather(LayerRole::force_mains, p.id);
  }
  std::sort(hits.begin(), hits.end(), [](const FindingIndex::Entry& a, const FindingIndex::Entry& b) {
    const bool a_data = a.list == FindingIndex::data_list, b_data = b.list == FindingIndex::data_list;
    return a_data != b_data ? !a_data : a.position < b.position;
  });
  std::vector<SceneMarker> markers;
  for (const auto& h : hits) {
    SceneMarker m;
    if (place(s, *h.finding, s.system, m)) markers.push_back(std::move(m));
  }
  s.markers = number_markers(std::move(markers));
  return s;
}

std::vector<SceneMarker> place_findings(const ProfileScene& scene, const Findings& findings, units::System system) {
  std::vector<SceneMarker> out;
  for (const auto& f : findings) {
    SceneMarker m;
    if (place(scene, f, system, m)) out.push_back(std::move(m));
  }
  return number_markers(std::move(out));
}

std::string pipe_size_text(const hydraulics::Section& section, units::System system) { return size_text(section, system); }

}  // namespace rimline::report

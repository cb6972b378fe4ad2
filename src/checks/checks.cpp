#include "rimline/checks/checks.hpp"

#include <algorithm>
#include <cmath>
#include <exception>
#include <iterator>
#include <sstream>
#include <thread>
#include <vector>

#include "rimline/hydraulics/friction.hpp"
#include "rimline/hydraulics/section.hpp"

namespace rimline::checks {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();
constexpr std::size_t parallel_from = 4096;  // conduits; below, a thread costs more than it saves
constexpr std::size_t max_threads = 8;       // conduit ranges at most, one per core
constexpr auto L = units::Dimension::length;
constexpr auto V = units::Dimension::velocity;

std::string fmt(double v, int decimals = 2) {
  std::ostringstream s;
  s.setf(std::ios::fixed);
  s.precision(decimals);
  s << v;
  return s.str();
}


// The basis, in words, before the velocity.
std::string velocity_low_text(const SelfCleansingVelocity& v, double flow_m3_s) {
  const std::string flow = q(flow_m3_s, units::Dimension::flow);
  if (v.basis == "normal_depth") return "at normal depth the design flow " + flow + " moves at";
  if (v.basis == "full_flow") return "flowing full at its slope (the self-cleansing basis chosen) it moves at";
  if (v.basis == "full_at_design_flow")
    return "the design flow " + flow + " exceeds the largest partly-full discharge, so it runs full at";
  return "with no normal depth on its flat or adverse slope, the velocity of the march falls to";
}

void check_structure(const model::Structure& s, const solve::StructureResult& r, double freeboard_m, Findings& out) {
  if (!r.solved) return;
  if (!s.rim_m) {
    out.push_back({"RIM_UNKNOWN", Severity::info, LayerRole::structures, s.id, "rim", nan, nan,
                   units::Dimension::length,
                   "structure " + s.id + " has no rim level, so freeboard and flooding could not be checked."});
    return;
  }
  const double fb = *s.rim_m - r.hgl_m;
  if (fb < 0.0) {
    out.push_back({"FLOODED", Severity::error, LayerRole::structures, s.id, "", fb, 0.0, units::Dimension::length,
                   "structure " + s.id + ": the HGL (" + q(r.hgl_m, L) + ") is " + q(-fb, L) + " above the rim (" +
                       q(*s.rim_m, L) + "); water leaves the system here."});
  } else if (fb < freeboard_m) {
    out.push_back({"FREEBOARD", Severity::error, LayerRole::structures, s.id, "", fb, freeboard_m,
                   units::Dimension::length,
                   "structure " + s.id + ": the HGL (" + q(r.hgl_m, L) + ") is " + q(fb, L) +
                       " below the rim, less than the required " + q(freeboard_m, L) + "."});
  }
}

void check_conduit(const model::Network& net, std::size_t ci, const solve::ConduitResult& r, const Criteria& c,
                   Findings& out) {
  const auto& p = net.conduits[ci];
  if (!r.solved) return;
  const auto& prof = r.profile;
  const double rise = hydraulics::rise_m(p.section);
  const auto [surcharged, crown_excess] = surcharge_of(p, r);
  if (surcharged) {
    out.push_back({"SURCHARGED", Severity::warning, LayerRole::conduits, p.id, "", std::max(crown_excess, 0.0), 0.0,
                   units::Dimension::length,
                   "pipe " + p.id + " runs surcharged over " + q_distance(prof.surcharged_length_m) + " of its " +
                       q_distance(p.length_m) + "; the HGL stands up to " + q(std::max(crown_excess, 0.0), L) +
                       " above the crown."});
  }
  if (r.flow_m3_s <= 0.0) return;
  const auto low = self_cleansing_velocity(p, r, c.velocity_basis);
  if (low.velocity_m_s < c.velocity_min_m_s) {
    out.push_back({"VELOCITY_LOW", Severity::warning, LayerRole::conduits, p.id, "", low.velocity_m_s,
                   c.velocity_min_m_s, units::Dimension::velocity,
                   "pipe " + p.id + ": " + velocity_low_text(low, r.flow_m3_s) + " " + q(low.velocity_m_s, V) +
                       ", below the minimum " + q(c.velocity_min_m_s, V) + " (sediment may settle)."});
  }
  const double v_high = highest_velocity_m_s(r);
  if (c.velocity_max_m_s && v_high > *c.velocity_max_m_s) {
    out.push_back({"VELOCITY_HIGH", Severity::warning, LayerRole::conduits, p.id, "", v_high, *c.velocity_max_m_s,
                   units::Dimension::velocity,
                   "pipe " + p.id + ": the highest velocity along it reaches " + q(v_high, V) + ", above the maximum " +
                       q(*c.velocity_max_m_s, V) + " (scour; erosion protection may be needed)."});
  }
  if (std::isfinite(r.capacity_m3_s) && r.capacity_m3_s > 0.0) {
    const double ratio = r.flow_m3_s / r.capacity_m3_s;
    if (ratio > c.capacity_ratio_max) {
      out.push_back({"CAPACITY", Severity::warning, LayerRole::conduits, p.id, "", ratio, c.capacity_ratio_max,
                     units::Dimension::dimensionless,
                     "pipe " + p.id + ": the design flow " + q(r.flow_m3_s, units::Dimension::flow) + " is " +
                         fmt(ratio * 100.0, 0) + "% of its full-flow capacity " + q(r.capacity_m3_s, units::Dimension::flow) +
                         ", above the allowed " + fmt(c.capacity_ratio_max * 100.0, 0) + "%."});
    }
  }
  if (c.cover_min_m) {
    const auto& up = net.structures[p.from];
    const auto& down = net.structures[p.to];
    double cover = std::numeric_limits<double>::infinity();
    if (up.rim_m) cover = std::min(cover, *up.rim_m - (r.invert_up_m + rise));
    if (down.rim_m) cover = std::min(cover, *down.rim_m - (r.invert_down_m + rise));
    if (std::isfinite(cover) && cover < *c.cover_min_m) {
      out.push_back({"COVER", Severity::warning, LayerRole::conduits, p.id, "", cover, *c.cover_min_m,
                     units::Dimension::length,
                     "pipe " + p.id + ": the cover over the crown at a structure is " + q(cover, L) +
                         ", less than the minimum " + q(*c.cover_min_m, L) + "."});
    }
  }
}

}  // namespace

Findings run_checks(const model::Network& network, const solve::MarchResult& result, const Criteria& criteria,
                    const CriteriaOverrides& overrides) {
  // Each check reads only its own feature and result, so a city's conduits are cut into ranges
  // checked on every core (the structures, ~1/20 of the work, beside the first range), and the
  // lists are joined in the serial order: structures, then conduits.
  const std::size_t n = network.conduits.size();
  const std::size_t parts =
      n < parallel_from ? 1 : std::clamp<std::size_t>(std::thread::hardware_concurrency(), 1, max_threads);
  std::vector<Findings> found(parts + 1);  // [0]: structures, [1 + k]: conduit range k
  std::vector<std::exception_ptr> failed(parts + 1);
  auto conduit_range = [&](std::size_t k) {
    try {
      for (std::size_t ci = n * k / parts; ci < n * (k + 1) / parts; ++ci) {
        const std::size_t first = found[1 + k].size();
        check_conduit(network, ci, result.conduits[ci], criteria_for(criteria, overrides.conduits, network.conduits[ci].id),
                      found[1 + k]);
        stamp_fid(found[1 + k], first, network.conduits[ci].fid);
      }
    } catch (...) {
      failed[1 + k] = std::current_exception();
    }
  };
  {
    std::vector<std::jthread> threads;
    for (std::size_t k = 1; k < parts; ++k) threads.emplace_back(conduit_range, k);
    try {
      for (std::size_t s = 0; s < network.structures.size(); ++s) {
        const auto& id = network.structures[s].id;
        const std::size_t first = found[0].size();
        check_structure(network.structures[s], result.structures[s],
                        criteria_for(criteria, overrides.structures, id).freeboard_m, found[0]);
        stamp_fid(found[0], first, network.structures[s].fid);
      }
    } catch (...) {
      failed[0] = std::current_exception();
    }
    conduit_range(0);
  }  // joined
  for (const auto& e : failed)
    if (e) std::rethrow_exception(e);
  if (parts == 1 && found[1].empty()) return std::move(found[0]);
  std::size_t total = 0;
  for (const auto& f : found) total += f.size();
  Findings out;
  out.reserve(total);
  for (auto& f : found) {
    std::move(f.begin(), f.end(), std::back_inserter(out));
    Findings().swap(f);
  }
  return out;
}

SelfCleansingVelocity self_cleansing_velocity(const model::Conduit& conduit, const solve::ConduitResult& r,
                                              VelocityBasis basis) {
  SelfCleansingVelocity out;
  if (!r.solved) return out;
  const double q = std::max(0.0, r.flow_m3_s);
  const double full_area = hydraulics::full_geometry(conduit.section).area_m2;
  if (basis == VelocityBasis::full_flow && std::isfinite(r.capacity_m3_s)) {
    out.velocity_m_s = r.capacity_m3_s / full_area;
    out.basis = "full_flow";
  } else if (basis == VelocityBasis::normal_depth && r.slope > 0.0) {
    // The march found the normal depth of this flow at this slope (NaN: above the partly-full peak).
    const double yn = r.profile.normal_depth_m;
    if (std::isfinite(yn) && yn > 0.0) {
      out.velocity_m_s = q / hydraulics::geometry_at(conduit.section, yn).area_m2;
      out.basis = "normal_depth";
    } else {
      out.velocity_m_s = q / full_area;
      out.basis = "full_at_design_flow";
    }
  } else {
    out.velocity_m_s = std::min(r.profile.outlet().velocity_m_s, r.profile.inlet().velocity_m_s);
    out.basis = "marched";
  }
  return out;
}

Surcharge surcharge_of(const model::Conduit& conduit, const solve::ConduitResult& r) {
  Surcharge s;
  if (!r.solved) return s;
  const double rise = hydraulics::rise_m(conduit.section);
  s.crown_excess_m = std::max(r.profile.outlet().hgl_m - (r.invert_down_m + rise), r.profile.inlet().hgl_m - (r.invert_up_m + rise));
  s.surcharged = r.profile.surcharged_length_m > 0.0 || s.crown_excess_m > 1e-6;
  return s;
}

double highest_velocity_m_s(const solve::ConduitResult& r) {
  double v = 0.0;
  for (const auto& pt : r.profile.points) v = std::max(v, pt.velocity_m_s);
  return v;
}

std::string_view velocity_basis_name(VelocityBasis b) { return b == VelocityBasis::full_flow ? "full_flow" : "normal_depth"; }

Findings check_features(const model::Network& network, const solve::MarchResult& result, const Criteria& criteria,
                        const CriteriaOverrides& overrides, const std::vector<std::size_t>& structures,
                        const std::vector<std::size_t>& conduits) {
  Findings out;
  for (std::size_t s : structures) {
    const auto& st = network.structures[s];
    const std::size_t first = out.size();
    check_structure(st, result.structures[s], criteria_for(criteria, overrides.structures, st.id).freeboard_m, out);
    stamp_fid(out, first, st.fid);
  }
  for (std::size_t ci : conduits) {
    const std::size_t first = out.size();
    check_conduit(network, ci, result.conduits[ci], criteria_for(criteria, overrides.conduits, network.conduits[ci].id),
                  out);
    stamp_fid(out, first, network.conduits[ci].fid);
  }
  return out;
}

Criteria criteria_for(const Criteria& run, const std::map<std::string, Override>& overrides, const std::string& id) {
  const auto it = overrides.find(id);
  if (it == overrides.end()) return run;
  Criteria c = run;
  const Override& o = it->second;
  if (o.freeboard_m) c.freeboard_m = *o.freeboard_m;
  if (o.velocity_min_m_s) c.velocity_min_m_s = *o.velocity_min_m_s;
  if (o.velocity_max_m_s) c.velocity_max_m_s = o.velocity_max_m_s;
  if (o.capacity_ratio_max) c.capacity_ratio_max = *o.capacity_ratio_max;
  if (o.cover_min_m) c.cover_min_m = o.cover_min_m;
  if (o.velocity_basis) c.velocity_basis = *o.velocity_basis;
  return c;
}

std::string structure_status(const model::Structure& s, const solve::StructureResult& r, double freeboard_m) {
  if (!r.solved) return "not_checked";
  if (!s.rim_m) return "unknown_rim";
  const double fb = *s.rim_m - r.hgl_m;
  if (fb < 0.0) return "flooded";
  if (fb < freeboard_m) return "freeboard";
  return "ok";
}

}  // namespace rimline::checks

// Inverts and structure levels. Two numeric pipe fields are the inverts when, pipe by pipe, they lie
// close together against the spread of the network's levels and one pipe's downstream value meets the
// next pipe's upstream value where they join; the one that is higher in most pipes is upstream. The
// unit: the name's, else the slopes' magnitude (millimetres give slopes 1000 times too steep), else
// feet where anything else says US customary. Structure levels: a field above the connected inverts by
// a plausible cover is the rim, one at or just below the lowest connected invert is the structure invert.
#include <algorithm>
#include <cmath>
#include <unordered_map>

#include "mapping/field_words.hpp"
#include "mapping/inference.hpp"

namespace rimline::mapping::detail {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();
using units::Unit;

std::string sym(Unit u) { return std::string(units::unit_symbol(u)); }

double quantile(std::vector<double> v, double q) {
  if (v.empty()) return nan;
  const auto k = static_cast<std::ptrdiff_t>(q * static_cast<double>(v.size() - 1));
  std::nth_element(v.begin(), v.begin() + k, v.end());
  return v[static_cast<std::size_t>(k)];
}

struct PairFit {
  std::size_t a = npos, b = npos;
  double closeness = nan, agreement = nan, fall = nan, spread = nan, score = -1.0;
  std::size_t joins = 0;
};

}  // namespace

std::optional<Unit> Inference::level_unit(const Column& a, const Column* b, std::string& why) const {
  std::optional<Unit> named = units::unit_named_in(a.name());
  if (named && (units::dimension_of(*named) != units::Dimension::length || *named == Unit::in)) named.reset();
  std::vector<double> slopes;
  if (b)
    for (std::size_t r = 0; r < pipes_.rows; ++r) {
      const double L = pipes_.summary->rows.length_m[r], x = a.number(r), y = b->number(r);
      if (L > 0.0 && std::isfinite(x) && std::isfinite(y) && x != y) slopes.push_back(std::abs(x - y) / L);
    }
  const double s = slopes.size() >= 5 ? median(slopes) : nan;
  const std::string slope_text = std::isfinite(s) ? "median |difference| / plan length " + number_text(s) : "";
  if (std::isfinite(s) && s >= 0.3 && (!named || *named == Unit::m || *named == Unit::mm)) {
    why = slope_text + ": 1000 times a sewer's slope, so millimetres" +
          (named == Unit::m ? " (the name says m: the values do not)" : "");
    return Unit::mm;
  }
  if (named) {
    why = "the name states " + sym(*named) + (slope_text.empty() ? "" : "; " + slope_text + " fits");
    return named;
  }
  if (us_hint_) {
    why = "feet: " + us_why_ + (slope_text.empty() ? "" : "; " + slope_text + " fits");
    return system_length();
  }
  why = "metres: nothing says feet" + (slope_text.empty() ? std::string() : "; " + slope_text + " fits metres");
  return Unit::m;
}

void Inference::inverts() {
  std::vector<std::size_t> cand;
  for (const auto& c : pipes_.columns)
    if (!pipes_.used(c.index) && c.numeric && c.numbers * 10 >= pipes_.rows * 3 && c.distinct >= std::min<std::size_t>(5, pipes_.rows) &&
        c.distinct * 4 >= c.nonnull)
      cand.push_back(c.index);
  // Joins: a pipe arriving at a node and one leaving it (at most 3 of each per node).
  std::vector<std::vector<std::size_t>> arriving(node_count_), leaving(node_count_);
  for (std::size_t r = 0; r < pipes_.rows && !up_node_.empty(); ++r) {
    if (down_node_[r] != npos && arriving[down_node_[r]].size() < 3) arriving[down_node_[r]].push_back(r);
    if (up_node_[r] != npos && leaving[up_node_[r]].size() < 3) leaving[up_node_[r]].push_back(r);
  }
  const std::size_t enough_joins = std::clamp<std::size_t>(pipes_.rows / 2, 2, 5);
  auto evaluate = [&](std::size_t ia, std::size_t ib) {
    const Column& a = pipes_.columns[ia];
    const Column& b = pipes_.columns[ib];
    PairFit f{ia, ib};
    std::vector<double> all, diff;
    std::size_t falls = 0, equal = 0;
    for (std::size_t r = 0; r < pipes_.rows; ++r) {
      const double x = a.number(r), y = b.number(r);
      if (!std::isfinite(x) || !std::isfinite(y)) continue;
      all.push_back(x);
      all.push_back(y);
      diff.push_back(std::abs(x - y));
      falls += x > y;
      equal += x == y;
    }
    if (diff.size() < std::min<std::size_t>(5, std::max<std::size_t>(pipes_.rows, 2)) || equal * 2 > diff.size()) return f;
    f.spread = quantile(all, 0.95) - quantile(all, 0.05);
    if (!(f.spread > 0.0)) return f;
    f.closeness = median(diff) / f.spread;
    f.fall = static_cast<double>(falls) / static_cast<double>(diff.size());
    std::vector<double> joins;
    for (std::size_t n = 0; n < node_count_; ++n)
      for (std::size_t i : arriving[n])
        for (std::size_t j : leaving[n]) {
          const double x = b.number(i), y = a.number(j);
          if (i != j && std::isfinite(x) && std::isfinite(y)) joins.push_back(std::abs(x - y));
        }
    f.joins = joins.size();
    const bool joined = f.joins >= enough_joins;
    if (joined) f.agreement = median(joins) / f.spread;
    // Close together against the network's spread of levels; in a small network (a few pipes) the
    // spread is itself only a few pipes' fall, so agreement at the joins must carry it.
    const bool close = f.closeness < 0.15 || (joined && f.agreement < 0.05 && f.closeness < 0.6);
    if (!close || (joined && !(f.agreement < 0.05))) return f;
    f.score = std::max(0.0, (0.15 - f.closeness) / 0.15) + (joined ? 2.0 * (1.0 - f.agreement / 0.05) : 0.0) +
              (f.fall >= 0.5 ? f.fall - 0.5 : -1.0) + (says(a.words, Word::invert) ? 0.2 : 0.0) +
              (says(b.words, Word::invert) ? 0.2 : 0.0) + (says(a.words, Word::upstream) ? 0.2 : 0.0) +
              (says(b.words, Word::downstream) ? 0.2 : 0.0);
    return f;
  };
  std::vector<PairFit> fits;
  for (std::size_t i : cand)
    for (std::size_t j : cand)
      if (i != j)
        if (auto f = evaluate(i, j); f.score > 0.0) fits.push_back(f);
  if (fits.empty()) return;
  std::sort(fits.begin(), fits.end(), [](const PairFit& x, const PairFit& y) { return x.score > y.score; });
  PairFit best = fits.front();
  // A second, disjoint pair: measured and design inverts. The names say which is measured.
  const PairFit* second = nullptr;
  for (const auto& f : fits)
    if (f.a != best.a && f.a != best.b && f.b != best.a && f.b != best.b && f.score >= 0.5 * best.score) {
      second = &f;
      break;
    }
  PairFit fallback;
  if (second) {
    auto design = [&](const PairFit& f) {
      return says(pipes_.columns[f.a].words, Word::design) || says(pipes_.columns[f.b].words, Word::design);
    };
    auto measured = [&](const PairFit& f) {
      return says(pipes_.columns[f.a].words, Word::measured) || says(pipes_.columns[f.b].words, Word::measured);
    };
    fallback = *second;
    if ((design(best) && !design(*second)) || (measured(*second) && !measured(best))) std::swap(best, fallback);
    pipes_proposal.notes.push_back(
        "two pairs of fields behave as inverts: " + pipes_.columns[best.a].name() + " / " +
        pipes_.columns[best.b].name() + " and " + pipes_.columns[fallback.a].name() + " / " +
        pipes_.columns[fallback.b].name() + "; the first are proposed as the measured inverts and the second as their "
        "fallback" + (design(fallback) || measured(best) ? " (the names say so)" : " (the names do not say which is measured: check)"));
  }
  std::string why_unit;
  invert_unit_ = level_unit(pipes_.columns[best.a], &pipes_.columns[best.b], why_unit);
  invert_unit_guessed_ = why_unit.rfind("metres: nothing says feet", 0) == 0;
  const std::string join_text =
      best.joins >= enough_joins ? "one pipe's downstream value meets the next pipe's upstream value within a median " +
                            number_text(best.agreement * best.spread) + " at " + std::to_string(best.joins) + " joins"
                      : "no joins to compare (no links)";
  std::string evidence = "values close to the other's in each pipe (median |difference| " +
                         number_text(best.closeness * best.spread) + " against a spread of " +
                         number_text(best.spread) + "); " + join_text;
  // The inverts fall the other way from the links: the link fields are the other way round.
  if (best.fall < 0.5 && from_col_ != npos) {
    std::swap(from_col_, to_col_);
    std::swap(up_node_, down_node_);
    for (auto& f : pipes_proposal.fields) {
      if (f.role == "from") f.role = "to";
      else if (f.role == "to") f.role = "from";
    }
    std::swap(best.a, best.b);
    best.fall = 1.0 - best.fall;
    pipes_proposal.notes.push_back("the inverts fall against the order the geometry suggested, so " +
                                   pipes_.columns[from_col_].name() + " is taken as the upstream end");
  }
  const double fall_share = best.fall;
  const double confidence = best.joins >= enough_joins ? 0.9 : 0.6;
  add(pipes_proposal, pipes_, "invert_up", best.a, invert_unit_,
      evidence + "; higher than " + pipes_.columns[best.b].name() + " in " + number_text(100.0 * fall_share, 3) +
          " % of pipes; unit: " + why_unit,
      confidence);
  add(pipes_proposal, pipes_, "invert_down", best.b, invert_unit_,
      "the downstream partner of " + pipes_.columns[best.a].name() + "; unit: " + why_unit, confidence);
  if (second) {
    std::string fb_why;
    const auto fb_unit = level_unit(pipes_.columns[fallback.a], &pipes_.columns[fallback.b], fb_why);
    add(pipes_proposal, pipes_, "invert_up_fallback", fallback.a, fb_unit,
        "a second invert pair, used where " + pipes_.columns[best.a].name() + " is empty; unit: " + fb_why, 0.6);
    add(pipes_proposal, pipes_, "invert_down_fallback", fallback.b, fb_unit, "its downstream partner", 0.6);
  }
  if (from_col_ != npos && fall_share < 0.8) {
    pipes_proposal.direction_from_inverts = true;
    pipes_proposal.notes.push_back(number_text(100.0 * (1.0 - fall_share), 3) + " % of the pipes rise from " +
                                   pipes_.columns[from_col_].name() + " to " + pipes_.columns[to_col_].name() +
                                   ": from/to looks like the digitising order, so the inverts are to decide the flow");
  }
  up_col_ = best.a;
  down_col_ = best.b;
  const double k = units::to_si(1.0, *invert_unit_);
  up_si_.assign(pipes_.rows, nan);
  down_si_.assign(pipes_.rows, nan);
  for (std::size_t r = 0; r < pipes_.rows; ++r) {
    up_si_[r] = pipes_.columns[best.a].number(r) * k;
    down_si_[r] = pipes_.columns[best.b].number(r) * k;
  }
}

void Inference::structure_levels() {
  if (!has_structures_) return;
  const auto& sr = structures_.summary->rows;
  // The pipe inverts meeting each structure [m]: by the links, else by the nearest pipe end.
  std::vector<double> high(structures_.rows, nan), low(structures_.rows, nan);
  auto meet = [&](std::size_t s, double v) {
    if (s == npos || !std::isfinite(v)) return;
    high[s] = std::isfinite(high[s]) ? std::max(high[s], v) : v;
    low[s] = std::isfinite(low[s]) ? std::min(low[s], v) : v;
  };
  if (!up_si_.empty()) {
    if (nodes_are_structures_) {
      for (std::size_t r = 0; r < pipes_.rows; ++r) {
        meet(up_node_[r], up_si_[r]);
        meet(down_node_[r], down_si_[r]);
      }
    } else {
      // The structure nearest each pipe end within the end tolerance, through a grid of that size.
      const auto& pr = pipes_.summary->rows;
      const double tol = end_tolerance_m();
      double lat0 = 0.0;
      for (double y : sr.y0)
        if (std::isfinite(y)) {
          lat0 = y;
          break;
        }
      // Metres per degree on a sphere of 6371 km (grid cells only: the distances are computed exactly).
      const double mx = pr.lonlat ? 111194.9 * std::cos(lat0 * 3.14159265358979323846 / 180.0) : 1.0;
      const double my = pr.lonlat ? 111194.9 : 1.0;
      auto cell = [&](double x, double y, long long dx, long long dy) {
        return (std::llround(std::floor(x * mx / tol)) + dx) * 1000003LL + std::llround(std::floor(y * my / tol)) + dy;
      };
      std::unordered_multimap<long long, std::size_t> grid;
      for (std::size_t s = 0; s < structures_.rows; ++s)
        if (std::isfinite(sr.x0[s])) grid.emplace(cell(sr.x0[s], sr.y0[s], 0, 0), s);
      for (std::size_t r = 0; r < pipes_.rows; ++r)
        for (bool first : {true, false}) {
          const double x = first ? pr.x0[r] : pr.x1[r], y = first ? pr.y0[r] : pr.y1[r];
          if (!std::isfinite(x)) continue;
          std::size_t best = npos;
          double d_best = tol;
          for (long long dx = -1; dx <= 1; ++dx)
            for (long long dy = -1; dy <= 1; ++dy) {
              const auto [b, e] = grid.equal_range(cell(x, y, dx, dy));
              for (auto it = b; it != e; ++it) {
                const double d = distance_m(x, y, sr.x0[it->second], sr.y0[it->second]);
                if (d <= d_best) best = it->second, d_best = d;
              }
            }
          meet(best, first ? up_si_[r] : down_si_[r]);
        }
    }
  }
  std::vector<Unit> units_to_try;
  if (invert_unit_) units_to_try.push_back(*invert_unit_);
  if (const auto sys = system_length()) units_to_try.push_back(*sys);
  for (Unit u : {Unit::m, Unit::ft, Unit::mm})
    if (std::find(units_to_try.begin(), units_to_try.end(), u) == units_to_try.end()) units_to_try.push_back(u);
  struct Pick {
    std::size_t col = npos;
    Unit unit = Unit::m;
    double share = 0.0, typical = nan;
  } rim, sump;
  for (const auto& c : structures_.columns) {
    if (structures_.used(c.index) || !c.numeric || c.numbers * 10 < structures_.rows * 3) continue;
    std::vector<Unit> order = units_to_try;
    if (auto named = units::unit_named_in(c.name()); named && units::dimension_of(*named) == units::Dimension::length)
      order.insert(order.begin(), *named);
    for (Unit u : order) {
      const double k = units::to_si(1.0, u);
      std::vector<double> cover, depth;
      std::size_t above = 0, at_floor = 0;
      for (std::size_t s = 0; s < structures_.rows; ++s) {
        const double v = c.number(s) * k;
        if (!std::isfinite(v) || !std::isfinite(high[s])) continue;
        cover.push_back(v - high[s]);
        above += v - high[s] >= -0.05;
        depth.push_back(low[s] - v);
        at_floor += low[s] - v >= -0.1 && low[s] - v <= 2.0;
      }
      if (cover.size() < std::min<std::size_t>(5, structures_.rows)) break;
      const double n = static_cast<double>(cover.size());
      const double mc = median(cover), md = median(depth);
      const double s_rim = static_cast<double>(above) / n, s_sump = static_cast<double>(at_floor) / n;
      const double name_bonus_rim = says(c.words, Word::rim) ? 0.05 : 0.0;
      const double name_bonus_inv = says(c.words, Word::invert) ? 0.05 : 0.0;
      if (s_rim >= 0.9 && mc >= 0.3 && mc <= 15.0 && s_rim + name_bonus_rim > rim.share) rim = {c.index, u, s_rim + name_bonus_rim, mc};
      if (s_sump >= 0.8 && md >= -0.05 && md <= 1.0 && s_sump + name_bonus_inv > sump.share)
        sump = {c.index, u, s_sump + name_bonus_inv, md};
      if (s_rim >= 0.9 || s_sump >= 0.8) break;  // the first unit that fits is the one
    }
  }
  if (rim.col == sump.col) sump = {};
  if (rim.col != npos)
    add(structures_proposal, structures_, "rim", rim.col, rim.unit,
        "above the pipe inverts meeting the structure in " + number_text(100.0 * std::min(rim.share, 1.0), 3) +
            " % of structures, by a median cover of " + number_text(rim.typical) + " m when read in " + sym(rim.unit),
        0.85);
  if (sump.col != npos)
    add(structures_proposal, structures_, "invert", sump.col, sump.unit,
        "at or just below the lowest pipe invert meeting the structure (median " + number_text(sump.typical) +
            " m below) when read in " + sym(sump.unit),
        0.85);
  if (rim.col != npos || up_si_.size() > 0) return;
  // No pipe inverts to compare with: a pair of level fields of the structures, the higher the rim.
  for (const auto& a : structures_.columns)
    for (const auto& b : structures_.columns) {
      if (a.index == b.index || structures_.used(a.index) || structures_.used(b.index) || !a.numeric || !b.numeric)
        continue;
      std::vector<double> depth;
      std::size_t higher = 0;
      for (std::size_t s = 0; s < structures_.rows; ++s)
        if (std::isfinite(a.number(s)) && std::isfinite(b.number(s))) {
          depth.push_back(a.number(s) - b.number(s));
          higher += a.number(s) > b.number(s);
        }
      if (depth.size() < 5 || higher * 100 < depth.size() * 95) continue;
      std::string why;
      const auto u = level_unit(a, nullptr, why);
      const double d = median(depth) * units::to_si(1.0, *u);
      if (d < 0.5 || d > 15.0) continue;
      if (!(says(a.words, Word::rim) || says(b.words, Word::invert)) && a.distinct * 2 < a.nonnull) continue;
      add(structures_proposal, structures_, "rim", a.index, u,
          "above " + b.name() + " in every structure, by a median depth of " + number_text(d) + " m; unit: " + why, 0.6);
      add(structures_proposal, structures_, "invert", b.index, u, "below " + a.name() + "; unit: " + why, 0.6);
      return;
    }
}

}  // namespace rimline::mapping::detail

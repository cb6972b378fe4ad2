// Links and ids: a pipe field whose values are (almost all) found among a structure field's values is
// a from/to link and that structure field is the structure id; without a structure layer, two pipe
// fields whose shared values sit where the pipes' ends meet are the node ids. The order of a pair
// comes from which end of the line lies at the structure named.
#include <algorithm>
#include <cmath>
#include <unordered_map>
#include <unordered_set>

#include "mapping/field_words.hpp"
#include "mapping/inference.hpp"

namespace rimline::mapping::detail {
namespace {

std::string pct(double share) { return number_text(std::round(100.0 * share), 3) + " %"; }

bool link_like(const Column& c, std::size_t rows) {
  if (c.nonnull * 2 < rows) return false;
  if (c.numeric && !c.integer) return false;  // ids are text or whole numbers
  return c.distinct >= 2;
}

}  // namespace

void Inference::orient_by_names(std::size_t& from, std::size_t& to) const {
  const auto& a = pipes_.columns[from].words;
  const auto& b = pipes_.columns[to].words;
  const bool a_down = says(a, Word::downstream) || says(a, Word::to);
  const bool b_up = says(b, Word::upstream) || says(b, Word::from);
  if (a_down && b_up) std::swap(from, to);
}

bool Inference::links_to_structures() {
  const auto& pr = pipes_.summary->rows;
  const auto& sr = structures_.summary->rows;
  struct Best {
    std::size_t k = npos, a = npos, b = npos;
    double ca = 0.0, cb = 0.0;
  } best;
  std::vector<std::unordered_map<std::string, std::size_t>> index(structures_.columns.size());
  for (const auto& k : structures_.columns) {
    if (k.nonnull * 100 < structures_.rows * 95 || k.distinct * 100 < k.nonnull * 95) continue;
    if (k.numeric && !k.integer) continue;
    auto& map = index[k.index];
    for (std::size_t r = 0; r < structures_.rows; ++r)
      if (k.has(r)) map.emplace(k.key(r), r);
    std::vector<std::pair<double, std::size_t>> found;
    for (const auto& p : pipes_.columns) {
      if (!link_like(p, pipes_.rows)) continue;
      std::size_t in = 0;
      for (std::size_t r = 0; r < pipes_.rows; ++r) in += p.has(r) && map.count(p.key(r));
      const double share = static_cast<double>(in) / static_cast<double>(p.nonnull);
      if (share >= 0.8) found.push_back({share, p.index});
    }
    if (found.size() < 2) continue;
    std::sort(found.rbegin(), found.rend());
    if (found[0].first + found[1].first > best.ca + best.cb)
      best = {k.index, found[0].second, found[1].second, found[0].first, found[1].first};
  }
  if (best.k == npos) return false;
  const auto& map = index[best.k];
  const Column& ca = pipes_.columns[best.a];
  const Column& cb = pipes_.columns[best.b];
  // Which end of each line lies at the structure the first field names.
  std::size_t a_first = 0, decided = 0;
  for (std::size_t r = 0; r < pipes_.rows; ++r) {
    if (!ca.has(r) || !cb.has(r)) continue;
    const auto ia = map.find(ca.key(r)), ib = map.find(cb.key(r));
    if (ia == map.end() || ib == map.end() || !std::isfinite(pr.x0[r]) || !std::isfinite(sr.x0[ia->second])) continue;
    const double straight = distance_m(pr.x0[r], pr.y0[r], sr.x0[ia->second], sr.y0[ia->second]) +
                            distance_m(pr.x1[r], pr.y1[r], sr.x0[ib->second], sr.y0[ib->second]);
    const double crossed = distance_m(pr.x0[r], pr.y0[r], sr.x0[ib->second], sr.y0[ib->second]) +
                           distance_m(pr.x1[r], pr.y1[r], sr.x0[ia->second], sr.y0[ia->second]);
    if (straight == crossed) continue;
    ++decided;
    a_first += straight < crossed;
  }
  std::size_t from = best.a, to = best.b;
  std::string order;
  if (decided > 0) {
    const double share = static_cast<double>(a_first) / static_cast<double>(decided);
    if (share < 0.5) std::swap(from, to);
    order = "; the structure it names lies at the line's first vertex in " +
            pct(std::max(share, 1.0 - share)) + " of " + std::to_string(decided) + " pipes, so it is the upstream end";
  } else {
    orient_by_names(from, to);
    order = "; no geometry to tell the order, so the names decide it";
  }
  structure_id_col_ = best.k;
  from_col_ = from;
  to_col_ = to;
  nodes_are_structures_ = true;
  node_count_ = structures_.rows;
  up_node_.assign(pipes_.rows, npos);
  down_node_.assign(pipes_.rows, npos);
  for (std::size_t r = 0; r < pipes_.rows; ++r) {
    const Column& f = pipes_.columns[from];
    const Column& t = pipes_.columns[to];
    if (f.has(r))
      if (const auto it = map.find(f.key(r)); it != map.end()) up_node_[r] = it->second;
    if (t.has(r))
      if (const auto it = map.find(t.key(r)); it != map.end()) down_node_[r] = it->second;
  }
  const std::string kname = structures_.columns[best.k].name();
  add(structures_proposal, structures_, "id", best.k, std::nullopt,
      "unique and never empty; the pipes' " + ca.name() + " and " + cb.name() + " values are found among its values (" +
          pct(best.ca) + ", " + pct(best.cb) + ")",
      0.95);
  add(pipes_proposal, pipes_, "from", from, std::nullopt,
      pct(from == best.a ? best.ca : best.cb) + " of its values are structure ids (" + kname + ")" + order, 0.9);
  add(pipes_proposal, pipes_, "to", to, std::nullopt,
      pct(to == best.a ? best.ca : best.cb) + " of its values are structure ids (" + kname +
          "); it names the other end of each pipe",
      0.9);
  return true;
}

bool Inference::links_between_pipes() {
  const auto& pr = pipes_.summary->rows;
  const double tol = end_tolerance_m();
  struct Pair {
    std::size_t a = npos, b = npos;
    bool a_first = true;
    double overlap = 0.0, consistent = 0.0;
  } best;
  std::vector<std::size_t> cand;
  for (const auto& c : pipes_.columns)
    if (link_like(c, pipes_.rows) && c.nonnull * 10 >= pipes_.rows * 8 && c.distinct * 10 >= pipes_.rows * 3)
      cand.push_back(c.index);
  for (std::size_t i = 0; i < cand.size(); ++i)
    for (std::size_t j = i + 1; j < cand.size(); ++j) {
      const Column& a = pipes_.columns[cand[i]];
      const Column& b = pipes_.columns[cand[j]];
      std::unordered_set<std::string> va, vb;
      for (std::size_t r = 0; r < pipes_.rows; ++r) {
        if (a.has(r)) va.insert(a.key(r));
        if (b.has(r)) vb.insert(b.key(r));
      }
      std::size_t both = 0;
      for (const auto& v : va) both += vb.count(v);
      const double overlap = static_cast<double>(both) / static_cast<double>(std::min(va.size(), vb.size()));
      if (overlap < 0.3) continue;
      // Do the ends that share a value lie together? Both ways round: a at the first vertex, or at the last.
      for (bool a_first : {true, false}) {
        std::unordered_map<std::string, std::pair<double, double>> at;
        std::size_t checked = 0, agree = 0;
        for (std::size_t r = 0; r < pipes_.rows; ++r) {
          if (!std::isfinite(pr.x0[r])) continue;
          for (bool first_col : {true, false}) {
            const Column& c = first_col ? a : b;
            if (!c.has(r)) continue;
            const bool at_first = first_col == a_first;
            const double x = at_first ? pr.x0[r] : pr.x1[r], y = at_first ? pr.y0[r] : pr.y1[r];
            const auto [it, fresh] = at.try_emplace(c.key(r), x, y);
            if (fresh) continue;
            ++checked;
            agree += distance_m(x, y, it->second.first, it->second.second) <= tol;
          }
        }
        if (checked < 2) continue;
        const double consistent = static_cast<double>(agree) / static_cast<double>(checked);
        if (consistent >= 0.8 && overlap * consistent > best.overlap * best.consistent)
          best = {a.index, b.index, a_first, overlap, consistent};
      }
    }
  if (best.a == npos) return false;
  std::size_t from = best.a_first ? best.a : best.b, to = best.a_first ? best.b : best.a;
  from_col_ = from;
  to_col_ = to;
  std::unordered_map<std::string, std::size_t> node;
  up_node_.assign(pipes_.rows, npos);
  down_node_.assign(pipes_.rows, npos);
  auto node_of = [&](const std::string& k) { return node.try_emplace(k, node.size()).first->second; };
  std::unordered_set<std::string> leaving;
  for (std::size_t r = 0; r < pipes_.rows; ++r) {
    if (pipes_.columns[from].has(r)) {
      up_node_[r] = node_of(pipes_.columns[from].key(r));
      leaving.insert(pipes_.columns[from].key(r));
    }
    if (pipes_.columns[to].has(r)) down_node_[r] = node_of(pipes_.columns[to].key(r));
  }
  node_count_ = node.size();
  std::unordered_set<std::string> ends;
  for (std::size_t r = 0; r < pipes_.rows; ++r)
    if (pipes_.columns[to].has(r) && !leaving.count(pipes_.columns[to].key(r))) ends.insert(pipes_.columns[to].key(r));
  pipes_proposal.network_ends.assign(ends.begin(), ends.end());
  std::sort(pipes_proposal.network_ends.begin(), pipes_proposal.network_ends.end());
  const std::string evidence = "node ids: " + pct(best.overlap) + " of the values of one of " +
                               pipes_.columns[best.a].name() + " / " + pipes_.columns[best.b].name() +
                               " recur in the other, and pipes sharing a value have an end at the same place (" +
                               pct(best.consistent) + " within " + number_text(tol, 2) + " m)";
  add(pipes_proposal, pipes_, "from", from, std::nullopt, evidence + "; its node lies at the line's first vertex", 0.85);
  add(pipes_proposal, pipes_, "to", to, std::nullopt, evidence + "; its node lies at the line's last vertex", 0.85);
  return true;
}

// Without ids: pipe ends that lie together (on a grid of the end tolerance) are one node.
void Inference::geometric_nodes() {
  const auto& pr = pipes_.summary->rows;
  const double tol = end_tolerance_m();
  double lat0 = 0.0;
  for (std::size_t r = 0; r < pipes_.rows; ++r)
    if (std::isfinite(pr.y0[r])) {
      lat0 = pr.y0[r];
      break;
    }
  const double metres_x = pr.lonlat ? 111194.9 * std::cos(lat0 * 3.14159265358979323846 / 180.0) : 1.0;
  const double metres_y = pr.lonlat ? 111194.9 : 1.0;
  std::unordered_map<long long, std::size_t> cell;
  auto node_at = [&](double x, double y) {
    if (!std::isfinite(x)) return npos;
    const long long cx = std::llround(x * metres_x / tol), cy = std::llround(y * metres_y / tol);
    return cell.try_emplace(cx * 1000003LL + cy, cell.size()).first->second;
  };
  up_node_.assign(pipes_.rows, npos);
  down_node_.assign(pipes_.rows, npos);
  for (std::size_t r = 0; r < pipes_.rows; ++r) {
    up_node_[r] = node_at(pr.x0[r], pr.y0[r]);
    down_node_[r] = node_at(pr.x1[r], pr.y1[r]);
  }
  node_count_ = cell.size();
}

void Inference::ids() {
  auto score = [](const Layer& l, const Column& c) {
    if (!c.unique) return -1.0;
    double s = 1.0;
    if (!c.numeric) s += 1.0;  // asset numbers are often text; row numbers never
    if (c.integer && c.summary->min && c.summary->max &&
        *c.summary->max - *c.summary->min + 1.0 <= 1.05 * static_cast<double>(l.rows))
      s -= 1.5;  // a consecutive run: a row number the GIS made, not the asset's id
    const std::string up = c.words.empty() ? "" : c.words.front();
    std::string joined;
    for (const auto& w : c.words) joined += w;
    for (const char* internal : {"OBJECTID", "FID", "OID", "GID", "MIPRINX", "OGCFID", "ROWID", "PRINX", "OBJECTID1"})
      if (joined == internal) s -= 2.0;
    if (says(c.words, Word::id)) s += 0.5;
    return s;
  };
  auto pick = [&](Layer& l, MappingProposal& m, const char* what) {
    std::size_t best = npos;
    double best_score = 0.0;
    for (const auto& c : l.columns) {
      if (l.used(c.index)) continue;
      const double s = score(l, c);
      if (s > best_score) best = c.index, best_score = s;
    }
    if (best == npos) return;
    const Column& c = l.columns[best];
    add(m, l, "id", best, std::nullopt,
        std::string("unique and never empty over ") + std::to_string(l.rows) + " " + what +
            (c.numeric ? "" : ", text (an asset number rather than a row number)"),
        c.numeric ? 0.6 : 0.8);
  };
  if (has_pipes_) pick(pipes_, pipes_proposal, "pipes");
  if (has_structures_ && structure_id_col_ == npos) pick(structures_, structures_proposal, "structures");
}

void Inference::links() {
  if (has_pipes_) {
    bool linked = has_structures_ && links_to_structures();
    if (!linked) linked = links_between_pipes();
    if (!linked) geometric_nodes();
  }
  ids();
}

}  // namespace rimline::mapping::detail

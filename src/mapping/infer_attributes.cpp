// Lengths (the ratio to the line's own length), sizes and their units (magnitudes; width/height pairs
// by the height's zeros), roughness, materials, shape and type codes with their values, pressure-main
// flags (values whose pipes rise along the flow, or that name a pressure main), flows.
#include <algorithm>
#include <cmath>
#include <map>

#include "mapping/field_words.hpp"
#include "mapping/inference.hpp"

namespace rimline::mapping::detail {
namespace {

using units::Unit;
std::string sym(Unit u) { return std::string(units::unit_symbol(u)); }

// Rows per value of a text column, most frequent first.
std::vector<std::pair<std::string, std::size_t>> value_counts(const Column& c, std::size_t rows) {
  std::vector<std::size_t> n(c.data->values.size(), 0);
  for (std::size_t r = 0; r < rows; ++r)
    if (c.data->text[r] >= 0) ++n[static_cast<std::size_t>(c.data->text[r])];
  std::vector<std::pair<std::string, std::size_t>> out;
  for (std::size_t i = 0; i < n.size(); ++i) out.push_back({c.data->values[i], n[i]});
  std::stable_sort(out.begin(), out.end(), [](const auto& a, const auto& b) { return a.second > b.second; });
  return out;
}

bool code_like(const Column& c, std::size_t max_distinct = 40) {
  // A code repeats (few values over many features); a layer of a handful of features shows no repeats.
  return !c.numeric && c.distinct >= 1 && c.distinct <= max_distinct && (c.distinct * 2 <= c.nonnull || c.nonnull < 10);
}

}  // namespace

void Inference::lengths() {
  const auto& L = pipes_.summary->rows.length_m;
  struct Band {
    double lo, hi;
    Unit unit;
  };
  const bool us_survey = std::abs(pipes_.summary->crs_metres_per_unit - units::metres_per_us_survey_foot) < 1e-9;
  const Band bands[] = {{0.9, 1.11, Unit::m},
                        {3.0, 3.6, us_survey ? Unit::us_ft : Unit::ft},
                        {900.0, 1110.0, Unit::mm},
                        {90.0, 111.0, Unit::cm}};
  std::size_t best = npos;
  double best_share = 0.0, best_ratio = 0.0;
  Unit best_unit = Unit::m;
  for (const auto& c : pipes_.columns) {
    if (pipes_.used(c.index) || !c.numeric) continue;
    std::vector<double> ratio;
    for (std::size_t r = 0; r < pipes_.rows; ++r)
      if (L[r] > 0.0 && std::isfinite(c.number(r)) && c.number(r) > 0.0) ratio.push_back(c.number(r) / L[r]);
    if (ratio.size() < std::min<std::size_t>(5, pipes_.rows) || ratio.size() * 2 < pipes_.rows) continue;
    const double m = median(ratio);
    std::size_t near = 0;
    for (double x : ratio) near += std::abs(x / m - 1.0) <= 0.15;
    const double share = static_cast<double>(near) / static_cast<double>(ratio.size()) +
                         (says(c.words, Word::length) ? 0.05 : 0.0);
    for (const Band& b : bands)
      if (m >= b.lo && m <= b.hi && share >= 0.7 && share > best_share)
        best = c.index, best_share = share, best_ratio = m, best_unit = b.unit;
  }
  if (best == npos) return;
  length_unit_ = best_unit;
  if ((best_unit == Unit::ft || best_unit == Unit::us_ft) && !us_hint_) {
    us_hint_ = true;
    us_why_ = "the length field is in feet";
  }
  add(pipes_proposal, pipes_, "length", best, best_unit,
      "median ratio to the line's own length in metres " + number_text(best_ratio, 4) + " (" +
          number_text(100.0 * std::min(best_share, 1.0), 3) + " % of pipes within 15 % of it): " + sym(best_unit),
      0.9);
}

void Inference::sizes() {
  // A size field: positive values of a standard-size magnitude, few distinct values, not a level.
  auto unit_of = [&](const Column& c, std::string& why) -> std::optional<Unit> {
    const double m = c.median_positive;
    auto named = units::unit_named_in(c.name());
    if (named && units::dimension_of(*named) == units::Dimension::length) {
      const double si = m * units::to_si(1.0, *named);
      if (si >= 0.05 && si <= 6.0) {
        why = "the name states " + sym(*named) + " (median " + number_text(m) + ")";
        return named;
      }
      why = "median " + number_text(m) + " is not a pipe size in " + sym(*named) + ", the unit the name states; ";
    }
    if (m >= 80.0 && m <= 4000.0) return why += "median " + number_text(m) + " looks like millimetres", Unit::mm;
    if (m >= 0.05 && m < 4.0) return why += "median " + number_text(m) + " looks like metres", Unit::m;
    if (m >= 4.0 && m < 80.0) {
      if (us_hint_) return why += "median " + number_text(m) + " looks like inches (" + us_why_ + ")", Unit::in;
      return why += "median " + number_text(m) + " looks like centimetres or inches; centimetres as nothing says US "
                    "customary: check",
             Unit::cm;
    }
    return std::nullopt;
  };
  std::vector<std::size_t> cand;
  for (const auto& c : pipes_.columns) {
    if (pipes_.used(c.index) || !c.numeric || c.median_positive <= 0.0) continue;
    if (c.distinct > std::max<std::size_t>(120, c.nonnull * 15 / 100)) continue;
    if (c.summary->min && *c.summary->min < 0.0) continue;
    std::string why;
    if (!unit_of(c, why)) continue;
    if (says(c.words, Word::slope) || says(c.words, Word::id)) continue;
    cand.push_back(c.index);
  }
  auto name_score = [&](std::size_t i, Word w) { return says(pipes_.columns[i].words, w) ? 1 : 0; };
  // A width/height pair: the height 0 or empty where the pipe is circular, of like size elsewhere.
  std::size_t w = npos, h = npos;
  double best = 0.0;
  for (std::size_t a : cand)
    for (std::size_t b : cand) {
      if (a == b) continue;
      const Column& ca = pipes_.columns[a];
      const Column& cb = pipes_.columns[b];
      std::size_t both = 0, zero = 0, alike = 0;
      for (std::size_t r = 0; r < pipes_.rows; ++r) {
        const double x = ca.number(r), y = cb.number(r);
        if (!std::isfinite(x) || x <= 0.0) continue;
        ++both;
        if (!std::isfinite(y) || y == 0.0) ++zero;
        else if (y / x >= 0.2 && y / x <= 5.0) ++alike;
      }
      if (both < std::min<std::size_t>(5, pipes_.rows) || both == zero || alike * 10 < (both - zero) * 8) continue;
      const double score = 1.0 + name_score(b, Word::height) + name_score(a, Word::width) + name_score(a, Word::diameter) +
                           (zero > 0 ? 0.5 : 0.0);
      if (score > best) best = score, w = a, h = b;
    }
  if (w != npos && name_score(w, Word::height) && !name_score(h, Word::height)) std::swap(w, h);
  std::size_t diameter = npos;
  if (w == npos) {
    double d_best = -1.0;
    for (std::size_t c : cand) {
      const double s = name_score(c, Word::diameter) * 2 + name_score(c, Word::width);
      if (s > d_best) d_best = s, diameter = c;
    }
  }
  auto propose = [&](const char* role, std::size_t c, const std::string& extra) {
    std::string why;
    const auto u = unit_of(pipes_.columns[c], why);
    if (!size_unit_) size_unit_ = u;
    add(pipes_proposal, pipes_, role, c, u, extra + why, why.find("check") == std::string::npos ? 0.8 : 0.45);
    if (u == Unit::in && !us_hint_) {
      us_hint_ = true;
      us_why_ = "the sizes are in inches";
    }
  };
  if (w != npos) {
    std::size_t zero = 0, n = 0;
    for (std::size_t r = 0; r < pipes_.rows; ++r) {
      const double y = pipes_.columns[h].number(r);
      ++n;
      zero += !std::isfinite(y) || y == 0.0;
    }
    pipes_proposal.shape_from_height = zero > 0 && zero < n;
    width_col_ = w;
    height_col_ = h;
    const std::string pair = pipes_proposal.shape_from_height
                                 ? "a size pair: " + pipes_.columns[h].name() + " is 0 or empty in " +
                                       std::to_string(zero) + " of " + std::to_string(n) +
                                       " pipes (circular: this is their diameter) and of like size elsewhere; "
                                 : "a size pair with " + pipes_.columns[h].name() + "; ";
    propose("width", w, pair);
    propose("height", h, "the pair's height; ");
  } else if (diameter != npos) {
    propose("diameter", diameter, "positive values of pipe sizes, few of them distinct (" +
                                      std::to_string(pipes_.columns[diameter].distinct) + "); ");
  }
}

void Inference::roughness_and_material() {
  for (const auto& c : pipes_.columns) {
    if (pipes_.used(c.index) || !c.numeric || !c.summary->min || !c.summary->max) continue;
    if (*c.summary->min >= 0.008 && *c.summary->max <= 0.05 && c.distinct <= 15 && c.distinct >= 1) {
      add(pipes_proposal, pipes_, "manning_n", c.index, std::nullopt,
          "every value between 0.008 and 0.05 and only " + std::to_string(c.distinct) +
              " distinct: Manning's n by class" + (says(c.words, Word::roughness) ? "; the name agrees" : ""),
          says(c.words, Word::roughness) ? 0.9 : 0.6);
      break;
    }
  }
  std::size_t best = npos;
  double best_share = 0.0;
  for (const auto& c : pipes_.columns) {
    if (pipes_.used(c.index) || !code_like(c, 80)) continue;
    std::size_t known = 0;
    for (const auto& [v, n] : value_counts(c, pipes_.rows)) known += material_named(v) ? n : 0;
    const double share = static_cast<double>(known) / static_cast<double>(c.nonnull) + (says(c.words, Word::material) ? 0.3 : 0.0);
    if (share >= 0.5 && share > best_share) best = c.index, best_share = share;
  }
  if (best == npos) return;
  for (const auto& [v, n] : value_counts(pipes_.columns[best], pipes_.rows)) pipes_proposal.material_values.push_back(v);
  add(pipes_proposal, pipes_, "material", best, std::nullopt,
      "few distinct values, " + number_text(100.0 * std::min(best_share, 1.0), 3) +
          " % of them pipe materials (RC, PVC, VC ...)",
      0.8);
}

void Inference::codes() {
  // Shape codes: values that name sections, or that split the pipes cleanly by a height > 0.
  std::size_t best = npos;
  double best_score = 0.0;
  for (const auto& c : pipes_.columns) {
    if (pipes_.used(c.index) || !code_like(c, 30)) continue;
    std::size_t named = 0, clean = 0;
    for (const auto& [v, n] : value_counts(c, pipes_.rows)) named += shape_named(v).empty() ? 0 : n;
    if (height_col_ != npos) {
      std::map<std::int32_t, std::pair<std::size_t, std::size_t>> split;  // value -> rows with height > 0, rows
      for (std::size_t r = 0; r < pipes_.rows; ++r) {
        if (c.data->text[r] < 0) continue;
        const double h = pipes_.columns[height_col_].number(r);
        auto& s = split[c.data->text[r]];
        s.first += std::isfinite(h) && h > 0.0;
        ++s.second;
      }
      bool both_sides = false, any_box = false, any_circle = false;
      for (const auto& [v, s] : split) {
        const double share = static_cast<double>(s.first) / static_cast<double>(s.second);
        if (share <= 0.1 || share >= 0.9) clean += s.second;
        any_box = any_box || share >= 0.9;
        any_circle = any_circle || share <= 0.1;
      }
      both_sides = any_box && any_circle;
      if (!both_sides) clean = 0;
    }
    const double score = (static_cast<double>(named) + 0.8 * static_cast<double>(clean)) / static_cast<double>(c.nonnull) +
                         (says(c.words, Word::shape) ? 0.3 : 0.0);
    if (score >= 0.6 && score > best_score) best = c.index, best_score = score;
  }
  if (best == npos) return;
  const Column& c = pipes_.columns[best];
  for (const auto& [v, n] : value_counts(c, pipes_.rows)) {
    CodeValue cv{v, shape_named(v), "", n};
    cv.why = cv.meaning.empty() ? "" : (cv.meaning == "egg" ? "the value names an " : "the value names a ") + cv.meaning + " section";
    if (height_col_ != npos) {
      std::size_t with_height = 0, rows = 0;
      for (std::size_t r = 0; r < pipes_.rows; ++r)
        if (c.data->text[r] >= 0 && c.data->values[static_cast<std::size_t>(c.data->text[r])] == v) {
          ++rows;
          const double h = pipes_.columns[height_col_].number(r);
          with_height += std::isfinite(h) && h > 0.0;
        }
      const double share = rows ? static_cast<double>(with_height) / static_cast<double>(rows) : 0.0;
      if (cv.meaning.empty() && share >= 0.9) cv.meaning = "box", cv.why = "its pipes have a height";
      if (cv.meaning.empty() && share <= 0.1) cv.meaning = "circular", cv.why = "its pipes have no height";
    }
    pipes_proposal.shape_values.push_back(cv);
  }
  pipes_proposal.shape_from_height = false;  // the shape field says it
  add(pipes_proposal, pipes_, "shape", best, std::nullopt,
      "a section code: its values name sections or split the pipes by their height; values listed in [pipes.shapes]",
      best_score >= 0.9 ? 0.85 : 0.6);
  if (width_col_ != npos && !pipes_proposal.find("diameter")) {
    std::string why;
    const auto* wp = pipes_proposal.find("width");
    pipes_proposal.fields.push_back({"diameter", wp->field, wp->unit, "the width is the diameter of circular pipes", wp->confidence});
  }
}

void Inference::pressure_flags() {
  // The share of pipes whose inverts rise along the flow, overall and per value: pumped mains rise.
  auto rises = [&](std::size_t r) {
    return !up_si_.empty() && std::isfinite(up_si_[r]) && std::isfinite(down_si_[r]) && down_si_[r] > up_si_[r] + 0.001;
  };
  std::size_t base_rise = 0, base_n = 0;
  for (std::size_t r = 0; r < pipes_.rows && !up_si_.empty(); ++r)
    if (std::isfinite(up_si_[r]) && std::isfinite(down_si_[r])) ++base_n, base_rise += rises(r);
  const double base = base_n ? static_cast<double>(base_rise) / static_cast<double>(base_n) : 0.0;
  struct Pick {
    std::size_t col = npos;
    std::vector<CodeValue> values;
    double score = 0.0;
  } best;
  for (const auto& c : pipes_.columns) {
    if (pipes_.used(c.index) || c.numeric || c.distinct < 2 || c.distinct > 40) continue;
    const bool named_field = says(c.words, Word::pressure);
    std::vector<CodeValue> flagged;
    double score = 0.0, length = 0.0;
    bool any_named = false;
    for (const auto& [v, n] : value_counts(c, pipes_.rows)) {
      std::size_t up = 0, known = 0;
      for (std::size_t r = 0; r < pipes_.rows; ++r)
        if (c.data->text[r] >= 0 && c.data->values[static_cast<std::size_t>(c.data->text[r])] == v &&
            !up_si_.empty() && std::isfinite(up_si_[r]) && std::isfinite(down_si_[r]))
          ++known, up += rises(r);
      const double share = known ? static_cast<double>(up) / static_cast<double>(known) : 0.0;
      const bool by_name = pressure_named(v) || (named_field && yes_value(v));
      const bool by_data = known >= 5 && share >= 0.5 && share >= 4.0 * base;
      length += static_cast<double>(v.size());
      if (!by_name && !by_data) continue;
      any_named = any_named || by_name;
      std::string why = by_name ? "the value names a pressure main" : "";
      if (by_data)
        why += (why.empty() ? "" : "; ") + number_text(100.0 * share, 2) + " % of its " + std::to_string(known) +
               " pipes rise along the flow (" + number_text(100.0 * base, 2) + " % of all pipes)";
      flagged.push_back({v, "pressure", why, n});
      score += (by_name ? 1.0 : 0.0) + (by_data ? 1.0 : 0.0);
    }
    if (flagged.empty() || (!any_named && !named_field)) continue;  // data alone, in a field nothing names: chance
    score -= 0.01 * length / static_cast<double>(c.distinct);       // short codes over long descriptions
    if (score > best.score) best = {c.index, flagged, score};
  }
  if (best.col == npos) return;
  pipes_proposal.force_main_values = best.values;
  add(pipes_proposal, pipes_, "force_main", best.col, std::nullopt,
      "its values " + [&] {
        std::string v;
        for (const auto& x : best.values) v += (v.empty() ? "" : ", ") + x.value;
        return v;
      }() + " mark pressure mains (by name, or because their pipes rise along the flow)",
      best.score >= 2.0 ? 0.85 : 0.6);
}

void Inference::structure_types() {
  if (!has_structures_) return;
  // Network ends: structures pipes arrive at and none leave.
  std::vector<char> end(structures_.rows, 0);
  if (nodes_are_structures_) {
    std::vector<char> leaves(structures_.rows, 0), arrives(structures_.rows, 0);
    for (std::size_t r = 0; r < pipes_.rows; ++r) {
      if (up_node_[r] != npos) leaves[up_node_[r]] = 1;
      if (down_node_[r] != npos) arrives[down_node_[r]] = 1;
    }
    const std::size_t idc = structure_id_col_;
    for (std::size_t s = 0; s < structures_.rows; ++s) {
      end[s] = arrives[s] && !leaves[s];
      if (end[s] && idc != npos) structures_proposal.network_ends.push_back(structures_.columns[idc].key(s));
    }
  }
  std::size_t best = npos;
  double best_score = 0.0;
  for (const auto& c : structures_.columns) {
    if (structures_.used(c.index) || !code_like(c, 40)) continue;
    std::size_t known = 0;
    for (const auto& [v, n] : value_counts(c, structures_.rows)) known += kind_named(v).empty() ? 0 : n;
    const double score = static_cast<double>(known) / static_cast<double>(c.nonnull) + (says(c.words, Word::type) ? 0.2 : 0.0);
    if (score >= 0.3 && score > best_score) best = c.index, best_score = score;
  }
  if (best == npos) return;
  const Column& c = structures_.columns[best];
  for (const auto& [v, n] : value_counts(c, structures_.rows)) {
    CodeValue cv{v, kind_named(v), "", n};
    std::size_t ends = 0;
    for (std::size_t s = 0; s < structures_.rows; ++s)
      if (end[s] && c.data->text[s] >= 0 && c.data->values[static_cast<std::size_t>(c.data->text[s])] == v) ++ends;
    cv.why = cv.meaning.empty() ? "" : "the value names a " + cv.meaning;
    if (ends > 0 && ends * 10 >= n * 8) {
      if (cv.meaning.empty()) cv.meaning = "outfall";
      cv.why += (cv.why.empty() ? "" : "; ") + std::to_string(ends) + " of its " + std::to_string(n) +
                " structures are network ends (no pipe leaves them)";
    }
    structures_proposal.type_values.push_back(cv);
  }
  add(structures_proposal, structures_, "type", best, std::nullopt,
      "a type code: " + number_text(100.0 * std::min(best_score, 1.0), 3) +
          " % of the structures have a value naming a kind; values listed in [structures.types]",
      best_score >= 0.8 ? 0.85 : 0.6);
}

void Inference::flows() {
  auto flow_unit = [&](const Column& c, std::string& why) {
    auto named = units::unit_named_in(c.name());
    if (named && units::dimension_of(*named) == units::Dimension::flow) {
      why = "the name states " + sym(*named);
      return *named;
    }
    if (us_hint_) return why = "cfs: " + us_why_ + "; check", Unit::cfs;
    if (c.median_positive >= 1.0) return why = "median " + number_text(c.median_positive) + " looks like L/s; check", Unit::l_s;
    return why = "median " + number_text(c.median_positive) + " looks like m3/s; check", Unit::m3_s;
  };
  if (has_pipes_) {
    for (const auto& c : pipes_.columns) {
      if (pipes_.used(c.index) || !c.numeric || !says(c.words, Word::flow)) continue;
      if (c.summary->min && *c.summary->min < 0.0) continue;
      // Design flows grow downstream: the pipe leaving a node carries at least what one arriving brings.
      std::size_t joins = 0, grows = 0;
      std::vector<double> leaving(node_count_, std::numeric_limits<double>::quiet_NaN());
      for (std::size_t r = 0; r < pipes_.rows && !up_node_.empty(); ++r)
        if (up_node_[r] != npos) leaving[up_node_[r]] = c.number(r);
      for (std::size_t r = 0; r < pipes_.rows && !down_node_.empty(); ++r)
        if (down_node_[r] != npos && std::isfinite(leaving[down_node_[r]]) && std::isfinite(c.number(r)))
          ++joins, grows += leaving[down_node_[r]] >= 0.99 * c.number(r);
      if (joins >= 5 && grows * 10 < joins * 7) continue;
      std::string why;
      const Unit u = flow_unit(c, why);
      add(pipes_proposal, pipes_, "flow", c.index, u,
          "the name says flow, values are never negative" +
              (joins >= 5 ? ", and they grow downstream at " + number_text(100.0 * static_cast<double>(grows) / static_cast<double>(joins), 3) + " % of joins" : std::string()) +
              "; unit: " + why,
          joins >= 5 ? 0.8 : 0.5);
      break;
    }
  }
  if (has_structures_) {
    for (const auto& c : structures_.columns) {
      if (structures_.used(c.index) || !c.numeric || !says(c.words, Word::flow)) continue;
      if (c.summary->min && *c.summary->min < 0.0) continue;
      std::string why;
      const Unit u = flow_unit(c, why);
      add(structures_proposal, structures_, "inflow", c.index, u,
          "the name says flow and the values are never negative (a local inflow at the structure); unit: " + why, 0.5);
      break;
    }
  }
}

}  // namespace rimline::mapping::detail

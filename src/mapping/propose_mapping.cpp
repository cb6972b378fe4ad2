// The proposed mapping of an export: the inference's steps in order, and the public entry points.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <unordered_set>

#include "mapping/field_words.hpp"
#include "mapping/inference.hpp"

namespace rimline::mapping {
namespace detail {

std::string Column::key(std::size_t row) const {
  const double v = data->number[row];
  if (std::isfinite(v) && v == std::floor(v) && std::abs(v) < 1e15) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.0f", v);
    return buf;
  }
  const std::int32_t t = data->text[row];
  return t < 0 ? std::string() : data->values[static_cast<std::size_t>(t)];
}

bool Layer::used(std::size_t column) const { return std::find(taken.begin(), taken.end(), column) != taken.end(); }

double median(std::vector<double> v) {
  if (v.empty()) return std::numeric_limits<double>::quiet_NaN();
  const auto mid = v.begin() + static_cast<std::ptrdiff_t>(v.size() / 2);
  std::nth_element(v.begin(), mid, v.end());
  return *mid;
}

std::string number_text(double v, int significant) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.*g", significant, v);
  return buf;
}

Layer make_layer(const LayerSummary& summary) {
  Layer l;
  l.summary = &summary;
  l.rows = summary.rows.count;
  for (std::size_t i = 0; i < summary.fields.size() && i < summary.rows.columns.size(); ++i) {
    Column c;
    c.index = i;
    c.summary = &summary.fields[i];
    c.data = &summary.rows.columns[i];
    c.words = words_of(c.summary->name);
    std::vector<double> positive;
    bool whole = true;
    for (std::size_t r = 0; r < l.rows; ++r) {
      if (c.data->text[r] < 0) continue;
      ++c.nonnull;
      const double v = c.data->number[r];
      if (!std::isfinite(v)) continue;
      ++c.numbers;
      whole = whole && v == std::floor(v);
      if (v > 0.0) positive.push_back(v);
    }
    c.distinct = c.data->values.size();
    const bool date = c.summary->type.find("Date") != std::string::npos || c.summary->type.find("Time") != std::string::npos;
    c.numeric = !date && c.numbers > 0 && c.numbers >= c.nonnull * 95 / 100;
    c.integer = c.numeric && whole;
    c.unique = c.nonnull == l.rows && l.rows > 0 && c.distinct == c.nonnull;
    c.median_positive = positive.empty() ? 0.0 : median(positive);
    l.columns.push_back(std::move(c));
  }
  return l;
}

Inference::Inference(const LayerSummary* pipes, const LayerSummary* structures) {
  if (pipes) {
    pipes_ = make_layer(*pipes);
    has_pipes_ = pipes_.rows > 0;
    pipes_proposal.kind = LayerKind::pipes;
  }
  if (structures) {
    structures_ = make_layer(*structures);
    has_structures_ = structures_.rows > 0;
    structures_proposal.kind = LayerKind::structures;
  }
}

double Inference::distance_m(double x0, double y0, double x1, double y1) const {
  if (!pipes_.summary || !pipes_.summary->rows.lonlat) return std::hypot(x1 - x0, y1 - y0);
  // Equirectangular on a sphere of radius 6371 km: good to ~0.5 % over a city, enough to tell ends apart.
  constexpr double r = 6371000.0, rad = 3.14159265358979323846 / 180.0;
  const double dx = (x1 - x0) * rad * std::cos(0.5 * (y0 + y1) * rad) * r, dy = (y1 - y0) * rad * r;
  return std::hypot(dx, dy);
}

// Pipe ends this close meet: 2 % of the median pipe length, at least 0.5 m and at most 5 m.
double Inference::end_tolerance_m() const {
  std::vector<double> l;
  for (double x : pipes_.summary->rows.length_m)
    if (x > 0.0) l.push_back(x);
  const double m = l.empty() ? 25.0 : median(l);
  return std::clamp(0.02 * m, 0.5, 5.0);
}

void Inference::add(MappingProposal& m, Layer& l, const std::string& role, std::size_t column,
                    std::optional<units::Unit> unit, std::string why, double confidence) {
  if (column == npos) return;
  l.take(column);
  m.fields.push_back({role, l.columns[column].name(), unit, std::move(why), std::clamp(confidence, 0.0, 1.0)});
}

std::optional<units::Unit> Inference::system_length() const {
  if (!us_hint_) return std::nullopt;
  const bool survey = pipes_.summary &&
                      std::abs(pipes_.summary->crs_metres_per_unit - units::metres_per_us_survey_foot) < 1e-9;
  return survey ? units::Unit::us_ft : units::Unit::ft;  // a US survey foot CRS: its levels are in the same foot
}

void Inference::run() {
  if (!has_pipes_ && !has_structures_) return;
  if (has_pipes_) {
    const auto& s = *pipes_.summary;
    if (s.crs_metres_per_unit != 1.0 && !s.crs_linear_unit.empty()) {
      us_hint_ = true;
      us_why_ = "the CRS is in " + s.crs_linear_unit;
    }
  }
  links();
  if (has_pipes_) {
    lengths();
    inverts();  // before the sizes, so that no level passes for a size
    sizes();
    // Sizes in inches say US customary: inverts whose unit nothing else told are then in feet.
    if (us_hint_ && invert_unit_ == units::Unit::m && invert_unit_guessed_) {
      invert_unit_ = system_length();
      const double k = units::to_si(1.0, *invert_unit_);
      for (std::size_t r = 0; r < pipes_.rows; ++r) {
        up_si_[r] = pipes_.columns[up_col_].number(r) * k;
        down_si_[r] = pipes_.columns[down_col_].number(r) * k;
      }
      for (auto& f : pipes_proposal.fields)
        if (f.role.rfind("invert_", 0) == 0 && f.unit == units::Unit::m) {
          f.unit = invert_unit_;
          const auto at = f.reason.find("metres: nothing says feet");
          if (at != std::string::npos) f.reason = f.reason.substr(0, at) + "feet: " + us_why_;
        }
    }
  }
  structure_levels();
  if (has_pipes_) {
    roughness_and_material();
    codes();
    pressure_flags();
  }
  structure_types();
  flows();
}

}  // namespace detail

const FieldProposal* MappingProposal::find(const std::string& role) const {
  for (const auto& f : fields)
    if (f.role == role) return &f;
  return nullptr;
}

std::string confidence_word(double c) { return c >= 0.8 ? "high" : c >= 0.5 ? "medium" : "low"; }

NetworkProposal propose_network(const LayerSummary* pipes, const LayerSummary* structures) {
  detail::Inference inference(pipes, structures);
  inference.run();
  NetworkProposal out;
  out.pipes = std::move(inference.pipes_proposal);
  out.structures = std::move(inference.structures_proposal);
  return out;
}

MappingProposal propose_mapping(const LayerSummary& layer) {
  if (layer.lines()) return propose_network(&layer, nullptr).pipes;
  if (layer.points()) return propose_network(nullptr, &layer).structures;
  return {};
}

}  // namespace rimline::mapping

#pragma once
// Inferring a project from an unseen export: which field plays which role, from the data first
// (values one layer's field shares with another's, levels that agree where pipes meet, magnitudes,
// ratios to the geometry) and from the names second (src/mapping/field_words.hpp). One Inference
// per `fields` call; its steps live in infer_links.cpp, infer_levels.cpp and infer_attributes.cpp.
// Every threshold here is common practice, no source: the result is a proposal a user reviews.
// Private to src/mapping.
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "rimline/mapping/inspect.hpp"

namespace rimline::mapping::detail {

inline constexpr std::size_t npos = static_cast<std::size_t>(-1);

struct Column {
  std::size_t index = 0;                // into LayerSummary::fields / rows.columns
  const FieldSummary* summary = nullptr;
  const FieldColumn* data = nullptr;
  std::vector<std::string> words;       // of the name
  std::size_t nonnull = 0;              // kept rows with a value
  std::size_t numbers = 0;              // kept rows whose value is a number
  std::size_t distinct = 0;
  bool numeric = false;                 // (almost) every value a number, not a date
  bool integer = false;                 // numeric and every value whole
  bool unique = false;                  // never empty, every value distinct
  double median_positive = 0.0;         // of the values > 0
  const std::string& name() const { return summary->name; }
  double number(std::size_t row) const { return data->number[row]; }
  // The value as a key for matching across layers: whole numbers without decimals ("12" == 12.0).
  std::string key(std::size_t row) const;
  bool has(std::size_t row) const { return data->text[row] >= 0; }
};

struct Layer {
  const LayerSummary* summary = nullptr;
  std::vector<Column> columns;
  std::size_t rows = 0;
  bool used(std::size_t column) const;
  std::vector<std::size_t> taken;       // columns given a role
  void take(std::size_t column) { taken.push_back(column); }
};

Layer make_layer(const LayerSummary& summary);
double median(std::vector<double> v);
std::string number_text(double v, int significant = 4);

class Inference {
 public:
  Inference(const LayerSummary* pipes, const LayerSummary* structures);
  MappingProposal pipes_proposal, structures_proposal;
  void run();

 private:
  // infer_links.cpp
  void links();
  bool links_to_structures();
  bool links_between_pipes();
  void geometric_nodes();
  void ids();
  void orient_by_names(std::size_t& from, std::size_t& to) const;
  // infer_levels.cpp
  void inverts();
  void structure_levels();
  std::optional<units::Unit> level_unit(const Column& a, const Column* b, std::string& why) const;
  // infer_attributes.cpp
  void lengths();
  void sizes();
  void codes();
  void pressure_flags();
  void roughness_and_material();
  void flows();
  void structure_types();
  // helpers
  double distance_m(double x0, double y0, double x1, double y1) const;
  double end_tolerance_m() const;
  void add(MappingProposal& m, Layer& l, const std::string& role, std::size_t column, std::optional<units::Unit> unit,
           std::string why, double confidence);
  std::optional<units::Unit> system_length() const;  // ft when anything says US customary

  Layer pipes_, structures_;
  bool has_pipes_ = false, has_structures_ = false;
  // Per pipe row: the structure row (or node number) at its upstream / downstream end, as the
  // links or the geometry say; npos where unknown. node_count_: number of distinct nodes.
  std::vector<std::size_t> up_node_, down_node_;
  std::size_t node_count_ = 0;
  bool nodes_are_structures_ = false;   // node numbers are rows of the structure layer
  std::size_t from_col_ = npos, to_col_ = npos, structure_id_col_ = npos;
  std::size_t up_col_ = npos, down_col_ = npos;  // inverts
  std::optional<units::Unit> invert_unit_;
  bool invert_unit_guessed_ = false;    // metres only because nothing said otherwise
  std::vector<double> up_si_, down_si_;  // invert levels in metres per pipe row (NaN unknown)
  std::optional<units::Unit> size_unit_, length_unit_;
  std::size_t height_col_ = npos, width_col_ = npos;
  bool us_hint_ = false;                // the CRS, a size in inches or a length in feet says US customary
  std::string us_why_;
};

}  // namespace rimline::mapping::detail

#pragma once
// The pipe reader, split over read_pipes.cpp (ids, geometry, lengths, links, flows) and
// pipe_section.cpp (shape, sizes, roughness). Private to src/gis.
#include <map>
#include <optional>
#include <string>
#include <string_view>

#include "gis/read_layers.hpp"
#include "gis/value_checks.hpp"

namespace rimline::gis::detail {

inline constexpr const char* left_out = "the pipe is left out of the analysis";
// A line shorter than 1 mm has no usable direction or slope (common practice, no source).
inline constexpr double zero_length_m = 1e-3;

struct PipeColumns {
  int id, from, to, shape, material, manning_n, split, force_main;
  int diameter, width, height, ks, invert_up, invert_down, length, flow, rated_pressure;
  int invert_up_fallback, invert_down_fallback;
};

// Column of every mapped pipe field (-1: not mapped); throws for a mapped field the layer lacks.
PipeColumns resolve_pipe_columns(const PipeFields& f, const OpenLayer& l);
// The field that gives a circular pipe its diameter (width doubles as diameter with shape_from_height).
const FieldRef& diameter_ref(const Project& p);

class PipeReader {
 public:
  explicit PipeReader(LayerRead& in)
      : in_(in), p_(in.project), f_(in.project.pipe_fields), col_(resolve_pipe_columns(f_, in.source)) {}

  void read(OGRFeature& feature, model::Conduit& c);

 private:
  void read_id(OGRFeature& feature, model::Conduit& c);

  void read_geometry(OGRFeature& feature, model::Conduit& c, const FeatureRef& who);

  void read_length(OGRFeature& feature, model::Conduit& c, const FeatureRef& who);

  // Shape from the shape field, from the height (shape_from_height) or the default.
  std::optional<hydraulics::Shape> read_shape(OGRFeature& feature, const FeatureRef& who);

  // A required size: null -> the default (if any) or DATA_MISSING; bad values -> DATA_IMPLAUSIBLE.
  std::optional<double> read_size(OGRFeature& feature, int col, const FieldRef& ref, std::optional<double> fallback,
                                  std::string_view role, const FeatureRef& who);

  void read_section(OGRFeature& feature, model::Conduit& c, const FeatureRef& who);

  // A roughness value from its field, else from the material table, else the default.
  // `lo`/`hi` bound the plausible SI value; `name` is "n" or "ks".
  void read_roughness(OGRFeature& feature, model::Conduit& c, const FeatureRef& who);

  std::optional<double> roughness(OGRFeature& feature, int col, const FieldRef& ref, std::string_view role,
                                  std::string_view name, double lo, double hi,
                                  const std::map<std::string, double>& by_material, std::optional<double> fallback,
                                  const std::string& material, bool needed, const FeatureRef& who);

  void read_links(OGRFeature& feature, model::Conduit& c, const FeatureRef& who);

  // An invert from its field, else (empty or a sentinel) from its fallback field: INVERT_FALLBACK.
  std::optional<double> read_invert(OGRFeature& feature, int col, const FieldRef& ref, int fallback_col,
                                    const FieldRef& fallback, std::string_view what, const FeatureRef& who);

  void read_flow(OGRFeature& feature, model::Conduit& c, const FeatureRef& who);

  template <typename MakeText>
  void tally(std::string_view role, std::string_view key, const std::string& id, MakeText&& make) {
    in_.defaults.add(LayerRole::conduits, role, key, id, std::forward<MakeText>(make));
  }

  LayerRead& in_;
  const Project& p_;
  const PipeFields& f_;
  PipeColumns col_;
};

}  // namespace rimline::gis::detail

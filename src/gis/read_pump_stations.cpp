// [pump_station_points] -> model::PumpStation, one feature at a time (GDAL stays in src/gis).
#include "rimline/gis/read_pump_stations.hpp"

#include <algorithm>
#include <cmath>

#include "gis/gdal_source.hpp"
#include "gis/value_checks.hpp"
#include "rimline/error.hpp"

namespace rimline::gis {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

struct Columns {
  int id, duty, discharge, curve, fittings, on, off;
};

class PointReader {
 public:
  PointReader(const Project& p, detail::OpenLayer& l, Findings& f) : p_(p), l_(l), findings_(f) {
    const auto& pf = p.pump_station_fields;
    auto idx = [&](const std::string& name, const char* key) {
      return detail::field_index(l, name, std::string("pump_station_points.fields.") + key);
    };
    col_ = {idx(pf.id, "id"),       idx(pf.duty_pumps, "duty_pumps"), idx(pf.discharge, "discharge"),
            idx(pf.curve, "curve"), idx(pf.fittings_k, "fittings_k"), idx(pf.pump_on.field, "pump_on"),
            idx(pf.pump_off.field, "pump_off")};
  }

  std::optional<model::PumpStation> read(OGRFeature& feature) {
    const auto& pf = p_.pump_station_fields;
    model::PumpStation st;
    const auto id = detail::read_text(feature, col_.id);
    id_ = id ? *id : "fid " + std::to_string(feature.GetFID());
    st.id = id_;
    st.where = l_.source + ":" + l_.layer_name + ":fid " + std::to_string(feature.GetFID());
    if (!id) return missing(pf.id, "no wet-well structure id");
    const auto on = level(feature, col_.on, pf.pump_on, "pump-on level");
    const auto off = level(feature, col_.off, pf.pump_off, "pump-off level");
    if (!on || !off) return std::nullopt;
    if (!(*on > *off))
      return bad(pf.pump_on.field, "the pump-on level " + q(*on, units::Dimension::length) +
                                       " is not above the pump-off level " + q(*off, units::Dimension::length));
    st.pump_on_m = *on, st.pump_off_m = *off;
    const auto curve = detail::read_text(feature, col_.curve);
    if (!curve) return missing(pf.curve, "no pump curve named");
    const auto it = p_.pump_curves.find(*curve);
    if (it == p_.pump_curves.end()) {
      std::vector<std::string> names;
      for (const auto& [name, points] : p_.pump_curves) names.push_back(name);
      const std::string near = closest_name(*curve, names);
      return bad(pf.curve, pf.curve + " \"" + *curve + "\" names no [pump_curves] entry" +
                               (near.empty() ? "" : " (did you mean \"" + near + "\"?)"));
    }
    st.curve = it->second;
    if (col_.duty >= 0) {
      const auto raw = detail::read_number(feature, col_.duty);
      if (raw.state == detail::RawNumber::State::number) {
        if (!(raw.value >= 1.0 && raw.value <= 20.0 && raw.value == std::floor(raw.value)))
          return bad(pf.duty_pumps, pf.duty_pumps + " " + detail::format_number(raw.value) +
                                        " is not a whole number of pumps from 1 to 20");
        st.duty_pumps = static_cast<int>(raw.value);
      }
    }
    if (col_.discharge >= 0) st.discharge_id = detail::read_text(feature, col_.discharge).value_or("");
    if (col_.fittings >= 0) {
      const auto raw = detail::read_number(feature, col_.fittings);
      if (raw.state == detail::RawNumber::State::number) {
        if (!(raw.value >= 0.0)) return bad(pf.fittings_k, pf.fittings_k + " is negative");
        st.fittings_k = raw.value;
      }
    }
    return st;
  }

 private:
  std::optional<double> level(OGRFeature& feature, int col, const FieldRef& ref, const std::string& what) {
    const auto raw = detail::read_number(feature, col);
    if (raw.state == detail::RawNumber::State::null) {
      missing(ref.field, "no " + what);
      return std::nullopt;
    }
    if (raw.state != detail::RawNumber::State::number) {
      bad(ref.field, ref.field + " is not a finite number, so the station has no " + what);
      return std::nullopt;
    }
    return units::to_si(raw.value, ref.unit);
  }
  std::nullopt_t missing(const std::string& field, const std::string& what) {
    add("DATA_MISSING", field, field + " is empty: " + what + "; the pump station is left out.");
    return std::nullopt;
  }
  std::nullopt_t bad(const std::string& field, const std::string& what) {
    add("DATA_IMPLAUSIBLE", field, what + "; the pump station is left out.");
    return std::nullopt;
  }
  void add(const char* code, const std::string& field, const std::string& message) {
    findings_.push_back({code, Severity::error, LayerRole::pump_stations, id_, field, nan, nan,
                         units::Dimension::dimensionless, message});
  }

  const Project& p_;
  detail::OpenLayer& l_;
  Findings& findings_;
  Columns col_{};
  std::string id_;
};

}  // namespace

std::vector<model::PumpStation> read_pump_station_points(const Project& project,
                                                         const std::vector<model::PumpStation>& existing,
                                                         Findings& findings, std::vector<std::string>& input_files) {
  std::vector<model::PumpStation> out;
  if (project.pump_station_points.source.empty()) return out;
  detail::OpenLayer layer = detail::open_layer(project.pump_station_points, "pump_station_points");
  detail::add_input_files(input_files, layer.files);
  PointReader reader(project, layer, findings);
  detail::GdalErrorCapture capture;
  layer.layer->ResetReading();
  while (OGRFeatureUniquePtr f{layer.layer->GetNextFeature()}) {
    auto st = reader.read(*f);
    if (!st) continue;
    auto same = [&st](const model::PumpStation& o) { return o.id == st->id; };
    if (std::any_of(existing.begin(), existing.end(), same) || std::any_of(out.begin(), out.end(), same)) {
      findings.push_back({"DATA_DUPLICATE_ID", Severity::warning, LayerRole::pump_stations, st->id,
                          project.pump_station_fields.id, nan, nan, units::Dimension::dimensionless,
                          "pump station " + st->id + " is given more than once; the first is used."});
      continue;
    }
    out.push_back(std::move(*st));
  }
  return out;
}

}  // namespace rimline::gis

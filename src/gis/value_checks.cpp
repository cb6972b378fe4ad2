#include "gis/value_checks.hpp"

#include "base/number_text.hpp"

#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdio>

namespace rimline::gis::detail {
namespace {

std::string_view trim(std::string_view s) {
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.front()))) s.remove_prefix(1);
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.back()))) s.remove_suffix(1);
  return s;
}

std::string_view unit_words(units::Unit u) {
  switch (u) {
    case units::Unit::mm:
      return "millimetres";
    case units::Unit::in:
      return "inches";
    case units::Unit::m:
      return "metres";
    default:
      return units::unit_symbol(u);
  }
}

// A unit in which the raw number would be a plausible size: the usual mix-up of mm and inches
// (or m), tried in the direction that fixes the error.
std::optional<units::Unit> likely_unit(double raw, units::Unit given, bool too_small, const Plausibility& q) {
  const units::Unit bigger[] = {units::Unit::in, units::Unit::m};
  const units::Unit smaller[] = {units::Unit::mm, units::Unit::in};
  for (units::Unit u : too_small ? bigger : smaller) {
    if (u == given) continue;
    const double si = units::to_si(raw, u);
    const bool right_way = too_small ? si > units::to_si(raw, given) : si < units::to_si(raw, given);
    if (right_way && si >= q.diameter_min_m && si <= q.diameter_max_m) return u;
  }
  return std::nullopt;
}

}  // namespace

bool same_ignoring_case(std::string_view a, std::string_view b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i)
    if (std::toupper(static_cast<unsigned char>(a[i])) != std::toupper(static_cast<unsigned char>(b[i]))) return false;
  return true;
}

RawNumber read_number(OGRFeature& f, int idx) {
  RawNumber r;
  if (idx < 0 || !f.IsFieldSetAndNotNull(idx)) return r;
  const OGRFieldType type = f.GetFieldDefnRef(idx)->GetType();
  if (type == OFTInteger || type == OFTInteger64 || type == OFTReal) {
    r.value = f.GetFieldAsDouble(idx);
  } else {
    const std::string_view text = trim(f.GetFieldAsString(idx));
    if (text.empty()) return r;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), r.value);
    if (ec != std::errc() || end != text.data() + text.size()) {
      r.state = RawNumber::State::not_number;
      r.text = text;
      return r;
    }
  }
  r.state = std::isfinite(r.value) ? RawNumber::State::number : RawNumber::State::not_finite;
  return r;
}

std::optional<std::string> read_text(OGRFeature& f, int idx) {
  if (idx < 0 || !f.IsFieldSetAndNotNull(idx)) return std::nullopt;
  const std::string_view text = trim(f.GetFieldAsString(idx));
  if (text.empty()) return std::nullopt;
  return std::string(text);
}

std::string format_number(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.10g", v);
  return buf;
}

std::string format_value(double raw, units::Unit u) {
  if (u == units::Unit::one) return format_number(raw);
  return format_number(raw) + " " + std::string(units::unit_symbol(u));
}

// A token rendered in the run's units where the text is shown (render_message).
std::string format_si(double si, units::Dimension d) { return q(si, d); }

std::string format_fixed(double v, int decimals) {
  std::string out = fixed_text(v, decimals);  // bounded: a 1e300 value was cut to 47 wrong digits
  if (out.find('.') != std::string::npos && out.find('e') == std::string::npos) {
    while (out.back() == '0') out.pop_back();
    if (out.back() == '.') out.pop_back();
  }
  if (out == "-0") out = "0";
  return out;
}

void FeatureRef::add(std::string_view code, Severity s, const std::string& field, std::string message, double value,
                     double limit, units::Dimension d) const {
  Finding f;
  f.code = code;
  f.severity = s;
  f.layer = layer;
  f.feature_id = id;
  f.field = field;
  f.value = value;
  f.limit = limit;
  f.dimension = d;
  f.message = std::move(message);
  findings.push_back(std::move(f));
}

std::optional<double> checked_number(const RawNumber& raw, const std::string& field, std::string_view consequence,
                                     const FeatureRef& who, Severity severity) {
  switch (raw.state) {
    case RawNumber::State::null:
      return std::nullopt;
    case RawNumber::State::number:
      return raw.value;
    case RawNumber::State::not_number:
      who.add("DATA_IMPLAUSIBLE", severity, field,
              field + " holds \"" + raw.text + "\", which is not a number; " + std::string(consequence) + ".");
      return std::nullopt;
    case RawNumber::State::not_finite:
      who.add("DATA_IMPLAUSIBLE", severity, field,
              field + " is not a finite number; " + std::string(consequence) + ".");
      return std::nullopt;
  }
  return std::nullopt;
}

std::optional<double> checked_level(const RawNumber& raw, const FieldRef& ref, std::string_view what,
                                    const Plausibility& limits, const FeatureRef& who, bool zero_means_missing) {
  auto unknown_text = [what] { return "the " + std::string(what) + " is unknown"; };
  if (raw.state == RawNumber::State::null) {
    who.add("DATA_MISSING", Severity::warning, ref.field, ref.field + " is empty; " + unknown_text() + ".");
    return std::nullopt;
  }
  const auto v = checked_number_lazy(raw, ref.field, unknown_text, who);
  if (!v) return std::nullopt;
  const double si = units::to_si(*v, ref.unit);
  const bool good = !(*v == 0.0 && zero_means_missing) && si < limits.invert_max_m && si >= limits.invert_min_m;
  if (good) return si;
  const std::string unknown = unknown_text();
  const auto L = units::Dimension::length;
  if (*v == 0.0 && zero_means_missing) {
    who.add("DATA_IMPLAUSIBLE", Severity::warning, ref.field,
            ref.field + " is exactly 0, a common stand-in for a missing level; " + unknown + ".", si, 0.0, L);
    return std::nullopt;
  }
  if (si >= limits.invert_max_m) {
    who.add("DATA_IMPLAUSIBLE", Severity::warning, ref.field,
            ref.field + " " + format_value(*v, ref.unit) + " is at or above " +
                format_value(units::from_si(limits.invert_max_m, ref.unit), ref.unit) + ", a no-data sentinel; " +
                unknown + ".",
            si, limits.invert_max_m, L);
    return std::nullopt;
  }
  if (si < limits.invert_min_m) {
    who.add("DATA_IMPLAUSIBLE", Severity::warning, ref.field,
            ref.field + " " + format_value(*v, ref.unit) + " is below " +
                format_value(units::from_si(limits.invert_min_m, ref.unit), ref.unit) + ", a no-data sentinel; " +
                unknown + ".",
            si, limits.invert_min_m, L);
    return std::nullopt;
  }
  return si;
}

std::optional<double> checked_size(const RawNumber& raw, const FieldRef& ref, const Plausibility& limits,
                                   std::string_view consequence, Severity severity, const FeatureRef& who) {
  const auto v = checked_number(raw, ref.field, consequence, who, severity);
  if (!v) return std::nullopt;
  const double si = units::to_si(*v, ref.unit);
  const auto L = units::Dimension::length;
  const std::string shown = ref.field + " " + format_value(*v, ref.unit);
  if (!(si > 0.0)) {
    who.add("DATA_IMPLAUSIBLE", severity, ref.field,
            shown + " is not a positive size; " + std::string(consequence) + ".", si, 0.0, L);
    return std::nullopt;
  }
  const bool too_small = si < limits.diameter_min_m;
  if (too_small || si > limits.diameter_max_m) {
    const double limit = too_small ? limits.diameter_min_m : limits.diameter_max_m;
    std::string msg = shown + (too_small ? " is smaller than the plausible " : " is larger than the plausible ") +
                      format_value(units::from_si(limit, ref.unit), ref.unit);
    if (const auto u = likely_unit(*v, ref.unit, too_small, limits))
      msg += " (it looks like a value in " + std::string(unit_words(*u)) + ")";
    who.add("DATA_IMPLAUSIBLE", severity, ref.field, msg + "; " + std::string(consequence) + ".", si, limit, L);
    return std::nullopt;
  }
  return si;
}

std::optional<double> checked_flow(double raw, const FieldRef& ref, std::string_view consequence, const FeatureRef& who) {
  const double si = units::to_si(raw, ref.unit);
  if (si >= 0.0 && si <= max_flow_m3_s) return si;
  const bool negative = si < 0.0;
  who.add("DATA_IMPLAUSIBLE", Severity::warning, ref.field,
          ref.field + " " + format_value(raw, ref.unit) + (negative ? " is negative; " : " is beyond any drain (above ") +
              (negative ? "" : format_si(max_flow_m3_s, units::Dimension::flow) + "); ") + std::string(consequence) + ".",
          std::isfinite(si) ? si : std::numeric_limits<double>::quiet_NaN(), negative ? 0.0 : max_flow_m3_s,
          units::Dimension::flow);
  return std::nullopt;
}

IdText read_id(OGRFeature& f, int idx) {
  IdText out;
  if (idx < 0 || !f.IsFieldSetAndNotNull(idx)) return out;
  const OGRFieldType type = f.GetFieldDefnRef(idx)->GetType();
  if (type == OFTReal) {
    const double v = f.GetFieldAsDouble(idx);
    constexpr double exact = 9007199254740992.0;  // 2^53: every whole number up to it is a double
    if (std::isfinite(v) && v == std::trunc(v) && std::fabs(v) < 1e18) {
      std::string text;
      append_fixed(text, v, 0);
      out.id = text;
      if (std::fabs(v) > exact)
        out.inexact = "the number is beyond 2^53, where a real field no longer keeps every whole number: " + text +
                      " may not be the id in the file";
      return out;
    }
  }
  if (type == OFTInteger64) {
    const GIntBig v = f.GetFieldAsInteger64(idx);
    if (v == std::numeric_limits<GIntBig>::max() || v == std::numeric_limits<GIntBig>::min())
      out.inexact = "the number is at the end of the 64-bit range, where GDAL puts ids beyond it: " +
                    std::to_string(v) + " may not be the id in the file";
  }
  const std::string_view text = trim(f.GetFieldAsString(idx));
  if (!text.empty()) out.id = std::string(text);
  return out;
}

void report_inexact_id(const IdText& id, const std::string& field, const FeatureRef& who) {
  if (id.inexact.empty()) return;
  who.add("DATA_ID_INEXACT", Severity::warning, field,
          field + " is a number that cannot be read exactly (" + id.inexact +
              "); ids that differ only there read alike: store ids as text.");
}

}  // namespace rimline::gis::detail

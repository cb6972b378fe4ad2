// [comparison] and [headroom] -> ConnectionSettings (SI).
#include "config/project_connections.hpp"

namespace rimline::config::detail {

void read_connection_settings(TomlSection comparison, TomlSection headroom, Project& p) {
  using units::Dimension;
  auto& c = p.connections.comparison;
  c.level_tolerance_m = comparison.quantity("level_tolerance", Dimension::length).value_or(c.level_tolerance_m);
  c.velocity_tolerance_m_s =
      comparison.quantity("velocity_tolerance", Dimension::velocity).value_or(c.velocity_tolerance_m_s);
  c.ratio_tolerance = comparison.number("ratio_tolerance").value_or(c.ratio_tolerance);
  c.ignore_codes = comparison.strings("ignore_codes");
  for (const double v : {c.level_tolerance_m, c.velocity_tolerance_m_s, c.ratio_tolerance})
    if (!(v >= 0.0)) comparison.fail("level_tolerance", "tolerances must not be negative");
  comparison.finish();

  auto& h = p.connections.headroom;
  h.structures = headroom.strings("structures");
  h.existing = headroom
                   .choice<ExistingExceptions>("existing", {{"no_worse", ExistingExceptions::no_worse},
                                                            {"none", ExistingExceptions::none}})
                   .value_or(h.existing);
  h.precision_m3_s = headroom.quantity("precision", Dimension::flow).value_or(h.precision_m3_s);
  if (!(h.precision_m3_s > 0.0)) headroom.fail("precision", "must be greater than 0");
  h.relative_precision = headroom.number("relative_precision").value_or(h.relative_precision);
  if (!(h.relative_precision >= 0.0 && h.relative_precision < 0.5))
    headroom.fail("relative_precision", "must lie in [0, 0.5)");
  h.limit_m3_s = headroom.quantity("limit", Dimension::flow);
  if (h.limit_m3_s && !(*h.limit_m3_s > 0.0)) headroom.fail("limit", "must be greater than 0");
  headroom.finish();
}

}  // namespace rimline::config::detail

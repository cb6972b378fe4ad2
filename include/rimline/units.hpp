#pragma once
// Every conversion factor rimline uses, each with its source. Inside rimline all
// quantities are SI (m, s, m^3/s); values are converted once where they enter
// (io) and once where they leave (report).
#include <optional>
#include <string>
#include <string_view>

namespace rimline::units {

// International foot and inch: exact by the 1959 international yard and pound
// agreement (NIST SP 811, 2008 ed., Appendix B.8).
inline constexpr double metres_per_foot = 0.3048;
inline constexpr double metres_per_inch = 0.0254;
// US survey foot = 1200/3937 m (NIST SP 811, 2008 ed., B.6; deprecated 2022 but still in old exports).
inline constexpr double metres_per_us_survey_foot = 1200.0 / 3937.0;
// US gallon = 231 cubic inches exactly (NIST SP 811, 2008 ed., B.8).
inline constexpr double cubic_metres_per_us_gallon = 231.0 * metres_per_inch * metres_per_inch * metres_per_inch;
inline constexpr double cubic_metres_per_cubic_foot = metres_per_foot * metres_per_foot * metres_per_foot;
inline constexpr double seconds_per_day = 86400.0;
inline constexpr double seconds_per_minute = 60.0;
inline constexpr double seconds_per_hour = 3600.0;
// International mile = 5280 ft exactly (NIST SP 811, 2008 ed., B.8).
inline constexpr double metres_per_mile = 5280.0 * metres_per_foot;
// Standard acceleration of gravity, 9.80665 m/s^2 (3rd CGPM 1901; NIST SP 330, 2019 ed.).
inline constexpr double gravity_m_s2 = 9.80665;
inline constexpr double gravity_ft_s2 = gravity_m_s2 / metres_per_foot;  // 32.174 ft/s^2

enum class Dimension {
  length, flow, velocity, area, dimensionless, slope, temperature, pressure_head,
  time,             // s (inlet time, time of concentration, IDF durations)
  intensity,        // rainfall intensity, m/s (a depth per time, kept apart from velocity)
  flow_per_length,  // infiltration allowance per length of sewer, m^3/s per m
  flow_per_area     // infiltration allowance per contributing area, m^3/s per m^2
};

enum class Unit {
  m, mm, cm, ft, us_ft, in,                 // length / elevation
  m3_s, l_s, cfs, mgd, gpm,                  // flow
  m_s, ft_s,                                 // velocity
  m2, ha, ft2, acre,                         // area
  one, percent,                              // dimensionless, slope
  deg_c, deg_f,                              // temperature
  s, min, h,                                 // time
  mm_h, in_h,                                // rainfall intensity
  l_d, gpd,                                  // flow (per-capita sewage flows)
  l_s_km, gpd_mi,                            // flow per length of sewer
  l_s_ha, gpd_acre,                          // flow per contributing area
  m_head, ft_head, kpa, psi, bar             // pressure, held as head of water [m]
};

Dimension dimension_of(Unit u);
// Accepts the usual spellings: "m", "mm", "ft", "us_ft" / "ftUS", "in", "m3/s", "L/s", "cfs", "MGD",
// "gpm", "m/s", "ft/s", "ha", "acre", "%", "C", "F", "kPa", "psi", "bar", "m_head", "ft_head" ... Returns nullopt for an unknown spelling.
std::optional<Unit> parse_unit(std::string_view text);
std::string_view unit_symbol(Unit u);
// The symbols of every unit of a dimension, in table order ("m, mm, cm, ft, us_ft, in" for lengths),
// for messages that list the accepted units.
std::string unit_symbols(Dimension d);

// The unit a field's name states in its last word ("US_INV_FT" -> ft, "DIA_IN" -> in, "Q_LPS" -> L/s,
// "depthM" -> m), as exports write it; nullopt when the name states none. Names are split at every
// character that is not a letter or digit and where a lower-case letter meets an upper-case one.
std::optional<Unit> unit_named_in(std::string_view field_name);

// value [u] -> SI (m, m^3/s, m/s, m^2, 1, degC)
double to_si(double value, Unit u);
// SI -> value [u]
double from_si(double si_value, Unit u);

// The unit system a run reports in.
enum class System { si, us };
// The display unit of a dimension in a system (length: m | ft, flow: m3/s | cfs, velocity: m/s | ft/s,
// time: min, intensity: mm/h | in/h, per length: L/s/km | gpd/mi, per area: L/s/ha | gpd/acre).
Unit display_unit(Dimension d, System s);

}  // namespace rimline::units

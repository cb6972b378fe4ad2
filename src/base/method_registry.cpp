#include "rimline/method_registry.hpp"

#include <array>

namespace rimline {
namespace {

constexpr std::array<MethodRow, 32> rows{{
    {"friction", "manning", "Manning", "V = (1/n) R^(2/3) S^(1/2) on the hydraulic radius of the wetted section",
     "Manning (1891); SI form, and the US form with 1.486 = (1/0.3048)^(1/3) ft^(1/3)/m^(1/3)"},
    {"friction", "darcy_weisbach", "Darcy-Weisbach with Colebrook-White",
     "S = f/(4R) V^2/2g; f from Colebrook-White on ks and Re, 64/Re below Re 2000",
     "Colebrook (1939), J. Instn Civ. Engrs 11(4) (citation from memory)"},
    {"friction", "hazen_williams", "Hazen-Williams", "V = 0.849 C R^0.63 S^0.54 (SI), pressure mains only",
     "Williams & Hazen, Hydraulic Tables (1905); SI constant 0.849 from memory"},
    {"profile", "standard_step", "Gradually varied flow, step method",
     "dE/dx = S0 - Sf between sections, step length set by the allowed depth change; jump by specific force",
     "Chow, Open-Channel Hydraulics (1959), step methods and the jump (chapters from memory)"},
    {"structure loss", "constant_k", "Constant K by structure type",
     "h = K V_o^2/2g, V_o the velocity at the outflow pipe's inlet (partly full or full, from its profile)",
     "common practice, no source (K values are the project's)"},
    {"structure loss", "bend", "K plus bend by deflection angle",
     "h = (K + K_bend(theta)) V_o^2/2g on the velocity at the outflow pipe's inlet, K_bend from the deflection "
     "between main inflow and outflow",
     "bend coefficients from memory (see src/hydraulics/losses)"},
    {"structure loss", "hec22", "HEC-22 access-hole energy-loss method",
     "K = K_o C_D C_d C_Q C_p C_B with angle, depth, relative flow, plunging and benching corrections; H = K V_o^2/2g "
     "on the velocity at the outflow pipe's inlet is the whole loss across the access hole: access-hole energy "
     "level = outflow EGL + H, the water level in the hole = that energy level, each inflow pipe's EGL at its "
     "outlet = that level (its HGL = level - V_i^2/2g)",
     "FHWA HEC-22, 2nd ed. (2001), section 7.1.6 - implemented from memory, not from the document"},
    {"structure energy", "whole_loss", "K is the whole loss across the structure (default)",
     "structure energy level E = EGL at the outflow pipe's inlet + K V_o^2/2g; water level in the structure = E; "
     "each arriving pipe's EGL at its outlet = E, so its HGL there = E - V^2/2g (critical depth where E is below "
     "its critical energy: it falls freely into the structure)",
     "the definition of tabulated manhole and junction K values as the whole energy loss, e.g. FHWA HEC-22, 2nd ed. "
     "(2001), Table 7-5 - from memory"},
    {"structure energy", "still_pool", "Still pool (conservative option)",
     "the structure is a still pool at E = EGL at the outflow pipe's inlet + K V_o^2/2g, and E is each arriving "
     "pipe's HGL at its outlet: its velocity head V^2/2g is lost in the pool as well ((1 + K) velocity heads across "
     "a straight-through structure); per run or per structure",
     "common practice, no source (some agencies ask for it)"},
    {"structure energy", "receiving_water", "Outfalls and wet wells",
     "the tailwater or pump-on level is the arriving pipe's HGL at its outlet (its velocity head is spent in the "
     "receiving water), or critical depth at a free outlet when that is higher",
     "common practice, no source (exit loss K = 1)"},
    {"water", "viscosity", "Kinematic viscosity of water",
     "nu(T) from the Vogel equation for the dynamic viscosity over the density of water, at [methods] "
     "water_temperature (default 15 C); used by Darcy-Weisbach (Reynolds number), pipes and force mains",
     "Vogel equation constants and density formula from memory; within about 1 % of tabulated water properties"},
    {"flows", "rational", "Rational Method along the network",
     "Q = C i A at each pipe for the C A upstream and i at its time of concentration Tc = longest (inlet time + travel "
     "time through the pipes between); SI inside, so no unit constant (1/360 for mm/h and ha to m3/s, 1.008 for in/h "
     "and acres to cfs)",
     "Kuichling (1889; citation from memory); checked against Fair, Geyer and Okun's Water and Wastewater Engineering "
     "(Shammas & Wang, 2011), "
     "Example 11.9, and Ponce, Engineering Hydrology (1989), Table 4-2"},
    {"flows", "idf", "IDF relation",
     "i = a / (t + b)^c (t, b in min) for the chosen return period, or a table of "
     "durations interpolated log-log (extended beyond it with a finding)",
     "common practice (the form of Fair, Geyer and Okun, Example 11.9); the constants are the project's"},
    {"flows", "travel_velocity", "Pipe travel time for Tc",
     "length / velocity at normal depth for the pipe's own design flow (known before any pipe downstream needs it, so "
     "no iteration with the march); full-flow velocity by option or where normal depth does not exist; 0 without a "
     "slope",
     "common practice, no source"},
    {"flows", "inlet_time", "Default inlet time", "10 min where a catchment gives none ([catchments.defaults])",
     "common practice, no source (agency manuals use 5-15 min)"},
    {"flows", "composite_c", "Composite runoff coefficient",
     "area-weighted C of the land-use polygons a catchment overlaps (polygon intersection); the uncovered part keeps "
     "the catchment's own C",
     "common practice, no source"},
    {"flows", "harmon", "Sanitary peak flow, Harmon peaking factor",
     "Q = PF q P + infiltration per length of pipe or per area; PF = 1 + 14 / (4 + sqrt(P)), P in thousands",
     "Harmon (1918); as (18 + sqrt P) / (4 + sqrt P) in Recommended Standards for Wastewater Facilities (Ten States "
     "Standards) - section and edition from memory"},
    {"criterion", "freeboard", "Freeboard below the rim", "HGL at least this far below the rim (default 0.3 m, about 1 ft)",
     "common practice, no source (agency manuals range from 0 to 1 ft)"},
    {"criterion", "velocity_min", "Minimum velocity",
     "self-cleansing velocity (default 0.9 m/s, 3 ft/s) of the pipe's own design flow at normal depth (velocity_min_basis "
     "normal_depth, default; above the partly-full peak: the design flow filling the pipe) or flowing full at its "
     "slope (full_flow); per run or per pipe; tailwater and surcharge play no part",
     "TxDOT Hydraulic Design Manual (2016 revision): 3 ft/s for storm drains; the bases: common practice, no source"},
    {"criterion", "velocity_min_sanitary", "Minimum velocity, sanitary", "0.6 m/s (2 ft/s) flowing full, n = 0.013",
     "Recommended Standards for Wastewater Facilities (Ten States Standards), 2004, section 33.41"},
    {"criterion", "velocity_max", "Maximum velocity",
     "the highest velocity anywhere along the pipe (supercritical reaches included) above about 4.6 m/s (15 ft/s)",
     "Ten States Standards - from memory"},
    {"criterion", "capacity_ratio_max", "Capacity ratio", "design flow over full-flow capacity at the pipe slope",
     "common practice, no source"},
    {"criterion", "cover_min", "Minimum cover", "rim minus crown at each end (off unless set)",
     "common practice, no source (set from the local standard)"},
    {"data", "level_tolerance", "Pipe inverts against their structures",
     "a pipe end's invert more than 0.1 m below the structure's invert, or above its rim, is a finding",
     "common practice, no source (survey and digitising slack of levels)"},
    {"data", "invert_step_max", "Plausible invert step at a structure",
     "an arriving pipe's outlet more than 3 m above or below the main outflow's inlet is a finding",
     "common practice, no source (drop structures rarely exceed a few metres)"},
    {"data", "unit_check", "Unit of the mapped levels",
     "the median pipe slope (1e-4 to 0.3) and the agreement of pipe inverts with the structures' inverts (1 m) and "
     "rims (below them, within 30 m) under the declared unit, and under m, mm, cm, ft, in",
     "common practice, no source"},
    {"data", "ground_rims", "Rims from a ground raster",
     "the raster's level at the structure (bilinear between pixel centres), plus the stated offset, where no rim is "
     "recorded; a recorded rim more than 0.5 m from it is a finding",
     "common practice, no source"},
    {"pump", "operating_point", "Pump operating point on the force-main system curve",
     "n identical duty pumps in parallel: H_pump(Q/n) = static lift + friction + (K_fittings + 1) V^2/2g, at the low "
     "and high wet-well level with one and all duty pumps; pump curve interpolated monotone",
     "Fritsch & Carlson (1980), SIAM J. Numer. Anal. 17(2) 238-246 (curve); system curve and cases: common practice, "
     "no source"},
    {"criterion", "fm_pressure_min", "Force-main minimum pressure head",
     "zero pressure head: where the HGL runs below the pipe the main is sub-atmospheric (air entry, column separation), an "
     "air-release valve candidate at the high point",
     "common practice, no source"},
    {"criterion", "fm_velocity_min", "Force-main minimum (scour) velocity", "0.6 m/s (2 ft/s) in every operating case",
     "Fair, Geyer & Okun, Water and Wastewater Engineering, 3rd ed., 14.14.4.2; Ten States Standards, section 48 "
     "(2 ft/s) - both from memory"},
    {"criterion", "fm_velocity_max", "Force-main maximum velocity", "2.5 m/s (8 ft/s) in every operating case",
     "Fair, Geyer & Okun, Water and Wastewater Engineering, 3rd ed., 14.14.4.2 - from memory"},
    {"criterion", "fm_cover", "Force-main cover for a DEM profile",
     "1.2 m (4 ft) from ground to crown where the profile comes from a DEM (centreline = ground - cover - D/2)",
     "common practice, no source (set from the local standard)"},
}};

}  // namespace

std::span<const MethodRow> method_rows() { return rows; }

}  // namespace rimline

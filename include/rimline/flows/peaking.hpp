#pragma once
// Peaking factors for sanitary design flows: peak hourly flow / average daily flow.

namespace rimline::flows {

// Harmon (1918): PF = 1 + 14 / (4 + sqrt(P)), P = contributing population in thousands; written
// (18 + sqrt(P)) / (4 + sqrt(P)) in Recommended Standards for Wastewater Facilities (Ten States
// Standards), where it is the ratio of peak hourly to average daily flow (section and edition from
// memory). `population` in persons, >= 0; PF -> 4.5 as P -> 0.
double harmon_peaking_factor(double population);

}  // namespace rimline::flows

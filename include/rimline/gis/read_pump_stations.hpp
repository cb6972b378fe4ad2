#pragma once
// Pump stations from a point layer ([pump_station_points] in the project file): per feature the
// wet-well structure id, pump-on / pump-off levels, duty pumps, discharge structure, fittings K and
// the name of its [pump_curves] entry. A feature with a data problem is a finding (layer
// pump_stations: DATA_MISSING or DATA_IMPLAUSIBLE, error) and is left out; DATA_DUPLICATE_ID
// (warning) when a [[pump_stations]] entry or an earlier point has the same id (the first wins).
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/config/project.hpp"
#include "rimline/model/pump_station.hpp"

namespace rimline::gis {
using namespace rimline::config;  // the readers speak the project file's vocabulary

// The stations of the point layer; `existing` are the [[pump_stations]] entries (for duplicates).
// The layer's files are added to `input_files` (hashed in the summary) when not there yet.
std::vector<model::PumpStation> read_pump_station_points(const Project& project,
                                                         const std::vector<model::PumpStation>& existing,
                                                         Findings& findings, std::vector<std::string>& input_files);

}  // namespace rimline::gis

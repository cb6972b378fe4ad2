#pragma once
// The vertical profile of each force main (pipe centreline elevation along the line), from the
// best source at hand:
//   1. Z on the line's vertices (taken as the pipe invert there; centreline = Z + rise / 2);
//   2. a ground DEM raster read with GDAL, sampled bilinearly at every vertex and every `spacing`
//      between, minus the cover to the crown and half the rise;
//   3. the two end inverts only (a straight grade line), flagged FM_PROFILE_COARSE (info), since
//      high points between the ends stay unseen.
// A DEM that does not cover a line (outside the raster or no-data) gives FM_PROFILE_COARSE
// (warning) naming the first uncovered station, and the end inverts are used. A DEM that cannot be
// opened stops the run: Error(bad_input) naming the file.
#include <string>
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"
#include "rimline/model/pump_station.hpp"

namespace rimline::gis {

// One profile per usable force-main conduit (model::Conduit::force_main), in conduit order.
std::vector<model::ForceMainProfile> force_main_profiles(const model::Network& network,
                                                         const model::ForceMainSettings& settings, Findings& findings);

// Ground elevations [m] of a DEM at points given in the network's run CRS [m], bilinear between
// pixel centres; NaN where the raster does not cover a point or a neighbouring pixel is no-data.
// Also the ground levels of [ground] (src/run/ground_rims.cpp). Throws Error(bad_input) naming the
// file when it is not a raster with that band.
std::vector<double> sample_dem(const std::string& dem_source, double dem_metres_per_unit, const model::Network& network,
                               const std::vector<model::Point2>& points_m, int band = 1);

}  // namespace rimline::gis

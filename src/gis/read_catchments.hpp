#pragma once
// Catchment polygons (and optional land-use polygons for a composite C) -> model::Catchment, in
// the run CRS and SI. A catchment without a usable polygon is left out; one without a usable C or
// inlet time takes the project's default, as its finding says. Private to src/gis.
#include <vector>

#include "gis/gdal_source.hpp"
#include "gis/line_geometry.hpp"
#include "gis/run_crs.hpp"
#include "rimline/finding.hpp"
#include "rimline/config/project.hpp"
#include "rimline/gis/read_network.hpp"
#include "rimline/model/catchment.hpp"

namespace rimline::gis::detail {

struct PolygonLayer {
  OpenLayer& source;
  Placement placement;
};

// land_use may be null. Throws Error(bad_config) for a mapped field the layer lacks.
void read_catchments(const Project& project, PolygonLayer catchments, const PolygonLayer* land_use,
                     std::vector<model::Catchment>& out, Findings& findings);

// Opens [catchments] (and [land_use]) when the project has them, reads them into result.catchments
// and adds their files to result.input_files.
void read_catchment_layers(const Project& project, const RunCrs& crs, ReadResult& result);

}  // namespace rimline::gis::detail

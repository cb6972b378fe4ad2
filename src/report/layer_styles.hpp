#pragma once
// The default style of each result layer of results.gpkg, in the `layer_styles` table that desktop
// GIS clients read when a GeoPackage layer is opened (columns f_table_catalog, f_table_schema,
// f_table_name, f_geometry_column, styleName, styleQML, styleSLD, useAsDefault, description, owner,
// ui, update_time), so the results open coloured by status. Each style is given twice: as a QGIS
// style document (QML) and as an OGC Styled Layer Descriptor 1.0.0 (SLD), both of rimline's own
// design, from the palette of the plan map (status_palette.hpp).
#include <string>
#include <vector>

namespace rimline::report {

class SqliteDb;

// The QML and SLD documents of one layer; empty when rimline has no style for that layer.
std::string layer_style_qml(const std::string& table);
std::string layer_style_sld(const std::string& table);

// Creates layer_styles (registered in gpkg_contents as an attributes table) with one default style
// per layer of gpkg_geometry_columns that rimline styles. update_time is left NULL so that two runs
// write the same rows.
void write_layer_styles(SqliteDb& db);

}  // namespace rimline::report

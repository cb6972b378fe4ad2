#include "report/layer_styles.hpp"

#include <string_view>
#include <utility>
#include <vector>

#include "base/number_text.hpp"
#include "report/sqlite_db.hpp"
#include "report/status_palette.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::report {
namespace {

std::string rgba(const StatusColour& c, int alpha = 255) {
  return std::to_string(c.r) + "," + std::to_string(c.g) + "," + std::to_string(c.b) + "," + std::to_string(alpha);
}

std::string xml_text(std::string_view s) { return xml_escape(s); }

std::string option(const char* name, const std::string& value) {
  return "        <Option name=\"" + std::string(name) + "\" type=\"QString\" value=\"" + xml_text(value) + "\"/>\n";
}

// QML symbols (QGIS style document): a filled circle, a line, a translucent fill. Sizes in mm.
std::string qml_marker(const std::string& name, const StatusColour& c, double size_mm) {
  return "    <symbol type=\"marker\" name=\"" + name + "\" alpha=\"1\" clip_to_extent=\"1\" force_rhr=\"0\">\n"
         "      <layer class=\"SimpleMarker\" enabled=\"1\" pass=\"0\" locked=\"0\">\n      <Option type=\"Map\">\n" +
         option("name", "circle") + option("color", rgba(c)) + option("outline_color", "35,35,35,255") +
         option("outline_width", "0.2") + option("size", fixed_text(size_mm, 1)) + option("size_unit", "MM") +
         "      </Option>\n      </layer>\n    </symbol>\n";
}

std::string qml_line(const std::string& name, const StatusColour& c, double width_mm, bool dashed) {
  return "    <symbol type=\"line\" name=\"" + name + "\" alpha=\"1\" clip_to_extent=\"1\" force_rhr=\"0\">\n"
         "      <layer class=\"SimpleLine\" enabled=\"1\" pass=\"0\" locked=\"0\">\n      <Option type=\"Map\">\n" +
         option("line_color", rgba(c)) + option("line_width", fixed_text(width_mm, 1)) +
         option("line_width_unit", "MM") + option("line_style", dashed ? "dash" : "solid") +
         option("capstyle", "round") + option("joinstyle", "round") + "      </Option>\n      </layer>\n    </symbol>\n";
}

std::string qml_fill(const std::string& name, const StatusColour& c) {
  return "    <symbol type=\"fill\" name=\"" + name + "\" alpha=\"1\" clip_to_extent=\"1\" force_rhr=\"0\">\n"
         "      <layer class=\"SimpleFill\" enabled=\"1\" pass=\"0\" locked=\"0\">\n      <Option type=\"Map\">\n" +
         option("color", rgba(c, 40)) + option("outline_color", rgba(c)) + option("outline_width", "0.3") +
         option("style", "solid") + "      </Option>\n      </layer>\n    </symbol>\n";
}

std::string qml_document(const std::string& renderer) {
  return "<!DOCTYPE qgis PUBLIC 'http://mrcc.com/qgis.dtd' 'SYSTEM'>\n"
         "<qgis version=\"3.28.0\" styleCategories=\"Symbology\">\n" + renderer + "</qgis>\n";
}

std::string qml_single(const std::string& symbol) {
  return qml_document("  <renderer-v2 type=\"singleSymbol\" symbollevels=\"0\" enableorderby=\"0\" forceraster=\"0\">\n"
                      "   <symbols>\n" + symbol + "   </symbols>\n  </renderer-v2>\n");
}

constexpr StatusColour catchment_colour{"catchment", "Catchment", "#4d7c3a", 77, 124, 58};

// SLD 1.0.0 (OGC 02-070): one rule per status.
std::string sld_point(const StatusColour& c, double size_px) {
  return "<PointSymbolizer><Graphic><Mark><WellKnownName>circle</WellKnownName><Fill><CssParameter name=\"fill\">" +
         std::string(c.hex) + "</CssParameter></Fill><Stroke><CssParameter name=\"stroke\">#232323</CssParameter>"
         "<CssParameter name=\"stroke-width\">0.5</CssParameter></Stroke></Mark><Size>" +
         std::to_string(static_cast<int>(size_px)) + "</Size></Graphic></PointSymbolizer>";
}

std::string sld_line(const StatusColour& c, double width_px, bool dashed) {
  return "<LineSymbolizer><Stroke><CssParameter name=\"stroke\">" + std::string(c.hex) +
         "</CssParameter><CssParameter name=\"stroke-width\">" + std::to_string(static_cast<int>(width_px)) +
         "</CssParameter>" + (dashed ? "<CssParameter name=\"stroke-dasharray\">6 3</CssParameter>" : "") +
         "</Stroke></LineSymbolizer>";
}

std::string sld_rule(std::string_view title, const std::string& filter, const std::string& symbolizer) {
  return "<Rule><Name>" + xml_text(title) + "</Name><Title>" + xml_text(title) + "</Title>" + filter + symbolizer +
         "</Rule>";
}

std::string sld_equal(const char* property, std::string_view value) {
  return "<ogc:Filter><ogc:PropertyIsEqualTo><ogc:PropertyName>" + std::string(property) +
         "</ogc:PropertyName><ogc:Literal>" + xml_text(value) + "</ogc:Literal></ogc:PropertyIsEqualTo></ogc:Filter>";
}

std::string sld_document(const std::string& table, const std::string& rules) {
  return "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
         "<StyledLayerDescriptor version=\"1.0.0\" xmlns=\"http://www.opengis.net/sld\" "
         "xmlns:ogc=\"http://www.opengis.net/ogc\" xmlns:xlink=\"http://www.w3.org/1999/xlink\" "
         "xmlns:xsi=\"http://www.w3.org/2001/XMLSchema-instance\" xsi:schemaLocation=\"http://www.opengis.net/sld "
         "http://schemas.opengis.net/sld/1.0.0/StyledLayerDescriptor.xsd\"><NamedLayer><Name>" + xml_text(table) +
         "</Name><UserStyle><Name>rimline status</Name><Title>rimline: " + xml_text(table) +
         " by result</Title><FeatureTypeStyle>" + rules + "</FeatureTypeStyle></UserStyle></NamedLayer>"
         "</StyledLayerDescriptor>\n";
}

}  // namespace

std::string layer_style_qml(const std::string& table) {
  if (table == "structures") {
    std::string categories, symbols;
    for (std::size_t k = 0; k < structure_palette.size(); ++k) {
      const auto& c = structure_palette[k];
      const bool failing = c.status == "flooded" || c.status == "freeboard";
      categories += "    <category symbol=\"" + std::to_string(k) + "\" value=\"" + std::string(c.status) +
                    "\" label=\"" + xml_text(c.label) + "\" render=\"true\"/>\n";
      symbols += qml_marker(std::to_string(k), c, failing ? 4.0 : 2.6);
    }
    return qml_document("  <renderer-v2 type=\"categorizedSymbol\" attr=\"status\" symbollevels=\"0\" "
                        "enableorderby=\"0\" forceraster=\"0\">\n   <categories>\n" + categories +
                        "   </categories>\n   <symbols>\n" + symbols + "   </symbols>\n  </renderer-v2>\n");
  }
  if (table == "conduits") {
    // Not solved: no HGL at the upstream end; surcharged: a surcharged length; else below the crown.
    const char* filters[] = {"&quot;hgl_up&quot; IS NULL", "&quot;surcharged_length&quot; &gt; 0", "ELSE"};
    const std::size_t order[] = {2, 0, 1};  // palette rows: not_checked, surcharged, ok
    std::string rules, symbols;
    for (std::size_t k = 0; k < 3; ++k) {
      const auto& c = conduit_palette[order[k]];
      rules += "    <rule key=\"r" + std::to_string(k) + "\" filter=\"" + filters[k] + "\" label=\"" +
               xml_text(c.label) + "\" symbol=\"" + std::to_string(k) + "\"/>\n";
      symbols += qml_line(std::to_string(k), c, c.status == "surcharged" ? 1.2 : 0.7, c.status == "not_checked");
    }
    return qml_document("  <renderer-v2 type=\"RuleRenderer\" symbollevels=\"0\" enableorderby=\"0\" "
                        "forceraster=\"0\">\n   <rules key=\"root\">\n" + rules + "   </rules>\n   <symbols>\n" +
                        symbols + "   </symbols>\n  </renderer-v2>\n");
  }
  if (table == "conduits_not_checked") return qml_single(qml_line("0", conduit_palette[2], 0.7, true));
  if (table == "force_mains") return qml_single(qml_line("0", force_main_colour, 0.9, false));
  if (table == "force_main_points") return qml_single(qml_marker("0", force_main_colour, 1.2));
  if (table == "catchments") return qml_single(qml_fill("0", catchment_colour));
  return "";
}

std::string layer_style_sld(const std::string& table) {
  std::string rules;
  if (table == "structures") {
    for (const auto& c : structure_palette)
      rules += sld_rule(c.label, sld_equal("status", c.status),
                        sld_point(c, c.status == "flooded" || c.status == "freeboard" ? 14 : 9));
  } else if (table == "conduits") {
    rules += sld_rule(conduit_palette[2].label,
                      "<ogc:Filter><ogc:PropertyIsNull><ogc:PropertyName>hgl_up</ogc:PropertyName></ogc:PropertyIsNull>"
                      "</ogc:Filter>",
                      sld_line(conduit_palette[2], 2, true));
    rules += sld_rule(conduit_palette[0].label,
                      "<ogc:Filter><ogc:PropertyIsGreaterThan><ogc:PropertyName>surcharged_length</ogc:PropertyName>"
                      "<ogc:Literal>0</ogc:Literal></ogc:PropertyIsGreaterThan></ogc:Filter>",
                      sld_line(conduit_palette[0], 4, false));
    rules += sld_rule(conduit_palette[1].label, "<ElseFilter/>", sld_line(conduit_palette[1], 2, false));
  } else if (table == "conduits_not_checked") {
    rules = sld_rule(conduit_palette[2].label, "", sld_line(conduit_palette[2], 2, true));
  } else if (table == "force_mains") {
    rules = sld_rule(force_main_colour.label, "", sld_line(force_main_colour, 3, false));
  } else if (table == "force_main_points") {
    rules = sld_rule("Force main profile point", "", sld_point(force_main_colour, 4));
  } else if (table == "catchments") {
    rules = sld_rule(catchment_colour.label, "",
                     "<PolygonSymbolizer><Fill><CssParameter name=\"fill\">" + std::string(catchment_colour.hex) +
                         "</CssParameter><CssParameter name=\"fill-opacity\">0.15</CssParameter></Fill><Stroke>"
                         "<CssParameter name=\"stroke\">" + std::string(catchment_colour.hex) +
                         "</CssParameter></Stroke></PolygonSymbolizer>");
  } else {
    return "";
  }
  return sld_document(table, rules);
}

void write_layer_styles(SqliteDb& db) {
  const std::string t = "layer_styles";
  std::vector<std::pair<std::string, std::string>> layers;  // table, geometry column
  {
    auto q = db.prepare("SELECT table_name, column_name FROM gpkg_geometry_columns ORDER BY table_name", t);
    while (sqlite3_step(q.get()) == SQLITE_ROW)
      layers.emplace_back(reinterpret_cast<const char*>(sqlite3_column_text(q.get(), 0)),
                          reinterpret_cast<const char*>(sqlite3_column_text(q.get(), 1)));
  }
  db.exec("CREATE TABLE layer_styles (id INTEGER PRIMARY KEY AUTOINCREMENT, f_table_catalog TEXT(256), "
          "f_table_schema TEXT(256), f_table_name TEXT(256), f_geometry_column TEXT(256), styleName TEXT(30), "
          "styleQML TEXT, styleSLD TEXT, useAsDefault BOOLEAN, description TEXT, owner TEXT(30), ui TEXT(30), "
          "update_time DATETIME)",
          t);
  db.exec("INSERT INTO gpkg_contents (table_name, data_type, identifier, description) VALUES ('layer_styles', "
          "'attributes', 'layer_styles', 'default styles of the result layers (rimline)')",
          t);
  auto insert = db.prepare(
      "INSERT INTO layer_styles (f_table_catalog, f_table_schema, f_table_name, f_geometry_column, styleName, "
      "styleQML, styleSLD, useAsDefault, description, owner, ui, update_time) VALUES ('', '', ?, ?, ?, ?, ?, 1, ?, "
      "'rimline', NULL, NULL)",
      t);
  for (const auto& [table, geometry_column] : layers) {
    const std::string qml = layer_style_qml(table), sld = layer_style_sld(table);
    if (qml.empty()) continue;
    const std::string name = "rimline status", description = "rimline: " + table + " coloured by result";
    sqlite3_bind_text(insert.get(), 1, table.c_str(), -1, SQLITE_TRANSIENT);
    sqlite3_bind_text(insert.get(), 2, geometry_column.c_str(), -1, SQLITE_TRANSIENT);
    sqlite3_bind_text(insert.get(), 3, name.c_str(), -1, SQLITE_TRANSIENT);
    sqlite3_bind_text(insert.get(), 4, qml.c_str(), -1, SQLITE_TRANSIENT);
    sqlite3_bind_text(insert.get(), 5, sld.c_str(), -1, SQLITE_TRANSIENT);
    sqlite3_bind_text(insert.get(), 6, description.c_str(), -1, SQLITE_TRANSIENT);
    db.step_reset(insert.get(), t);
  }
}

}  // namespace rimline::report

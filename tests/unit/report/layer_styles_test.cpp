// The default layer styles stored in results.gpkg (layer_styles.hpp). Their documents are checked
// for well-formedness (xml_check.hpp: W3C XML 1.0 5th ed.), for a rule per result status, and the
// SLD for the elements OGC 02-070 (SLD 1.0.0) names: StyledLayerDescriptor, NamedLayer, UserStyle,
// FeatureTypeStyle, Rule, ogc:Filter.
#include <catch2/catch.hpp>

#include "report/layer_styles.hpp"
#include "report/status_palette.hpp"
#include "xml_check.hpp"

using namespace rimline;

TEST_CASE("every result layer has a well-formed QML and SLD style with a rule per status", "[report][gpkg]") {
  for (const char* table : {"structures", "conduits", "conduits_not_checked", "force_mains", "force_main_points",
                            "catchments"}) {
    INFO(table);
    const std::string qml = report::layer_style_qml(table), sld = report::layer_style_sld(table);
    const auto q = test::check_xml(qml), s = test::check_xml(sld);
    CHECK(q.error.empty());
    CHECK(s.error.empty());
    CHECK(q.elements.count("renderer-v2") == 1);
    CHECK(s.elements.count("StyledLayerDescriptor") == 1);
    CHECK(s.elements.count("FeatureTypeStyle") == 1);
  }
  const std::string qml = report::layer_style_qml("structures"), sld = report::layer_style_sld("structures");
  for (const auto& c : report::structure_palette) {
    CHECK(qml.find("value=\"" + std::string(c.status) + "\"") != std::string::npos);
    CHECK(sld.find("<ogc:Literal>" + std::string(c.status) + "</ogc:Literal>") != std::string::npos);
    CHECK(sld.find(std::string(c.hex)) != std::string::npos);
  }
  CHECK(test::check_xml(report::layer_style_sld("conduits")).elements.at("Rule") == 3);
  CHECK(report::layer_style_qml("structure_cases").empty());  // a table without geometry has no style
}

#include <cpl_error.h>

#include <catch2/catch.hpp>

#include "gis/read_layers.hpp"

using namespace rimline;

TEST_CASE("GDAL messages are captured, not printed, and capped per layer", "[io][gdal]") {
  Findings findings;
  gis::detail::GdalErrorCapture capture;
  gis::detail::GdalMessageSink sink(LayerRole::structures, findings, 2);
  CPLError(CE_Warning, CPLE_AppDefined, "first");
  sink.take(capture, "MH1");
  CPLError(CE_Failure, CPLE_AppDefined, "second");
  CPLError(CE_Warning, CPLE_AppDefined, "third");
  CPLError(CE_Warning, CPLE_AppDefined, "fourth");
  sink.take(capture, "MH2");
  CHECK(capture.messages().empty());
  sink.finish(capture);
  REQUIRE(findings.size() == 3);
  CHECK(findings[0].feature_id == "MH1");
  CHECK(findings[0].message == "GDAL reported: first");
  CHECK(findings[1].feature_id == "MH2");
  CHECK(findings[1].message == "GDAL reported: second");
  CHECK(findings[2].message == "GDAL reported 2 more messages for this layer; they are not listed.");
  for (const auto& f : findings) {
    CHECK(f.code == "DATA_SOURCE");
    CHECK(f.layer == LayerRole::structures);
  }
}

TEST_CASE("the capture keeps the last error for an Error's message", "[io][gdal]") {
  gis::detail::GdalErrorCapture capture;
  CPLError(CE_Failure, CPLE_AppDefined, "cannot open");
  CPLError(CE_Warning, CPLE_AppDefined, "a later warning");
  CHECK(capture.last_error() == "cannot open");
  CHECK(gis::detail::printable_source("PG:dbname=x user=u password=secret host=h") ==
        "PG:dbname=x user=u password=*** host=h");
}

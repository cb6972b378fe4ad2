// Section codes as exports write them: the words are the trade's own in each language (common
// practice, no source); what is checked is that each names its section and nothing else.
#include "mapping/field_words.hpp"

#include <catch2/catch.hpp>

using rimline::mapping::detail::shape_named;

TEST_CASE("shape codes: circle, box and egg in the languages exports use", "[mapping]") {
  for (const char* v : {"CIRC", "Kreis", "rond", "CIRCULAR"}) CHECK(shape_named(v) == "circular");
  for (const char* v : {"BOX", "Rechteck", "RECT", "cajon"}) CHECK(shape_named(v) == "box");
  for (const char* v : {"EGG", "egg-shaped", "Eiprofil", "OVOIDE", "ovoid", "OV", "eivormig"})
    CHECK(shape_named(v) == "egg");
  // An oval (elliptical) pipe is not the standard egg; an unknown word names nothing.
  CHECK(shape_named("OVAL").empty());
  CHECK(shape_named("HORSESHOE").empty());
}

#include "rimline/model/pump_station.hpp"

namespace rimline::model {

std::string_view profile_source_name(ProfileSource s) {
  switch (s) {
    case ProfileSource::vertex_z: return "vertex_z";
    case ProfileSource::dem: return "dem";
    case ProfileSource::end_inverts: return "end_inverts";
  }
  return "end_inverts";
}

}  // namespace rimline::model

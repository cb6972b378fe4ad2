#pragma once
// The sheet border and title block of a profile sheet (rimline's own layout: one band
// along the foot of the sheet, read left to right from what the drawing is to when it was made).
#include <string>

#include "report/canvas.hpp"

namespace rimline::report {

struct TitleInfo {
  std::string project;
  std::string drawing;     // "Profile OF-1-1: T-20 to outfall OF-1"
  std::string tailwater;   // the case label
  std::string flow_case;
  std::string units;
  std::string scales;      // "H 1:5000   V 1:250   vertical exaggeration 20:1"
  std::string date;
  int sheet = 1;
  int sheets = 1;
  std::string case_caption = "TAILWATER";  // "OPERATING CASES" on a force-main sheet
  std::string datum;                       // the vertical datum of the levels
  std::string number;                      // drawing number, "HGL-OF-1-2"
  std::string revision = "0";              // rimline issues revision 0; the engineer revises
};

inline constexpr double title_block_h_mm = 40.0;
inline constexpr double sheet_margin_mm = 10.0;

// Draws the border and title block on a sheet of width x height mm.
void draw_title_block(const TitleInfo& info, double width_mm, double height_mm, Canvas& c);

}  // namespace rimline::report

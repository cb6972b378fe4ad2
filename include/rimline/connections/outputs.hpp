#pragma once
// What a proposal's comparison and a headroom search add to `rimline check --out DIR`, in the
// run's units (CSV values to four decimals, as exceptions.csv):
//   DIR/changes.csv            one row per exception of either run:
//                              change,layer,feature_id,question,code_before,value_before,case_before,
//                              code_after,value_after,case_after,limit,unit
//                              (change: new | worsened | unchanged | improved | resolved; worst first)
//   DIR/structure_changes.csv  id,hgl_before,hgl_after,hgl_change,freeboard_before,freeboard_after,
//                              freeboard_change,unit  (the envelope over the tailwater cases)
//   DIR/headroom.csv           structure,headroom,unit,at_limit,governing_layer,governing_id,criterion,
//                              change,value,value_unit,tailwater_case,trials,note
//   results.gpkg               layers exception_changes (the feature's point or line), structure_changes
//                              and headroom (points), and a column `headroom` in layer structures
//   report.html                sections "Proposal" (verdict, change table, plan map coloured by the HGL
//                              change, the profile from the connection to the outfall with both HGLs)
//                              and "Connection headroom" (the lowest, a plan map coloured by headroom)
#include <string>
#include <vector>

#include "rimline/connections/compare.hpp"
#include "rimline/connections/headroom.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::connections {

std::string changes_csv(const Comparison& cmp, units::System sys);
std::string structure_changes_csv(const Comparison& cmp, units::System sys);
std::string headroom_csv(const std::vector<Headroom>& headroom, units::System sys);

// Adds the layers (and the structures' headroom column) to a finished results.gpkg of `run`.
// Either list may be null.
void add_gpkg_layers(const std::string& gpkg_path, const run::CheckRun& run, const Comparison* cmp,
                     const std::vector<Headroom>* headroom);

// The report sections (self-contained HTML with inline SVG). `base` and `proposed` are the two runs.
std::string comparison_html(const Comparison& cmp, const run::CheckRun& base, const run::CheckRun& proposed,
                            const std::vector<std::string>& connection_ids);
std::string headroom_html(const std::vector<Headroom>& headroom, const run::CheckRun& run,
                          const config::ConnectionSettings& settings);

// "0.0421 m3/s" in the run's units, "at least ..." at the ceiling, or the note.
std::string headroom_text(const Headroom& h, units::System sys);

}  // namespace rimline::connections

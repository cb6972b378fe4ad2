#include "rimline/report/profile_pdf.hpp"

#include <cmath>
#include <optional>

#include "report/force_main_drawing.hpp"
#include "report/profile_draw.hpp"
#include "report/sheet_text.hpp"
#include "report/title_block.hpp"
#include "report/plan_sheet.hpp"
#include "rimline/error.hpp"

#if __has_include(<cairo-pdf.h>)
#include <cairo-pdf.h>
#include <cairo.h>
#define RIMLINE_HAVE_CAIRO 1
#endif

// Cairo's text goes through fontconfig, which keeps caches it never frees; under
// LeakSanitizer (RIMLINE_SANITIZE builds) those would fail every run that writes a PDF.
#if defined(__SANITIZE_ADDRESS__)
#include <sanitizer/lsan_interface.h>
#define RIMLINE_IGNORE_LIBRARY_CACHES __lsan::ScopedDisabler library_caches_are_not_leaks
#else
#define RIMLINE_IGNORE_LIBRARY_CACHES
#endif

namespace rimline::report {

#ifdef RIMLINE_HAVE_CAIRO
namespace {

constexpr double points_per_mm = 72.0 / 25.4;  // PostScript point = 1/72 in (PDF 32000-1:2008, 8.3.2.3)

class CairoCanvas final : public Canvas {
 public:
  explicit CairoCanvas(cairo_t* cr) : cr_(cr) {}

  void polyline(const std::vector<Pt>& pts, const Pen& pen) override {
    if (pts.size() < 2) return;
    path(pts);
    stroke(pen);
  }

  void polygon(const std::vector<Pt>& pts, const std::optional<Rgb>& fill, const std::optional<Pen>& pen) override {
    if (pts.size() < 3) return;
    path(pts);
    cairo_close_path(cr_);
    if (fill) {
      cairo_set_source_rgb(cr_, fill->r, fill->g, fill->b);
      if (pen) cairo_fill_preserve(cr_);
      else cairo_fill(cr_);
    }
    if (pen) stroke(*pen);
    cairo_new_path(cr_);
  }

  void text(Pt at, const std::string& utf8, const TextStyle& st) override {
    cairo_save(cr_);
    cairo_select_font_face(cr_, "sans-serif", CAIRO_FONT_SLANT_NORMAL,
                           st.bold ? CAIRO_FONT_WEIGHT_BOLD : CAIRO_FONT_WEIGHT_NORMAL);
    cairo_set_font_size(cr_, st.size_mm);
    // The advance is measured only where the anchor needs it (most labels start at their point;
    // measuring is a fifth of cairo's cost of a label).
    double shift = 0.0;
    if (st.anchor != Anchor::start) {
      cairo_text_extents_t ext;
      cairo_text_extents(cr_, utf8.c_str(), &ext);
      shift = st.anchor == Anchor::middle ? -0.5 * ext.x_advance : -ext.x_advance;
    }
    cairo_translate(cr_, at.x, at.y);
    // Cairo turns positive angles clockwise on the page (y down); the canvas angle is counter-clockwise.
    if (st.rotate_deg != 0.0) cairo_rotate(cr_, -st.rotate_deg * M_PI / 180.0);
    cairo_move_to(cr_, shift, 0.0);
    cairo_set_source_rgb(cr_, st.color.r, st.color.g, st.color.b);
    cairo_show_text(cr_, utf8.c_str());
    cairo_restore(cr_);
  }

  void begin_group(const std::string&, const std::string&) override {}
  void end_group() override {}

 private:
  void path(const std::vector<Pt>& pts) {
    cairo_new_path(cr_);
    cairo_move_to(cr_, pts[0].x, pts[0].y);
    for (std::size_t i = 1; i < pts.size(); ++i) cairo_line_to(cr_, pts[i].x, pts[i].y);
  }
  void stroke(const Pen& pen) {
    cairo_set_source_rgb(cr_, pen.color.r, pen.color.g, pen.color.b);
    cairo_set_line_width(cr_, pen.width_mm);
    cairo_set_line_join(cr_, CAIRO_LINE_JOIN_ROUND);
    cairo_set_dash(cr_, pen.dash_mm.empty() ? nullptr : pen.dash_mm.data(), static_cast<int>(pen.dash_mm.size()), 0.0);
    cairo_stroke(cr_);
  }
  cairo_t* cr_;
};

}  // namespace

bool pdf_supported() { return true; }

void write_profiles_pdf(const run::CheckRun& run, const std::vector<ProfileSheet>& sheets, const std::string& date,
                        const std::string& path, const FindingIndex* shared_index) {
  RIMLINE_IGNORE_LIBRARY_CACHES;
  cairo_surface_t* surface =
      cairo_pdf_surface_create(path.c_str(), sheet_width_mm * points_per_mm, sheet_height_mm * points_per_mm);
  if (cairo_surface_status(surface) != CAIRO_STATUS_SUCCESS) {
    cairo_surface_destroy(surface);
    throw Error(ErrorKind::bad_input, ErrorContext{path, "", "", ""}, "PDF cannot be created");
  }
  cairo_pdf_surface_set_metadata(surface, CAIRO_PDF_METADATA_TITLE, ("Profiles: " + run.project.name).c_str());
  cairo_pdf_surface_set_metadata(surface, CAIRO_PDF_METADATA_CREATOR, "rimline");
  cairo_t* cr = cairo_create(surface);
  cairo_scale(cr, points_per_mm, points_per_mm);
  CairoCanvas canvas(cr);
  const double m = sheet_margin_mm;
  const Panel panel{m + 4.0, m + 4.0, sheet_width_mm - 2 * m - 8.0,
                    sheet_height_mm - 2 * m - title_block_h_mm - 8.0};
  int k = 0;
  int stations = 0;
  for (const auto& st : run.pump_stations) stations += st.layout.ok ? 1 : 0;
  const int pages = 1 + static_cast<int>(sheets.size()) + stations;
  std::optional<FindingIndex> own_index;
  const FindingIndex& index = shared_index ? *shared_index : own_index.emplace(run, &sheets);  // once for every page
  {  // The plan of the whole network first: where each drawn path and finding is.
    const std::string scale = draw_plan_sheet(run, panel, canvas);
    TitleInfo info{run.project.name, "Plan of the network, coloured by result over the tailwater cases",
                   "every tailwater case (the one that governs each feature)", flow_case_text(run),
                   units_text(run.report_units), scale, date, ++k, pages, "TAILWATER", run.project.vertical_datum,
                   "HGL-PLAN", "0"};
    draw_title_block(info, sheet_width_mm, sheet_height_mm, canvas);
    cairo_show_page(cr);
  }
  for (const auto& sheet : sheets) {
    const ProfileScene scene = build_scene(run, sheet.path, sheet.case_index, sheet.number, &index);
    const PlotFrame f = draw_profile(scene, panel, canvas);
    TitleInfo info{run.project.name,
                   "Profile " + scene.name() + ": " + scene.head_id + " to outfall " + scene.outfall_id,
                   scene.case_label,
                   flow_case_text(run),
                   units_text(run.report_units),
                   scale_text(f),
                   date,
                   ++k,
                   pages,
                   "TAILWATER",
                   run.project.vertical_datum,
                   "HGL-" + scene.name(),
                   "0"};
    draw_title_block(info, sheet_width_mm, sheet_height_mm, canvas);
    cairo_show_page(cr);
  }
  // One page per pump station: its force main over every operating case.
  for (std::size_t i = 0; i < run.pump_stations.size(); ++i) {
    if (!run.pump_stations[i].layout.ok) continue;
    const std::string scales = draw_force_main(run, i, panel, canvas);
    const auto& ps = run.project.pump_stations[i];
    TitleInfo info{run.project.name, force_main_title(run, i),
                   "1 to " + std::to_string(ps.duty_pumps) + " pumps, wet well low and high",
                   flow_case_text(run), units_text(run.report_units), scales, date, ++k, pages, "OPERATING CASES",
                   run.project.vertical_datum, "HGL-" + ps.id + "-FM", "0"};
    draw_title_block(info, sheet_width_mm, sheet_height_mm, canvas);
    cairo_show_page(cr);
  }
  cairo_destroy(cr);
  cairo_surface_finish(surface);
  const cairo_status_t status = cairo_surface_status(surface);
  cairo_surface_destroy(surface);
  if (status != CAIRO_STATUS_SUCCESS)
    throw Error(ErrorKind::bad_input, ErrorContext{path, "", "", ""},
                std::string("PDF cannot be written: ") + cairo_status_to_string(status));
}

#else

bool pdf_supported() { return false; }

void write_profiles_pdf(const run::CheckRun&, const std::vector<ProfileSheet>&, const std::string&,
                        const std::string& path, const FindingIndex*) {
  throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""}, "this rimline was built without cairo: no PDF");
}

#endif

}  // namespace rimline::report

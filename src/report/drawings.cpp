// write_drawings: the profile SVGs, the PDF set and the HTML report, staged for one commit.
#include <cmath>
#include <exception>
#include <filesystem>
#include <fstream>
#include <functional>
#include <set>
#include <thread>

#include "report/force_main_drawing.hpp"
#include "report/profile_scene.hpp"
#include "report/sheet_text.hpp"
#include "report/svg_canvas.hpp"
#include "rimline/error.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_pdf.hpp"
#include "rimline/report/report_html.hpp"

namespace rimline::report {
namespace {

namespace fs = std::filesystem;

// Ids come from the source layer; keep file names portable (POSIX portable file name set).
std::string file_stem(const std::string& name) {
  std::string out;
  for (char c : name) {
    const bool ok = (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '.' ||
                    c == '_' || c == '-';
    out += ok ? c : '_';
  }
  return out.empty() ? "profile" : out;
}

void write_file(const std::string& path, const std::function<void(std::ostream&)>& fill) {
  std::error_code ec;
  fs::create_directories(fs::path(path).parent_path(), ec);
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  fill(out);
  out.flush();
  if (!out) throw Error(ErrorKind::bad_input, ErrorContext{path, "", "", ""}, "cannot be written");
}

void write_file(const std::string& path, const std::string& text) {
  write_file(path, [&text](std::ostream& out) { out << text; });
}

}  // namespace

void write_drawings(const run::CheckRun& run, StagedFiles& files, const DrawingOptions& options) {
  const std::string html_tmp = files.path_for("report.html");
  const fs::path dir = fs::path(html_tmp).parent_path();
  const auto sheets = run.cases.empty() ? std::vector<ProfileSheet>{}
                                        : plan_sheets(run.read.network, run.topology, run.cases.size(), options);
  const std::string date = report_date();

  std::error_code ec;
  if (!sheets.empty()) fs::create_directories(dir / "profiles", ec);  // rename() needs the final folder
  // The PDF set (cairo) shares nothing with the SVGs and the page but the finished run: it is
  // drawn beside them, on another core (a city's 400 sheets are the longest drawing step).
  const bool pdf = pdf_supported() && !sheets.empty();
  if (!pdf) fs::remove(dir / "profiles.pdf", ec);
  const FindingIndex index(run, &sheets);  // once for every sheet, shared by the SVGs and the PDF
  std::exception_ptr pdf_failed;
  std::jthread pdf_writer;
  const std::string pdf_path = pdf ? files.path_for("profiles.pdf") : "";  // StagedFiles is not shared across threads
  if (pdf)
    pdf_writer = std::jthread([&] {
      try {
        write_profiles_pdf(run, sheets, date, pdf_path, &index);
      } catch (...) {
        pdf_failed = std::current_exception();
      }
    });
  std::vector<RenderedProfile> rendered;
  std::set<std::string> stems;
  for (const auto& sheet : sheets) {
    const ProfileScene scene = build_scene(run, sheet.path, sheet.case_index, sheet.number, &index);
    std::string stem = file_stem(scene.name());
    while (!stems.insert(stem).second) stem += "_";  // two ids that sanitise alike
    RenderedProfile r;
    r.name = stem;
    r.caption = scene.head_id + " to outfall " + scene.outfall_id + ", " + scene.case_label;
    r.svg = scene_svg(scene, run.project.name);
    r.length = scene.x_max;
    r.structures = scene.structures.size();
    r.findings = scene.markers.size();
    for (const auto& st : scene.structures) {
      const double fb = st.rim - st.hgl;
      if (std::isfinite(fb) && !(fb >= r.least_freeboard)) {
        r.least_freeboard = fb;
        r.least_freeboard_at = st.id;
      }
    }
    write_file(files.path_for("profiles/" + stem + ".svg"), "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" + r.svg);
    if (rendered.size() >= inline_profiles) std::string().swap(r.svg);  // linked, not inlined: a city's 400 are 0.1 GB
    rendered.push_back(std::move(r));
  }
  // Force-main profiles, one per laid-out pump station, listed with the others.
  for (std::size_t i = 0; i < run.pump_stations.size(); ++i) {
    RenderedProfile r;
    r.svg = force_main_svg(run, i);
    if (r.svg.empty()) continue;
    std::string stem = file_stem(run.project.pump_stations[i].id + "-force-main");
    while (!stems.insert(stem).second) stem += "_";
    r.name = stem;
    const auto& st = run.pump_stations[i];
    r.caption = "force main of pump station " + run.project.pump_stations[i].id + " to " +
                run.read.network.structures[st.layout.discharge].id + ", every operating case";
    r.length = to_report(st.layout.points.back().station_m, units::Dimension::length, run.report_units);
    fs::create_directories(dir / "profiles", ec);
    write_file(files.path_for("profiles/" + stem + ".svg"), "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" + r.svg);
    rendered.push_back(std::move(r));
  }
  // Profiles of an earlier run into this directory that this run does not draw would mislead.
  for (const auto& e : fs::directory_iterator(dir / "profiles", ec)) {
    if (e.path().extension() == ".svg" && !stems.count(e.path().stem().string())) fs::remove(e.path(), ec);
  }

  write_file(html_tmp, [&](std::ostream& out) {
    write_report_html(out, run, rendered, date, pdf, selection_text(options, run.report_units), options.more_sections);
  });
  if (pdf_writer.joinable()) pdf_writer.join();
  if (pdf_failed) std::rethrow_exception(pdf_failed);
}

}  // namespace rimline::report

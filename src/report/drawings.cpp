// write_drawings: the profile SVGs, the PDF set and the HTML report, staged for one commit.
#include <cctype>
#include <cerrno>
#include <cmath>
#include <cstring>
#include <exception>
#include <filesystem>
#include <fstream>
#include <functional>
#include <set>
#include <thread>

#include "report/force_main_drawing.hpp"
#include "report/budgets_csv.hpp"
#include "report/profile_scene.hpp"
#include "report/sheet_text.hpp"
#include "report/svg_canvas.hpp"
#include "report/write_failure.hpp"
#include "rimline/error.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_pdf.hpp"
#include "rimline/report/report_html.hpp"
#include "rimline/sha256.hpp"

namespace rimline::report {
namespace {

namespace fs = std::filesystem;

// File names made from ids (issue 18, defect 8): a 303-character outfall id made a name too long
// to create and stopped the run. A stem keeps the POSIX portable file name set
// (A-Z a-z 0-9 . _ -), at most max_stem_bytes of it; a longer id is cut and given the first 8 hex
// digits of the SHA-256 of the whole id, so two long ids that share their start stay apart.
// Names a file system or a shell treats specially are prefixed with '_': leading '.' (hidden) or
// '-' (an option), the device names Windows reserves in any folder (CON, PRN, AUX, NUL, COM1-9,
// LPT1-9, with any extension).
constexpr std::size_t max_stem_bytes = 80;

bool windows_reserved(const std::string& stem) {
  std::string base = stem.substr(0, stem.find('.'));
  for (auto& c : base) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  if (base == "CON" || base == "PRN" || base == "AUX" || base == "NUL") return true;
  return base.size() == 4 && (base.rfind("COM", 0) == 0 || base.rfind("LPT", 0) == 0) && base[3] >= '1' && base[3] <= '9';
}

}  // namespace

std::string file_stem(const std::string& name) {
  std::string out;
  for (char c : name) {
    const bool ok = (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '.' ||
                    c == '_' || c == '-';
    out += ok ? c : '_';
  }
  if (out.empty()) return "profile";
  if (out.size() > max_stem_bytes) out = out.substr(0, max_stem_bytes - 9) + "~" + sha256_hex(name).substr(0, 8);
  if (out[0] == '.' || out[0] == '-' || windows_reserved(out)) out = "_" + out;
  return out;
}

namespace {

// `stem`, or stem_2, stem_3, ... when an earlier drawing has it (two ids that sanitise alike).
std::string unique_stem(const std::string& stem, std::set<std::string>& stems) {
  std::string s = stem;
  for (int k = 2; !stems.insert(s).second; ++k) s = stem + "_" + std::to_string(k);
  return s;
}

// A drawing that cannot be written is a finding: the run's other outputs are still written.
void drawing_failed(Findings& out, const std::string& file, const std::string& why) {
  Finding f;
  f.code = "DRAWING_NOT_WRITTEN";
  f.severity = Severity::warning;
  f.layer = LayerRole::project;
  f.feature_id = file;
  f.message = "the drawing " + file + " could not be written (" + why + "); the other outputs are complete.";
  out.push_back(std::move(f));
}

// Writes one staged file; 0 when it was written, else the errno of the failure (EIO when unknown).
int try_write(const std::string& path, const std::function<void(std::ostream&)>& fill) {
  errno = 0;
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  if (out) {
    fill(out);
    out.flush();
    if (out) return 0;
  }
  const int err = errno != 0 ? errno : EIO;
  std::error_code ec;
  fs::remove(path, ec);
  return err;
}

}  // namespace

void write_drawings(const run::CheckRun& run, StagedFiles& files, const DrawingOptions& options,
                    Findings* output_findings) {
  Findings local;
  Findings& failed = output_findings ? *output_findings : local;
  const std::string html_tmp = files.path_for("report.html");
  const auto sheets = run.cases.empty() ? std::vector<ProfileSheet>{}
                                        : plan_sheets(run.read.network, run.topology, run.cases.size(), options);
  const std::string date = report_date();

  // The PDF set (cairo) shares nothing with the SVGs and the page but the finished run: it is
  // drawn beside the SVGs, on another core (a city's 400 sheets are the longest drawing step).
  // Everything the thread uses is declared before it, so an exception that unwinds this function
  // joins the thread before any of it goes: the PDF's path was once a string destroyed while the
  // thread still read it, and cairo created a file named from freed memory in the working folder.
  const bool pdf = pdf_supported() && !sheets.empty();
  const FindingIndex index(run, &sheets);  // once for every sheet, shared by the SVGs and the PDF
  const std::string pdf_path = pdf ? files.path_for("profiles.pdf") : "";  // StagedFiles is not shared across threads
  std::string pdf_failed;
  std::jthread pdf_writer;
  if (pdf)
    pdf_writer = std::jthread([&run, &sheets, &date, &index, &pdf_failed, pdf_path] {
      try {
        write_profiles_pdf(run, sheets, date, pdf_path, &index);
      } catch (const std::exception& e) {
        pdf_failed = e.what();
      }
    });
  std::vector<RenderedProfile> rendered;
  std::set<std::string> stems;
  for (const auto& sheet : sheets) {
    const ProfileScene scene = build_scene(run, sheet.path, sheet.case_index, sheet.number, &index);
    RenderedProfile r;
    r.name = unique_stem(file_stem(scene.name()), stems);
    r.caption = scene.head_id + " to outfall " + scene.outfall_id + ", " + scene.case_label;
    r.svg = scene_svg(scene, run.project.name);
    r.length = scene.x_max;
    r.structures = scene.structures.size();
    r.findings = scene.markers.size();
    r.case_index = sheet.case_index;
    for (const auto& st : scene.structures) r.structure_ids.push_back(st.id);
    for (const auto& pp : scene.pipes) r.conduit_ids.push_back(pp.id);
    for (const auto& m : scene.markers) r.markers.push_back({m.number, m.code, m.feature_id});
    for (const auto& st : scene.structures) {
      const double fb = st.rim - st.hgl;
      if (std::isfinite(fb) && !(fb >= r.least_freeboard)) {
        r.least_freeboard = fb;
        r.least_freeboard_at = st.id;
      }
    }
    const std::string file = "profiles/" + r.name + ".svg";
    if (const int err = try_write(files.path_for(file), [&r](std::ostream& out) {
          out << "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" << r.svg;
        })) {
      drawing_failed(failed, file, std::strerror(err));
      continue;
    }
    if (rendered.size() >= inline_profiles) std::string().swap(r.svg);  // linked, not inlined: a city's 400 are 0.1 GB
    rendered.push_back(std::move(r));
  }
  // Force-main profiles, one per laid-out pump station, listed with the others.
  for (std::size_t i = 0; i < run.pump_stations.size(); ++i) {
    RenderedProfile r;
    r.svg = force_main_svg(run, i);
    if (r.svg.empty()) continue;
    r.name = unique_stem(file_stem(run.project.pump_stations[i].id + "-force-main"), stems);
    const auto& st = run.pump_stations[i];
    r.caption = "force main of pump station " + run.project.pump_stations[i].id + " to " +
                run.read.network.structures[st.layout.discharge].id + ", every operating case";
    r.length = to_report(st.layout.points.back().station_m, units::Dimension::length, run.report_units);
    const std::string file = "profiles/" + r.name + ".svg";
    if (const int err = try_write(files.path_for(file), [&r](std::ostream& out) {
          out << "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" << r.svg;
        })) {
      drawing_failed(failed, file, std::strerror(err));
      continue;
    }
    rendered.push_back(std::move(r));
  }
  if (pdf_writer.joinable()) pdf_writer.join();  // the page says whether the PDF was written
  if (!pdf_failed.empty()) {
    drawing_failed(failed, "profiles.pdf", pdf_failed);
    std::error_code ec;
    fs::remove(pdf_path, ec);
  }
  const int err = try_write(html_tmp, [&](std::ostream& out) {
    write_report_html(out, run, rendered, date, pdf && pdf_failed.empty(), selection_text(options, run.report_units),
                      &failed, options.more_sections);
  });
  if (err) throw_write_failure(files.final_name(html_tmp), err, "");  // the report is not a drawing
  // The budgets the report summarises (budgets_csv.hpp): bounded by the network, not by findings x depth.
  files.write_stream("budgets.csv", [&run](std::ostream& out) { write_budgets_csv(run, out); });
}

}  // namespace rimline::report

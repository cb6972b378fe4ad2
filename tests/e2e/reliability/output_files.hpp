#pragma once
// Whether an output file is whole: a CSV whose every row has the header's field count and ends in
// a newline, JSON that parses, a GeoPackage GDAL opens with every layer readable, an HTML report
// that reaches its closing tag. A file cut short or half-written fails at least one of these.
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <memory>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "rimline/sha256.hpp"

namespace rimline::reliability {

namespace fs = std::filesystem;

inline std::string slurp(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

// Field count of each record of an RFC 4180 CSV text (quotes may hold commas, newlines, "").
// Returns empty when a quote is left open.
inline std::vector<std::size_t> csv_record_widths(const std::string& text) {
  std::vector<std::size_t> widths;
  std::size_t fields = 1;
  bool quoted = false, any = false;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char ch = text[i];
    any = true;
    if (quoted) {
      if (ch == '"' && i + 1 < text.size() && text[i + 1] == '"')
        ++i;
      else if (ch == '"')
        quoted = false;
    } else if (ch == '"') {
      quoted = true;
    } else if (ch == ',') {
      ++fields;
    } else if (ch == '\n') {
      widths.push_back(fields);
      fields = 1;
      any = false;
    }
  }
  if (quoted) return {};
  if (any) widths.push_back(0);  // a last record without its newline: cut short
  return widths;
}

inline std::string csv_problem(const fs::path& p) {
  const auto w = csv_record_widths(slurp(p));
  if (w.empty()) return "no records or an open quote";
  for (std::size_t i = 1; i < w.size(); ++i)
    if (w[i] != w[0])
      return "record " + std::to_string(i) + " has " + std::to_string(w[i]) + " fields, header " + std::to_string(w[0]);
  return "";
}

inline std::string json_problem(const fs::path& p) {
  try {
    const auto parsed = nlohmann::json::parse(slurp(p));
    (void)parsed;
  } catch (const std::exception& e) {
    return e.what();
  }
  return "";
}

// Every feature value of every layer, as text, in layer and fid order.
inline std::vector<std::string> gpkg_rows(const fs::path& p) {
  GDALAllRegister();
  std::unique_ptr<GDALDataset> ds(GDALDataset::Open(p.c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY));
  if (!ds) return {"<cannot open>"};
  std::vector<std::string> rows;
  for (auto* layer : ds->GetLayers()) {
    rows.push_back("layer " + std::string(layer->GetName()));
    for (auto& f : *layer) {
      std::string row = std::to_string(f->GetFID());
      for (int i = 0; i < f->GetFieldCount(); ++i)
        row += "|" + std::string(f->IsFieldSetAndNotNull(i) ? f->GetFieldAsString(i) : "<null>");
      if (const OGRGeometry* g = f->GetGeometryRef()) {
        char* wkt = nullptr;
        g->exportToWkt(&wkt);
        row += "|" + std::string(wkt ? wkt : "");
        CPLFree(wkt);
      }
      rows.push_back(row);
    }
  }
  return rows;
}

inline std::string gpkg_problem(const fs::path& p) {
  const auto rows = gpkg_rows(p);
  if (!rows.empty() && rows[0] == "<cannot open>") return "GDAL cannot open it";
  if (rows.empty()) return "no layers";
  return "";
}

inline std::string html_problem(const fs::path& p) {
  const std::string t = slurp(p);
  return t.find("</html>") == std::string::npos ? "no closing </html>" : "";
}

// A PDF ends with its %%EOF marker (ISO 32000-1:2008, 7.5.5); a file cut short does not.
inline std::string pdf_problem(const fs::path& p) {
  const std::string t = slurp(p);
  if (t.rfind("%PDF-", 0) != 0) return "no %PDF- header";
  const auto end = t.find_last_not_of("\r\n");
  return end != std::string::npos && end >= 4 && t.compare(end - 4, 5, "%%EOF") == 0 ? "" : "no closing %%EOF";
}

// The problem with a whole output file ("" when it is whole), by its extension.
inline std::string file_problem(const fs::path& p) {
  const auto ext = p.extension().string();
  if (ext == ".csv") return csv_problem(p);
  if (ext == ".json") return json_problem(p);
  if (ext == ".gpkg") return gpkg_problem(p);
  if (ext == ".html") return html_problem(p);
  if (ext == ".pdf") return pdf_problem(p);
  return "";
}

// SHA-256 of every regular file under `dir`, by path relative to it.
inline std::map<std::string, std::string> hash_tree(const fs::path& dir) {
  std::map<std::string, std::string> out;
  if (!fs::exists(dir)) return out;
  for (const auto& e : fs::recursive_directory_iterator(dir))
    if (e.is_regular_file()) out[fs::relative(e.path(), dir).string()] = sha256_file_hex(e.path().string());
  return out;
}

// What identifies an output's content across runs: the SHA-256 of its bytes, except for a
// GeoPackage (SQLite pages and gpkg_contents.last_change differ run to run: its feature values) and
// the report and PDF (they carry the run date: only whether they are whole).
inline std::string content_key(const fs::path& p) {
  const auto ext = p.extension().string();
  if (ext == ".gpkg") {
    std::string all;
    for (const auto& row : gpkg_rows(p)) all += row + "\n";
    return sha256_hex(all);
  }
  if (ext == ".html" || ext == ".pdf") return file_problem(p).empty() ? "whole" : "partial";
  return sha256_file_hex(p.string());
}

}  // namespace rimline::reliability

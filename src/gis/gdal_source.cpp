#include "gis/gdal_source.hpp"

#include <algorithm>

#include <cpl_string.h>

#include <mutex>
#include <regex>

#include "rimline/error.hpp"

namespace rimline::gis::detail {

GdalErrorCapture::GdalErrorCapture() { CPLPushErrorHandlerEx(&GdalErrorCapture::handler, this); }
GdalErrorCapture::~GdalErrorCapture() { CPLPopErrorHandler(); }

void GdalErrorCapture::handler(CPLErr level, CPLErrorNum, const char* text) {
  auto* self = static_cast<GdalErrorCapture*>(CPLGetErrorHandlerUserData());
  if (!self || level == CE_None || level == CE_Debug) return;
  self->messages_.push_back({level >= CE_Failure, text ? text : ""});
}

std::string GdalErrorCapture::last_error() const {
  for (auto it = messages_.rbegin(); it != messages_.rend(); ++it)
    if (it->is_error) return it->text;
  return messages_.empty() ? std::string() : messages_.back().text;
}

std::string printable_source(const std::string& source) {
  static const std::regex password(R"((password\s*=\s*)('[^']*'|\S+))", std::regex::icase);
  return std::regex_replace(source, password, "$1***");
}

namespace {

std::string replace_all(std::string text, const std::string& from, const std::string& to) {
  for (std::size_t at = text.find(from); !from.empty() && at != std::string::npos; at = text.find(from, at + to.size()))
    text.replace(at, from.size(), to);
  return text;
}

void register_drivers() {
  static std::once_flag once;
  std::call_once(once, [] { GDALAllRegister(); });
}

std::vector<std::string> layer_names(GDALDataset& ds) {
  std::vector<std::string> names;
  for (int i = 0; i < ds.GetLayerCount(); ++i) names.emplace_back(ds.GetLayer(i)->GetName());
  return names;
}

std::string quoted_list(const std::vector<std::string>& names) {
  std::string out;
  for (const auto& n : names) out += (out.empty() ? "" : ", ") + ("\"" + n + "\"");
  return out;
}

// The source's attribute filter on the opened layer. A file driver compiles it as OGR SQL at once;
// the PostgreSQL driver passes it into its SELECT unchecked, so a count (which the readers ask for
// anyway) makes the database judge it here, before any feature is read.
void apply_where(OpenLayer& out, const LayerSource& src, const std::string& role) {
  if (src.where.empty()) return;
  GdalErrorCapture capture;
  const OGRErr set = out.layer->SetAttributeFilter(src.where.c_str());
  if (set == OGRERR_NONE) (void)out.layer->GetFeatureCount(FALSE);
  const bool failed = set != OGRERR_NONE || std::any_of(capture.messages().begin(), capture.messages().end(),
                                                        [](const auto& m) { return m.is_error; });
  if (!failed) return;
  std::string why = capture.last_error();
  if (why.empty()) why = "GDAL refused it";
  const std::string origin = src.where_origin.empty() ? std::string("the project file") : src.where_origin;
  throw Error(ErrorKind::bad_config, ErrorContext{origin, out.layer_name, "", ""},
              "the " + role + " filter where = \"" + src.where + "\" on the layer \"" + out.layer_name + "\" of " +
                  out.source + " is not accepted: " + why);
}

}  // namespace

std::vector<std::string> field_names(OGRLayer& layer) {
  std::vector<std::string> names;
  OGRFeatureDefn* defn = layer.GetLayerDefn();
  for (int i = 0; i < defn->GetFieldCount(); ++i) names.emplace_back(defn->GetFieldDefn(i)->GetNameRef());
  return names;
}

OpenedSource open_dataset(const LayerSource& src, const std::string& role) {
  register_drivers();
  check_source_files(src.source, role);
  OpenedSource out;
  out.copy = private_copy_if_sqlite(src.source, role);
  const std::string& path = out.copy ? out.copy->path : src.source;
  GdalErrorCapture capture;
  std::vector<const char*> options;
  for (const auto& o : src.open_options) options.push_back(o.c_str());
  options.push_back(nullptr);
  out.dataset.reset(GDALDataset::Open(path.c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY, nullptr,
                                      src.open_options.empty() ? nullptr : options.data(), nullptr));
  if (!out.dataset) {
    std::string why = capture.last_error();
    if (why.empty()) why = "no GDAL vector driver recognises it";
    if (out.copy) why = replace_all(why, out.copy->path, src.source);
    throw Error(ErrorKind::bad_input, ErrorContext{printable_source(src.source), "", "", ""},
                "cannot open the " + role + " source: " + why);
  }
  return out;
}

OpenLayer open_layer(const LayerSource& src, const std::string& role) {
  OpenLayer out;
  out.source = printable_source(src.source);
  OpenedSource opened = open_dataset(src, role);
  out.copy = std::move(opened.copy);
  out.dataset = std::move(opened.dataset);
  GDALDataset& ds = *out.dataset;
  if (ds.GetLayerCount() == 0)
    throw Error(ErrorKind::bad_input, ErrorContext{out.source, "", "", ""}, "the " + role + " source has no layers");
  if (src.layer.empty()) {
    // With several layers, taking the first would silently depend on the file's internal order.
    if (ds.GetLayerCount() > 1)
      throw Error(ErrorKind::bad_config, ErrorContext{out.source, "", "", ""},
                  "the " + role + " source has " + std::to_string(ds.GetLayerCount()) + " layers (" +
                      quoted_list(layer_names(ds)) + "); name one with layer = \"...\" in [" + role + "]");
    out.layer = ds.GetLayer(0);
  } else {
    out.layer = ds.GetLayerByName(src.layer.c_str());
    if (!out.layer) {
      const auto names = layer_names(ds);
      std::string msg =
          "no layer \"" + src.layer + "\" in the " + role + " source (layers: " + quoted_list(names) + ")";
      const std::string near = closest_name(src.layer, names);
      if (!near.empty()) msg += "; did you mean \"" + near + "\"?";
      throw Error(ErrorKind::bad_config, ErrorContext{out.source, "", "", ""}, msg);
    }
  }
  out.layer_name = out.layer->GetName();
  out.where = src.where;
  apply_where(out, src, role);
  if (char** files = ds.GetFileList()) {
    for (char** f = files; *f; ++f) out.files.emplace_back(*f);
    CSLDestroy(files);
  }
  if (out.copy) {  // the files read are the originals, hashed as copied
    out.files.clear();
    for (const auto& [file, sha] : out.copy->read) out.files.push_back(file);
    out.read_hashes = out.copy->read;
  }
  return out;
}

void require_geometry_and_features(const OpenLayer& l, const std::string& role) {
  const ErrorContext where{l.source, l.layer_name, "", ""};
  if (l.layer->GetGeomType() == wkbNone)
    throw Error(ErrorKind::bad_input, where,
                "the " + role + " layer has no geometry column (a CSV needs a WKT column, or X/Y columns named in "
                "open_options)");
  if (l.layer->GetFeatureCount(FALSE) == 0)
    throw Error(ErrorKind::bad_input, where,
                "the " + role + " layer has no features" +
                    (l.where.empty() ? std::string() : " that match its filter where = \"" + l.where + "\""));
  // A layer declared as points cannot hold one pipe: the structure layer named as the pipes.
  const OGRwkbGeometryType type = wkbFlatten(l.layer->GetGeomType());
  if (role == "pipes" && (type == wkbPoint || type == wkbMultiPoint))
    throw Error(ErrorKind::bad_input, where,
                "the pipes layer holds " + std::string(OGRGeometryTypeToName(type)) +
                    " geometries, not lines; is it the structure layer?");
}

int field_index(const OpenLayer& l, const std::string& field, const std::string& role_key) {
  if (field.empty()) return -1;
  const int idx = l.layer->GetLayerDefn()->GetFieldIndex(field.c_str());
  if (idx >= 0) return idx;
  const auto names = field_names(*l.layer);
  std::string msg = "the field mapped by " + role_key + " is not in the layer";
  const std::string near = closest_name(field, names);
  if (!near.empty()) msg += "; did you mean \"" + near + "\"?";
  throw Error(ErrorKind::bad_config, ErrorContext{l.source, l.layer_name, "", field}, msg);
}

void add_input_files(std::vector<std::string>& input_files, const std::vector<std::string>& files) {
  for (const auto& f : files)
    if (std::find(input_files.begin(), input_files.end(), f) == input_files.end()) input_files.push_back(f);
}

void add_input_files(std::vector<std::string>& input_files, std::vector<std::pair<std::string, std::string>>& hashes,
                     const OpenLayer& layer) {
  add_input_files(input_files, layer.files);
  hashes.insert(hashes.end(), layer.read_hashes.begin(), layer.read_hashes.end());
}

std::string raw_text_by_fid(OGRLayer& layer, const std::string& field, std::int64_t fid) {
  const int idx = field.empty() ? -1 : layer.GetLayerDefn()->GetFieldIndex(field.c_str());
  if (idx < 0) return "";
  GdalErrorCapture quiet;
  const OGRFeatureUniquePtr f(layer.GetFeature(fid));
  return f && f->IsFieldSetAndNotNull(idx) ? f->GetFieldAsString(idx) : "";
}

}  // namespace rimline::gis::detail

#pragma once
// GDAL, wrapped once: RAII handles, GDAL's error channel captured instead of printed, and a
// vector layer opened read-only with errors that name the source, the layer and the field.
// Private to src/gis; nothing outside gis (and mapping, which reuses these handles) includes a GDAL header.
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <cstddef>
#include <memory>
#include <string>
#include <vector>

#include "gis/source_files.hpp"
#include "rimline/config/project.hpp"

namespace rimline::gis::detail {
// The readers speak the project file's vocabulary (LayerSource, FieldRef, Plausibility, ...).
using namespace rimline::config;

// Collects what GDAL reports while it lives (thread-local handler stack), so nothing reaches
// stderr; the messages end up in an Error's text or in findings.
class GdalErrorCapture {
 public:
  GdalErrorCapture();
  ~GdalErrorCapture();
  GdalErrorCapture(const GdalErrorCapture&) = delete;
  GdalErrorCapture& operator=(const GdalErrorCapture&) = delete;

  struct Message {
    bool is_error = false;
    std::string text;
  };
  const std::vector<Message>& messages() const { return messages_; }
  std::string last_error() const;  // the last error (or warning) text, "" if none
  void clear() { messages_.clear(); }

 private:
  static void handler(CPLErr level, CPLErrorNum number, const char* text);
  std::vector<Message> messages_;
};

// The source text for messages, with any "password=..." of a connection string masked.
std::string printable_source(const std::string& source);

// A dataset and, for a SQLite source with a journal beside it, the private copy it reads (kept
// until the dataset is closed: members are destroyed in reverse order).
struct OpenedSource {
  std::shared_ptr<PrivateCopy> copy;
  GDALDatasetUniquePtr dataset;
};

struct OpenLayer {
  std::shared_ptr<PrivateCopy> copy;  // declared before the dataset, so it outlives it
  GDALDatasetUniquePtr dataset;
  OGRLayer* layer = nullptr;  // owned by the dataset
  std::string source;         // printable source, for messages
  std::string layer_name;
  std::string where;  // the attribute filter set on the layer ("" for none)
  std::vector<std::string> files;  // files behind the dataset (shapefile: .shp/.dbf/.shx/.prj ...), as named in the project
  // SHA-256 of files read through a private copy (the bytes copied), by the original's path.
  std::vector<std::pair<std::string, std::string>> read_hashes;
};

// Adds the files behind a layer to the run's list of inputs, each once (layers may share a file).
void add_input_files(std::vector<std::string>& input_files, const std::vector<std::string>& files);
// The same for an open layer, with the hashes of what it read through a private copy.
void add_input_files(std::vector<std::string>& input_files, std::vector<std::pair<std::string, std::string>>& hashes,
                     const OpenLayer& layer);

// Opens `src` as a vector data source read-only, after check_source_files, from a private copy
// when private_copy_if_sqlite makes one. Throws Error(bad_input) when it cannot be opened.
OpenedSource open_dataset(const LayerSource& src, const std::string& role);

// Opens `src` as a vector data source read-only and picks its layer (by name, or the first).
// Throws Error(bad_input) when the source cannot be opened, Error(bad_config) for an unknown layer.
OpenLayer open_layer(const LayerSource& src, const std::string& role);

// Throws Error(bad_input) when the layer has no geometry column or (when cheap to know) no features.
void require_geometry_and_features(const OpenLayer& l, const std::string& role);

// Index of a mapped field in the layer, -1 when not mapped. A mapped field absent from the layer
// throws Error(bad_config) with "did you mean ...?" over the layer's field names.
int field_index(const OpenLayer& l, const std::string& field, const std::string& role_key);

std::vector<std::string> field_names(OGRLayer& layer);

// The text of `field` in the feature `fid` of the layer, untrimmed ("" when the field or feature
// is not there). Random access by fid: for the few features a message quotes, not for a whole layer.
std::string raw_text_by_fid(OGRLayer& layer, const std::string& field, std::int64_t fid);

}  // namespace rimline::gis::detail

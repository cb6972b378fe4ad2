// The comparison and headroom layers of results.gpkg (include/rimline/connections/outputs.hpp),
// added to the staged file once report/ has written its own layers and closed it.
#include <gdal_priv.h>
#include <ogr_spatialref.h>
#include <ogrsf_frmts.h>

#include <cmath>
#include <memory>
#include <unordered_map>

#include "rimline/connections/outputs.hpp"
#include "rimline/error.hpp"
#include "report/layer_srs.hpp"
#include "rimline/report/outputs.hpp"

namespace rimline::connections {
namespace {

using units::Dimension;

struct DatasetCloser {
  void operator()(GDALDataset* d) const { GDALClose(d); }
};

class LayerWriter {
 public:
  LayerWriter(const std::string& path, const run::CheckRun& run) : path_(path), run_(run), sys_(run.report_units) {
    GDALAllRegister();
    ds_.reset(static_cast<GDALDataset*>(GDALOpenEx(path.c_str(), GDAL_OF_VECTOR | GDAL_OF_UPDATE, nullptr, nullptr, nullptr)));
    if (!ds_) throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""}, "cannot be opened to add layers");
    // The same placement as the run's own layers: run metres -> the input CRS and its unit.
    report::place_layers(run, out_srs_, run_srs_, to_source_);
    ds_->StartTransaction();
  }

  void finish() {
    if (ds_->CommitTransaction() != OGRERR_NONE)
      throw Error(ErrorKind::bad_config, ErrorContext{path_, "", "", ""}, "cannot be written");
    ds_.reset();
  }

  OGRLayer* layer(const char* name, OGRwkbGeometryType type, std::initializer_list<std::pair<const char*, OGRFieldType>> fields) {
    char** opts = CSLSetNameValue(nullptr, "FID", "fid");
    OGRLayer* l = ds_->CreateLayer(name, &out_srs_, type, opts);
    CSLDestroy(opts);
    if (!l) throw Error(ErrorKind::bad_config, ErrorContext{path_, name, "", ""}, "layer cannot be created");
    l->SetMetadataItem("RIMLINE_UNITS", sys_ == units::System::us ? "length ft, flow cfs, velocity ft/s"
                                                                  : "length m, flow m3/s, velocity m/s");
    l->SetMetadataItem("RIMLINE_CAUTION", report::caution);
    for (const auto& [n, t] : fields) {
      OGRFieldDefn d(n, t);
      l->CreateField(&d);
    }
    return l;
  }

  void point(OGRFeature& f, const model::Point2& p) const {
    double x = p.x, y = p.y;
    place(x, y);
    OGRPoint pt(x, y);
    f.SetGeometry(&pt);
  }
  void line(OGRFeature& f, const model::Conduit& c) const {
    OGRLineString l = report::plan_line(run_, to_source_.get(), c);
    if (l.getNumPoints() >= 2) f.SetGeometry(&l);
  }
  void set(OGRFeature& f, const char* name, double si, Dimension d) const {
    if (std::isfinite(si)) f.SetField(name, report::to_report(si, d, sys_));
  }
  void add(OGRLayer* l, OGRFeature& f) const {
    if (l->CreateFeature(&f) != OGRERR_NONE)
      throw Error(ErrorKind::bad_config, ErrorContext{path_, l->GetName(), "", ""}, "a feature cannot be written");
  }
  units::System sys() const { return sys_; }

  void add_column_from(const char* layer, const char* column, const std::string& update_sql) {
    OGRLayer* l = ds_->GetLayerByName(layer);
    OGRFieldDefn d(column, OFTReal);
    if (!l || l->CreateField(&d) != OGRERR_NONE)
      throw Error(ErrorKind::bad_config, ErrorContext{path_, layer, "", ""}, std::string("cannot take the column ") + column);
    ds_->ExecuteSQL(update_sql.c_str(), nullptr, nullptr);
  }

 private:
  void place(double& x, double& y) const { report::place_point(run_, to_source_.get(), x, y); }

  std::string path_;
  const run::CheckRun& run_;
  units::System sys_;
  std::unique_ptr<GDALDataset, DatasetCloser> ds_;
  OGRSpatialReference out_srs_, run_srs_;
  std::unique_ptr<OGRCoordinateTransformation> to_source_;
};

void write_changes(LayerWriter& w, const run::CheckRun& run, const Comparison& cmp) {
  const auto& net = run.read.network;
  std::unordered_map<std::string, std::size_t> structure, conduit;
  for (std::size_t s = 0; s < net.structures.size(); ++s) structure.emplace(net.structures[s].id, s);
  for (std::size_t c = 0; c < net.conduits.size(); ++c) conduit.emplace(net.conduits[c].id, c);
  OGRLayer* l = w.layer("exception_changes", wkbUnknown,
                        {{"change", OFTString}, {"layer", OFTString}, {"feature_id", OFTString}, {"question", OFTString},
                         {"code_before", OFTString}, {"value_before", OFTReal}, {"case_before", OFTString},
                         {"code_after", OFTString}, {"value_after", OFTReal}, {"case_after", OFTString},
                         {"limit", OFTReal}, {"unit", OFTString}});
  for (const auto& e : cmp.exceptions) {
    OGRFeature f(l->GetLayerDefn());
    const Finding& any = e.after ? e.after->finding : e.before->finding;
    f.SetField("change", std::string(change_name(e.change)).c_str());
    f.SetField("layer", std::string(layer_role_name(e.layer)).c_str());
    f.SetField("feature_id", e.feature_id.c_str());
    f.SetField("question", e.question.c_str());
    if (e.before) {
      f.SetField("code_before", e.before->finding.code.c_str());
      w.set(f, "value_before", e.before->finding.value, e.before->finding.dimension);
      f.SetField("case_before", render_message(e.before->case_label, w.sys()).c_str());
    }
    if (e.after) {
      f.SetField("code_after", e.after->finding.code.c_str());
      w.set(f, "value_after", e.after->finding.value, e.after->finding.dimension);
      f.SetField("case_after", render_message(e.after->case_label, w.sys()).c_str());
    }
    w.set(f, "limit", any.limit, any.dimension);
    if (any.dimension != Dimension::dimensionless)
      f.SetField("unit", std::string(units::unit_symbol(units::display_unit(any.dimension, w.sys()))).c_str());
    if (e.layer == LayerRole::structures) {
      if (const auto it = structure.find(e.feature_id); it != structure.end()) w.point(f, net.structures[it->second].location);
    } else if (const auto it = conduit.find(e.feature_id); it != conduit.end()) {
      w.line(f, net.conduits[it->second]);
    }
    w.add(l, f);
  }
  OGRLayer* s = w.layer("structure_changes", wkbPoint,
                        {{"id", OFTString}, {"status", OFTString}, {"hgl_before", OFTReal}, {"hgl_after", OFTReal}, {"hgl_change", OFTReal},
                         {"freeboard_before", OFTReal}, {"freeboard_after", OFTReal}, {"freeboard_change", OFTReal}});
  for (const auto& c : cmp.structures) {
    OGRFeature f(s->GetLayerDefn());
    f.SetField("id", c.id.c_str());
    f.SetField("status", c.added ? "added" : "existing");
    w.set(f, "hgl_before", c.hgl_before_m, Dimension::length);
    w.set(f, "hgl_after", c.hgl_after_m, Dimension::length);
    w.set(f, "hgl_change", c.hgl_change_m(), Dimension::length);
    w.set(f, "freeboard_before", c.freeboard_before_m, Dimension::length);
    w.set(f, "freeboard_after", c.freeboard_after_m, Dimension::length);
    w.set(f, "freeboard_change", c.freeboard_after_m - c.freeboard_before_m, Dimension::length);
    w.point(f, net.structures[c.structure].location);
    w.add(s, f);
  }
}

void write_headroom(LayerWriter& w, const run::CheckRun& run, const std::vector<Headroom>& headroom) {
  const auto& net = run.read.network;
  OGRLayer* l = w.layer("headroom", wkbPoint,
                        {{"id", OFTString}, {"headroom", OFTReal}, {"at_limit", OFTInteger}, {"governing_layer", OFTString},
                         {"governing_id", OFTString}, {"criterion", OFTString}, {"change", OFTString},
                         {"tailwater_case", OFTString}, {"note", OFTString}});
  for (const auto& h : headroom) {
    OGRFeature f(l->GetLayerDefn());
    f.SetField("id", h.id.c_str());
    w.set(f, "headroom", h.headroom_m3_s, Dimension::flow);
    f.SetField("at_limit", h.at_limit ? 1 : 0);
    if (!h.governing_id.empty()) {
      f.SetField("governing_layer", std::string(layer_role_name(h.governing_layer)).c_str());
      f.SetField("governing_id", h.governing_id.c_str());
      f.SetField("criterion", h.criterion.c_str());
      f.SetField("change", h.change.c_str());
      f.SetField("tailwater_case", render_message(h.case_label, w.sys()).c_str());
    }
    if (!h.note.empty()) f.SetField("note", h.note.c_str());
    w.point(f, net.structures[h.structure].location);
    f.SetFID(static_cast<GIntBig>(h.structure) + 1);  // the structures layer's fid of the same structure
    w.add(l, f);
  }
  // The same figure in each structure's row: the structures layer's rows went in in network
  // order (fid = index + 1). Through GDAL, whose connection has the GeoPackage SQL functions the
  // layer's triggers name.
  w.add_column_from("structures", "headroom",
                    "UPDATE structures SET headroom = (SELECT h.headroom FROM headroom h WHERE h.fid = structures.fid)");
}

}  // namespace

void add_gpkg_layers(const std::string& gpkg_path, const run::CheckRun& run, const Comparison* cmp,
                     const std::vector<Headroom>* headroom) {
  LayerWriter w(gpkg_path, run);
  if (cmp) write_changes(w, run, *cmp);
  if (headroom) write_headroom(w, run, *headroom);
  w.finish();
}

}  // namespace rimline::connections

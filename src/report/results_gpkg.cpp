#include <gdal_priv.h>
#include <ogr_spatialref.h>
#include <ogrsf_frmts.h>

#include <algorithm>
#include <cmath>
#include <exception>
#include <map>
#include <memory>
#include <ostream>
#include <string>
#include <thread>
#include <utility>
#include <vector>

#include "rimline/error.hpp"
#include "rimline/file_kind.hpp"
#include "rimline/flows/catchment_outlets.hpp"
#include "rimline/hydraulics/section.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/report_html.hpp"
#include "rimline/report/staged_files.hpp"
#include "gis/gdal_source.hpp"
#include "report/gpkg_rows.hpp"
#include "report/gpkg_rtree.hpp"
#include "report/layer_srs.hpp"
#include "report/layer_styles.hpp"
#include "report/sqlite_db.hpp"
#include "report/write_failure.hpp"

namespace rimline::report {
namespace {

using units::Dimension;

struct DatasetCloser {
  void operator()(GDALDataset* d) const { GDALClose(d); }
};

class Writer {
 public:
  Writer(const run::CheckRun& run, const std::string& path) : run_(run), sys_(run.report_units), path_(path) {
    GDALAllRegister();
    auto* drv = GetGDALDriverManager()->GetDriverByName("GPKG");
    if (!drv) throw Error(ErrorKind::internal, "GDAL has no GPKG driver");
    ds_.reset(drv->Create(path.c_str(), 0, 0, 0, GDT_Unknown, nullptr));
    if (!ds_) throw_write_failure(path, 0, gdal_.last_error());
    place_layers(run, out_srs_, run_srs_, to_source_);
  }

  void write() {
    ds_->StartTransaction();
    // The two large layers get their schema from GDAL and their rows through SQLite (gpkg_rows.hpp).
    layer("structures", wkbPoint, structure_columns);
    layer("conduits", wkbLineString, conduit_columns());
    layer("conduits_not_checked", wkbLineString, conduit_columns());
    write_cases();
    write_catchments();
    if (!run_.pump_stations.empty()) {
      write_force_mains();
      write_force_main_points();
      write_pump_cases();
    }
    if (ds_->CommitTransaction() != OGRERR_NONE) throw_write_failure(path_, 0, gdal_.last_error());
    ds_.reset();  // closed before SQLite opens it again for the rows and the indexes
    // GDAL reports some failures only on its error channel (a full disk: "ERROR 1: ... database or
    // disk is full" for each table it could not make); the first is the cause.
    for (const auto& m : gdal_.messages())
      if (m.is_error) throw_write_failure(path_, 0, m.text);
    SqliteDb db(path_);
    db.exec("BEGIN", "");
    std::vector<SpatialIndexRequest> indexes;
    write_structure_rows(db, indexes);
    write_conduit_rows(db, indexes);
    for (auto& [layer, rq] : indexes_) indexes.push_back(std::move(rq));
    add_gpkg_spatial_indexes(db, std::move(indexes));
    write_layer_styles(db);
    db.exec("COMMIT", "");
  }

 private:
  // Run coordinates are metres in the run CRS; the outputs go back to the input CRS and its unit.
  void place(double& x, double& y) const { place_point(run_, to_source_.get(), x, y); }

  // A column of a layer whose rows go through SQLite: its schema is still made by GDAL.
  struct Column {
    const char* name;
    OGRFieldType type;
  };

  OGRLayer* layer(const char* name, OGRwkbGeometryType type, const std::vector<Column>& columns) {
    OGRLayer* l = layer(name, type);
    auto& names = sql_columns_[name];
    for (const auto& c : columns) {
      field(l, c.name, c.type);
      names.emplace_back(c.name);
    }
    geometry_column_[name] = l->GetGeometryColumn();
    return l;
  }

  OGRLayer* layer(const char* name, OGRwkbGeometryType type) {
    char** opts = nullptr;
    opts = CSLSetNameValue(opts, "FID", "fid");
    // The spatial index is packed in one pass after the rows (gpkg_rtree.hpp), not grown per row.
    opts = CSLSetNameValue(opts, "SPATIAL_INDEX", "NO");
    OGRLayer* l = ds_->CreateLayer(name, type == wkbNone ? nullptr : &out_srs_, type, opts);
    CSLDestroy(opts);
    if (!l) throw_write_failure(path_, 0, "layer " + std::string(name) + ": " + gdal_.last_error());
    l->SetMetadataItem("RIMLINE_UNITS", sys_ == units::System::us ? "length ft, flow cfs, velocity ft/s"
                                                                  : "length m, flow m3/s, velocity m/s");
    l->SetMetadataItem("RIMLINE_CAUTION", caution);
    return l;
  }

  // The pipe's plan line in the output CRS (a line of fewer than two points is left without geometry).
  void set_line(OGRFeature& f, const model::Conduit& c) const {
    OGRLineString line = plan_line(run_, to_source_.get(), c);
    if (line.getNumPoints() >= 2) f.SetGeometry(&line);
  }

  void add(OGRLayer* l, OGRFeature& f) {
    if (l->CreateFeature(&f) != OGRERR_NONE)
      throw_write_failure(path_, 0, "layer " + std::string(l->GetName()) + ": " + gdal_.last_error());
    const OGRGeometry* g = f.GetGeometryRef();
    if (!g || g->IsEmpty()) return;
    OGREnvelope e;
    g->getEnvelope(&e);
    auto it = std::find_if(indexes_.begin(), indexes_.end(), [l](const auto& x) { return x.first == l; });
    if (it == indexes_.end()) {
      indexes_.emplace_back(l, SpatialIndexRequest{l->GetName(), l->GetGeometryColumn(), "fid", {}});
      it = indexes_.end() - 1;
    }
    it->second.envelopes.push_back(Envelope{f.GetFID(), e.MinX, e.MaxX, e.MinY, e.MaxY});
  }

  static void field(OGRLayer* l, const char* name, OGRFieldType t) {
    OGRFieldDefn d(name, t);
    l->CreateField(&d);
  }

  // Field index by name, looked up once per layer and name: OGRFeatureDefn::GetFieldIndex is a
  // linear case-insensitive scan, a fifth of this writer's time at 1e5 pipes when done per value.
  // Keyed by the name's address (the names are literals of this file); another address holding
  // the same name is merely another cache entry.
  int ix(OGRFeature& f, const char* name) {
    const auto key = std::make_pair(f.GetDefnRef(), name);
    const auto it = field_ix_.find(key);
    if (it != field_ix_.end()) return it->second;
    return field_ix_[key] = f.GetFieldIndex(name);
  }

  void set(OGRFeature& f, const char* name, double si, Dimension d) {
    if (std::isfinite(si)) f.SetField(ix(f, name), to_report(si, d, sys_));
    else f.SetFieldNull(ix(f, name));
  }

  // The case label as shown, rendered once per case rather than once per feature; `every`: the
  // figure is the same in every case of the sweep.
  const std::string& case_label(std::size_t k, bool every = false) {
    if (case_labels_.empty()) {
      for (const auto& c : run_.cases) case_labels_.push_back(render_message(c.label, sys_));
      case_labels_.emplace_back(run::every_case);
    }
    return every ? case_labels_.back() : case_labels_[k];
  }

  // Flows modes "rational" / "sanitary": each catchment with the figures used and its outlet.
  void write_catchments() {
    if (!run_.catchment_flows) return;
    OGRLayer* l = layer("catchments", wkbMultiPolygon);
    for (const char* n : {"id", "outlet"}) field(l, n, OFTString);
    for (const char* n : {"area", "runoff_c", "inlet_time", "population"}) field(l, n, OFTReal);
    for (const auto& k : run_.catchments) {
      OGRFeature f(l->GetLayerDefn());
      f.SetField(ix(f, "id"), k.id.c_str());
      if (k.structure != model::no_index)
        f.SetField(ix(f, "outlet"), run_.read.network.structures[k.structure].id.c_str());
      set(f, "area", k.area_m2, Dimension::area);
      f.SetField(ix(f, "runoff_c"), k.runoff_c);
      set(f, "inlet_time", k.inlet_time_s, Dimension::time);
      if (k.population) f.SetField(ix(f, "population"), *k.population);
      auto ring_of = [this](const std::vector<model::Point2>& pts) {
        OGRLinearRing r;
        for (const auto& v : pts) {
          double x = v.x, y = v.y;
          place(x, y);
          r.addPoint(x, y);
        }
        r.closeRings();
        return r;
      };
      OGRMultiPolygon shape;
      for (const auto& ring : k.rings) {
        OGRPolygon poly;
        OGRLinearRing outer = ring_of(ring);
        poly.addRing(&outer);
        for (const auto& hole : k.holes)  // a hole belongs to the part that holds its first vertex
          if (!hole.empty() && flows::inside_rings({ring}, hole.front())) {
            OGRLinearRing inner = ring_of(hole);
            poly.addRing(&inner);
          }
        shape.addGeometry(&poly);
      }
      if (!shape.IsEmpty()) f.SetGeometry(&shape);
      add(l, f);
    }
  }

  static inline const std::vector<Column> structure_columns = {
      {"id", OFTString},  {"kind", OFTString}, {"status", OFTString}, {"governing_outflow", OFTString},
      {"tailwater_case", OFTString}, {"rim", OFTReal}, {"invert", OFTReal}, {"hgl", OFTReal}, {"egl", OFTReal},
      {"freeboard", OFTReal}, {"required_freeboard", OFTReal}, {"structure_loss", OFTReal}, {"k_effective", OFTReal}};

  GpkgRows rows_of(SqliteDb& db, const std::string& table) {
    return GpkgRows(db, table, geometry_column_.at(table), sql_columns_.at(table));
  }

  // Converted to the report's units; NaN or infinite stays NULL.
  void put(GpkgRows& rows, int column, double si, Dimension d) const {
    if (std::isfinite(si)) rows.real(column, to_report(si, d, sys_));
  }

  static void take_index(GpkgRows& rows, std::vector<SpatialIndexRequest>& indexes) {
    rows.finish();
    auto rq = std::move(rows).index_request();
    if (!rq.envelopes.empty()) indexes.push_back(std::move(rq));
  }

  void write_structure_rows(SqliteDb& db, std::vector<SpatialIndexRequest>& indexes) {
    GpkgRows rows = rows_of(db, "structures");
    const int id = rows.column("id"), kind = rows.column("kind"), status = rows.column("status"),
              governing = rows.column("governing_outflow"), case_col = rows.column("tailwater_case"),
              rim = rows.column("rim"), invert = rows.column("invert"), hgl = rows.column("hgl"),
              egl = rows.column("egl"), freeboard = rows.column("freeboard"),
              required = rows.column("required_freeboard"), loss = rows.column("structure_loss"),
              k_eff = rows.column("k_effective");
    const auto& net = run_.read.network;
    rows.expect_rows(net.structures.size());
    for (std::size_t s = 0; s < net.structures.size(); ++s) {
      const auto& st = net.structures[s];
      rows.text(id, st.id);
      rows.text(kind, model::structure_kind_name(st.kind));
      rows.text(status, run::envelope_status(run_, s));
      put(rows, rim, st.rim_m.value_or(NAN), Dimension::length);
      put(rows, invert, st.invert_m.value_or(NAN), Dimension::length);
      put(rows, required, run::required_freeboard_m(run_, s), Dimension::length);
      if (!run_.cases.empty()) {
        const auto& c = run_.cases[run_.envelope_structure_case[s]];
        const auto& r = c.march.structures[s];
        const auto env = run::structure_envelope(run_, s);
        rows.text(case_col, case_label(env.index, env.every));
        if (r.solved) {
          put(rows, hgl, r.hgl_m, Dimension::length);
          put(rows, egl, r.egl_m, Dimension::length);
          put(rows, freeboard, st.rim_m ? *st.rim_m - r.hgl_m : NAN, Dimension::length);
          put(rows, loss, r.loss_m, Dimension::length);
          rows.real(k_eff, r.k_effective);
          if (r.governing_outflow != model::no_index) rows.text(governing, net.conduits[r.governing_outflow].id);
        }
      }
      double x = st.location.x, y = st.location.y;
      place(x, y);
      rows.point(x, y);
      rows.add();
    }
    take_index(rows, indexes);
  }

  std::vector<Column> conduit_columns() const {
    std::vector<Column> out;
    for (const char* n : {"id", "from_id", "to_id", "shape", "regime", "governs", "profile_class", "note", "tailwater_case",
                          "velocity_selfclean_basis", "velocity_selfclean_case", "velocity_highest_case", "solved_by"})
      out.push_back({n, OFTString});
    for (const char* n : {"rise", "width", "length", "slope", "flow", "capacity", "capacity_ratio", "velocity_up",
                          "velocity_down", "depth_up", "depth_down", "hgl_up", "hgl_down", "egl_up", "egl_down",
                          "normal_depth", "critical_depth", "surcharged_length", "invert_up", "invert_down",
                          "velocity_selfclean", "velocity_highest"})
      out.push_back({n, OFTReal});
    out.push_back({"reversed", OFTInteger});
    out.push_back({"against_source", OFTInteger});
    for (const char* n : design_columns()) out.push_back({n, OFTReal});
    return out;
  }

  // Flows modes "rational" / "sanitary": the design figures behind each pipe's flow.
  std::vector<const char*> design_columns() const {
    if (!run_.catchment_flows) return {};
    if (run_.catchment_flows->mode == flows::CatchmentMode::storm)
      return {"contributing_area", "runoff_ca", "tc", "travel_time", "intensity"};
    return {"contributing_area", "population", "peaking_factor", "infiltration"};
  }

  // The design columns present in this run's mode, looked up once (-1: not in this mode).
  struct DesignColumns {
    int area = -1, runoff_ca = -1, tc = -1, travel_time = -1, intensity = -1, population = -1, peaking_factor = -1,
        infiltration = -1;
  };
  DesignColumns design_columns_of(const GpkgRows& rows) const {
    DesignColumns d;
    if (!run_.catchment_flows) return d;
    d.area = rows.column("contributing_area");
    if (run_.catchment_flows->mode == flows::CatchmentMode::storm) {
      d.runoff_ca = rows.column("runoff_ca"), d.tc = rows.column("tc"), d.travel_time = rows.column("travel_time");
      d.intensity = rows.column("intensity");
    } else {
      d.population = rows.column("population"), d.peaking_factor = rows.column("peaking_factor");
      d.infiltration = rows.column("infiltration");
    }
    return d;
  }

  void put_design_fields(GpkgRows& rows, const DesignColumns& col, std::size_t ci) const {
    if (!run_.catchment_flows) return;
    const auto& d = run_.catchment_flows->pipes[ci];
    put(rows, col.area, d.area_m2, Dimension::area);
    if (run_.catchment_flows->mode == flows::CatchmentMode::storm) {
      put(rows, col.runoff_ca, d.ca_m2, Dimension::area);
      put(rows, col.tc, d.tc_s, Dimension::time);
      put(rows, col.travel_time, d.travel_time_s, Dimension::time);
      put(rows, col.intensity, d.intensity_m_s, Dimension::intensity);
    } else {
      rows.real(col.population, d.population);
      if (std::isfinite(d.peaking_factor)) rows.real(col.peaking_factor, d.peaking_factor);
      put(rows, col.infiltration, d.infiltration_m3_s, Dimension::flow);
    }
  }

  // The columns of a conduit row by name, looked up once per table.
  struct ConduitColumns {
    int id, from_id, to_id, shape, regime, governs, profile_class, note, tailwater_case, rise, width, length, slope,
        flow, capacity, capacity_ratio, velocity_up, velocity_down, depth_up, depth_down, hgl_up, hgl_down, egl_up,
        egl_down, normal_depth, critical_depth, surcharged_length, invert_up, invert_down, reversed,
        selfclean, selfclean_basis, selfclean_case, highest, highest_case, solved_by, against_source;
    explicit ConduitColumns(const GpkgRows& r)
        : id(r.column("id")), from_id(r.column("from_id")), to_id(r.column("to_id")), shape(r.column("shape")),
          regime(r.column("regime")), governs(r.column("governs")), profile_class(r.column("profile_class")),
          note(r.column("note")), tailwater_case(r.column("tailwater_case")), rise(r.column("rise")),
          width(r.column("width")), length(r.column("length")), slope(r.column("slope")), flow(r.column("flow")),
          capacity(r.column("capacity")), capacity_ratio(r.column("capacity_ratio")),
          velocity_up(r.column("velocity_up")), velocity_down(r.column("velocity_down")),
          depth_up(r.column("depth_up")), depth_down(r.column("depth_down")), hgl_up(r.column("hgl_up")),
          hgl_down(r.column("hgl_down")), egl_up(r.column("egl_up")), egl_down(r.column("egl_down")),
          normal_depth(r.column("normal_depth")), critical_depth(r.column("critical_depth")),
          surcharged_length(r.column("surcharged_length")), invert_up(r.column("invert_up")),
          invert_down(r.column("invert_down")), reversed(r.column("reversed")),
          selfclean(r.column("velocity_selfclean")), selfclean_basis(r.column("velocity_selfclean_basis")),
          selfclean_case(r.column("velocity_selfclean_case")), highest(r.column("velocity_highest")),
          highest_case(r.column("velocity_highest_case")), solved_by(r.column("solved_by")),
          against_source(r.column("against_source")) {}
  };

  // Pipes that could not be solved go to their own layer with the reason, so that every row of
  // `conduits` carries a full set of figures. A force main of a laid-out pump station is neither:
  // it is checked with its station and has its row in `force_mains`.
  void write_conduit_rows(SqliteDb& db, std::vector<SpatialIndexRequest>& indexes) {
    GpkgRows solved_rows = rows_of(db, "conduits"), unsolved_rows = rows_of(db, "conduits_not_checked");
    const ConduitColumns col(solved_rows);  // the two tables have the same columns
    const DesignColumns design = design_columns_of(solved_rows);
    const auto& net = run_.read.network;
    solved_rows.expect_rows(net.conduits.size());  // nearly all of them, as a rule
    std::vector<bool> with_station(net.conduits.size(), false);
    for (const auto& st : run_.pump_stations)
      if (st.layout.ok)
        for (std::size_t ci : st.layout.chain) with_station[ci] = true;
    std::vector<double> xy;
    for (std::size_t ci = 0; ci < net.conduits.size(); ++ci) {
      const auto& c = net.conduits[ci];
      if (with_station[ci]) continue;
      const bool solved =
          !run_.cases.empty() && run_.cases[run_.envelope_conduit_case[ci]].march.conduits[ci].solved;
      GpkgRows& rows = solved ? solved_rows : unsolved_rows;
      rows.text(col.id, c.id);
      if (c.from != model::no_index) rows.text(col.from_id, net.structures[c.from].id);
      if (c.to != model::no_index) rows.text(col.to_id, net.structures[c.to].id);
      rows.text(col.shape, hydraulics::shape_name(c.section.shape));
      put(rows, col.rise, c.section.shape == hydraulics::Shape::circular ? c.section.diameter_m : c.section.height_m,
          Dimension::length);
      put(rows, col.width, c.section.shape != hydraulics::Shape::circular ? c.section.width_m : NAN, Dimension::length);
      put(rows, col.length, c.length_m, Dimension::length);
      rows.integer(col.reversed, c.reversed ? 1 : 0);
      // The direction from_id -> to_id is the one the pipe flows: the march's orientation, or the
      // network solve's where it took the pipe; against_source: against its from/to ids or digitising.
      const auto& ns = run_.network;
      const bool by_network = ci < ns.solved_conduit.size() && ns.solved_conduit[ci];
      rows.text(col.solved_by, by_network ? "network" : "march");
      rows.integer(col.against_source, ci < ns.against_source.size() && ns.against_source[ci] ? 1 : 0);
      put_design_fields(rows, design, ci);
      if (!run_.cases.empty()) {
        const auto& cs = run_.cases[run_.envelope_conduit_case[ci]];
        const auto& r = cs.march.conduits[ci];
        const auto env = run::conduit_envelope(run_, ci);
        rows.text(col.tailwater_case, case_label(env.index, env.every));
        if (!r.note.empty()) rows.text(col.note, r.note);
        put(rows, col.flow, r.flow_m3_s, Dimension::flow);
        if (r.solved) {
          const auto& p = r.profile;
          rows.real(col.slope, r.slope);
          put(rows, col.capacity, r.capacity_m3_s, Dimension::flow);
          if (std::isfinite(r.capacity_m3_s) && r.capacity_m3_s > 0) rows.real(col.capacity_ratio, r.flow_m3_s / r.capacity_m3_s);
          put(rows, col.invert_up, r.invert_up_m, Dimension::length);
          put(rows, col.invert_down, r.invert_down_m, Dimension::length);
          put(rows, col.velocity_up, p.inlet().velocity_m_s, Dimension::velocity);
          put(rows, col.velocity_down, p.outlet().velocity_m_s, Dimension::velocity);
          put(rows, col.depth_up, p.inlet().depth_m, Dimension::length);
          put(rows, col.depth_down, p.outlet().depth_m, Dimension::length);
          put(rows, col.hgl_up, p.inlet().hgl_m, Dimension::length);
          put(rows, col.hgl_down, p.outlet().hgl_m, Dimension::length);
          put(rows, col.egl_up, p.inlet().egl_m, Dimension::length);
          put(rows, col.egl_down, p.outlet().egl_m, Dimension::length);
          put(rows, col.normal_depth, p.normal_depth_m, Dimension::length);
          put(rows, col.critical_depth, p.critical_depth_m, Dimension::length);
          put(rows, col.surcharged_length, p.surcharged_length_m, Dimension::length);
          rows.text(col.regime, hydraulics::regime_name(p.regime));
          rows.text(col.governs, hydraulics::governs_name(p.governs));
          rows.text(col.profile_class, p.profile_class);
          // The velocities the two velocity rules compared, each from the case that governs it.
          const auto basis = checks::criteria_for(run_.criteria, run_.overrides.conduits, c.id).velocity_basis;
          const auto lo = ci < run_.envelope_velocity_low.size() ? run_.envelope_velocity_low[ci] : run::EnvelopeCase{};
          const auto low = checks::self_cleansing_velocity(c, run_.cases[lo.index].march.conduits[ci], basis);
          put(rows, col.selfclean, low.velocity_m_s, Dimension::velocity);
          rows.text(col.selfclean_basis, low.basis);
          rows.text(col.selfclean_case, case_label(lo.index, lo.every));
          const auto hi = ci < run_.envelope_velocity_high.size() ? run_.envelope_velocity_high[ci] : run::EnvelopeCase{};
          put(rows, col.highest, checks::highest_velocity_m_s(run_.cases[hi.index].march.conduits[ci]), Dimension::velocity);
          rows.text(col.highest_case, case_label(hi.index, hi.every));
        }
      }
      xy.clear();
      for (const auto& v : c.vertices) {
        double x = v.x, y = v.y;
        place(x, y);
        xy.push_back(x);
        xy.push_back(y);
      }
      rows.line(xy);
      rows.add();
    }
    take_index(solved_rows, indexes);
    take_index(unsolved_rows, indexes);
  }

  // One row per structure and tailwater level of a sweep; a single level is the structures layer.
  void write_cases() {
    if (run_.cases.size() < 2) return;
    OGRLayer* l = layer("structure_cases", wkbNone);
    for (const char* n : {"id", "tailwater_case"}) field(l, n, OFTString);
    for (const char* n : {"tailwater", "hgl", "freeboard"}) field(l, n, OFTReal);
    const auto& net = run_.read.network;
    for (std::size_t k = 0; k < run_.cases.size(); ++k) {
      const auto& c = run_.cases[k];
      for (std::size_t s = 0; s < net.structures.size(); ++s) {
        const auto& r = c.march.structures[s];
        OGRFeature f(l->GetLayerDefn());
        f.SetField(ix(f, "id"), net.structures[s].id.c_str());
        f.SetField(ix(f, "tailwater_case"), case_label(k).c_str());
        set(f, "tailwater", c.tailwater_m, Dimension::length);
        set(f, "hgl", r.solved ? r.hgl_m : NAN, Dimension::length);
        const auto& rim = net.structures[s].rim_m;
        set(f, "freeboard", r.solved && rim ? *rim - r.hgl_m : NAN, Dimension::length);
        add(l, f);
      }
    }
  }

  // Force mains: one row per force-main conduit of a laid-out station, with its envelope over the
  // operating cases; the profile points with HGL / EGL / pressure head envelopes; the cases.
  void write_force_mains() {
    OGRLayer* l = layer("force_mains", wkbLineString);
    for (const char* n : {"id", "pump_station", "from_id", "to_id", "profile_source", "discharge_basis"}) field(l, n, OFTString);
    for (const char* n : {"diameter", "length", "rated_pressure", "design_flow", "velocity_min", "velocity_max",
                          "pressure_head_min", "pressure_head_max", "discharge_level"})
      field(l, n, OFTReal);
    const auto& net = run_.read.network;
    for (std::size_t i = 0; i < run_.pump_stations.size(); ++i) {
      const auto& st = run_.pump_stations[i];
      for (std::size_t j = 0; j < st.layout.chain.size(); ++j) {
        const auto& c = net.conduits[st.layout.chain[j]];
        OGRFeature f(l->GetLayerDefn());
        f.SetField(ix(f, "id"), c.id.c_str());
        f.SetField(ix(f, "pump_station"), run_.project.pump_stations[i].id.c_str());
        f.SetField(ix(f, "from_id"), net.structures[c.from].id.c_str());
        f.SetField(ix(f, "to_id"), net.structures[c.to].id.c_str());
        f.SetField(ix(f, "profile_source"), std::string(model::profile_source_name(st.layout.sources[j])).c_str());
        f.SetField(ix(f, "discharge_basis"), st.discharge_basis.c_str());
        set(f, "diameter", hydraulics::rise_m(c.section), Dimension::length);
        set(f, "length", c.length_m, Dimension::length);
        set(f, "rated_pressure", c.rated_pressure_head_m.value_or(NAN), Dimension::pressure_head);
        set(f, "design_flow", st.design_flow_m3_s, Dimension::flow);
        set(f, "discharge_level", st.discharge_level_m, Dimension::length);
        double v_lo = INFINITY, v_hi = -INFINITY, p_lo = INFINITY, p_hi = -INFINITY;
        for (const auto& k : st.cases) {
          if (!k.exists) continue;
          v_lo = std::min(v_lo, k.velocity_m_s[j]);
          v_hi = std::max(v_hi, k.velocity_m_s[j]);
          for (std::size_t p = 0; p < st.layout.points.size(); ++p)
            if (st.layout.points[p].conduit == st.layout.chain[j])
              p_lo = std::min(p_lo, k.pressure_head_m[p]), p_hi = std::max(p_hi, k.pressure_head_m[p]);
        }
        set(f, "velocity_min", v_lo, Dimension::velocity);
        set(f, "velocity_max", v_hi, Dimension::velocity);
        set(f, "pressure_head_min", p_lo, Dimension::pressure_head);
        set(f, "pressure_head_max", p_hi, Dimension::pressure_head);
        set_line(f, c);
        add(l, f);
      }
    }
  }

  void write_force_main_points() {
    OGRLayer* l = layer("force_main_points", wkbPoint);
    for (const char* n : {"force_main_id", "pump_station"}) field(l, n, OFTString);
    for (const char* n : {"station", "pipe_elevation", "hgl_min", "hgl_max", "egl_max", "pressure_head_min",
                          "pressure_head_max"})
      field(l, n, OFTReal);
    const auto& net = run_.read.network;
    for (std::size_t i = 0; i < run_.pump_stations.size(); ++i) {
      const auto& st = run_.pump_stations[i];
      for (std::size_t p = 0; p < st.layout.points.size(); ++p) {
        const auto& pt = st.layout.points[p];
        double h_lo = INFINITY, h_hi = -INFINITY, e_hi = -INFINITY, p_lo = INFINITY, p_hi = -INFINITY;
        for (const auto& k : st.cases) {
          if (!k.exists) continue;
          h_lo = std::min(h_lo, k.hgl_m[p]), h_hi = std::max(h_hi, k.hgl_m[p]), e_hi = std::max(e_hi, k.egl_m[p]);
          p_lo = std::min(p_lo, k.pressure_head_m[p]), p_hi = std::max(p_hi, k.pressure_head_m[p]);
        }
        OGRFeature f(l->GetLayerDefn());
        f.SetField(ix(f, "force_main_id"), net.conduits[pt.conduit].id.c_str());
        f.SetField(ix(f, "pump_station"), run_.project.pump_stations[i].id.c_str());
        set(f, "station", pt.station_m, Dimension::length);
        set(f, "pipe_elevation", pt.centreline_m, Dimension::length);
        set(f, "hgl_min", h_lo, Dimension::length);
        set(f, "hgl_max", h_hi, Dimension::length);
        set(f, "egl_max", e_hi, Dimension::length);
        set(f, "pressure_head_min", p_lo, Dimension::pressure_head);
        set(f, "pressure_head_max", p_hi, Dimension::pressure_head);
        double x = pt.xy.x, y = pt.xy.y;
        place(x, y);
        OGRPoint g(x, y);
        f.SetGeometry(&g);
        add(l, f);
      }
    }
  }

  void write_pump_cases() {
    OGRLayer* l = layer("pump_cases", wkbNone);
    for (const char* n : {"pump_station", "operating_case"}) field(l, n, OFTString);
    for (const char* n : {"pumps", "operating_point", "design"}) field(l, n, OFTInteger);
    for (const char* n : {"wet_well_level", "discharge_level", "static_lift", "flow", "head", "velocity",
                          "pressure_head_min", "pressure_head_max"})
      field(l, n, OFTReal);
    for (std::size_t i = 0; i < run_.pump_stations.size(); ++i) {
      const auto& st = run_.pump_stations[i];
      for (std::size_t k = 0; k < st.cases.size(); ++k) {
        const auto& c = st.cases[k];
        OGRFeature f(l->GetLayerDefn());
        f.SetField(ix(f, "pump_station"), run_.project.pump_stations[i].id.c_str());
        f.SetField(ix(f, "operating_case"), c.label.c_str());
        f.SetField(ix(f, "pumps"), c.pumps);
        f.SetField(ix(f, "operating_point"), c.exists ? 1 : 0);
        f.SetField(ix(f, "design"), c.exists && k == st.design_case ? 1 : 0);
        set(f, "wet_well_level", c.wet_well_m, Dimension::length);
        set(f, "discharge_level", st.discharge_level_m, Dimension::length);
        set(f, "static_lift", c.static_lift_m, Dimension::length);
        if (c.exists) {
          set(f, "flow", c.flow_m3_s, Dimension::flow);
          set(f, "head", c.head_m, Dimension::length);
          set(f, "velocity", c.velocity_m_s.front(), Dimension::velocity);
          set(f, "pressure_head_min", *std::min_element(c.pressure_head_m.begin(), c.pressure_head_m.end()),
              Dimension::pressure_head);
          set(f, "pressure_head_max", *std::max_element(c.pressure_head_m.begin(), c.pressure_head_m.end()),
              Dimension::pressure_head);
        }
        add(l, f);
      }
    }
  }

  gis::detail::GdalErrorCapture gdal_;  // GDAL's messages kept off stderr; declared first, popped last
  const run::CheckRun& run_;
  units::System sys_;
  std::string path_;
  std::unique_ptr<GDALDataset, DatasetCloser> ds_;
  OGRSpatialReference out_srs_;
  OGRSpatialReference run_srs_;
  std::unique_ptr<OGRCoordinateTransformation> to_source_;
  std::map<std::pair<const OGRFeatureDefn*, const char*>, int> field_ix_;
  std::vector<std::string> case_labels_;
  std::vector<std::pair<const OGRLayer*, SpatialIndexRequest>> indexes_;  // in layer creation order
  std::map<std::string, std::vector<std::string>> sql_columns_;  // layers whose rows go through SQLite
  std::map<std::string, std::string> geometry_column_;
};

}  // namespace

void write_results_gpkg(const run::CheckRun& run, const std::string& path) { Writer(run, path).write(); }

const std::vector<std::string>& output_names() {
  // changes.csv, structure_changes.csv (a proposal's run) and headroom.csv (--headroom) too: a plain
  // run after one of those must not leave their figures beside its own.
  static const std::vector<std::string> names = {"exceptions.csv", "results.gpkg",          "summary.json",
                                                 "report.html",    "profiles.pdf",          "profiles",
                                                 "budgets.csv",    "changes.csv",           "structure_changes.csv",
                                                 "headroom.csv"};
  return names;
}

void check_output_folder(const std::string& out_dir, const std::vector<std::string>& inputs) {
  const FileKind kind = file_kind(out_dir);
  if (kind != FileKind::missing && kind != FileKind::directory)
    throw Error(ErrorKind::bad_config, ErrorContext{out_dir, "", "", ""},
                "is " + std::string(file_kind_text(kind)) + ", not a folder; --out names the folder the outputs go in");
  refuse_outputs_over_inputs(out_dir, output_names(), inputs);
}

namespace {

// An error of one of the writers, told with the output's final name and the state of the folder.
[[noreturn]] void rethrow_with_state(const Error& e, const StagedFiles& files) {
  const std::string prefix = format_context(e.where());
  std::string what = std::string(e.what()).substr(prefix.size());
  for (std::size_t at = what.find(files.staging_dir()); at != std::string::npos; at = what.find(files.staging_dir()))
    what.replace(at, files.staging_dir().size(), files.out_dir());
  ErrorContext where = e.where();
  where.file = files.final_name(where.file);
  throw Error(e.kind(), where, what + "; " + StagedFiles::untouched);
}

}  // namespace

void write_outputs(const run::CheckRun& run, const std::string& out_dir, const OutputOptions& options) {
  std::vector<std::string> inputs;
  for (const auto& f : run.inputs) inputs.push_back(f.path);
  check_output_folder(out_dir, inputs);  // before anything is written
  StagedFiles files(out_dir, output_names());
  const std::string gpkg = files.path_for("results.gpkg");
  std::exception_ptr gpkg_failed;
  try {
    {
      // results.gpkg (SQLite inserts) is the longest writer of a city-wide run and shares nothing
      // with the others but the finished run: it is written beside them, on another core.
      std::jthread gpkg_writer([&] {
        try {
          write_results_gpkg(run, gpkg);
          if (options.more_layers) options.more_layers(gpkg);
        } catch (...) {
          gpkg_failed = std::current_exception();
        }
      });
      // The drawings first: one that cannot be written is a finding the list and summary carry.
      Findings output_findings;
      if (options.drawings) write_drawings(run, files, options.profiles, &output_findings);
      files.write_stream("exceptions.csv",
                         [&](std::ostream& out) { write_exceptions_csv(run, out, output_findings); });
      files.write_text("summary.json", summary_json(run, output_findings));
      for (const auto& [name, text] : options.more_files) files.write_text(name, text);
    }
    if (gpkg_failed) std::rethrow_exception(gpkg_failed);
  } catch (const Error& e) {
    rethrow_with_state(e, files);
  }
  files.commit();
}

}  // namespace rimline::report

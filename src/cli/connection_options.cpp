#include "cli/connection_options.hpp"

#include <algorithm>
#include <cmath>
#include <ostream>

#include "rimline/connections/added_flow.hpp"
#include "rimline/connections/outputs.hpp"
#include "rimline/error.hpp"

namespace rimline::cli {

void add_connection_options(CLI::App& app, ConnectionArgs& a) {
  app.add_option("--proposal", a.proposal,
                 "Proposal file (TOML): run the proposed network beside the existing one and compare them");
  app.add_flag("--headroom", a.headroom,
               "Search every structure's connection headroom: the inflow it can take before any criterion fails");
  app.add_option("--headroom-at", a.headroom_at, "Search the headroom at this structure only (repeatable)");
}

ConnectionJob::ConnectionJob(const ConnectionArgs& args, const config::Project& project) : args_(args), project_(project) {
  if (!args_.proposal.empty()) proposal_ = config::load_proposal(args_.proposal);
}

config::Project ConnectionJob::project_to_run() const {
  return proposal_ ? config::proposed_project(project_, *proposal_) : project_;
}

void ConnectionJob::amend(run::RunOptions& options) const {
  if (!proposal_) return;
  const config::Proposal& p = *proposal_;
  if (p.tailwater_mode || !p.tailwater_levels_m.empty()) options.tailwater_levels_m.clear();  // the proposal's own
  if (!p.pipes.empty())
    options.amend_network = [&p](model::Network& net, Findings& findings) {
      connections::apply_pipe_changes(p.pipes, net, findings);
    };
  if (!p.inflows.empty())
    options.amend_flows = [&p](const model::Network& net, const topology::Topology& topo, const flows::SplitRule& split,
                               std::vector<double>& flow, Findings& findings) {
      connections::add_inflows(p.inflows, net, topo, split, flow, findings);
    };
}

void ConnectionJob::finish(const run::CheckRun& result, const run::RunOptions& options, report::OutputOptions& out,
                           std::ostream* log) {
  result_ = &result;
  const auto sys = result.report_units;
  const auto& settings = project_.connections;
  std::vector<std::string> connection_ids;
  if (proposal_) {
    run::RunOptions base_options = options;
    base_options.amend_network = nullptr;
    base_options.amend_flows = nullptr;
    if (options.progress) options.progress("the existing network");
    base_.emplace(run::run_check(project_, base_options));
    comparison_ = connections::compare_runs(*base_, result, settings.comparison, proposal_->name);
    for (const auto& in : proposal_->inflows)
      if (std::find(connection_ids.begin(), connection_ids.end(), in.structure) == connection_ids.end())
        connection_ids.push_back(in.structure);
    // The heads of a new sewer the proposal lays (added structures no pipe drains into): its
    // profile runs through the connection to the outfall.
    const auto& net = result.read.network;
    for (std::size_t s = 0; s < net.structures.size(); ++s)
      if (net.structures[s].proposed && result.topology.nodes[s].inflows.empty() &&
          std::find(connection_ids.begin(), connection_ids.end(), net.structures[s].id) == connection_ids.end())
        connection_ids.push_back(net.structures[s].id);
    out.more_files.emplace_back("changes.csv", connections::changes_csv(*comparison_, sys));
    out.more_files.emplace_back("structure_changes.csv", connections::structure_changes_csv(*comparison_, sys));
    out.profiles.more_sections += connections::comparison_html(*comparison_, *base_, result, connection_ids);
    if (log) *log << "proposal " << (proposal_->name.empty() ? args_.proposal : proposal_->name) << ": "
                  << render_message(comparison_->verdict, sys) << "\n";
  }
  if (args_.headroom || !args_.headroom_at.empty()) {
    std::vector<std::size_t> at;
    for (const auto& id : args_.headroom_at) {
      const std::size_t s = model::find_structure(result.read.network, id);
      if (s == model::no_index) throw Error(ErrorKind::bad_config, "--headroom-at: the network has no structure \"" + id + "\"");
      at.push_back(s);
    }
    if (options.progress) options.progress("connection headroom");
    headroom_ = connections::connection_headroom(result, settings, at);
    out.more_files.emplace_back("headroom.csv", connections::headroom_csv(headroom_, sys));
    out.profiles.more_sections += connections::headroom_html(headroom_, result, settings);
    if (log) {
      std::vector<const connections::Headroom*> low;
      for (const auto& h : headroom_)
        if (std::isfinite(h.headroom_m3_s)) low.push_back(&h);
      std::stable_sort(low.begin(), low.end(), [](auto* a, auto* b) { return a->headroom_m3_s < b->headroom_m3_s; });
      if (const std::size_t n = connections::not_searched_for_the_solve(headroom_))
        *log << "connection headroom: " << n << " structure(s) not searched, their added flow would reach pipes the "
             << "network solve settles (see headroom.csv)\n";
      *log << "connection headroom, lowest:\n";
      for (std::size_t i = 0; i < low.size() && i < 5; ++i)
        *log << "  " << low[i]->id << ": " << connections::headroom_text(*low[i], sys)
             << (low[i]->governing_id.empty() ? "" : " (" + low[i]->criterion + " " + low[i]->change + " at " +
                                                         low[i]->governing_id + ", " +
                                                         render_message(low[i]->case_label, sys) + ")")
             << "\n";
    }
  }
  if (comparison_ || !headroom_.empty())
    out.more_layers = [this](const std::string& gpkg) {
      connections::add_gpkg_layers(gpkg, *result_, comparison_ ? &*comparison_ : nullptr,
                                   headroom_.empty() ? nullptr : &headroom_);
    };
}

}  // namespace rimline::cli

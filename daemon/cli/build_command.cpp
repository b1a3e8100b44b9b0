// `ringroad build INPUT -o REGION.rrg [--profile car|bicycle|foot] [--quiet]`: reads an OSM
// extract, builds the road graph of one profile and writes it as a region graph file. Progress
// goes to stderr on a terminal; a one-paragraph summary follows unless --quiet. The output is
// written through a temporary file, so a failure never leaves a half-written REGION.rrg.

#include "common/atomic_file.hpp"
#include "common/input_error.hpp"
#include "common/progress.hpp"
#include "daemon/cli/commands.hpp"
#include "extract/road_extractor.hpp"
#include "graph/graph_file.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/stored_sections.hpp"

#include <CLI/CLI.hpp>

#include <charconv>
#include <cstdio>
#include <filesystem>
#include <memory>
#include <string>

namespace ringroad::cli {

namespace {

struct BuildArguments {
    std::string input;
    std::string output;
    std::string profile = "car";
    bool quiet = false;
    bool no_hierarchy = false;
};

// A count from the graph's metadata; 0 when absent.
std::uint64_t metadata_count(const graph::RoadGraph& graph, const char* key) {
    const std::string text = graph.metadata_value(key);
    std::uint64_t value = 0;
    std::from_chars(text.data(), text.data() + text.size(), value);
    return value;
}

// The same figure `ringroad info` prints: roads open in at least one direction.
double road_km(const graph::RoadGraph& graph) {
    return static_cast<double>(metadata_count(graph, "road_length_dm")) / 10000.0;
}

std::string count_of(std::uint64_t count, const char* singular, const char* plural) {
    return std::to_string(count) + " " + (count == 1 ? singular : plural);
}

void print_summary(const graph::RoadGraph& graph, const BuildArguments& arguments, double seconds) {
    std::uint64_t main_junctions = 0;
    for (std::uint32_t component : graph.components()) main_junctions += component == 0 ? 1 : 0;
    std::fprintf(stderr,
                 "Built %s from %s (%s profile): %s, %s, %.1f km of road; %s, the main one with %s; "
                 "%s stored (%s read, %s unmatched); %s skipped for nodes missing from the extract; %s; %.1f s.\n",
                 arguments.output.c_str(), arguments.input.c_str(), arguments.profile.c_str(),
                 count_of(graph.vertex_count(), "junction", "junctions").c_str(),
                 count_of(graph.edge_count(), "edge", "edges").c_str(), road_km(graph),
                 count_of(graph.component_count(), "strongly connected component", "strongly connected components").c_str(),
                 count_of(main_junctions, "junction", "junctions").c_str(),
                 count_of(graph.turn_restrictions().size(), "turn restriction", "turn restrictions").c_str(),
                 graph.metadata_value("restrictions_read").c_str(),
                 graph.metadata_value("restrictions_unmatched").c_str(),
                 count_of(metadata_count(graph, "ways_missing_nodes"), "way", "ways").c_str(),
                 router::hierarchy::has_hierarchy_sections(graph, router::Metric::time) ? "contraction hierarchy built"
                                                                                    : "no contraction hierarchy",
                 seconds);
    if (const std::uint64_t repaired = metadata_count(graph, "names_repaired"); repaired > 0) {
        std::fprintf(stderr, "%s not valid UTF-8: stored with U+FFFD in place of each bad byte sequence.\n",
                     count_of(repaired, "way's name was", "ways' names were").c_str());
    }
}

graph::RoadGraph build_graph_from_extract(const BuildArguments& arguments, Progress& progress) {
    const auto profile = extract::profile_from_name(arguments.profile);
    if (!profile) throw InputError("--profile: unknown profile '" + arguments.profile + "'", "profile");
    return extract::extract_and_build_road_graph({arguments.input, *profile}, &progress);
}

// The hierarchy is built once here rather than at every load: it is the slow part of
// preparing a region, and every later command maps it from the file.
graph::RoadGraph add_contraction_hierarchy(const graph::RoadGraph& graph, Progress& progress) {
    auto sections = router::hierarchy::build_hierarchy_sections(graph, router::RestrictionPolicy::automatic, &progress);
    progress.finish();
    return graph::attach_sections(graph, std::move(sections));
}

// The routing graph and the snapping index are stored too, so that opening the file derives
// nothing (router/STORED.md).
graph::RoadGraph add_query_sections(const graph::RoadGraph& graph, Progress& progress) {
    progress.phase("storing the routing graph and snapping index");
    auto sections = router::build_query_sections(graph, router::RestrictionPolicy::automatic);
    progress.finish();
    return graph::attach_sections(graph, std::move(sections));
}

void write_graph(const graph::RoadGraph& graph, const std::string& output, Progress& progress) {
    progress.phase("writing " + output);
    graph::write_road_graph(graph, output);
    progress.finish();
}

void run_build(const BuildArguments& arguments) {
    check_output_writable(arguments.output);   // before the (long) extraction
    Progress progress{arguments.quiet};
    graph::RoadGraph graph = build_graph_from_extract(arguments, progress);
    graph = add_query_sections(graph, progress);   // first: the contraction reuses the stored routing graph
    if (!arguments.no_hierarchy) graph = add_contraction_hierarchy(graph, progress);
    write_graph(graph, arguments.output, progress);
    if (!arguments.quiet) print_summary(graph, arguments, progress.elapsed_seconds());
}

} // namespace

void add_build_command(CLI::App& app) {
    auto arguments = std::make_shared<BuildArguments>();
    auto* command = app.add_subcommand("build", "Build a region graph (.rrg) from an OpenStreetMap extract");
    command->add_option("INPUT", arguments->input, "OSM extract: .osm.pbf, .osm, .osm.bz2 or .osm.gz")->required();
    command->add_option("-o,--output", arguments->output, "Region graph file to write (.rrg; - for standard output)")->required();
    command->add_option("--profile", arguments->profile, "Mode of travel: car (default), bicycle or foot")
        ->check(CLI::IsMember({"car", "bicycle", "foot"}));
    command->add_flag("--quiet", arguments->quiet, "No progress and no summary on stderr");
    command->add_flag("--no-hierarchy", arguments->no_hierarchy,
                      "Skip the contraction hierarchy (smaller, faster build; slower matrices)");
    command->callback([arguments] { run_build(*arguments); });
}

} // namespace ringroad::cli

// `ringroad synth --junctions N [--seed S] -o REGION.osm.pbf [--quiet]`: invents a region whose
// car graph has about N junctions and writes it as an OSM PBF file, so the pipeline can be
// measured on any size. Same N and seed, same bytes. Progress on a terminal, a one-paragraph
// summary on stderr unless --quiet; the file appears only when complete. `-o -` writes to standard
// output; a name must end in .pbf (synth writes PBF only, and `build` reads by extension).

#include "common/atomic_file.hpp"
#include "common/input_error.hpp"
#include "common/progress.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/numeric_options.hpp"
#include "synth/pbf_region_writer.hpp"
#include "synth/region_calibration.hpp"

#include <CLI/CLI.hpp>

#include <stdlib.h>

#include <charconv>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <memory>
#include <string>
#include <vector>

namespace ringroad::cli {

namespace {

struct SynthArguments {
    std::string junctions;
    std::uint64_t seed = 1;
    std::string output;
    bool quiet = false;
};

std::string allowed_range() {
    return std::to_string(synth::kMinJunctions) + " .. " + std::to_string(synth::kMaxJunctions);
}

// Read here rather than by CLI11 so that every bad value gets the same one-line message.
std::uint64_t parse_junctions(const std::string& text) {
    std::uint64_t value = 0;
    const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (text.empty() || error == std::errc::invalid_argument || end != text.data() + text.size()) {
        throw InputError("--junctions: '" + text + "' is not a whole number (allowed range " + allowed_range() + ")", "junctions");
    }
    if (error == std::errc::result_out_of_range) {
        throw InputError("--junctions: " + text + " is outside the allowed range " + allowed_range(), "junctions");
    }
    return value;
}

void print_summary(const synth::RegionPlan& plan, const SynthArguments& arguments, std::uint64_t bytes, double seconds) {
    const synth::PlanFigures& figures = plan.figures;
    std::fprintf(stderr,
                 "Wrote %s (seed %llu): %llu junctions planned for the car profile on a %u x %u street grid; "
                 "%zu nodes, %zu ways, %zu turn restrictions, %u motorways with %u interchanges, %u roundabouts, "
                 "%u cul-de-sacs and driveways; "
                 "%.1f MiB; %.1f x %.1f km, lat %.4f .. %.4f, lon %.4f .. %.4f; %.1f s.\n",
                 arguments.output.c_str(), static_cast<unsigned long long>(arguments.seed),
                 static_cast<unsigned long long>(figures.junctions), figures.grid_rows, figures.grid_columns,
                 plan.nodes.size(), plan.ways.size(), plan.restrictions.size(), figures.motorways, figures.interchanges,
                 figures.roundabouts, figures.cul_de_sacs, static_cast<double>(bytes) / (1024.0 * 1024.0), figures.width_m / 1000.0,
                 figures.height_m / 1000.0, figures.min_lat, figures.max_lat, figures.min_lon, figures.max_lon, seconds);
}

// Refuses, with one line, a file name `build` would read as another format.
CLI::Validator pbf_file_name() {
    return CLI::Validator(
        [](std::string& path) -> std::string {
            const bool pbf = path.size() > 4 && path.compare(path.size() - 4, 4, ".pbf") == 0;
            std::error_code ignored;
            // A folder is reported as such when the command runs (exit 1).
            if (pbf || path == "-" || is_stream_output(path) || std::filesystem::is_directory(path, ignored)) return {};
            return "'" + path + "' does not end in .pbf: synth writes OSM PBF only (name it REGION.osm.pbf)";
        },
        "FILE.osm.pbf");
}

// Standard output and special files get the finished file whole, from a private scratch folder.
std::uint64_t write_region(const synth::RegionPlan& plan, const std::string& output, Progress& progress) {
    if (!is_stream_output(output)) return synth::write_region_pbf(plan, final_link_target(output), &progress);
    namespace fs = std::filesystem;
    std::string folder = (fs::temp_directory_path() / "ringroad-synth-XXXXXX").string();
    if (::mkdtemp(folder.data()) == nullptr) throw InputError(folder + ": cannot create a scratch folder");
    struct Remove {
        std::string folder;
        ~Remove() {
            std::error_code ignored;
            fs::remove_all(folder, ignored);
        }
    } cleanup{folder};
    const std::string scratch = folder + "/region.osm.pbf";
    const std::uint64_t bytes = synth::write_region_pbf(plan, scratch, &progress);
    std::ifstream in(scratch, std::ios::binary);
    AtomicFile file(output);
    std::vector<char> buffer(1 << 16);
    while (in.read(buffer.data(), static_cast<std::streamsize>(buffer.size())) || in.gcount() > 0) {
        file.write(buffer.data(), static_cast<std::size_t>(in.gcount()));
    }
    file.commit();
    return bytes;
}

void run_synth(const SynthArguments& arguments) {
    const std::uint64_t junctions = parse_junctions(arguments.junctions);
    if (junctions < synth::kMinJunctions || junctions > synth::kMaxJunctions) {
        throw InputError("--junctions: " + arguments.junctions + " is outside the allowed range " + allowed_range(), "junctions");
    }
    check_output_writable(arguments.output);   // before the planning, which takes a while at large sizes
    Progress progress{arguments.quiet};
    const synth::RegionPlan plan = synth::plan_region(junctions, arguments.seed, &progress);
    const std::uint64_t bytes = write_region(plan, arguments.output, progress);
    progress.finish();
    if (!arguments.quiet) print_summary(plan, arguments, bytes, progress.elapsed_seconds());
}

} // namespace

void add_synth_command(CLI::App& app) {
    auto arguments = std::make_shared<SynthArguments>();
    auto* command = app.add_subcommand("synth", "Invent a region of about N junctions and write it as an OSM PBF file");
    command->add_option("--junctions", arguments->junctions,
                        "Junctions the car graph of the region should have (" + allowed_range() + ")")
        ->required();
    command->add_option("--seed", arguments->seed, "Seed of the invented layout (default 1; same seed, same bytes)")
        ->check(count_between(0, UINT64_MAX));
    command->add_option("-o,--output", arguments->output, "OSM PBF file to write (.osm.pbf; - for standard output)")
        ->required()
        ->check(pbf_file_name());
    command->add_flag("--quiet", arguments->quiet, "No progress and no summary on stderr");
    command->callback([arguments] { run_synth(*arguments); });
}

} // namespace ringroad::cli

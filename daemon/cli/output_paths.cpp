#include "daemon/cli/output_paths.hpp"

#include <CLI/CLI.hpp>

#include <sys/stat.h>

#include <filesystem>
#include <string>
#include <vector>

namespace ringroad::cli {

namespace {

struct NamedPath {
    std::string option;
    std::string path;
};

bool is_output_option(const CLI::Option& option) {
    return option.check_lname("output") || option.check_lname("second-table");
}

std::string option_name(const CLI::Option& option) { return option.get_name(); }

bool same_file(const std::string& a, const std::string& b) {
    struct stat first {}, second {};
    if (::stat(a.c_str(), &first) == 0 && ::stat(b.c_str(), &second) == 0) {
        return first.st_dev == second.st_dev && first.st_ino == second.st_ino;
    }
    // Not created yet: the same name after resolving links and relative parts.
    std::error_code error_a, error_b;
    const auto canonical_a = std::filesystem::weakly_canonical(a, error_a);
    const auto canonical_b = std::filesystem::weakly_canonical(b, error_b);
    return !error_a && !error_b && canonical_a == canonical_b;
}

} // namespace

void check_output_paths(const CLI::App& command) {
    std::vector<NamedPath> outputs, inputs;
    for (const CLI::Option* option : command.get_options()) {
        if (option->count() == 0 || option->get_type_size_max() == 0) continue;   // unused, or a flag
        for (const std::string& value : option->results()) {
            (is_output_option(*option) ? outputs : inputs).push_back({option_name(*option), value});
        }
    }
    for (std::size_t i = 0; i < outputs.size(); ++i) {
        const NamedPath& output = outputs[i];
        if (output.path.empty()) {
            throw CLI::ValidationError(output.option, "an empty file name (use - for standard output)");
        }
        for (std::size_t j = 0; j < i; ++j) {
            const NamedPath& other = outputs[j];
            const bool both_stdout = output.path == "-" && other.path == "-";
            if (both_stdout || (output.path != "-" && other.path != "-" && same_file(output.path, other.path))) {
                throw CLI::ValidationError(output.option, "'" + output.path + "' is also the " + other.option +
                                                              " output; give each output its own file");
            }
        }
        if (output.path == "-") continue;
        struct stat status {};
        if (::stat(output.path.c_str(), &status) != 0 || !S_ISREG(status.st_mode)) continue;
        for (const NamedPath& input : inputs) {
            struct stat input_status {};
            if (::stat(input.path.c_str(), &input_status) != 0) continue;
            if (input_status.st_dev == status.st_dev && input_status.st_ino == status.st_ino) {
                throw CLI::ValidationError(output.option, "'" + output.path + "' is the same file as the input " +
                                                              (input.option.empty() ? "" : input.option + " ") + "'" +
                                                              input.path + "'; writing it would destroy the input");
            }
        }
    }
}

} // namespace ringroad::cli

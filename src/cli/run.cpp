// SPDX-License-Identifier: MIT
#include "catchpeak/cli/run.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/version.hpp"

#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include <exception>
#include <functional>

namespace catchpeak::cli {

namespace {

constexpr const char *description =
    "catchpeak: design peak flows for every design point of a drainage project, from a DEM, "
    "design points, land cover, soils and rainfall, with a calculation sheet a checker can "
    "reproduce line by line.\n"
    "Results must be reviewed by a licensed professional engineer; the local drainage code "
    "governs.";

int to_int(ExitCode c) { return static_cast<int>(c); }

/// Names of the subcommands, for the "unknown command" message.
std::string command_list(const CLI::App &app) {
    std::string names;
    for (const auto *sub : app.get_subcommands([](const CLI::App *) { return true; })) {
        names += names.empty() ? "" : ", ";
        names += sub->get_name();
    }
    return names.empty() ? "none yet" : names;
}

} // namespace

int run(const std::vector<std::string> &args, std::ostream &out, std::ostream &err) {
    CLI::App app{description, "catchpeak"};
    app.set_help_flag("-h,--help", "Print this help and exit");
    bool show_version = false;
    app.add_flag("--version", show_version, "Print the version and the git commit, and exit");
    app.require_subcommand(0, 1);

    // Subcommands are registered here as they are implemented; each one sets `action`.
    std::function<int()> action;

    try {
        std::vector<std::string> reversed(args.rbegin(), args.rend());
        app.parse(reversed);
    } catch (const CLI::CallForHelp &) {
        out << app.help();
        return to_int(ExitCode::success);
    } catch (const CLI::ExtrasError &e) {
        const bool is_command = !args.empty() && !args.front().empty() && args.front()[0] != '-';
        err << (is_command ? fmt::format("catchpeak: unknown command '{}'", args.front())
                           : fmt::format("catchpeak: {}", e.what()))
            << fmt::format("; commands: {}; see 'catchpeak --help'\n", command_list(app));
        return to_int(ExitCode::bad_input);
    } catch (const CLI::ParseError &e) {
        err << "catchpeak: " << e.what() << "; see 'catchpeak --help'\n";
        return to_int(ExitCode::bad_input);
    }

    if (show_version) {
        out << fmt::format("catchpeak {} (commit {})\n", version(), git_commit());
        return to_int(ExitCode::success);
    }
    if (!action) {
        out << app.help();
        return to_int(ExitCode::success);
    }
    try {
        return action();
    } catch (const Error &e) {
        err << "catchpeak: " << e.what() << '\n';
        return to_int(e.exit_code());
    } catch (const std::exception &e) {
        err << "catchpeak: internal error: " << e.what() << '\n';
        return to_int(ExitCode::internal_error);
    }
}

} // namespace catchpeak::cli

// SPDX-License-Identifier: MIT
#include "catchpeak/cli/run.hpp"

#include "catchpeak/app/delineate.hpp"
#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/app/recheck.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/snap_rule.hpp"
#include "catchpeak/core/spelling.hpp"
#include "catchpeak/core/version.hpp"

#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include <algorithm>
#include <exception>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

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

/// The subcommands' option values and the action the chosen one sets; they must outlive the
/// parse and the action.
struct Commands {
    std::function<int()> action;
    std::string init_dir;
    std::string check_file;
    std::string run_file;
    std::string run_out;
    bool run_quiet = false;
    std::string recheck_dir;
    std::string recheck_project;
    app::DelineateOptions delineate_options;
    std::string delineate_snap{option_key(snap_rule_options, SnapRule::nearest_stream)};
    bool delineate_quiet = false;
};

/// Takes the application and the commands' values; adds the subcommands "init", "check" and
/// "run", each setting c.action.
void add_project_commands(CLI::App &app, Commands &c, std::ostream &out, std::ostream &err) {
    auto *init = app.add_subcommand("init", "Write a commented project template as "
                                            "DIR/project.toml (never overwrites)");
    init->add_option("DIR", c.init_dir, "Folder of the new project")->required();
    init->callback([&c, &out] {
        c.action = [&c, &out] {
            const auto file = app::init_project(c.init_dir);
            out << fmt::format("wrote {}; edit it, then run 'catchpeak check {}'\n", file.string(),
                               file.string());
            return to_int(ExitCode::success);
        };
    });

    auto *check = app.add_subcommand(
        "check", "Validate a project file and its inputs without computing; lists every problem");
    check->add_option("PROJECT", c.check_file, "The project file (.toml)")->required();
    check->callback([&c, &out] {
        c.action = [&c, &out] {
            app::check_project_file(c.check_file, out);
            return to_int(ExitCode::success);
        };
    });

    auto *runc = app.add_subcommand(
        "run", "Compute every design point and return period of a project and write the results");
    runc->add_option("PROJECT", c.run_file, "The project file (.toml)")->required();
    runc->add_option("--out", c.run_out, "Output folder (default: [output] folder of the project)");
    runc->add_flag("--quiet", c.run_quiet, "No progress and no summary table");
    runc->callback([&c, &out, &err] {
        c.action = [&c, &out, &err] {
            app::RunOptions options;
            if (!c.run_out.empty()) {
                options.out_dir = std::filesystem::path(c.run_out);
            }
            options.quiet = c.run_quiet;
            app::run_project(c.run_file, options, out, err);
            return to_int(ExitCode::success);
        };
    });
}

/// Takes the application and the commands' values; adds the subcommand "recheck", setting
/// c.action.
void add_recheck_command(CLI::App &app, Commands &c, std::ostream &out) {
    auto *recheckc = app.add_subcommand(
        "recheck", "Verify the inputs and outputs of a run, recompute it in memory and compare "
                   "every calculation line; exit 0 when everything is reproduced, 3 when a "
                   "line differs from unchanged inputs, 4 when an input changed since the run, "
                   "5 when an output changed since the run");
    recheckc->add_option("OUTPUT_DIR", c.recheck_dir, "Output folder of a 'catchpeak run'")
        ->required();
    recheckc->add_option("--project", c.recheck_project,
                         "The project file (default: the recorded one, beside the output folder)");
    recheckc->callback([&c, &out] {
        c.action = [&c, &out] {
            app::RecheckOptions options;
            if (!c.recheck_project.empty()) {
                options.project_file = std::filesystem::path(c.recheck_project);
            }
            const auto report = app::recheck(c.recheck_dir, options);
            out << app::format_recheck(report);
            return to_int(report.exit_code());
        };
    });
}

/// Takes the application and the commands' values; adds the subcommand "delineate", setting
/// c.action.
/// The snapping options of `delineate`.
void add_snap_options(CLI::App &delineate, Commands &c) {
    app::DelineateOptions &o = c.delineate_options;
    delineate.add_option("--snap", c.delineate_snap,
                         "How a point moves: nearest_stream (the nearest cell draining at least "
                         "--snap-stream-threshold), largest_flow (the cell of largest flow "
                         "accumulation) or none (the cell under it); default nearest_stream");
    delineate
        .add_option("--snap-stream-threshold", o.snap_stream_threshold_m2,
                    "M2: with --snap nearest_stream, cells draining at least this area are "
                    "streams")
        ->capture_default_str();
    delineate
        .add_option("--snap-area-factor", o.snap_area_factor,
                    "Warn when the snapped catchment is more than this many times the "
                    "catchment of the cell under the point, or when the catchments within the "
                    "radius differ more")
        ->capture_default_str();
}

void add_delineate_command(CLI::App &app, Commands &c, std::ostream &out, std::ostream &err) {
    app::DelineateOptions &o = c.delineate_options;
    auto *delineate = app.add_subcommand(
        "delineate", "Delineate the catchment above every design point from a DEM: area, "
                     "longest flow path, slopes; writes catchments.json and catchments.gpkg");
    delineate->add_option("--dem", o.dem, "DEM raster in a projected CRS (metres or feet)")
        ->required();
    delineate
        ->add_option("--points", o.points,
                     "Design points (any vector file GDAL reads); reprojected to the DEM's "
                     "CRS if theirs differs")
        ->required();
    delineate->add_option("--id-field", o.id_field, "Field holding the design point ids")
        ->required();
    delineate->add_option("--points-crs", o.points_crs.text,
                          "The CRS of the points' coordinates when their file does not declare "
                          "it (e.g. EPSG:32617; a GeoJSON file without a \"crs\" member is "
                          "WGS 84 longitude/latitude)");
    o.points_crs.key = "--points-crs";
    o.points_crs.where = "--points-crs";
    delineate
        ->add_option("--snap-radius", o.snap_radius_m,
                     "Metres: each point may move within this distance (see --snap)")
        ->required();
    add_snap_options(*delineate, c);
    delineate->add_option("--out", o.out_dir, "Folder to write the results to")->required();
    delineate->add_option("--breach-lines", o.breach_lines,
                          "Lines (culverts under embankments) along which the DEM is lowered");
    delineate
        ->add_option("--stream-threshold", o.stream_threshold_m2,
                     "M2: cells draining at least this area are streams (0: none)")
        ->capture_default_str();
    delineate->add_flag("--quiet", c.delineate_quiet, "No progress on stderr");
    delineate->callback([&c, &out, &err] {
        c.action = [&c, &out, &err] {
            c.delineate_options.snap_rule = app::snap_rule_option(c.delineate_snap);
            const auto summary =
                app::delineate(c.delineate_options, c.delineate_quiet ? nullptr : &err);
            if (!c.delineate_quiet) {
                for (const auto &note : summary.notes) {
                    err << "note: " << note << '\n';
                }
            }
            for (const auto &warning : summary.warnings) {
                err << "warning: " << warning << '\n';
            }
            out << fmt::format("{} design points: wrote {} and {}\n", summary.design_points,
                               summary.json.string(), summary.gpkg.string());
            return to_int(ExitCode::success);
        };
    });
}

/// The options of a command ("--out", "-h", ...), as they are written on the command line.
std::vector<std::string> option_names(const CLI::App &app) {
    std::vector<std::string> names;
    for (const auto *o : app.get_options()) {
        for (const auto &l : o->get_lnames()) {
            names.push_back("--" + l);
        }
        for (const auto &s : o->get_snames()) {
            names.push_back("-" + s);
        }
    }
    return names;
}

/// " (did you mean 'x'?)" when one of `candidates` is close to `word`, else "".
std::string did_you_mean(const std::string &word, const std::vector<std::string> &candidates) {
    const std::string hint = closest_match(word, candidates);
    return hint.empty() ? std::string() : fmt::format(" (did you mean '{}'?)", hint);
}

/// The command the arguments chose (the application itself when none).
const CLI::App &chosen_command(const CLI::App &app) {
    const CLI::App *command = &app;
    for (const auto *sub : app.get_subcommands()) {
        command = sub;
    }
    return *command;
}

/// "catchpeak run", or "catchpeak" when no command was chosen.
std::string command_name(const CLI::App &app, const CLI::App &command) {
    return &command == &app ? std::string("catchpeak")
                            : fmt::format("catchpeak {}", command.get_name());
}

/// The message for the first option that no one took, named as the user wrote it, with a
/// suggestion and the options of its command; nullopt when every option was known.
std::optional<std::string> unknown_option(const CLI::App &app) {
    const CLI::App &command = chosen_command(app);
    const std::vector<std::string> left = command.remaining();
    const auto option = std::find_if(
        left.begin(), left.end(), [](const std::string &a) { return a.size() > 1 && a[0] == '-'; });
    if (option == left.end()) {
        return std::nullopt;
    }
    const std::string name = command_name(app, command);
    const std::string given = option->substr(0, option->find('='));
    const std::vector<std::string> options = option_names(command);
    return fmt::format("{}: unknown option '{}'{}; options: {}; see '{} --help'", name, given,
                       did_you_mean(given, options), fmt::join(options, ", "), name);
}

/// The message for arguments no one took: the first unknown option, or the unknown command, or
/// an argument too many.
std::string extras_message(const CLI::App &app) {
    if (auto m = unknown_option(app)) {
        return *m;
    }
    const CLI::App &command = chosen_command(app);
    const std::vector<std::string> left = command.remaining();
    const std::string first = left.empty() ? std::string() : left.front();
    if (&command == &app) {
        std::vector<std::string> commands;
        for (const auto *sub : app.get_subcommands([](const CLI::App *) { return true; })) {
            commands.push_back(sub->get_name());
        }
        return fmt::format("catchpeak: unknown command '{}'{}; commands: {}; see 'catchpeak "
                           "--help'",
                           first, did_you_mean(first, commands), command_list(app));
    }
    const std::string name = command_name(app, command);
    return fmt::format("{}: unexpected argument '{}' (the command takes no more); see '{} "
                       "--help'",
                       name, first, name);
}

/// Takes the application with its commands and the arguments; parses them. Gives the exit
/// code when the parse ends the run (help shown, or a bad argument reported on `err`),
/// nullopt when the run goes on.
std::optional<int> parse_arguments(CLI::App &app, const std::vector<std::string> &args,
                                   std::ostream &out, std::ostream &err) {
    try {
        std::vector<std::string> reversed(args.rbegin(), args.rend());
        app.parse(reversed);
    } catch (const CLI::CallForHelp &) {
        out << app.help();
        return to_int(ExitCode::success);
    } catch (const CLI::ExtrasError &) {
        err << extras_message(app) << '\n';
        return to_int(ExitCode::bad_input);
    } catch (const CLI::ParseError &e) {
        // An unknown option first: "--pionts" is the cause of "--points is required".
        if (auto m = unknown_option(app)) {
            err << *m << '\n';
            return to_int(ExitCode::bad_input);
        }
        err << "catchpeak: " << e.what() << "; see 'catchpeak --help'\n";
        return to_int(ExitCode::bad_input);
    }
    return std::nullopt;
}

} // namespace

int run(const std::vector<std::string> &args, std::ostream &out, std::ostream &err) {
    CLI::App app{description, "catchpeak"};
    app.set_help_flag("-h,--help", "Print this help and exit");
    bool show_version = false;
    app.add_flag("--version", show_version, "Print the version and the git commit, and exit");
    app.require_subcommand(0, 1);

    // Subcommands; each one sets `action`. The logic lives in catchpeak::app.
    Commands commands;
    add_project_commands(app, commands, out, err);
    add_recheck_command(app, commands, out);
    add_delineate_command(app, commands, out, err);
    if (const std::optional<int> code = parse_arguments(app, args, out, err)) {
        return *code;
    }

    if (show_version) {
        out << fmt::format("catchpeak {} (commit {})\n", version(), git_commit());
        return to_int(ExitCode::success);
    }
    if (!commands.action) {
        out << app.help();
        return to_int(ExitCode::success);
    }
    try {
        return commands.action();
    } catch (const Error &e) {
        err << "catchpeak: " << e.what() << '\n';
        return to_int(e.exit_code());
    } catch (const std::exception &e) {
        err << "catchpeak: internal error: " << e.what() << '\n';
        return to_int(ExitCode::internal_error);
    }
}

} // namespace catchpeak::cli

// SPDX-License-Identifier: MIT
// The command line, called as a function (STYLE.md 1). Each case: arguments, expected exit
// code (by name), and text that must appear on stdout or stderr.
#include "catchpeak/cli/run.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/version.hpp"

#include <gtest/gtest.h>

#include <sstream>
#include <string>
#include <vector>

using catchpeak::ExitCode;

namespace {

struct CliCase {
    std::string name;
    std::vector<std::string> args;
    ExitCode code;
    std::string expect_out; // must appear on stdout ("" = no check)
    std::string expect_err; // must appear on stderr ("" = no check)
};

const std::vector<CliCase> &cases() {
    static const std::vector<CliCase> c = {
        {"version", {"--version"}, ExitCode::success, "catchpeak 0.1.0 (commit ", ""},
        {"help", {"--help"}, ExitCode::success, "licensed professional engineer", ""},
        {"no_arguments_prints_help", {}, ExitCode::success, "Usage:", ""},
        {"unknown_command",
         {"frobnicate"},
         ExitCode::bad_input,
         "",
         "unknown command 'frobnicate'"},
        {"unknown_option", {"--frobnicate"}, ExitCode::bad_input, "", "--frobnicate"},
        // `catchpeak run --frobnicate p.toml` said "unknown command 'run'".
        {"unknown_option_of_a_command",
         {"run", "--frobnicate", "p.toml"},
         ExitCode::bad_input,
         "",
         "catchpeak run: unknown option '--frobnicate'; options: --help, -h, --out, --quiet"},
        {"unknown_option_after_the_project",
         {"run", "p.toml", "--frobnicate"},
         ExitCode::bad_input,
         "",
         "catchpeak run: unknown option '--frobnicate'"},
        {"misspelt_option_of_a_command",
         {"run", "--quite", "p.toml"},
         ExitCode::bad_input,
         "",
         "unknown option '--quite' (did you mean '--quiet'?)"},
        {"misspelt_option_with_a_value",
         {"recheck", "--projekt=p.toml", "out"},
         ExitCode::bad_input,
         "",
         "catchpeak recheck: unknown option '--projekt' (did you mean '--project'?)"},
        // A misspelt required option is named, not the required one it leaves missing.
        {"misspelt_required_option",
         {"delineate", "--dem", "d.tif", "--pionts", "p.gpkg"},
         ExitCode::bad_input,
         "",
         "catchpeak delineate: unknown option '--pionts' (did you mean '--points'?)"},
        {"misspelt_program_option",
         {"--verison"},
         ExitCode::bad_input,
         "",
         "catchpeak: unknown option '--verison' (did you mean '--version'?)"},
        {"misspelt_command",
         {"runn", "p.toml"},
         ExitCode::bad_input,
         "",
         "unknown command 'runn' (did you mean 'run'?)"},
        {"an_argument_too_many",
         {"run", "a.toml", "b.toml"},
         ExitCode::bad_input,
         "",
         "catchpeak run: unexpected argument 'b.toml'"},
    };
    return c;
}

// Shown in test names and failure messages instead of the object's bytes.
[[maybe_unused]] void PrintTo(const CliCase &c, std::ostream *os) { *os << c.name; }

class CliRun : public ::testing::TestWithParam<CliCase> {};

} // namespace

TEST_P(CliRun, ExitCodeAndMessage) {
    const auto &c = GetParam();
    std::ostringstream out;
    std::ostringstream err;
    const int code = catchpeak::cli::run(c.args, out, err);
    EXPECT_EQ(code, static_cast<int>(c.code)) << "stdout:\n"
                                              << out.str() << "stderr:\n"
                                              << err.str();
    if (!c.expect_out.empty()) {
        EXPECT_NE(out.str().find(c.expect_out), std::string::npos) << out.str();
    }
    if (!c.expect_err.empty()) {
        EXPECT_NE(err.str().find(c.expect_err), std::string::npos) << err.str();
    }
}

INSTANTIATE_TEST_SUITE_P(Cases, CliRun, ::testing::ValuesIn(cases()),
                         [](const auto &param_info) { return param_info.param.name; });

TEST(Cli, VersionNamesTheCommit) {
    std::ostringstream out;
    std::ostringstream err;
    ASSERT_EQ(catchpeak::cli::run({"--version"}, out, err), 0);
    EXPECT_NE(out.str().find(std::string(catchpeak::git_commit())), std::string::npos);
    EXPECT_FALSE(catchpeak::git_commit().empty());
}

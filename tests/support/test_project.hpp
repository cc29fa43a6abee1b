// SPDX-License-Identifier: MIT
// One builder for the table-input projects the tests run: a scratch folder, project.toml made
// of its typed parts ([project], [inputs], [rainfall], [methods], [settings], [output]) with
// sensible defaults, the catchment table, the IDF and any other file, and the commands run on
// it through the command line (cli::run) or the app functions.
#pragma once

#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/app/recheck.hpp"
#include "catchpeak/cli/run.hpp"
#include "support/test_env.hpp"

#include <filesystem>
#include <fstream>
#include <map>
#include <optional>
#include <sstream>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace catchpeak::test {

/// Writes `text` to `path` as bytes.
inline void write_file(const std::filesystem::path &path, const std::string &text) {
    std::ofstream(path, std::ios::binary) << text;
}

/// The bytes of a file ("" when it cannot be read).
inline std::string read_file(const std::filesystem::path &path) {
    std::ifstream in(path, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

/// `text` with the first `from` replaced by `to`; throws when `from` is not in it.
inline std::string replaced(std::string text, const std::string &from, const std::string &to) {
    const auto at = text.find(from);
    if (at == std::string::npos) {
        throw std::runtime_error("test set-up: text not found: " + from);
    }
    text.replace(at, from.size(), to);
    return text;
}

/// Replaces the first `from` in a file by `to`; throws when `from` is not in it.
inline void replace_in_file(const std::filesystem::path &path, const std::string &from,
                            const std::string &to) {
    write_file(path, replaced(read_file(path), from, to));
}

/// What a command printed and its exit code.
struct CliResult {
    int code = -1;
    std::string out;
    std::string err;
};

/// Runs the command line with `args` (without the program name).
inline CliResult cli(const std::vector<std::string> &args) {
    std::ostringstream out;
    std::ostringstream err;
    const int code = cli::run(args, out, err);
    return {code, out.str(), err.str()};
}

/// Key-value lines of one table of project.toml, in order; values are TOML text
/// (`"\"kirpich\""`, `"5"`, `"[2, 10]"`).
class TomlTable {
  public:
    /// Sets `key` (replacing its value in place, else appending it).
    TomlTable &set(const std::string &key, const std::string &toml_value) {
        for (auto &[k, v] : entries_) {
            if (k == key) {
                v = toml_value;
                return *this;
            }
        }
        entries_.emplace_back(key, toml_value);
        return *this;
    }
    /// Sets `key` to a TOML text (quoted).
    TomlTable &text(const std::string &key, const std::string &value) {
        return set(key, "\"" + value + "\"");
    }
    TomlTable &remove(const std::string &key) {
        std::erase_if(entries_, [&](const auto &e) { return e.first == key; });
        return *this;
    }
    [[nodiscard]] bool empty() const { return entries_.empty(); }
    [[nodiscard]] std::string toml() const {
        std::string s;
        for (const auto &[k, v] : entries_) {
            s += k + " = " + v + "\n";
        }
        return s;
    }

  private:
    std::vector<std::pair<std::string, std::string>> entries_;
};

/// The text of a project.toml made of its tables. Defaults: an SI project "Test project" with
/// the catchment table catchments.csv, the IDF idf.csv, the 10-year return period and the
/// output folder "out"; no [methods] or [settings] (the program's defaults) unless set. A table
/// left empty is not written.
struct ProjectToml {
    ProjectToml() {
        project.text("name", "Test project").text("units", "SI");
        inputs.text("catchment_table", "catchments.csv");
        rainfall.text("idf", "idf.csv").set("return_periods_yr", "[10]");
        output.text("folder", "out");
    }

    TomlTable project;
    TomlTable inputs;
    TomlTable rainfall;
    TomlTable methods;
    TomlTable settings;
    TomlTable design;
    TomlTable output;
    /// Text put after [methods] (e.g. "[[methods.point]]" tables), before [settings].
    std::string methods_extra;

    /// The tables in order, a blank line between two.
    [[nodiscard]] std::string toml() const {
        std::string s;
        const auto table = [&](const char *name, const TomlTable &t, const std::string &extra) {
            if (t.empty() && extra.empty()) {
                return;
            }
            s += (s.empty() ? "[" : "\n[") + std::string(name) + "]\n" + t.toml() + extra;
        };
        table("project", project, "");
        table("inputs", inputs, "");
        table("rainfall", rainfall, "");
        table("methods", methods, methods_extra);
        table("settings", settings, "");
        table("design", design, "");
        table("output", output, "");
        return s;
    }
};

/// A table-input test project in a fresh scratch folder: project.toml (ProjectToml, with its
/// defaults), the catchment table, the IDF and any other file, written by write() (and by the
/// run functions, when not yet written).
class TestProject : public ProjectToml {
  public:
    explicit TestProject(const std::string &scratch_name) : dir_(scratch_dir(scratch_name)) {}

    [[nodiscard]] const std::filesystem::path &dir() const { return dir_; }
    [[nodiscard]] std::filesystem::path file() const { return dir_ / "project.toml"; }
    /// The output folder while [output] folder is the default "out".
    [[nodiscard]] std::filesystem::path out_dir() const { return dir_ / "out"; }

    /// A file of the project folder (the catchment table, the IDF, a land table, ...).
    TestProject &with_file(const std::string &name, std::string text) {
        files_[name] = std::move(text);
        return *this;
    }
    TestProject &catchments(std::string csv) { return with_file("catchments.csv", std::move(csv)); }
    TestProject &idf(std::string csv) { return with_file("idf.csv", std::move(csv)); }
    /// project.toml as given instead of toml() (to test text the parts cannot make).
    TestProject &project_text(std::string text) {
        project_text_ = std::move(text);
        return *this;
    }

    /// Writes project.toml and every file (again, when written before); returns the project
    /// file.
    std::filesystem::path write() {
        write_file(file(), project_text_ ? *project_text_ : toml());
        for (const auto &[name, text] : files_) {
            write_file(dir_ / name, text);
        }
        written_ = true;
        return file();
    }

    /// The project file, written first unless it was already (later runs see the files as a
    /// test changed them).
    std::filesystem::path written() { return written_ ? file() : write(); }

    /// `catchpeak <name> project.toml <args...>` on the written project.
    CliResult command(const std::string &name, const std::vector<std::string> &args = {}) {
        std::vector<std::string> all{name, written().string()};
        all.insert(all.end(), args.begin(), args.end());
        return cli(all);
    }

    /// app::run_project on the written project (quiet, at a fixed run time unless `options`
    /// say otherwise); returns the output folder. `out` and `err` get what the run prints.
    std::filesystem::path run_app(const app::RunOptions &options, std::ostream &out,
                                  std::ostream &err) {
        return app::run_project(written(), options, out, err);
    }
    std::filesystem::path run_app(const app::RunOptions &options = quiet_options()) {
        std::ostringstream out;
        std::ostringstream err;
        return run_app(options, out, err);
    }

    /// Quiet, at the run time 2026-01-01T00:00:00Z.
    static app::RunOptions quiet_options() {
        app::RunOptions o;
        o.quiet = true;
        o.run_time_utc = "2026-01-01T00:00:00Z";
        return o;
    }

  private:
    std::filesystem::path dir_;
    std::map<std::string, std::string> files_;
    std::optional<std::string> project_text_;
    bool written_ = false;
};

} // namespace catchpeak::test

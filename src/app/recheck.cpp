// SPDX-License-Identifier: MIT
#include "catchpeak/app/recheck.hpp"

#include "catchpeak/app/inputs.hpp"
#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/app/sha256.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/project/project.hpp"
#include "catchpeak/report/line_text.hpp"
#include "catchpeak/report/results_json.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <sstream>
#include <system_error>
#include <utility>

namespace catchpeak::app {

using project::load_project;
using project::Project;

namespace fs = std::filesystem;

namespace {

constexpr std::string_view built_in_prefix = "config/";

bool same_value(double a, double b) {
    if (std::isnan(a) || std::isnan(b)) {
        return std::isnan(a) && std::isnan(b);
    }
    if (a == b) {
        return true;
    }
    return std::abs(a - b) <= recheck_relative_tolerance * std::max(std::abs(a), std::abs(b));
}

bool is_file(const fs::path &p) {
    std::error_code ec;
    return fs::is_regular_file(p, ec);
}

fs::path resolve_input(const std::string &recorded, const fs::path &project_dir) {
    if (recorded.rfind(built_in_prefix, 0) == 0) {
        return config_dir() / recorded.substr(built_in_prefix.size());
    }
    const fs::path p(recorded);
    return p.is_absolute() ? p : project_dir / p;
}

/// The recorded project file: given, or looked for above the output folder and in it.
fs::path find_project_file(const fs::path &output_dir, const report::Stamp &stamp,
                           const RecheckOptions &options) {
    const std::string record = (output_dir / report::run_record_file_name).string();
    if (options.project_file) {
        if (!is_file(*options.project_file)) {
            throw_input_error(options.project_file->string(), "the project file does not exist",
                              "the project file of the run");
        }
        return *options.project_file;
    }
    const auto it = std::find_if(stamp.inputs.begin(), stamp.inputs.end(),
                                 [](const auto &in) { return in.role == "project file"; });
    if (it == stamp.inputs.end()) {
        throw_input_error(record, "no input with the role 'project file' is recorded",
                          "a run record written by 'catchpeak run'");
    }
    const fs::path name = fs::path(it->path).filename();
    const fs::path abs = fs::absolute(output_dir).lexically_normal();
    std::vector<fs::path> candidates;
    if (!stamp.project_file_from_output.empty()) {
        candidates.push_back((abs / stamp.project_file_from_output).lexically_normal());
    }
    if (abs.has_relative_path()) {
        candidates.push_back(abs.parent_path() / name);
    }
    candidates.push_back(abs / name);
    // Prefer the candidate that still has the recorded hash, else the first that exists.
    for (const auto &c : candidates) {
        if (is_file(c) && sha256_file(c) == it->sha256) {
            return c;
        }
    }
    for (const auto &c : candidates) {
        if (is_file(c)) {
            return c;
        }
    }
    throw_input_error(record,
                      fmt::format("the recorded project file '{}' is found at none of: {}",
                                  it->path,
                                  [&] {
                                      std::string all;
                                      for (const auto &c : candidates) {
                                          all += (all.empty() ? "" : ", ") + c.string();
                                      }
                                      return all;
                                  }()),
                      "the project file beside the output folder, or '--project FILE'");
}

/// Whether the file at `path` still has the recorded SHA-256; `current` gets its hash ("" when
/// it is missing).
InputCheck::Status file_status(const fs::path &path, const std::string &recorded,
                               std::string &current) {
    if (!is_file(path)) {
        return InputCheck::Status::missing;
    }
    current = sha256_file(path);
    return current == recorded ? InputCheck::Status::unchanged : InputCheck::Status::changed;
}

OutputCheck check_output(const fs::path &output_dir, const report::OutputRecord &o) {
    OutputCheck c;
    c.path = o.path;
    c.resolved = output_dir / o.path;
    c.recorded_sha256 = o.sha256;
    c.status = file_status(c.resolved, c.recorded_sha256, c.current_sha256);
    return c;
}

std::string line_text(const CalcLine &l) {
    const LineText t = report::text_of(l);
    return fmt::format("{} | {} | {} | {} {} | {}", t.label, t.symbols, t.numbers, full(l.value()),
                       t.unit, t.source);
}

std::vector<std::string> differing_fields(const CalcLine &line_a, const CalcLine &line_b) {
    const LineText a = report::text_of(line_a);
    const LineText b = report::text_of(line_b);
    std::vector<std::string> f;
    if (line_a.kind != line_b.kind) {
        f.emplace_back("kind");
    }
    if (a.label != b.label) {
        f.emplace_back("label");
    }
    if (a.symbols != b.symbols) {
        f.emplace_back("symbols");
    }
    if (a.numbers != b.numbers) {
        f.emplace_back("numbers");
    }
    if (!same_value(line_a.value(), line_b.value())) {
        f.emplace_back("value");
    }
    if (a.unit != b.unit) {
        f.emplace_back("unit");
    }
    if (a.source != b.source) {
        f.emplace_back("source");
    }
    return f;
}

void compare_lines(const report::RunResults &recorded, const report::RunResults &recomputed,
                   RecheckReport &rep) {
    std::map<std::string, const CalcLine *> now;
    std::vector<std::string> now_order;
    for (const auto &p : recomputed.points) {
        for (const auto &l : p.lines.lines()) {
            now.emplace(l.id, &l);
            now_order.push_back(l.id);
        }
    }
    std::map<std::string, bool> seen;
    for (const auto &p : recorded.points) {
        for (const auto &l : p.lines.lines()) {
            seen[l.id] = true;
            const auto it = now.find(l.id);
            if (it == now.end()) {
                rep.line_differences.push_back({l.id, l, std::nullopt, {"line"}});
                continue;
            }
            auto fields = differing_fields(l, *it->second);
            if (fields.empty()) {
                ++rep.lines_reproduced;
            } else {
                rep.line_differences.push_back({l.id, l, *it->second, std::move(fields)});
            }
        }
    }
    for (const auto &id : now_order) {
        if (!seen.count(id)) {
            rep.line_differences.push_back({id, std::nullopt, *now.at(id), {"line"}});
        }
    }
}

std::string peak_key(const std::string &point, const report::Peak &pk) {
    return fmt::format("{} {} {} yr", point, key_of(pk.method), full(pk.return_period_yr));
}

void compare_peaks(const report::RunResults &recorded, const report::RunResults &recomputed,
                   RecheckReport &rep) {
    std::map<std::string, const report::Peak *> now;
    std::vector<std::string> now_order;
    for (const auto &p : recomputed.points) {
        for (const auto &pk : p.peaks) {
            now.emplace(peak_key(p.id, pk), &pk);
            now_order.push_back(peak_key(p.id, pk));
        }
    }
    std::map<std::string, bool> seen;
    for (const auto &p : recorded.points) {
        for (const auto &pk : p.peaks) {
            const auto key = peak_key(p.id, pk);
            seen[key] = true;
            const auto it = now.find(key);
            if (it == now.end()) {
                rep.peak_differences.push_back({key, pk.q_m3_s, std::nullopt, pk.line_id, ""});
            } else if (!same_value(pk.q_m3_s, it->second->q_m3_s) ||
                       pk.line_id != it->second->line_id) {
                rep.peak_differences.push_back(
                    {key, pk.q_m3_s, it->second->q_m3_s, pk.line_id, it->second->line_id});
            } else {
                ++rep.peaks_reproduced;
            }
        }
    }
    for (const auto &key : now_order) {
        if (!seen.count(key)) {
            const auto *pk = now.at(key);
            rep.peak_differences.push_back({key, std::nullopt, pk->q_m3_s, "", pk->line_id});
        }
    }
}

} // namespace

std::size_t RecheckReport::inputs_not_unchanged() const {
    return static_cast<std::size_t>(std::count_if(inputs.begin(), inputs.end(), [](const auto &i) {
        return i.status != InputCheck::Status::unchanged;
    }));
}

std::size_t RecheckReport::outputs_not_unchanged() const {
    return static_cast<std::size_t>(
        std::count_if(outputs.begin(), outputs.end(),
                      [](const auto &o) { return o.status != InputCheck::Status::unchanged; }));
}

bool RecheckReport::all_reproduced() const {
    return inputs_not_unchanged() == 0 && outputs_not_unchanged() == 0 &&
           line_differences.empty() && peak_differences.empty() && recompute_error.empty();
}

ExitCode RecheckReport::exit_code() const {
    if (inputs_not_unchanged() != 0) {
        return ExitCode::inputs_changed;
    }
    if (!line_differences.empty() || !peak_differences.empty() || !recompute_error.empty()) {
        return ExitCode::not_reproduced;
    }
    return outputs_not_unchanged() != 0 ? ExitCode::outputs_changed : ExitCode::success;
}

RecheckReport recheck(const fs::path &output_dir, const RecheckOptions &options) {
    std::error_code ec;
    if (!fs::is_directory(output_dir, ec)) {
        throw_input_error(output_dir.string(), "the output folder does not exist",
                          "the output folder of a 'catchpeak run'");
    }
    for (const auto name : {report::results_file_name, report::run_record_file_name}) {
        if (!is_file(output_dir / name)) {
            throw_input_error((output_dir / name).string(), "the file does not exist",
                              "an output folder written by 'catchpeak run' (results.json "
                              "and run-record.json)");
        }
    }
    RecheckReport rep;
    rep.output_dir = output_dir;
    const report::Stamp stamp = report::read_run_record(output_dir);
    const report::RunResults recorded = report::read_results_json(output_dir);
    rep.project_file = find_project_file(output_dir, stamp, options);
    const fs::path project_dir = rep.project_file.parent_path();

    for (const auto &in : stamp.inputs) {
        InputCheck c;
        c.role = in.role;
        c.path = in.path;
        c.resolved =
            in.role == "project file" ? rep.project_file : resolve_input(in.path, project_dir);
        c.recorded_sha256 = in.sha256;
        c.status = file_status(c.resolved, c.recorded_sha256, c.current_sha256);
        rep.inputs.push_back(std::move(c));
    }
    for (const auto &o : stamp.outputs) {
        rep.outputs.push_back(check_output(output_dir, o));
    }

    report::RunResults recomputed;
    try {
        const Project p = load_project(rep.project_file);
        std::ostringstream silent;
        recomputed = compute_project(p, silent, true);
    } catch (const InputError &e) {
        rep.recompute_error = e.what();
        for (const auto &pt : recorded.points) {
            for (const auto &l : pt.lines.lines()) {
                rep.line_differences.push_back({l.id, l, std::nullopt, {"line"}});
            }
        }
        return rep;
    }
    compare_lines(recorded, recomputed, rep);
    compare_peaks(recorded, recomputed, rep);
    return rep;
}

std::string format_recheck(const RecheckReport &rep) {
    std::string s;
    s += fmt::format("recheck of {} (project file {})\n", rep.output_dir.string(),
                     rep.project_file.string());
    for (const auto &i : rep.inputs) {
        if (i.status == InputCheck::Status::changed) {
            s += fmt::format("input changed since the run: {} '{}' ({}): SHA-256 was {}, is {}\n",
                             i.role, i.path, i.resolved.string(), i.recorded_sha256,
                             i.current_sha256);
        } else if (i.status == InputCheck::Status::missing) {
            s += fmt::format("input missing since the run: {} '{}' (not found at {})\n", i.role,
                             i.path, i.resolved.string());
        }
    }
    s += fmt::format("{} of {} inputs unchanged\n", rep.inputs.size() - rep.inputs_not_unchanged(),
                     rep.inputs.size());
    for (const auto &o : rep.outputs) {
        if (o.status == InputCheck::Status::changed) {
            s += fmt::format("output changed since the run: '{}' ({}): SHA-256 was {}, is {}\n",
                             o.path, o.resolved.string(), o.recorded_sha256, o.current_sha256);
        } else if (o.status == InputCheck::Status::missing) {
            s += fmt::format("output missing since the run: '{}' (not found at {})\n", o.path,
                             o.resolved.string());
        }
    }
    if (!rep.outputs.empty()) {
        s += fmt::format("{} of {} outputs unchanged\n",
                         rep.outputs.size() - rep.outputs_not_unchanged(), rep.outputs.size());
    }
    if (!rep.recompute_error.empty()) {
        s += fmt::format("the project cannot be recomputed from the current inputs: {}\n",
                         rep.recompute_error);
    } else {
        for (const auto &d : rep.line_differences) {
            std::string fields;
            for (const auto &f : d.fields) {
                fields += (fields.empty() ? "" : ", ") + f;
            }
            s += fmt::format("line {} differs ({}):\n", d.id, fields);
            s += fmt::format("  recorded:   {}\n",
                             d.recorded ? line_text(*d.recorded) : "(no such line)");
            s += fmt::format("  recomputed: {}\n",
                             d.recomputed ? line_text(*d.recomputed) : "(no such line)");
        }
        for (const auto &d : rep.peak_differences) {
            auto q = [](const std::optional<double> &v, const std::string &id) {
                return v ? fmt::format("{} m3/s (line {})", full(*v), id) : "(no such peak)";
            };
            s += fmt::format("peak {} differs: recorded {}, recomputed {}\n", d.key,
                             q(d.recorded_q_m3_s, d.recorded_line_id),
                             q(d.recomputed_q_m3_s, d.recomputed_line_id));
        }
        s += fmt::format("{} peaks reproduced, {} differ\n", rep.peaks_reproduced,
                         rep.peak_differences.size());
    }
    s += fmt::format("{} lines reproduced, {} differ\n", rep.lines_reproduced,
                     rep.line_differences.size());
    return s;
}

} // namespace catchpeak::app

// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/report/results.hpp"

#include <filesystem>
#include <string>
#include <string_view>

/// results.json and run-record.json: the machine-readable results of a run.
///
/// results.json is always SI with the unit in every key name (area_m2, tc_min, q_m3_s, ...) and
/// full round-trip precision. It holds everything of RunResults except the stamp and the map
/// data: the same inputs give byte-identical files. The stamp (tool version, commit, time of the
/// run, SHA-256 of every input) goes to run-record.json beside it.
namespace catchpeak::report {

/// Name of the results file in an output folder.
inline constexpr std::string_view results_file_name = "results.json";
/// Name of the run record file in an output folder.
inline constexpr std::string_view run_record_file_name = "run-record.json";

/// The text of results.json (ends with a newline). Deterministic; no time of day; map data and
/// stamp left out. NaN values (warnings carry no value) are written as null.
[[nodiscard]] std::string results_json(const RunResults &results);

/// Parses the text of results.json. `where` names the file in error messages. The stamp and
/// the map data of the returned results are empty; null values read back as NaN.
/// Throws InputError when the text is not a results file of a known format version.
[[nodiscard]] RunResults parse_results_json(std::string_view text, std::string_view where);

/// The text of run-record.json for a stamp (ends with a newline).
[[nodiscard]] std::string run_record_json(const Stamp &stamp);

/// Parses the text of run-record.json. Throws InputError as parse_results_json does.
[[nodiscard]] Stamp parse_run_record_json(std::string_view text, std::string_view where);

/// Writes results.json into `dir` (to a temporary name, renamed when complete).
void write_results_json(const RunResults &results, const std::filesystem::path &dir);
/// Reads `dir`/results.json.
[[nodiscard]] RunResults read_results_json(const std::filesystem::path &dir);

/// Writes run-record.json into `dir` (to a temporary name, renamed when complete).
void write_run_record(const Stamp &stamp, const std::filesystem::path &dir);
/// Reads `dir`/run-record.json.
[[nodiscard]] Stamp read_run_record(const std::filesystem::path &dir);

} // namespace catchpeak::report

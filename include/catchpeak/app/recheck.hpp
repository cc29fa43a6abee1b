// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/error.hpp"

#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

/// `catchpeak recheck OUTPUT_DIR`: is a run still reproduced by its inputs?
///
/// Reads run-record.json and results.json of an output folder, verifies the SHA-256 of every
/// recorded input and output, loads the recorded project file, recomputes the whole project in
/// memory (the same compute function as `catchpeak run`; nothing is written) and compares every
/// calculation line and every peak with what the run recorded. Never modifies the folder.
namespace catchpeak::app {

/// Relative tolerance for comparing values (lines and peaks). results.json keeps every value
/// at full round-trip precision, so the same build on the same inputs gives identical values;
/// 1e-12 only admits last-digit differences of the maths library between builds or machines,
/// a million times below the 4 significant figures a checker reads on the sheet.
inline constexpr double recheck_relative_tolerance = 1e-12;

/// One recorded input and what recheck found.
struct InputCheck {
    enum class Status { unchanged, changed, missing };
    std::string role;               ///< "project file", "catchment table", "IDF", ...
    std::string path;               ///< as recorded in the run record
    std::filesystem::path resolved; ///< where recheck looked for it
    std::string recorded_sha256;
    std::string current_sha256; ///< empty when missing
    Status status = Status::unchanged;
};

/// One recorded output of the run (a file in the output folder) and what recheck found.
struct OutputCheck {
    std::string path;               ///< as recorded, relative to the output folder
    std::filesystem::path resolved; ///< where recheck looked for it
    std::string recorded_sha256;
    std::string current_sha256; ///< empty when missing
    InputCheck::Status status = InputCheck::Status::unchanged;
};

/// A calculation line that is not reproduced. One side is empty when the line exists only in
/// the run (missing from the recomputation) or only in the recomputation.
struct LineDifference {
    std::string id;
    std::optional<CalcLine> recorded;
    std::optional<CalcLine> recomputed;
    std::vector<std::string> fields; ///< names of the fields that differ ("value", "numbers"...)
};

/// A peak (design point, method, return period) that is not reproduced.
struct PeakDifference {
    std::string key; ///< e.g. "OUT-1 rational 10 yr"
    std::optional<double> recorded_q_m3_s;
    std::optional<double> recomputed_q_m3_s;
    std::string recorded_line_id;
    std::string recomputed_line_id;
};

struct RecheckReport {
    std::filesystem::path output_dir;
    std::filesystem::path project_file; ///< the project file recomputed
    std::vector<InputCheck> inputs;
    /// The outputs recorded in run-record.json (none in a record of an older run).
    std::vector<OutputCheck> outputs;
    std::size_t lines_reproduced = 0;
    std::vector<LineDifference> line_differences;
    std::size_t peaks_reproduced = 0;
    std::vector<PeakDifference> peak_differences;
    /// Set when the project could not be recomputed from the current inputs (the message of
    /// the InputError); every recorded line then counts as differing.
    std::string recompute_error;

    [[nodiscard]] std::size_t inputs_not_unchanged() const;
    [[nodiscard]] std::size_t outputs_not_unchanged() const;
    /// True when every input and output is unchanged and every line and peak is reproduced.
    [[nodiscard]] bool all_reproduced() const;
    /// The exit code of `catchpeak recheck` for this report: success when all_reproduced();
    /// inputs_changed when an input changed or is missing (whatever the lines then show: they
    /// are expected to differ); not_reproduced when every input is unchanged but a line or peak
    /// differs or the project cannot be recomputed; outputs_changed when only an output changed
    /// or is missing.
    [[nodiscard]] ExitCode exit_code() const;
};

struct RecheckOptions {
    /// The project file to recompute. Empty: the recorded project file name, looked for in the
    /// folder above OUTPUT_DIR (where `run` puts its default output folder) and then in
    /// OUTPUT_DIR itself.
    std::optional<std::filesystem::path> project_file;
};

/// Rechecks an output folder. Throws InputError when the folder, results.json or
/// run-record.json is missing or unreadable, or when the project file cannot be found.
/// Recorded paths are resolved against the project file's folder; a path recorded as
/// "config/<name>" (a method table built into the program) against the method-table folder
/// this program reads (config_dir()).
[[nodiscard]] RecheckReport recheck(const std::filesystem::path &output_dir,
                                    const RecheckOptions &options = {});

/// The text `catchpeak recheck` prints: the inputs that changed or are missing (role and
/// file), the outputs that changed or are missing (file), each differing line with its recorded and
/// recomputed text and value, each differing peak, then "P peaks reproduced, Q differ" and, last,
/// "N lines reproduced, M differ".
[[nodiscard]] std::string format_recheck(const RecheckReport &report);

} // namespace catchpeak::app

// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/files.hpp"
#include "catchpeak/report/results.hpp"

#include <cstddef>
#include <filesystem>
#include <functional>
#include <string>
#include <string_view>
#include <vector>

/// Everything `report` writes for one run, in one call.
namespace catchpeak::report {

/// What write_outputs wrote.
struct WrittenOutputs {
    std::filesystem::path results_json;
    std::filesystem::path run_record;
    std::filesystem::path summary_csv;
    std::filesystem::path sheet_pdf;
    std::size_t sheet_pages = 0;
};

/// The SHA-256 of a file's bytes as 64 lower-case hex digits (the app layer provides it).
using FileDigest = std::function<std::string(const std::filesystem::path &)>;

/// The GeoPackage of the catchments a DEM run writes beside the other outputs.
inline constexpr std::string_view catchments_file_name = "catchments.gpkg";

/// The names of every file write_outputs and the caller's `written_before` may put in an output
/// folder (for remove_stale_temporaries).
[[nodiscard]] std::vector<std::string> output_file_names();

/// Writes results.json, run-record.json, summary.csv and calculation-sheet.pdf into `dir`
/// (created when missing), as one set with the files the caller wrote before (`written_before`,
/// e.g. catchments.gpkg): every file is written under a temporary name, and all are renamed to
/// their final names only when every one is complete; when one fails, none is renamed and the
/// older files in `dir` stay as they were. run-record.json holds the outputs of
/// `results.stamp` (the caller's files) followed by the other three, each with `digest` of the
/// bytes written. Throws InputError naming the file when one cannot be written.
WrittenOutputs write_outputs(const RunResults &results, const std::filesystem::path &dir,
                             const FileDigest &digest, PendingFiles written_before = {});

} // namespace catchpeak::report

// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/report/results.hpp"

#include <cstddef>
#include <filesystem>
#include <functional>
#include <string>

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

/// Writes results.json, run-record.json, summary.csv and calculation-sheet.pdf into `dir`
/// (created when missing). Each file is written to a temporary name and renamed when complete.
/// run-record.json, written last, holds the outputs of `results.stamp` (files the caller wrote
/// before) followed by the other three, each with `digest` of the bytes written.
/// Throws InputError naming the file when one cannot be written.
WrittenOutputs write_outputs(const RunResults &results, const std::filesystem::path &dir,
                             const FileDigest &digest);

} // namespace catchpeak::report

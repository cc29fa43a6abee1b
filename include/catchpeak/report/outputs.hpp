// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/report/results.hpp"

#include <cstddef>
#include <filesystem>

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

/// Writes results.json, run-record.json, summary.csv and calculation-sheet.pdf into `dir`
/// (created when missing). Each file is written to a temporary name and renamed when complete.
/// Throws InputError naming the file when one cannot be written.
WrittenOutputs write_outputs(const RunResults &results, const std::filesystem::path &dir);

} // namespace catchpeak::report

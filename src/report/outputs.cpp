// SPDX-License-Identifier: MIT
#include "catchpeak/report/outputs.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/report/results_json.hpp"
#include "catchpeak/report/sheet.hpp"
#include "catchpeak/report/summary_csv.hpp"

#include <system_error>

namespace catchpeak::report {

WrittenOutputs write_outputs(const RunResults &results, const std::filesystem::path &dir,
                             const FileDigest &digest) {
    std::error_code ec;
    std::filesystem::create_directories(dir, ec);
    if (ec) {
        throw_input_error(dir.string(), "cannot create the output folder: " + ec.message(),
                          "a folder that can be written");
    }
    WrittenOutputs out;
    // The PDF first: it is the one most likely to fail, and then no new results.json stands
    // beside an old sheet.
    out.sheet_pdf = dir / sheet_file_name;
    out.sheet_pages = write_sheet_pdf(results, out.sheet_pdf);
    write_summary_csv(results, dir);
    out.summary_csv = dir / summary_file_name;
    write_results_json(results, dir);
    out.results_json = dir / results_file_name;
    // The run record: the stamp and the SHA-256 of each file written above (renamed into place
    // and complete, so these are the final bytes).
    Stamp stamp = results.stamp;
    for (const auto &f : {out.sheet_pdf, out.summary_csv, out.results_json}) {
        stamp.outputs.push_back({f.filename().string(), digest(f)});
    }
    write_run_record(stamp, dir);
    out.run_record = dir / run_record_file_name;
    return out;
}

} // namespace catchpeak::report

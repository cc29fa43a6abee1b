// SPDX-License-Identifier: MIT
#include "catchpeak/report/outputs.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/report/results_json.hpp"
#include "catchpeak/report/sheet.hpp"
#include "catchpeak/report/summary_csv.hpp"

#include <system_error>

namespace catchpeak::report {

std::vector<std::string> output_file_names() {
    return {std::string(sheet_file_name), std::string(summary_file_name),
            std::string(results_file_name), std::string(run_record_file_name),
            std::string(catchments_file_name)};
}

WrittenOutputs write_outputs(const RunResults &results, const std::filesystem::path &dir,
                             const FileDigest &digest, PendingFiles written_before) {
    std::error_code ec;
    std::filesystem::create_directories(dir, ec);
    if (ec) {
        throw_input_error(dir.string(), "cannot create the output folder: " + ec.message(),
                          "a folder that can be written");
    }
    PendingFiles set = std::move(written_before);
    WrittenOutputs out;
    out.sheet_pdf = dir / sheet_file_name;
    out.summary_csv = dir / summary_file_name;
    out.results_json = dir / results_file_name;
    out.run_record = dir / run_record_file_name;
    // Each file under its temporary name; the run record holds the SHA-256 of the bytes
    // written there, which are the final bytes (only renamed below).
    Stamp stamp = results.stamp;
    const auto sheet = set.add(out.sheet_pdf);
    out.sheet_pages = write_sheet_pdf(results, sheet);
    stamp.outputs.push_back({std::string(sheet_file_name), digest(sheet)});
    const auto summary = set.add(out.summary_csv);
    write_text_file_atomic(summary, summary_csv(results));
    stamp.outputs.push_back({std::string(summary_file_name), digest(summary)});
    const auto json = set.add(out.results_json);
    write_text_file_atomic(json, results_json(results));
    stamp.outputs.push_back({std::string(results_file_name), digest(json)});
    write_text_file_atomic(set.add(out.run_record), run_record_json(stamp));
    set.commit();
    return out;
}

} // namespace catchpeak::report

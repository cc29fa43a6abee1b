// SPDX-License-Identifier: MIT
// Benchmark of the report module: the whole calculation sheet (and results.json, summary.csv)
// for 500 invented design points x 4 return periods. Prints the times; target: sheet < 30 s.
//
//   report_bench [OUTPUT_DIR] [POINTS]
#include "catchpeak/report/results_json.hpp"
#include "catchpeak/report/sheet.hpp"
#include "catchpeak/report/summary_csv.hpp"
#include "report/sample_results.hpp"

#include <fmt/format.h>

#include <chrono>
#include <filesystem>
#include <string>

int main(int argc, char **argv) {
    namespace fs = std::filesystem;
    const fs::path dir = argc > 1 ? fs::path(argv[1]) : fs::temp_directory_path() / "report_bench";
    const std::size_t points = argc > 2 ? static_cast<std::size_t>(std::stoul(argv[2])) : 500;
    fs::create_directories(dir);
    using clock = std::chrono::steady_clock;
    auto seconds = [](clock::time_point a, clock::time_point b) {
        return std::chrono::duration<double>(b - a).count();
    };

    const auto t0 = clock::now();
    const auto results =
        catchpeak::test::sample_results(points, catchpeak::units::System::si, {2, 10, 25, 100});
    const auto t1 = clock::now();
    catchpeak::report::write_results_json(results, dir);
    catchpeak::report::write_summary_csv(results, dir);
    const auto t2 = clock::now();
    const auto pages =
        catchpeak::report::write_sheet_pdf(results, dir / catchpeak::report::sheet_file_name);
    const auto t3 = clock::now();

    fmt::print("design points: {}, return periods: 4 (Rational Method) + 1 hydrograph peak on "
               "every other point\n",
               points);
    fmt::print("building the invented results: {:.2f} s\n", seconds(t0, t1));
    fmt::print("results.json + summary.csv:    {:.2f} s\n", seconds(t1, t2));
    fmt::print("calculation sheet PDF:         {:.2f} s, {} pages, {:.1f} MB (target < 30 s)\n",
               seconds(t2, t3), pages,
               static_cast<double>(fs::file_size(dir / catchpeak::report::sheet_file_name)) /
                   1.0e6);
    return 0;
}

// SPDX-License-Identifier: MIT
#include "catchpeak/report/results_json.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/core/error.hpp"
#include "report/sample_results.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <clocale>
#include <cmath>
#include <fstream>
#include <sstream>

namespace catchpeak::report {
namespace {

/// Equal, with NaN equal to NaN (warning lines carry no value).
bool same(double a, double b) { return (std::isnan(a) && std::isnan(b)) || a == b; }

void expect_same_lines(const CalcLines &a, const CalcLines &b) {
    ASSERT_EQ(a.size(), b.size());
    for (std::size_t i = 0; i < a.size(); ++i) {
        const auto &x = a.lines()[i];
        const auto &y = b.lines()[i];
        EXPECT_EQ(x.id, y.id);
        EXPECT_EQ(catchpeak::test::text(x).label, catchpeak::test::text(y).label);
        EXPECT_EQ(catchpeak::test::text(x).symbols, catchpeak::test::text(y).symbols);
        EXPECT_EQ(catchpeak::test::text(x).numbers, catchpeak::test::text(y).numbers);
        EXPECT_TRUE(same(x.value(), y.value())) << x.id << ": " << x.value() << " vs " << y.value();
        EXPECT_EQ(catchpeak::test::text(x).unit, catchpeak::test::text(y).unit);
        EXPECT_EQ(catchpeak::test::text(x).source, catchpeak::test::text(y).source);
        EXPECT_EQ(x.kind, y.kind);
    }
}

void expect_same(const RunResults &a, const RunResults &b) {
    EXPECT_EQ(a.project.name, b.project.name);
    EXPECT_EQ(a.project.number, b.project.number);
    EXPECT_EQ(a.project.client, b.project.client);
    EXPECT_EQ(a.project.location, b.project.location);
    EXPECT_EQ(a.project.prepared_by, b.project.prepared_by);
    EXPECT_EQ(a.project.checked_by, b.project.checked_by);
    EXPECT_EQ(a.project.revision, b.project.revision);
    EXPECT_EQ(a.project.units, b.project.units);
    EXPECT_EQ(a.project.page_size, b.project.page_size);
    ASSERT_EQ(a.points.size(), b.points.size());
    for (std::size_t i = 0; i < a.points.size(); ++i) {
        const auto &p = a.points[i];
        const auto &q = b.points[i];
        EXPECT_EQ(p.id, q.id);
        EXPECT_EQ(p.given_xy, q.given_xy);
        EXPECT_EQ(p.snapped_xy, q.snapped_xy);
        EXPECT_EQ(p.snap_distance_m, q.snap_distance_m);
        EXPECT_EQ(p.from_table, q.from_table);
        EXPECT_EQ(p.catchment.area_m2, q.catchment.area_m2);
        EXPECT_EQ(p.catchment.local_area_m2, q.catchment.local_area_m2);
        EXPECT_EQ(p.catchment.longest_flow_path_m, q.catchment.longest_flow_path_m);
        EXPECT_EQ(p.catchment.elevation_top_m, q.catchment.elevation_top_m);
        EXPECT_EQ(p.catchment.elevation_outlet_m, q.catchment.elevation_outlet_m);
        EXPECT_EQ(p.catchment.slope_flow_path, q.catchment.slope_flow_path);
        EXPECT_EQ(p.catchment.slope_10_85, q.catchment.slope_10_85);
        EXPECT_EQ(p.catchment.mean_slope, q.catchment.mean_slope);
        EXPECT_EQ(p.catchment.upstream_points, q.catchment.upstream_points);
        ASSERT_EQ(p.land.parts.size(), q.land.parts.size());
        for (std::size_t k = 0; k < p.land.parts.size(); ++k) {
            EXPECT_EQ(p.land.parts[k].land_class, q.land.parts[k].land_class);
            EXPECT_EQ(p.land.parts[k].soil_group, q.land.parts[k].soil_group);
            EXPECT_EQ(p.land.parts[k].area_m2, q.land.parts[k].area_m2);
            EXPECT_EQ(p.land.parts[k].c, q.land.parts[k].c);
            EXPECT_EQ(p.land.parts[k].cn, q.land.parts[k].cn);
            EXPECT_EQ(p.land.parts[k].impervious_share, q.land.parts[k].impervious_share);
        }
        EXPECT_EQ(p.land.c_weighted, q.land.c_weighted);
        EXPECT_EQ(p.land.cn_weighted, q.land.cn_weighted);
        EXPECT_EQ(p.land.impervious_share, q.land.impervious_share);
        EXPECT_EQ(p.land.c_table, q.land.c_table);
        EXPECT_EQ(p.land.cn_table, q.land.cn_table);
        EXPECT_EQ(p.tc_min, q.tc_min);
        EXPECT_EQ(p.tc_method, q.tc_method);
        ASSERT_EQ(p.peaks.size(), q.peaks.size());
        for (std::size_t k = 0; k < p.peaks.size(); ++k) {
            const auto &x = p.peaks[k];
            const auto &y = q.peaks[k];
            EXPECT_EQ(x.return_period_yr, y.return_period_yr);
            EXPECT_EQ(x.method, y.method);
            EXPECT_EQ(x.q_m3_s, y.q_m3_s);
            EXPECT_EQ(x.line_id, y.line_id);
            EXPECT_EQ(x.intermediates, y.intermediates);
            ASSERT_EQ(x.hydrograph.has_value(), y.hydrograph.has_value());
            if (x.hydrograph) {
                EXPECT_EQ(x.hydrograph->step_s, y.hydrograph->step_s);
                EXPECT_EQ(x.hydrograph->q_m3_s, y.hydrograph->q_m3_s);
                EXPECT_EQ(x.hydrograph->rain_mm, y.hydrograph->rain_mm);
                EXPECT_EQ(x.hydrograph->excess_mm, y.hydrograph->excess_mm);
            }
        }
        expect_same_lines(p.lines, q.lines);
    }
    ASSERT_EQ(a.references.size(), b.references.size());
    for (std::size_t i = 0; i < a.references.size(); ++i) {
        EXPECT_EQ(a.references[i].key, b.references[i].key);
        EXPECT_EQ(a.references[i].citation, b.references[i].citation);
    }
    EXPECT_EQ(a.caution_notes, b.caution_notes);
}

std::string slurp(const std::filesystem::path &f) {
    std::ifstream in(f, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

RunResults sample() {
    auto r = test::sample_results(3, units::System::us_customary, {2, 10, 100}, false);
    r.caution_notes = {"First note, with \"quotes\" and a line\nbreak.", "Ünïcode ≥ note"};
    // Values that need every digit to round-trip.
    r.points[0].catchment.area_m2 = 0.1 + 0.2;
    r.points[0].peaks[0].q_m3_s = 1.0 / 3.0;
    r.points[1].catchment.mean_slope = 5e-324; // smallest subnormal
    r.points[2].catchment.longest_flow_path_m = 1.7976931348623157e308;
    r.project.page_size = PageSize::letter;
    return r;
}

TEST(ResultsJson, RoundTripGivesEqualResults) {
    const auto r = sample();
    const auto dir = test::scratch_dir("results_round_trip");
    write_results_json(r, dir);
    const auto back = read_results_json(dir);
    expect_same(r, back);
    // Warnings keep their NaN value through null.
    bool saw_warning = false;
    for (const auto &l : back.points[1].lines.lines()) {
        if (l.kind == LineKind::warning) {
            saw_warning = true;
            EXPECT_TRUE(std::isnan(l.value()));
        }
    }
    EXPECT_TRUE(saw_warning);
    EXPECT_TRUE(test::pending_files(dir).empty());
}

TEST(ResultsJson, TwoWritesAreByteIdenticalAndCarryNoTimeOfDay) {
    const auto r = sample();
    const auto d1 = test::scratch_dir("results_det_1");
    const auto d2 = test::scratch_dir("results_det_2");
    write_results_json(r, d1);
    auto other_stamp = r;
    other_stamp.stamp.run_time_utc = "2027-01-05T23:59:59Z";
    other_stamp.stamp.git_commit = "ffffffffffff";
    write_results_json(other_stamp, d2);
    const auto a = slurp(d1 / "results.json");
    const auto b = slurp(d2 / "results.json");
    ASSERT_FALSE(a.empty());
    EXPECT_EQ(a, b);
    EXPECT_EQ(a.find("2026-12-02"), std::string::npos);
    EXPECT_EQ(a.find("0123456789ab"), std::string::npos);
    // Read back and written again: the same bytes.
    EXPECT_EQ(results_json(parse_results_json(a, "results.json")), a);
}

TEST(ResultsJson, KeysCarryTheirUnitsAndNumbersArePlain) {
    const auto text = results_json(sample());
    for (const char *key : {"\"area_m2\"", "\"local_area_m2\"", "\"longest_flow_path_m\"",
                            "\"tc_min\"", "\"q_m3_s\"", "\"intensity_mm_per_h\"",
                            "\"runoff_depth_mm\"", "\"snap_distance_m\"", "\"return_period_yr\"",
                            "\"given_x_m\"", "\"snapped_y_m\"", "\"step_s\"", "\"rain_mm\""}) {
        EXPECT_NE(text.find(key), std::string::npos) << key;
    }
    // 0.1 + 0.2 is written with all 17 digits so that it reads back exactly.
    EXPECT_NE(text.find("0.30000000000000004"), std::string::npos);
    EXPECT_EQ(text.find("NaN"), std::string::npos);
    EXPECT_EQ(text.find("nan"), std::string::npos);
    EXPECT_EQ(text.back(), '\n');
}

TEST(ResultsJson, WritingDoesNotDependOnTheCLocale) {
    const auto r = sample();
    const auto before = results_json(r);
    // C.UTF-8 is the only other locale sure to exist; the check is that nothing changes.
    const char *old = std::setlocale(LC_ALL, nullptr);
    const std::string saved = old ? old : "C";
    if (std::setlocale(LC_ALL, "C.UTF-8") == nullptr) {
        GTEST_SKIP() << "no C.UTF-8 locale";
    }
    const auto after = results_json(r);
    std::setlocale(LC_ALL, saved.c_str());
    EXPECT_EQ(before, after);
}

TEST(ResultsJson, BadFilesAreInputErrorsNamingTheMember) {
    EXPECT_THROW((void)parse_results_json("{not json", "out/results.json"), InputError);
    EXPECT_THROW((void)parse_results_json(R"({"format":"something else","format_version":1})",
                                          "out/results.json"),
                 InputError);
    auto text = results_json(sample());
    const auto pos = text.find("\"tc_min\"");
    ASSERT_NE(pos, std::string::npos);
    text.replace(pos, 8, "\"tc_xxx\"");
    try {
        (void)parse_results_json(text, "out/results.json");
        FAIL() << "expected InputError";
    } catch (const InputError &e) {
        const std::string msg = e.what();
        EXPECT_NE(msg.find("out/results.json.design_points[0]"), std::string::npos) << msg;
        EXPECT_NE(msg.find("tc_min"), std::string::npos) << msg;
    }
    EXPECT_THROW((void)read_results_json(test::scratch_dir("results_missing")), InputError);
}

TEST(RunRecord, RoundTripKeepsTheStamp) {
    const auto r = sample();
    const auto dir = test::scratch_dir("run_record");
    write_run_record(r.stamp, dir);
    const auto s = read_run_record(dir);
    EXPECT_EQ(s.tool_version, r.stamp.tool_version);
    EXPECT_EQ(s.git_commit, r.stamp.git_commit);
    EXPECT_EQ(s.run_time_utc, r.stamp.run_time_utc);
    ASSERT_EQ(s.inputs.size(), r.stamp.inputs.size());
    for (std::size_t i = 0; i < s.inputs.size(); ++i) {
        EXPECT_EQ(s.inputs[i].role, r.stamp.inputs[i].role);
        EXPECT_EQ(s.inputs[i].path, r.stamp.inputs[i].path);
        EXPECT_EQ(s.inputs[i].sha256, r.stamp.inputs[i].sha256);
    }
    EXPECT_THROW((void)parse_run_record_json(results_json(r), "run-record.json"), InputError);
}

} // namespace
} // namespace catchpeak::report

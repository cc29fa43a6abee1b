// SPDX-License-Identifier: MIT
// The methods `catchpeak run` takes from the project file beyond the basic ones: design depths
// from an annual maximum series, the segmental tc methods, land parts of a catchment table, the
// pond and swamp share, the storm time step. Every expected figure is computed by hand in this
// file from the published equations (the steps are written out below), never copied from
// catchpeak's output.
#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/app/point_hydrology.hpp"
#include "catchpeak/app/recheck.hpp"
#include "catchpeak/core/error.hpp"
#include "support/calc_lines.hpp"
#include "support/test_env.hpp"

#include <fmt/format.h>
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <numbers>
#include <sstream>
#include <string>
#include <vector>

using namespace catchpeak::app;
using namespace catchpeak::project;
namespace fs = std::filesystem;

namespace {

void write(const fs::path &path, const std::string &text) {
    std::ofstream(path, std::ios::binary) << text;
}

const catchpeak::report::DesignPointResult &point(const catchpeak::report::RunResults &r,
                                                  const std::string &id) {
    for (const auto &p : r.points) {
        if (p.id == id) {
            return p;
        }
    }
    throw std::runtime_error("no design point " + id);
}

const catchpeak::report::Peak &peak(const catchpeak::report::DesignPointResult &dp,
                                    const std::string &method, double rp) {
    for (const auto &p : dp.peaks) {
        if (catchpeak::key_of(p.method) == method && p.return_period_yr == rp) {
            return p;
        }
    }
    throw std::runtime_error("no peak " + method);
}

std::size_t count_label(const catchpeak::report::DesignPointResult &dp, const std::string &label,
                        catchpeak::LineKind kind) {
    return static_cast<std::size_t>(
        std::count_if(dp.lines.lines().begin(), dp.lines.lines().end(), [&](const auto &l) {
            return l.kind == kind &&
                   catchpeak::test::text(l).label.find(label) != std::string::npos;
        }));
}

std::size_t count_key(const catchpeak::report::DesignPointResult &dp, const std::string &key) {
    return static_cast<std::size_t>(std::count_if(dp.lines.lines().begin(), dp.lines.lines().end(),
                                                  [&](const auto &l) { return l.key == key; }));
}

// An invented series of twelve annual maximum 24-hour depths (mm), years 2001-2012.
const std::vector<double> series_mm = {48.0, 62.0, 55.0, 71.0, 90.0, 58.0,
                                       66.0, 83.0, 52.0, 77.0, 61.0, 105.0};

std::string series_csv() {
    std::string s = "year,depth_24h_mm\n";
    for (std::size_t i = 0; i < series_mm.size(); ++i) {
        s += fmt::format("{},{}\n", 2001 + i, series_mm[i]);
    }
    return s;
}

/// Invented table project: one catchment, CN 80, tc given 30 min, TR-55 graphical peak, depths
/// from the annual maximum series by `distribution`.
fs::path ams_project(const fs::path &dir, const std::string &distribution) {
    write(dir / "project.toml", R"([project]
name = "Thistledown Lane drainage"
units = "SI"

[inputs]
catchment_table = "catchments.csv"

[rainfall]
return_periods_yr = [10, 100]
storm_type = "II"
annual_maximum_series = "ams.csv"
ams_distribution = ")" + distribution +
                                    R"("

[methods]
peak = ["tr55_graphical"]

[output]
folder = "out"
)");
    write(dir / "catchments.csv", "id,area_ha,length_m,slope_percent,cn,tc_min\n"
                                  "TL-1,40,900,2,80,30\n");
    write(dir / "ams.csv", series_csv());
    return dir / "project.toml";
}

} // namespace

TEST(DesignDepths, GumbelByMomentsComputedByHand) {
    const auto dir = catchpeak::test::scratch_dir("ams_gumbel");
    const Project p = load_project(ams_project(dir, "gumbel"));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    const auto &dp = point(r, "TL-1");
    // By hand (Chow, Maidment & Mays 1988, sec. 12.3): mean and sample standard deviation
    // (n - 1), K_T = -(sqrt(6)/pi)(0.5772 + ln(ln(T/(T - 1)))) (eq. 12.3.8), x_T = mean + K_T s.
    const double n = static_cast<double>(series_mm.size());
    double sum = 0.0;
    for (double x : series_mm) {
        sum += x;
    }
    const double mean = sum / n; // 868 / 12 = 72.333 mm
    double ss = 0.0;
    for (double x : series_mm) {
        ss += (x - mean) * (x - mean);
    }
    const double sd = std::sqrt(ss / (n - 1.0));
    auto k_t = [](double t) {
        return -(std::sqrt(6.0) / std::numbers::pi) * (0.5772 + std::log(std::log(t / (t - 1.0))));
    };
    // K_10 = 1.305, K_100 = 3.137 as commonly tabulated for the Gumbel distribution (value from
    // memory, not checked against the source); tolerance: the tables print 3 decimals.
    EXPECT_NEAR(k_t(10.0), 1.305, 0.0006);
    EXPECT_NEAR(k_t(100.0), 3.137, 0.0006);
    for (double t : {10.0, 100.0}) {
        // Tolerance 1e-9 mm: floating point only (same equations).
        EXPECT_NEAR(peak(dp, "tr55_graphical", t).intermediates.at("rainfall_depth_mm"),
                    mean + k_t(t) * sd, 1e-9)
            << t;
    }
    // The sheet shows n, the mean and the standard deviation once, K_T and x_T per return period.
    EXPECT_EQ(count_key(dp, "rain.ams_series"), 1u);
    EXPECT_EQ(count_label(dp, "Mean of the annual maxima", catchpeak::LineKind::calculation), 1u);
    EXPECT_EQ(count_label(dp, "Standard deviation", catchpeak::LineKind::calculation), 1u);
    EXPECT_EQ(count_label(dp, "Gumbel frequency factor", catchpeak::LineKind::calculation), 2u);
    EXPECT_EQ(count_label(dp, "Design depth, Gumbel", catchpeak::LineKind::calculation), 2u);
    // 12 years: a short record (fewer than 20 years; the warning names each return period) and
    // 100 yr > 2 x 12 yr (10 yr is not) are warnings (common practice, no source).
    EXPECT_EQ(count_label(dp, "Short rainfall record", catchpeak::LineKind::warning), 2u);
    EXPECT_EQ(count_label(dp, "Return period beyond the record", catchpeak::LineKind::warning), 1u);
    bool chow = false;
    for (const auto &ref : r.references) {
        chow = chow || ref.key == "Chow, Maidment & Mays (1988)";
    }
    EXPECT_TRUE(chow);
}

TEST(DesignDepths, GevByLMomentsComputedByHand) {
    const auto dir = catchpeak::test::scratch_dir("ams_gev");
    const Project p = load_project(ams_project(dir, "gev"));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    const auto &dp = point(r, "TL-1");
    // By hand (Hosking 1990; Hosking & Wallis 1997): unbiased probability-weighted moments of
    // the sorted values, l1 = b0, l2 = 2 b1 - b0, l3 = 6 b2 - 6 b1 + b0, tau3 = l3 / l2;
    // c = 2/(3 + tau3) - ln 2/ln 3, k = 7.8590 c + 2.9554 c^2 (Hosking, Wallis & Wood 1985);
    // alpha = l2 k / ((1 - 2^-k) Gamma(1 + k)), xi = l1 - alpha (1 - Gamma(1 + k)) / k;
    // x_T = xi + alpha (1 - (-ln(1 - 1/T))^k) / k.
    std::vector<double> v = series_mm;
    std::sort(v.begin(), v.end());
    const double n = static_cast<double>(v.size());
    double b0 = 0.0, b1 = 0.0, b2 = 0.0;
    for (std::size_t i = 0; i < v.size(); ++i) {
        const double j = static_cast<double>(i) + 1.0;
        b0 += v[i] / n;
        b1 += (j - 1.0) / (n - 1.0) * v[i] / n;
        b2 += (j - 1.0) * (j - 2.0) / ((n - 1.0) * (n - 2.0)) * v[i] / n;
    }
    const double l1 = b0;
    const double l2 = 2.0 * b1 - b0;
    const double tau3 = (6.0 * b2 - 6.0 * b1 + b0) / l2;
    const double c = 2.0 / (3.0 + tau3) - std::log(2.0) / std::log(3.0);
    const double k = 7.8590 * c + 2.9554 * c * c;
    const double g = std::tgamma(1.0 + k);
    const double alpha = l2 * k / ((1.0 - std::pow(2.0, -k)) * g);
    const double xi = l1 - alpha * (1.0 - g) / k;
    for (double t : {10.0, 100.0}) {
        const double x = xi + alpha * (1.0 - std::pow(-std::log(1.0 - 1.0 / t), k)) / k;
        // Tolerance 1e-9 mm: floating point only (same equations).
        EXPECT_NEAR(peak(dp, "tr55_graphical", t).intermediates.at("rainfall_depth_mm"), x, 1e-9)
            << t;
    }
    EXPECT_EQ(count_label(dp, "L-skewness", catchpeak::LineKind::calculation), 1u);
    EXPECT_EQ(count_label(dp, "Design depth, GEV", catchpeak::LineKind::calculation), 2u);
    bool hosking = false;
    for (const auto &ref : r.references) {
        hosking = hosking || ref.key == "Hosking (1990)";
    }
    EXPECT_TRUE(hosking);
}

TEST(DesignDepths, InchesColumnIsConverted) {
    const auto dir = catchpeak::test::scratch_dir("ams_inches");
    ams_project(dir, "gumbel");
    std::string s = "year,depth_24h_in\n";
    for (std::size_t i = 0; i < series_mm.size(); ++i) {
        s += fmt::format("{},{:.6f}\n", 2001 + i, series_mm[i] / 25.4);
    }
    write(dir / "ams.csv", s);
    const auto ams = read_annual_maximum_series(dir / "ams.csv", "ams.csv");
    ASSERT_EQ(ams.depth_mm.size(), series_mm.size());
    for (std::size_t i = 0; i < series_mm.size(); ++i) {
        // Tolerance 1e-4 mm: the file holds 6 decimals of inches (rounding 1.3e-5 mm).
        EXPECT_NEAR(ams.depth_mm[i], series_mm[i], 1e-4);
    }
}

namespace {

/// Runs a project into its "out" folder and rechecks it.
RecheckReport run_and_recheck(const fs::path &project) {
    RunOptions options;
    options.quiet = true;
    options.run_time_utc = "2026-01-01T00:00:00Z";
    std::ostringstream out;
    std::ostringstream err;
    run_project(project, options, out, err);
    return recheck(project.parent_path() / "out");
}

} // namespace

TEST(DesignDepths, RecheckReproducesTheFitAndSeesAChangedSeries) {
    const auto dir = catchpeak::test::scratch_dir("ams_recheck");
    const auto project = ams_project(dir, "gev");
    const auto report = run_and_recheck(project);
    EXPECT_TRUE(report.all_reproduced()) << format_recheck(report);
    EXPECT_GT(report.lines_reproduced, 20u);
    // One year's maximum changed: the recorded SHA-256 of the series no longer matches.
    auto changed = series_mm;
    changed[0] = 49.0;
    std::string s = "year,depth_24h_mm\n";
    for (std::size_t i = 0; i < changed.size(); ++i) {
        s += fmt::format("{},{}\n", 2001 + i, changed[i]);
    }
    write(dir / "ams.csv", s);
    const auto after = recheck(dir / "out");
    EXPECT_FALSE(after.all_reproduced());
    EXPECT_GE(after.inputs_not_unchanged(), 1u);
    EXPECT_FALSE(after.line_differences.empty());
}

namespace {

/// Invented US customary table project for the segmental tc methods: BR-1 (250 ac, longest flow
/// path 8,800 ft at 0.01 ft/ft, CN 75), BR-2 the same with its own sheet flow roughness.
fs::path segmental_project(const fs::path &dir, const std::string &tc,
                           const std::string &extra_methods) {
    write(dir / "project.toml", R"([project]
name = "Bramblewood Creek crossing"
units = "US"

[inputs]
catchment_table = "catchments.csv"

[rainfall]
return_periods_yr = [2]
storm_type = "II"
depths_24h_in = { "2" = 3.6 }

[methods]
tc = ")" + tc + R"("
peak = ["tr55_graphical"]
)" + extra_methods + R"(
[settings]
minimum_tc_min = 5

[output]
folder = "out"
)");
    write(dir / "catchments.csv", "id,area_ac,length_ft,slope_m_per_m,cn\n"
                                  "BR-1,250,8800,0.01,75\n"
                                  "BR-2,250,8800,0.01,75\n");
    return dir / "project.toml";
}

} // namespace

TEST(SegmentalTc, Tr55SheetShallowChannelComputedByHand) {
    const auto dir = catchpeak::test::scratch_dir("tc_tr55_segmental");
    const Project p = load_project(segmental_project(dir, "tr55_segmental", R"(
[methods.tr55_segmental]
shallow_length_m = 426.72      # 1,400 ft

[[methods.point]]
id = "BR-2"
sheet_manning_n = 0.011
shallow_surface = "paved"
)"));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    // By hand, TR-55 (1986) ch. 3, US units; the split: sheet flow the first 100 ft (the default
    // sheet_flow_max_length_m, 30.48 m), shallow concentrated 1,400 ft, channel the remaining
    // 8,800 - 100 - 1,400 = 7,300 ft; s = 0.01 for every segment; P2 = 3.6 in.
    //   sheet (eq. 3-3): Tt = 0.007 (n L)^0.8 / (P2^0.5 s^0.4), n = 0.24 (the default);
    //   shallow, unpaved: V = 16.1345 s^0.5 ft/s; Tt = L / (3600 V);
    //   channel (Manning): r = 27 / 28.2 ft (the default section), n = 0.05,
    //   V = 1.49 r^(2/3) s^0.5 / n; Tt = L / (3600 V).
    const double s = 0.01;
    auto sheet_h = [&](double n) {
        return 0.007 * std::pow(n * 100.0, 0.8) / (std::sqrt(3.6) * std::pow(s, 0.4));
    };
    const double shallow_h = 1400.0 / (3600.0 * 16.1345 * std::sqrt(s));
    const double shallow_paved_h = 1400.0 / (3600.0 * 20.3282 * std::sqrt(s));
    const double v_ch = 1.49 * std::pow(27.0 / 28.2, 2.0 / 3.0) * std::sqrt(s) / 0.05;
    const double channel_h = 7300.0 / (3600.0 * v_ch);
    // TR-55 Example 3-1 (problem statement checked secondary; answers from memory, not
    // checked): sheet flow n = 0.24, 100 ft, s = 0.01, P2 = 3.6 in -> 0.30 h; shallow
    // unpaved 1,400 ft, s = 0.01 -> 0.24 h. Tolerance 0.005 h: printed to 0.01 h.
    EXPECT_NEAR(sheet_h(0.24), 0.30, 0.005);
    EXPECT_NEAR(shallow_h, 0.24, 0.005);
    const auto &br1 = point(r, "BR-1");
    EXPECT_EQ(br1.tc_method, catchpeak::TcMethod::tr55_segmental);
    // Tolerance 1e-9 min: floating point only (same equations; the lengths pass through m).
    EXPECT_NEAR(br1.tc_min, 60.0 * (sheet_h(0.24) + shallow_h + channel_h), 1e-9);
    const auto &br2 = point(r, "BR-2");
    EXPECT_NEAR(br2.tc_min, 60.0 * (sheet_h(0.011) + shallow_paved_h + channel_h), 1e-9);
    // Every segment has its lines, in hours on a US sheet.
    EXPECT_EQ(count_label(br1, "Travel time, sheet flow", catchpeak::LineKind::calculation), 1u);
    EXPECT_EQ(count_label(br1, "Travel time, shallow concentrated flow",
                          catchpeak::LineKind::calculation),
              1u);
    EXPECT_EQ(count_label(br1, "Travel time, channel flow", catchpeak::LineKind::calculation), 1u);
    EXPECT_EQ(count_key(br1, "point.channel_length"), 1u);
    bool tr55 = false;
    for (const auto &ref : r.references) {
        tr55 = tr55 || ref.key == "TR-55 (1986)";
    }
    EXPECT_TRUE(tr55);
}

TEST(SegmentalTc, Tr55WithoutShallowLengthWarns) {
    const auto dir = catchpeak::test::scratch_dir("tc_tr55_no_shallow");
    const Project p = load_project(segmental_project(dir, "tr55_segmental", ""));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    const auto &br1 = point(r, "BR-1");
    // No channel: sheet flow 100 ft, then shallow concentrated flow over the other 8,700 ft.
    const double s = 0.01;
    const double sheet_h =
        0.007 * std::pow(0.24 * 100.0, 0.8) / (std::sqrt(3.6) * std::pow(s, 0.4));
    const double shallow_h = 8700.0 / (3600.0 * 16.1345 * std::sqrt(s));
    EXPECT_NEAR(br1.tc_min, 60.0 * (sheet_h + shallow_h), 1e-9);
    EXPECT_EQ(count_key(br1, "point.channel_start_missing"), 1u);
    EXPECT_EQ(count_label(br1, "Travel time, channel flow", catchpeak::LineKind::calculation), 0u);
}

TEST(SegmentalTc, KerbyKirpichComputedByHand) {
    const auto dir = catchpeak::test::scratch_dir("tc_kerby_kirpich");
    Project p = load_project(segmental_project(dir, "kerby_kirpich", R"(
[[methods.point]]
id = "BR-2"
retardance_n = 0.20
)"));
    p.settings.sheet_flow_max_length_m = 152.4; // 500 ft of overland flow
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    // By hand (TxDOT Hydraulic Design Manual ch. 4): tov = 0.828 (L N / S^0.5)^0.467 min
    // (L = 500 ft), tch = 0.0078 L^0.77 S^-0.385 min (Kirpich, L = 8,800 - 500 = 8,300 ft),
    // S = 0.01 for both, tc = tov + tch.
    const double s = 0.01;
    auto tov = [&](double n) { return 0.828 * std::pow(500.0 * n / std::sqrt(s), 0.467); };
    const double tch = 0.0078 * std::pow(8300.0, 0.77) * std::pow(s, -0.385);
    // TxDOT HDM worked example (checked secondary, REFERENCES.md 3): L = 500 ft, N = 0.40,
    // S = 0.02 -> printed "about 25" min (24.5 computed). Tolerance 0.6 min: "about" 25.
    EXPECT_NEAR(0.828 * std::pow(500.0 * 0.40 / std::sqrt(0.02), 0.467), 25.0, 0.6);
    EXPECT_EQ(point(r, "BR-1").tc_method, catchpeak::TcMethod::kerby_kirpich);
    // Tolerance 1e-9 min: floating point only.
    EXPECT_NEAR(point(r, "BR-1").tc_min, tov(0.40) + tch, 1e-9); // default N = 0.40
    EXPECT_NEAR(point(r, "BR-2").tc_min, tov(0.20) + tch, 1e-9);
    // 250 ac = 0.39 mi2 lies inside the 0.25-150 mi2 of the combined method: no warning.
    EXPECT_EQ(count_key(point(r, "BR-1"), "point.kerby_kirpich_area"), 0u);
    bool kerby = false;
    for (const auto &ref : r.references) {
        kerby = kerby || ref.key == "Kerby (1959)";
    }
    EXPECT_TRUE(kerby);
}

TEST(SegmentalTc, RecheckReproducesTheSegments) {
    const auto dir = catchpeak::test::scratch_dir("tc_segmental_recheck");
    const auto report = run_and_recheck(segmental_project(dir, "tr55_segmental", R"(
[methods.tr55_segmental]
shallow_length_m = 426.72
)"));
    EXPECT_TRUE(report.all_reproduced()) << format_recheck(report);
    EXPECT_GT(report.lines_reproduced, 30u);
}

namespace {

/// Invented SI table project: PS-1 and PS-2, 640 ac = 1 mi2 each, CN 80, tc given 30 min,
/// P24 = 127 mm = 5.0 in, Type II; `settings` and `methods_extra` are added to the file.
fs::path pond_project(const fs::path &dir, const std::string &settings,
                      const std::string &methods_extra) {
    write(dir / "project.toml", R"([project]
name = "Heronsgate marsh outfall"
units = "SI"

[inputs]
catchment_table = "catchments.csv"

[rainfall]
return_periods_yr = [25]
storm_type = "II"
depths_24h_mm = { "25" = 127.0 }

[methods]
peak = ["tr55_graphical", "scs_unit_hydrograph"]
)" + methods_extra + R"(
[settings]
minimum_tc_min = 5
)" + settings + R"(
[output]
folder = "out"
)");
    write(dir / "catchments.csv", "id,area_ac,length_m,slope_percent,cn,tc_min\n"
                                  "PS-1,640,3000,2,80,30\n"
                                  "PS-2,640,3000,2,80,30\n");
    return dir / "project.toml";
}

} // namespace

TEST(PondsAndSwamps, FpFromTheProjectAndThePoint) {
    const auto dir = catchpeak::test::scratch_dir("pond_factor");
    const Project p = load_project(pond_project(dir, "pond_swamp_percent = 1.0\n", R"(
[[methods.point]]
id = "PS-2"
pond_swamp_percent = 0.6
)"));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    // Fp from config/tr55_pond_factors.csv (TR-55 Table 4-2; values from memory, not checked
    // against the source): 1 % -> 0.87; 0.6 % lies between 0.2 % (0.97) and 1 % (0.87):
    // linear interpolation 0.97 + (0.6 - 0.2) / (1 - 0.2) x (0.87 - 0.97) = 0.92.
    const auto &pk1 = peak(point(r, "PS-1"), "tr55_graphical", 25.0);
    const auto &pk2 = peak(point(r, "PS-2"), "tr55_graphical", 25.0);
    EXPECT_NEAR(pk1.intermediates.at("fp"), 0.87, 1e-12);
    EXPECT_NEAR(pk2.intermediates.at("fp"), 0.92, 1e-12);
    // qp = qu Am Q Fp (TR-55 eq. 4-1): the same catchments, so the peaks differ by Fp alone.
    // Tolerance 1e-12 relative: floating point only.
    EXPECT_NEAR(pk2.q_m3_s / pk1.q_m3_s, 0.92 / 0.87, 1e-12);
    // By hand, TR-55 ch. 2 and 4: Q = (5.0 - 0.5)^2 / (5.0 - 0.5 + 2.5) in, Ia/P = 0.10 (the
    // first Type II row: C0 2.55323, C1 -0.61512, C2 -0.16403), tc = 0.5 h.
    const double q_in = 4.5 * 4.5 / 7.0;
    const double lt = std::log10(0.5);
    const double qu = std::pow(10.0, 2.55323 - 0.61512 * lt - 0.16403 * lt * lt);
    const double qp_m3_s = qu * 1.0 * q_in * 0.87 * 0.028316846592;
    EXPECT_NEAR(pk1.q_m3_s, qp_m3_s, qp_m3_s * 1e-6); // floating point and the 4-digit Ia/P row
}

TEST(PondsAndSwamps, NotGivenIsZeroWithANote) {
    const auto dir = catchpeak::test::scratch_dir("pond_none");
    const Project p = load_project(pond_project(dir, "", ""));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    EXPECT_DOUBLE_EQ(peak(point(r, "PS-1"), "tr55_graphical", 25.0).intermediates.at("fp"), 1.0);
    EXPECT_EQ(count_key(point(r, "PS-1"), "point.ponds_none"), 1u);
}

TEST(StormTimeStep, TheSettingIsUsedAndALongStepWarns) {
    // tc = 30 min. NEH 630 ch. 16 (from memory, not checked): a step of no more than about
    // 0.2 tp. With tp = D/2 + 0.6 tc (NEH 630 ch. 16) and D near 0.133 tc = 4 min, tp is
    // about 20 min and 0.2 tp about 4 min: a 60-min storm step warns, a 3-min step does not.
    // A 15-min step is long too, but the storm table's points lie 30 min apart around the peak
    // (config/storms), so the table's own warning ("Peak averaged over a table interval") is the
    // one that applies: a shorter step would not help, and the step warning is not given.
    for (const double step : {60.0, 15.0, 3.0}) {
        const auto dir =
            catchpeak::test::scratch_dir(fmt::format("storm_step_{}", static_cast<int>(step)));
        const Project p =
            load_project(pond_project(dir, fmt::format("storm_time_step_min = {}\n", step), ""));
        EXPECT_DOUBLE_EQ(p.settings.storm_time_step_min, step);
        std::ostringstream progress;
        const auto r = compute_project(p, progress, true);
        const auto &dp = point(r, "PS-1");
        bool step_line = false;
        for (const auto &l : dp.lines.lines()) {
            if (catchpeak::test::text(l).label == "Time step" && l.value() == step &&
                catchpeak::test::text(l).numbers.find(fmt::format(
                    "{} steps", static_cast<int>(1440.0 / step))) != std::string::npos) {
                step_line = true;
            }
        }
        EXPECT_TRUE(step_line) << step;
        const auto &pk = peak(dp, "scs_unit_hydrograph", 25.0);
        const double tp_min = pk.intermediates.at("unit_hydrograph_tp_min");
        // tp = D/2 + 0.6 tc (NEH 630 ch. 16), D the unit hydrograph's step.
        EXPECT_NEAR(tp_min, pk.intermediates.at("step_min") / 2.0 + 0.6 * 30.0, 1e-9);
        const auto table_warnings =
            count_label(dp, "Peak averaged over a table interval", catchpeak::LineKind::warning);
        EXPECT_EQ(table_warnings, step == 60.0 ? 0u : 1u) << step;
        EXPECT_EQ(count_key(dp, "point.storm_step_long"), step == 60.0 ? 1u : 0u) << step;
        EXPECT_EQ(step > 0.2 * tp_min, step != 3.0) << tp_min;
    }
}

TEST(Warnings, AWarningTheSameForEveryReturnPeriodIsShownOnce) {
    // 640 ac = 259 ha lies over the Rational Method's 80 ha limit for each of the three return
    // periods; the warning says the same each time and is shown once, while every return period
    // keeps its own peak line.
    const auto dir = catchpeak::test::scratch_dir("warning_once");
    write(dir / "project.toml", R"([project]
name = "Heronsgate marsh outfall"
units = "SI"

[inputs]
catchment_table = "catchments.csv"

[rainfall]
idf = "idf.csv"
return_periods_yr = [2, 5, 10]

[methods]
peak = ["rational"]

[settings]
rational_area_limit_ha = 80.0

[output]
folder = "out"
)");
    write(dir / "idf.csv", "# unit: mm/h\n"
                           "duration_min,2,5,10\n"
                           "5,100,125,150\n"
                           "60,30,38,45\n"
                           "120,20,25,30\n");
    write(dir / "catchments.csv", "id,area_ac,length_m,slope_percent,c\n"
                                  "PS-1,640,3000,2,0.3\n");
    std::ostringstream progress;
    const auto r = compute_project(load_project(dir / "project.toml"), progress, true);
    const auto &dp = point(r, "PS-1");
    EXPECT_EQ(count_label(dp, "Rational Method: catchment area over the limit",
                          catchpeak::LineKind::warning),
              1u);
    ASSERT_EQ(dp.peaks.size(), 3u);
    // Each peak's line id still names a calculation line giving that peak.
    for (const auto &pk : dp.peaks) {
        const auto &all = dp.lines.lines();
        const auto it =
            std::find_if(all.begin(), all.end(), [&](const auto &l) { return l.id == pk.line_id; });
        ASSERT_NE(it, all.end()) << pk.line_id;
        EXPECT_EQ(it->kind, catchpeak::LineKind::calculation);
        // The sheet is SI: the line's value is the peak in m3/s.
        EXPECT_DOUBLE_EQ(it->value(), pk.q_m3_s) << pk.line_id;
    }
}

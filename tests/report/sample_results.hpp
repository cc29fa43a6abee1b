// SPDX-License-Identifier: MIT
// Invented run results for the report tests and the report benchmark: no real place, no real
// project; every value is made up to exercise the writers.
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/report/results.hpp"
#include "support/calc_lines.hpp"

#include <fmt/format.h>

#include <cmath>
#include <cstddef>
#include <numbers>
#include <string>

namespace catchpeak::test {

/// A ring around (cx, cy), radius about r_m, wobbling so that it looks like a catchment.
inline report::Path blob(double cx, double cy, double r_m, double phase, std::size_t n = 48) {
    report::Path ring;
    for (std::size_t k = 0; k <= n; ++k) {
        const double a =
            2.0 * std::numbers::pi * static_cast<double>(k % n) / static_cast<double>(n);
        const double r = r_m * (1.0 + 0.22 * std::sin(3.0 * a + phase) + 0.1 * std::cos(5.0 * a));
        ring.emplace_back(cx + r * std::cos(a), cy + 1.3 * r * std::sin(a));
    }
    return ring;
}

/// A map of a catchment around (cx, cy), with a synthetic hillshade of w x h cells.
inline report::MapData sample_map(double cx, double cy, double r_m, bool nested, std::size_t w = 90,
                                  std::size_t h = 110) {
    report::MapData m;
    m.catchment.push_back({blob(cx, cy, r_m, 0.4)});
    if (nested) {
        m.local_catchment.push_back({blob(cx + 0.2 * r_m, cy - 0.5 * r_m, 0.5 * r_m, 1.1)});
    }
    const double outlet_x = cx + 0.1 * r_m, outlet_y = cy - 1.2 * r_m;
    for (int k = 0; k <= 20; ++k) {
        const double t = k / 20.0;
        m.longest_flow_path.emplace_back(outlet_x - 0.3 * r_m * std::sin(3.0 * t),
                                         outlet_y + 2.2 * r_m * t);
    }
    m.streams.push_back({{outlet_x, outlet_y}, {outlet_x + 0.5 * r_m, cy}, {cx + r_m, cy + r_m}});
    m.streams.push_back({{outlet_x, outlet_y}, {outlet_x - 0.1 * r_m, outlet_y - 0.5 * r_m}});
    m.given_xy = {outlet_x + 0.06 * r_m, outlet_y - 0.04 * r_m};
    m.snapped_xy = {outlet_x, outlet_y};
    m.hillshade_width = w;
    m.hillshade_height = h;
    m.hillshade.resize(w * h);
    for (std::size_t row = 0; row < h; ++row) {
        for (std::size_t col = 0; col < w; ++col) {
            const double v = 150.0 + 70.0 * std::sin(0.21 * static_cast<double>(col)) *
                                         std::cos(0.13 * static_cast<double>(row));
            m.hillshade[row * w + col] = static_cast<std::uint8_t>(v);
        }
    }
    m.hillshade_min_x = cx - 1.8 * r_m;
    m.hillshade_max_x = cx + 1.8 * r_m;
    m.hillshade_min_y = cy - 2.0 * r_m;
    m.hillshade_max_y = cy + 2.0 * r_m;
    return m;
}

/// One invented design point with `return_periods` return periods of the Rational Method, and
/// (when `with_hydrograph`) an SCS unit hydrograph peak for the last return period.
inline report::DesignPointResult sample_point(std::size_t i, units::System system,
                                              const std::vector<double> &return_periods,
                                              bool with_hydrograph, bool with_map) {
    report::DesignPointResult p;
    p.id = fmt::format("DP{}", i + 1);
    const double cx = 612000.0 + 900.0 * static_cast<double>(i);
    const double cy = 3804000.0 + 350.0 * static_cast<double>(i % 7);
    const double r_m = 180.0 + 35.0 * static_cast<double>(i % 5);
    p.snapped_xy = {cx + 0.1 * r_m, cy - 1.2 * r_m};
    p.given_xy = {p.snapped_xy.first + 0.06 * r_m, p.snapped_xy.second - 0.04 * r_m};
    p.snap_distance_m = std::hypot(0.06 * r_m, 0.04 * r_m);
    p.from_table = i % 4 == 3;
    auto &c = p.catchment;
    c.area_m2 = 123456.7 * (1.0 + 0.37 * static_cast<double>(i));
    c.local_area_m2 = i % 3 == 1 ? 0.6 * c.area_m2 : c.area_m2;
    c.longest_flow_path_m = 812.3 + 41.0 * static_cast<double>(i);
    c.elevation_top_m = 241.7;
    c.elevation_outlet_m = 212.4;
    c.slope_flow_path = (c.elevation_top_m - c.elevation_outlet_m) / c.longest_flow_path_m;
    c.slope_10_85 = 0.9 * c.slope_flow_path;
    c.mean_slope = 0.081;
    if (i % 3 == 1 && i > 0) {
        c.upstream_points = {fmt::format("DP{}", i)};
    }
    auto &w = p.land;
    w.parts = {{"Open space, good condition", "B", 0.55 * c.area_m2, 0.20, 61.0, 0.0},
               {"Residential, 1/4 acre lots", "C", 0.35 * c.area_m2, 0.45, 83.0, 0.38},
               {"Paved roads with curbs", "C", 0.10 * c.area_m2, 0.90, 98.0, 1.0}};
    w.c_weighted = 0.55 * 0.20 + 0.35 * 0.45 + 0.10 * 0.90;
    w.cn_weighted = 0.55 * 61.0 + 0.35 * 83.0 + 0.10 * 98.0;
    w.impervious_share = 0.35 * 0.38 + 0.10;
    w.c_table = "config/runoff_coefficients.csv";
    w.cn_table = "config/curve_numbers.csv";
    p.tc_min = 0.0078 * std::pow(units::m_to_ft(c.longest_flow_path_m), 0.77) *
               std::pow(c.slope_flow_path, -0.385);
    p.tc_method = catchpeak::TcMethod::kirpich;

    const bool us = system == units::System::us_customary;
    CalcLines lines;
    lines.add(catchpeak::test::text_note("Catchment area", "from the DEM", "project input",
                                         c.area_m2, "m2"));
    lines.add(catchpeak::test::text_calc(
        "Time of concentration, Kirpich", "tc = 0.0078 L^0.77 S^-0.385",
        fmt::format("tc = 0.0078 x {}^0.77 x {}^-0.385", sig(units::m_to_ft(c.longest_flow_path_m)),
                    sig(c.slope_flow_path)),
        p.tc_min, "min", "Kirpich (1940)"));
    if (i % 2 == 1) {
        lines.add(catchpeak::test::text_warn(
            "Time of concentration below the minimum",
            fmt::format("tc = {} min is below 5 min; 5 min is used, as local practice "
                        "usually asks for a minimum duration of the design storm",
                        sig(p.tc_min)),
            "common practice, no source"));
    }
    std::vector<std::size_t> peak_line_index;
    for (double rp : return_periods) {
        report::Peak pk;
        pk.return_period_yr = rp;
        pk.method = catchpeak::PeakMethod::rational;
        const double i_mm_h = 58.0 * std::pow(rp, 0.21);
        pk.q_m3_s =
            w.c_weighted * i_mm_h * c.area_m2 / 3.6e6 * (1.0 + 1e-7 * static_cast<double>(i));
        pk.intermediates["intensity_mm_per_h"] = i_mm_h;
        pk.intermediates["c_cf"] = 1.0;
        lines.add(catchpeak::test::text_calc(
            fmt::format("Rainfall intensity, {}-yr", rp), "i = IDF(tc, T)",
            fmt::format("i = IDF({} min, {} yr)", sig(p.tc_min), rp),
            us ? units::mm_per_h_to_in_per_h(i_mm_h) : i_mm_h, us ? "in/h" : "mm/h",
            "project IDF table"));
        lines.add(catchpeak::test::text_calc(
            fmt::format("Peak flow, Rational Method, {}-yr", rp),
            us ? "Q = C i A" : "Q = C i A / 360",
            fmt::format("Q = {} x {} x {}", sig(w.c_weighted), sig(i_mm_h), sig(c.area_m2 / 1e4)),
            us ? units::m3s_to_cfs(pk.q_m3_s) : pk.q_m3_s, us ? "cfs" : "m3/s",
            "Rational Method; Kuichling (1889)"));
        peak_line_index.push_back(lines.size() - 1);
        p.peaks.push_back(std::move(pk));
    }
    if (with_hydrograph) {
        report::Peak pk;
        pk.return_period_yr = return_periods.back();
        pk.method = catchpeak::PeakMethod::scs_unit_hydrograph;
        report::Hydrograph hg;
        hg.step_s = 300.0;
        const std::size_t n = 96;
        for (std::size_t k = 0; k < n; ++k) {
            const double t = static_cast<double>(k) / static_cast<double>(n);
            const double rain = 0.4 + 9.0 * std::exp(-std::pow((t - 0.35) * 9.0, 2.0));
            hg.rain_mm.push_back(rain);
            hg.excess_mm.push_back(t > 0.25 ? 0.6 * rain : 0.0);
            hg.q_m3_s.push_back(3.2 * std::exp(-std::pow((t - 0.45) * 6.0, 2.0)) *
                                (1.0 + 0.1 * static_cast<double>(i)));
        }
        double qmax = 0.0;
        for (double q : hg.q_m3_s) {
            qmax = std::max(qmax, q);
        }
        pk.q_m3_s = qmax;
        pk.intermediates["runoff_depth_mm"] = 41.25;
        pk.intermediates["time_to_peak_min"] = 215.0;
        pk.hydrograph = std::move(hg);
        lines.add(catchpeak::test::text_calc(
            fmt::format("Peak flow, SCS unit hydrograph, {}-yr", pk.return_period_yr),
            "Q = max of the convolution of excess and unit hydrograph", "see the hydrograph plot",
            us ? units::m3s_to_cfs(pk.q_m3_s) : pk.q_m3_s, us ? "cfs" : "m3/s",
            "NRCS NEH Part 630 ch. 16"));
        peak_line_index.push_back(lines.size() - 1);
        p.peaks.push_back(std::move(pk));
    }
    number_lines(lines, p.id);
    for (std::size_t k = 0; k < p.peaks.size(); ++k) {
        p.peaks[k].line_id = lines.lines()[peak_line_index[k]].id;
    }
    p.lines = std::move(lines);
    if (with_map) {
        p.map = sample_map(cx, cy, r_m, !p.catchment.upstream_points.empty());
    }
    return p;
}

inline report::RunResults sample_results(std::size_t points, units::System system,
                                         const std::vector<double> &return_periods = {2, 10, 100},
                                         bool maps = true) {
    report::RunResults r;
    r.project.name = "Sample business park, stage 2";
    r.project.number = "P-0417";
    r.project.client = "Example Development Ltd.";
    r.project.location = "North-east corner of the invented valley";
    r.project.prepared_by = "A. Engineer";
    r.project.checked_by = "B. Checker";
    r.project.revision = "B";
    r.project.units = system;
    r.stamp.tool_version = "0.1.0";
    r.stamp.git_commit = "0123456789ab";
    r.stamp.run_time_utc = "2026-12-02T10:15:00Z";
    r.stamp.inputs = {
        {"project file", "project.toml", std::string(64, 'a')},
        {"DEM", "data/dem.tif", std::string(64, 'b')},
        {"design points", "data/points.csv", std::string(64, 'c')},
        {"IDF", "data/idf.csv", std::string(64, 'd')},
    };
    for (std::size_t i = 0; i < points; ++i) {
        r.points.push_back(sample_point(i, system, return_periods, i % 2 == 0, maps));
    }
    r.references = {
        {"Kirpich (1940)", "Kirpich, Z. P. (1940). Time of concentration of small agricultural "
                           "watersheds. Civil Engineering 10(6), 362."},
        {"NRCS NEH Part 630 ch. 16",
         "USDA Natural Resources Conservation Service (2007). National Engineering Handbook, "
         "Part 630 Hydrology, Chapter 16: Hydrographs."},
    };
    return r;
}

} // namespace catchpeak::test

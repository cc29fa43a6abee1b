// SPDX-License-Identifier: MIT
// Culverts in a run: the culvert table read, each culvert checked at the largest peak of its
// design point for every return period, results.json's culvert object, and bad tables refused
// by check with the row and column.
#include "catchpeak/cli/run.hpp"
#include "catchpeak/core/error.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <memory>
#include <sstream>
#include <string>
#include <vector>

namespace {

using catchpeak::ExitCode;
using catchpeak::test::TestProject;

const char *const catchments = "id,area_ha,length_m,relief_m,c,cn\n"
                               "IN-1,8.0,420,6.0,0.55,80\n"
                               "IN-2,1.1,150,3.0,0.55,80\n";
const char *const idf = "# unit: mm/h\n"
                        "duration_min,2,10\n"
                        "5,100,150\n"
                        "10,80,120\n"
                        "60,30,45\n";
const char *const head = "id,shape,diameter_mm,inlet,manning_n,length_m,invert_in_m,"
                         "invert_out_m,hw_d_max\n";

TestProject culvert_project(const std::string &name, const std::string &rows) {
    TestProject p(name);
    p.catchments(catchments).idf(idf);
    p.rainfall.set("return_periods_yr", "[2, 10]");
    p.inputs.text("culvert_table", "culverts.csv");
    p.design.set("culvert_return_period_yr", "10");
    p.with_file("culverts.csv", std::string(head) + rows);
    return p;
}

nlohmann::json read_json(const std::filesystem::path &f) {
    std::ifstream in(f);
    return nlohmann::json::parse(in);
}

TEST(CulvertRun, EachFlowIsTheLargestPeakAndTheDesignFlowPasses) {
    auto p = culvert_project("culvert_run", "IN-1,circular,,concrete_groove_headwall,0.012,25,"
                                            "100.0,99.7,1.5\n");
    const auto r = p.command("run", {"--quiet"});
    ASSERT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.err;
    const auto j = read_json(p.out_dir() / "results.json");
    const auto &points = j.at("design_points");
    ASSERT_EQ(points.size(), 2U);
    ASSERT_TRUE(points[0].contains("culvert"));
    EXPECT_FALSE(points[1].contains("culvert"));
    const auto &c = points[0].at("culvert");
    EXPECT_TRUE(c.at("sized").get<bool>());
    ASSERT_EQ(c.at("cases").size(), 2U);
    for (const auto &k : c.at("cases")) {
        double largest = 0.0;
        for (const auto &pk : points[0].at("peaks")) {
            if (pk.at("return_period_yr") == k.at("return_period_yr")) {
                largest = std::max(largest, pk.at("q_m3_s").get<double>());
            }
        }
        EXPECT_DOUBLE_EQ(k.at("flow_m3_per_s").get<double>(), largest);
        EXPECT_DOUBLE_EQ(k.at("headwater_m").get<double>(),
                         std::max(k.at("inlet_control_headwater_m").get<double>(),
                                  k.at("outlet_control_headwater_m").get<double>()));
        EXPECT_NEAR(k.at("headwater_elevation_m").get<double>(),
                    100.0 + k.at("headwater_m").get<double>(), 1e-9);
    }
    const auto &design = c.at("cases")[1];
    EXPECT_TRUE(design.at("design").get<bool>());
    EXPECT_TRUE(design.at("passes").get<bool>());
    // HW/D <= 1.5 of the chosen diameter.
    EXPECT_LE(design.at("headwater_m").get<double>(), 1.5 * c.at("rise_m").get<double>() + 1e-12);
    // The culvert's lines follow the point's own, numbered on.
    bool found = false;
    for (const auto &l : points[0].at("lines")) {
        found = found || l.at("label") == "Size chosen";
    }
    EXPECT_TRUE(found);
    bool caution = false;
    for (const auto &n : j.at("caution_notes")) {
        caution =
            caution || n.get<std::string>().find("fish and wildlife passage") != std::string::npos;
    }
    EXPECT_TRUE(caution);
}

/// What a command printed on stdout.
std::string stdout_of(const std::string &command) {
    std::unique_ptr<FILE, int (*)(FILE *)> pipe(popen(command.c_str(), "r"), pclose);
    std::string out;
    if (!pipe) {
        return out;
    }
    std::array<char, 4096> buf{};
    for (std::size_t n = 0; (n = std::fread(buf.data(), 1, buf.size(), pipe.get())) > 0;) {
        out.append(buf.data(), n);
    }
    return out;
}

/// Whether `line` holds every one of `parts`, in that order.
bool holds_in_order(const std::string &line, const std::vector<std::string> &parts) {
    std::size_t at = 0;
    for (const auto &part : parts) {
        at = line.find(part, at);
        if (at == std::string::npos) {
            return false;
        }
        at += part.size();
    }
    return true;
}

/// 4 significant figures, as the sheet prints a number (catchpeak::sig, restated here from
/// its documented rule so that the test does not print with the code it checks).
std::string four_figures(double v) {
    if (v == 0.0) {
        return "0";
    }
    // Rounded to 4 figures first, so that 9.99996 prints as 10.00.
    const double scale = std::pow(10.0, 3 - std::floor(std::log10(std::abs(v))));
    const double rounded = std::round(v * scale) / scale;
    const int decimals = 3 - static_cast<int>(std::floor(std::log10(std::abs(rounded))));
    std::ostringstream s;
    s.setf(std::ios::fixed);
    s.precision(std::max(decimals, 0));
    s << rounded;
    return s.str();
}

std::string three_decimals(double v) {
    std::ostringstream s;
    s.setf(std::ios::fixed);
    s.precision(3);
    s << v;
    return s.str();
}

// The sheet's culvert table shows, for every flow checked, the numbers of results.json as the
// sheet prints them, in the order of the columns; and the performance curve is drawn under its
// title, with the road crest named. The road overtops at the 10-year flow (a 600 mm pipe under
// a crest 1.2 m above the inlet invert).
TEST(CulvertRun, SheetTableHoldsTheNumbersOfResultsJsonAndTheCurve) {
    TestProject p("culvert_sheet");
    p.catchments(catchments).idf(idf);
    p.rainfall.set("return_periods_yr", "[2, 10]");
    p.inputs.text("culvert_table", "culverts.csv");
    p.design.set("culvert_return_period_yr", "10");
    p.with_file("culverts.csv",
                "id,shape,diameter_mm,inlet,manning_n,length_m,invert_in_m,invert_out_m,"
                "hw_d_max,crest_m,crest_length_m\n"
                "IN-1,circular,600,concrete_groove_headwall,0.012,25,100.0,99.7,1.5,101.2,15\n");
    const auto r = p.command("run", {"--quiet"});
    ASSERT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.err;
    const auto j = read_json(p.out_dir() / "results.json");
    const auto &c = j.at("design_points")[0].at("culvert");
    const std::string text = stdout_of("pdftotext -layout -enc UTF-8 '" +
                                       (p.out_dir() / "calculation-sheet.pdf").string() + "' -");
    ASSERT_FALSE(text.empty()) << "pdftotext gave nothing";
    std::vector<std::string> lines;
    std::istringstream in(text);
    for (std::string l; std::getline(in, l);) {
        lines.push_back(l);
    }
    bool overtops = false;
    const double rise = c.at("rise_m").get<double>();
    for (const auto &k : c.at("cases")) {
        const double hw = k.at("headwater_m").get<double>();
        overtops = overtops || k.at("overtopping_flow_m3_per_s").get<double>() > 0.0;
        const auto rp = std::to_string(k.at("return_period_yr").get<int>()) + "-yr";
        const std::vector<std::string> row = {
            rp,
            four_figures(k.at("flow_m3_per_s").get<double>()),
            four_figures(k.at("culvert_flow_m3_per_s").get<double>()),
            four_figures(k.at("overtopping_flow_m3_per_s").get<double>()),
            three_decimals(k.at("headwater_elevation_m").get<double>()),
            four_figures(hw / rise),
            k.at("control").get<std::string>(),
            four_figures(k.at("outlet_velocity_m_per_s").get<double>()),
            three_decimals(100.0 + k.at("allowed_headwater_m").get<double>()),
            k.at("passes").get<bool>() ? "passes" : "fails",
            k.at("headwater_line_id").get<std::string>()};
        const bool found = std::any_of(lines.begin(), lines.end(), [&](const std::string &l) {
            return holds_in_order(l, row);
        });
        EXPECT_TRUE(found) << "no table row for " << rp << " with the numbers of results.json:\n"
                           << text;
    }
    EXPECT_TRUE(overtops) << "the project was meant to overtop the road";
    EXPECT_NE(text.find("Culvert performance curve: headwater elevation against flow"),
              std::string::npos);
    EXPECT_NE(text.find("road crest 101.200 m"), std::string::npos);
    EXPECT_NE(text.find("Flow through the barrels alone"), std::string::npos);
    // summary.csv has the culvert rows, with the controlling headwater's line.
    std::ifstream csv(p.out_dir() / "summary.csv");
    std::stringstream all;
    all << csv.rdbuf();
    for (const auto &k : c.at("cases")) {
        EXPECT_NE(all.str().find("," + k.at("headwater_line_id").get<std::string>() + "\n"),
                  std::string::npos)
            << all.str();
    }
}

TEST(CulvertRun, CheckNamesEveryBadCell) {
    auto p = culvert_project("culvert_check",
                             "IN-3,circular,600,concrete_groove_headwal,0.012,25,100,99.7,1.5\n");
    p.design.set("culvert_return_period_yr", "25");
    const auto r = p.command("check");
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::bad_input));
    EXPECT_NE(r.err.find("culverts.csv:2: column 'id'"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("did you mean 'IN-1'?"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("did you mean 'concrete_groove_headwall'?"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("[design] culvert_return_period_yr"), std::string::npos) << r.err;
    EXPECT_FALSE(std::filesystem::exists(p.out_dir() / "results.json"));
}

} // namespace

// Issue 15: `recheck` covers the culverts. An unchanged run is reproduced line by line; a
// culvert table changed after the run (a rougher barrel) is named, and the culvert's lines
// differ while the peaks are still reproduced.
TEST(CulvertRun, RecheckReproducesTheCulvertLinesAndNamesAChangedCulvertTable) {
    auto p = culvert_project("culvert_recheck", "IN-1,circular,900,concrete_groove_headwall,"
                                                "0.012,25,100.0,99.7,1.5\n");
    ASSERT_EQ(p.command("run", {"--quiet"}).code, static_cast<int>(ExitCode::success));
    const auto same = catchpeak::test::cli({"recheck", p.out_dir().string()});
    EXPECT_EQ(same.code, static_cast<int>(ExitCode::success)) << same.out << same.err;
    EXPECT_NE(same.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << same.out;
    catchpeak::test::write_file(p.dir() / "culverts.csv",
                                std::string(head) + "IN-1,circular,900,concrete_groove_headwall,"
                                                    "0.024,25,100.0,99.7,1.5\n");
    const auto changed = catchpeak::test::cli({"recheck", p.out_dir().string()});
    EXPECT_EQ(changed.code, static_cast<int>(ExitCode::inputs_changed))
        << changed.out << changed.err;
    EXPECT_NE(changed.out.find("culvert table 'culverts.csv'"), std::string::npos) << changed.out;
    EXPECT_NE(changed.out.find("line IN-1-L"), std::string::npos) << changed.out;
    EXPECT_EQ(changed.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << changed.out;
}

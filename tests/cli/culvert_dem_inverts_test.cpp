// SPDX-License-Identifier: MIT
// Culverts of a DEM project whose table leaves out the inverts: they are read from the DEM at
// the two ends of the breach line at the design point, the higher end being the inlet, and the
// sheet's lines say so. Without a breach line within reach, the run is refused naming the row.
// The valley of app/dem_project_data.hpp: on its axis the DEM is 100 + 0.5 (60 - row) m, so the
// expected inverts are computed by hand from the rows of the line's ends.
#include "app/dem_project_data.hpp"
#include "catchpeak/cli/run.hpp"
#include "catchpeak/core/error.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <fmt/format.h>

#include <fstream>
#include <string>

namespace {

namespace t = catchpeak::test;
using catchpeak::ExitCode;
using S = t::DemProjectSpec;

const char *const table = "id,shape,diameter_mm,inlet,manning_n,length_m,hw_d_max\n"
                          "DP-OUT,circular,,concrete_groove_headwall,0.012,30,1.5\n";

/// The valley project with a culvert at DP-OUT and a breach line from row `from` to row `to`
/// in column `col`.
t::TestProject project_with_line(const std::string &name, int col, int from, int to) {
    auto p = t::dem_project(name);
    const std::string wkt = fmt::format("LINESTRING({} {},{} {})", t::cell_x(col), t::cell_y(from),
                                        t::cell_x(col), t::cell_y(to));
    t::make_layer(p.dir() / "breach.gpkg", "breach", {"name"}, {{wkt, {"road"}}}, "EPSG:32633");
    p.inputs.text("breach_lines", "breach.gpkg").text("culvert_table", "culverts.csv");
    p.design.set("culvert_return_period_yr", "10");
    p.with_file("culverts.csv", table);
    return p;
}

double axis_z(int row) { return 100.0 + 0.5 * (S::height - row); }

} // namespace

TEST(CulvertDemInverts, InvertsAreReadAtTheEndsOfTheBreachLineTheHigherEndBeingTheInlet) {
    // Drawn downstream to upstream (row 57 to row 54): the inlet is the row-54 end all the same.
    auto p = project_with_line("culvert_dem_inverts", S::axis_col, 57, 54);
    const auto r = p.command("run", {"--quiet"});
    ASSERT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.err;
    std::ifstream in(p.out_dir() / "results.json");
    const auto j = nlohmann::json::parse(in);
    const nlohmann::json *out = nullptr;
    for (const auto &dp : j.at("design_points")) {
        if (dp.at("id") == "DP-OUT") {
            out = &dp;
        }
    }
    ASSERT_NE(out, nullptr);
    ASSERT_TRUE(out->contains("culvert"));
    const auto &c = out->at("culvert");
    EXPECT_DOUBLE_EQ(c.at("inlet_invert_m").get<double>(), axis_z(54));  // 103.0 m
    EXPECT_DOUBLE_EQ(c.at("outlet_invert_m").get<double>(), axis_z(57)); // 101.5 m
    bool said = false;
    for (const auto &l : out->at("lines")) {
        if (l.at("label") == "Inverts from the DEM") {
            said = true;
            const auto text = l.at("numbers").get<std::string>();
            EXPECT_NE(text.find("103.000"), std::string::npos) << text;
            EXPECT_NE(text.find("101.500"), std::string::npos) << text;
            EXPECT_NE(text.find("breach line 'breach.gpkg' feature 1"), std::string::npos) << text;
            EXPECT_EQ(text.find(p.dir().string()), std::string::npos) << text; // as given
        }
    }
    EXPECT_TRUE(said);
}

TEST(CulvertDemInverts, ABreachLineBeyondReachIsRefusedNamingTheDistance) {
    // Ten columns (100 m) east of the point, farther than the 5 m radius plus a cell diagonal.
    auto p = project_with_line("culvert_dem_inverts_far", S::axis_col + 10, 57, 54);
    const auto r = p.command("run", {"--quiet"});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::bad_input)) << r.err;
    EXPECT_NE(r.err.find("culverts.csv:2"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("100.0 m from design point 'DP-OUT'"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("[settings] snap_radius_m"), std::string::npos) << r.err;
    EXPECT_FALSE(std::filesystem::exists(p.out_dir() / "results.json"));
}

TEST(CulvertDemInverts, WithoutBreachLinesTheTableMustGiveTheInverts) {
    auto p = t::dem_project("culvert_dem_no_lines");
    p.inputs.text("culvert_table", "culverts.csv");
    p.design.set("culvert_return_period_yr", "10");
    p.with_file("culverts.csv", table);
    const auto r = p.command("check");
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::bad_input)) << r.err;
    EXPECT_NE(r.err.find("no DEM with breach lines"), std::string::npos) << r.err;
}

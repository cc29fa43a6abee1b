// SPDX-License-Identifier: MIT
// Checks against a published culvert example: FHWA HDS-5, Hydraulic Design of Highway Culverts,
// 2nd ed. (FHWA-NHI-01-020, Normann, Houghtalen and Johnston, September 2001), ch. III.C.5,
// Example Problem No. 4 (SI units), pp. 64-65: an existing 2134 mm by 2134 mm concrete box
// culvert with square edges, inlet invert 30.480 m, slope 5 percent, length 60.96 m, road
// centreline 35.357 m, the road a broad-crested weir 60.96 m long; tailwater 0.793, 0.945,
// 1.158 and 1.250 m at 11.327, 16.990, 22.654 and 28.317 m3/s. Its performance curve table
// (p. 65) prints the headwater elevation EL for five culvert flows and, where the road
// overtops, the depth over the crest Ho and the flow over the road Qot.
//
// The example reads its headwaters from nomographs (HDS-5 Charts 8A, 14A and 15A), not from the
// appendix A equations we compute; the tolerance below is widened for that. Its design forms
// (the inlet and outlet control columns) are images we could not read: the published numbers
// checked here are the controlling headwater of the curve table, so the outlet control
// headwater is checked only to lie below it. The example's text was seen in a reproduction of
// the 2nd edition (a conversion of the FHWA print), not in the print itself.
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydraulics/culvert.hpp"
#include "catchpeak/hydraulics/overtopping.hpp"

#include <gtest/gtest.h>

namespace {

using namespace catchpeak::hydraulics;
using catchpeak::units::System;

constexpr double inlet_invert_m = 30.480; // Example Problem No. 4, site data
constexpr double road_crest_m = 35.357;   // roadway centerline elevation
constexpr double road_length_m = 60.96;   // the road approximated as a weir 60.96 m long

// "Square edges" at a headwall: HDS-5 Chart 8, the 90 and 15 degree wingwall flare scale,
// whose appendix A constants are Table A.1's row "90 and 15 degree wingwall flares" (form 1,
// K 0.061, M 0.75, c 0.0400, Y 0.80; checked secondary). ke 0.5 for a square-edged box at a
// headwall and n 0.012 for concrete (the n of the concrete box outlet chart 15A): from memory,
// not checked; they enter the outlet control headwater alone, which does not govern here.
Culvert example_box() {
    const InletRow square_edge{"box_wingwall_90_15",
                               Shape::box,
                               InletForm::form1,
                               0.061,
                               0.75,
                               0.0400,
                               0.80,
                               -0.5,
                               0.5,
                               "Table A.1, concrete box, 90 and 15 degree wingwall flares"};
    return {Section::box(2.134, 2.134), 1, 60.96, 0.05, 0.012, square_edge};
}

// The curve table prints EL to 0.01 m, read from the inlet control nomograph (Chart 8A), not
// computed. Our appendix A equations give 32.862, 33.960, 34.619, 35.380 and 35.799 m: 0.01 to
// 0.14 m from the printed values, up to 0.066 in HW/D, with no sign that one side is favoured.
// The tolerance, 0.07 D = 0.15 m, was set to cover these differences (a nomograph read to a
// few hundredths of HW/D: common practice, no source); it is not derived from the chart's
// scale, which we could not see. The neighbouring row of Table A.1 (0 degree flares, c 0.0423,
// Y 0.82) would move the submerged points up by 0.15 to 0.25 m (computed) and fail the check
// at 16.990 and 24.069 m3/s.
constexpr double nomograph_tol_m = 0.07 * 2.134;

struct CurveRow {
    double q_m3_s;      ///< culvert flow
    double tailwater_m; ///< the example's tailwater (interpolated by us where it gives none)
    double elevation_m; ///< EL, the published headwater elevation
};

TEST(Hds5Example4, ControllingHeadwaterOfTheCurveTable) {
    // HDS-5 (2001) Example Problem No. 4 (SI), performance curve table p. 65: culvert flow and
    // EL. The tailwater of 19.822 and 24.069 m3/s is not given; it is interpolated linearly
    // between the given flows (it enters only the outlet control headwater).
    const CurveRow rows[] = {{11.327, 0.793, 32.96},
                             {16.990, 0.945, 33.93},
                             {19.822, 0.945 + (1.158 - 0.945) * 0.5, 34.71},
                             {22.654, 1.158, 35.52},
                             {24.069, 1.158 + (1.250 - 1.158) * 0.25, 35.81}};
    for (const auto &row : rows) {
        const Site site{inlet_invert_m, row.tailwater_m, {std::nullopt, 10.0}};
        const auto r = analyse(example_box(), row.q_m3_s, site, System::si);
        const double controlling_el = inlet_invert_m + r.value.hw_m;
        EXPECT_NEAR(controlling_el, row.elevation_m, nomograph_tol_m) << "Q " << row.q_m3_s;
        // The published EL is the controlling headwater: no control may lie above it.
        EXPECT_LT(inlet_invert_m + r.value.outlet.hw_m, row.elevation_m + nomograph_tol_m)
            << "Q " << row.q_m3_s;
        EXPECT_LT(inlet_invert_m + r.value.inlet.hw_m, row.elevation_m + nomograph_tol_m)
            << "Q " << row.q_m3_s;
    }
}

// The road's share where the curve overtops: Qot = Cd L Ho^1.5 with Cd read from HDS-5 Figure
// III-11 (2.70 at the lower, 2.92 at the higher flow, kt = 1) and corrected for SI by 0.552, as
// the example prints beside the table (p. 65). Qot is printed to 0.1 m3/s (tolerance half a
// unit); Ho is printed to 0.01 m and used as printed (EL = crest + Ho).
TEST(Hds5Example4, FlowOverTheRoad) {
    constexpr double printed_tol_m3_s = 0.05;
    const RoadCrest low{road_crest_m, road_length_m, weir_coefficient_si_from_us(2.70)};
    EXPECT_NEAR(road_flow_m3_s(low, road_crest_m + 0.16), 5.8, printed_tol_m3_s);
    const RoadCrest high{road_crest_m, road_length_m, weir_coefficient_si_from_us(2.92)};
    EXPECT_NEAR(road_flow_m3_s(high, road_crest_m + 0.45), 29.7, printed_tol_m3_s);
    // The example's SI correction 0.552 is the units' factor 0.3048^0.5 to three digits.
    EXPECT_NEAR(weir_coefficient_si_from_us(1.0), 0.552, 0.0005);
    // Below the crest no flow goes over the road.
    EXPECT_EQ(road_flow_m3_s(low, road_crest_m - 0.2), 0.0);
}

} // namespace

// SPDX-License-Identifier: MIT
#include "../../src/report/internal/sheet_content.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/report/sheet.hpp"
#include "catchpeak/report/sheet_units.hpp"
#include "report/sample_results.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <string>
#include <vector>

namespace catchpeak::report {
namespace {

template <class B> std::vector<const B *> blocks_of(const SheetSection &s) {
    std::vector<const B *> out;
    for (const auto &b : s.blocks) {
        if (const auto *p = std::get_if<B>(&b)) {
            out.push_back(p);
        }
    }
    return out;
}

std::vector<std::string> headings(const SheetSection &s) {
    std::vector<std::string> out;
    for (const auto *h : blocks_of<HeadingBlock>(s)) {
        out.push_back(h->text);
    }
    for (const auto *c : blocks_of<ChartBlock>(s)) {
        out.push_back(c->title);
    }
    return out;
}

bool contains(const std::string &text, const std::string &part) {
    return text.find(part) != std::string::npos;
}

TEST(SheetContent, TheSnapOfADemPointIsListedWithItsCatchments) {
    auto r = test::sample_results(1, units::System::si);
    SnapFigures snap;
    snap.rule = SnapRule::largest_flow;
    snap.radius_m = 10.0;
    snap.given_cell_area_m2 = 1500.0;
    snap.snapped_area_m2 = 4967000.0;
    snap.min_area_within_radius_m2 = 100.0;
    snap.max_area_within_radius_m2 = 4967000.0;
    snap.direction = "north-east";
    r.points[0].snap = snap;
    const auto doc = sheet_content(r);
    const auto paragraphs = blocks_of<ParagraphBlock>(doc.sections[2]);
    ASSERT_FALSE(paragraphs.empty());
    const std::string &text = paragraphs[0]->markup;
    // Areas in ha to 4 significant figures, as the sheet prints areas.
    EXPECT_TRUE(contains(text, "to the north-east, to the cell of largest flow accumulation "
                               "within 10.00 m ([settings] snap = &quot;largest_flow&quot;)"))
        << text;
    EXPECT_TRUE(contains(text, "Catchment of the cell under the given point 0.1500 ha, of the "
                               "snapped cell 496.7 ha; within the snap radius smallest 0.01000 "
                               "ha, largest 496.7 ha."))
        << text;
    // A table catchment has no snap: the sentence is not there.
    const auto plain_doc = sheet_content(test::sample_results(1, units::System::si));
    const auto plain = blocks_of<ParagraphBlock>(plain_doc.sections[2]);
    ASSERT_FALSE(plain.empty());
    EXPECT_FALSE(contains(plain[0]->markup, "[settings] snap"));
}

TEST(SheetContent, SectionsInOrderCoverSummaryPointsReferences) {
    const auto r = test::sample_results(3, units::System::si, {5, 25});
    const auto doc = sheet_content(r);
    std::vector<std::string> titles;
    for (const auto &s : doc.sections) {
        titles.push_back(s.title);
    }
    EXPECT_EQ(titles,
              (std::vector<std::string>{"Cover", "Summary", "Design point DP1", "Design point DP2",
                                        "Design point DP3", "References"}));
    EXPECT_EQ(doc.system, units::System::si);
    EXPECT_EQ(doc.frame.project, "Sample business park, stage 2 (P-0417)");
    EXPECT_EQ(doc.frame.stamp, "catchpeak 0.1.0 · commit 0123456789ab · run 2026-12-02T10:15:00Z");
    EXPECT_EQ(doc.pdf.create_date, "2026-12-02T10:15:00Z");
}

TEST(SheetContent, CoverHasProjectStampInputsAndNumberedCautions) {
    const auto r = test::sample_results(1, units::System::us_customary);
    const auto cover = sheet_content(r).sections.front();
    const auto info = blocks_of<InfoWithSealBlock>(cover);
    ASSERT_EQ(info.size(), 1u);
    EXPECT_EQ(info[0]->items.front(),
              (std::pair<std::string, std::string>{"Project", r.project.name}));
    EXPECT_EQ(info[0]->items[7],
              (std::pair<std::string, std::string>{"Date of the run", "2026-12-02"}));
    const auto tables = blocks_of<TableBlock>(cover);
    ASSERT_EQ(tables.size(), 1u);
    ASSERT_EQ(tables[0]->rows.size(), r.stamp.inputs.size());
    EXPECT_EQ(tables[0]->rows[1].cells[2].markup, r.stamp.inputs[1].sha256);
    EXPECT_EQ(tables[0]->rows[1].cells[2].style, style::Style::mono);
    const auto lists = blocks_of<ListBlock>(cover);
    ASSERT_EQ(lists.size(), 1u);
    EXPECT_TRUE(lists[0]->numbered);
    EXPECT_EQ(lists[0]->items.size(), default_caution_notes().size());
    EXPECT_EQ(headings(cover), (std::vector<std::string>{"Stamp of the run", "Cautions"}));
}

TEST(SheetContent, SummaryHasOneRowPerPeakAndShadesPointsWithWarnings) {
    const auto r = test::sample_results(2, units::System::us_customary, {10, 100});
    const auto summary = sheet_content(r).sections[1];
    const auto tables = blocks_of<TableBlock>(summary);
    ASSERT_EQ(tables.size(), 1u);
    const auto &t = *tables[0];
    EXPECT_TRUE(contains(t.columns[1].title, "(acre)"));
    EXPECT_TRUE(contains(t.columns[5].title, "(cfs)"));
    std::size_t peaks = 0;
    for (const auto &p : r.points) {
        peaks += p.peaks.size();
    }
    ASSERT_EQ(t.rows.size(), peaks);
    // DP1 (3 peaks: two Rational, one hydrograph) has no warning; DP2 has one.
    const auto &first = t.rows[0];
    EXPECT_EQ(first.cells[0].markup, "<b>DP1</b>");
    EXPECT_EQ(first.cells[3].markup, "10-yr");
    EXPECT_EQ(first.cells[4].markup, "Rational Method");
    EXPECT_EQ(first.cells[5].markup,
              "<b>" +
                  sig(sheet_flow(r.points[0].peaks[0].q_m3_s, units::System::us_customary).value) +
                  "</b>");
    EXPECT_EQ(first.cells[6].markup, r.points[0].peaks[0].line_id);
    EXPECT_FALSE(first.fill.has_value());
    EXPECT_TRUE(contains(t.rows[1].cells[0].markup, "#888888")) << "repeated id in grey";
    EXPECT_EQ(t.rows[1].cells[1].markup, "");
    const auto &dp2 = t.rows[3];
    EXPECT_EQ(dp2.cells[0].markup, "<b>DP2</b>");
    ASSERT_TRUE(dp2.fill.has_value());
    EXPECT_TRUE(contains(dp2.cells[7].markup, "DP2-L3")); // the warning line
    EXPECT_TRUE(t.rows[4].fill.has_value());
}

TEST(SheetContent, DesignPointSectionGivesItsPartsInOrder) {
    const auto r = test::sample_results(2, units::System::si, {5, 25});
    const auto doc = sheet_content(r);
    // DP1: map, no warnings, a hydrograph for the last return period.
    const auto &dp1 = doc.sections[2];
    EXPECT_EQ(headings(dp1), (std::vector<std::string>{"Design point DP1", "Catchment",
                                                       "Land cover and soils", "Calculation",
                                                       "Hyetograph and hydrograph, 25-yr, SCS unit "
                                                       "hydrograph"}));
    EXPECT_TRUE(blocks_of<WarningsBlock>(dp1).empty());
    ASSERT_EQ(blocks_of<MapBlock>(dp1).size(), 1u);
    EXPECT_EQ(blocks_of<MapBlock>(dp1)[0]->map, &*r.points[0].map);
    // The map comes before the catchment's figures.
    std::size_t map_at = 0, catchment_at = 0;
    for (std::size_t i = 0; i < dp1.blocks.size(); ++i) {
        if (std::holds_alternative<MapBlock>(dp1.blocks[i])) {
            map_at = i;
        }
        if (const auto *h = std::get_if<HeadingBlock>(&dp1.blocks[i]);
            h != nullptr && h->text == "Catchment") {
            catchment_at = i;
        }
    }
    EXPECT_LT(map_at, catchment_at);
    // DP2: its warning in the box, before everything else but the heading and note.
    const auto &dp2 = doc.sections[3];
    const auto warnings = blocks_of<WarningsBlock>(dp2);
    ASSERT_EQ(warnings.size(), 1u);
    ASSERT_EQ(warnings[0]->items.size(), 1u);
    EXPECT_TRUE(contains(warnings[0]->items[0], "DP2-L3"));
    EXPECT_TRUE(contains(warnings[0]->title, "(1)"));
    EXPECT_TRUE(std::holds_alternative<WarningsBlock>(dp2.blocks[3]));
    // Figures: area in hectares, and the weighted land row shaded.
    const auto tables = blocks_of<TableBlock>(dp2);
    ASSERT_EQ(tables.size(), 3u); // figures, land, calculation lines
    EXPECT_EQ(tables[0]->rows[0].cells[0].markup, "Catchment area, A");
    EXPECT_TRUE(contains(tables[0]->rows[0].cells[1].markup, " ha"));
    EXPECT_EQ(tables[1]->rows.back().cells[0].markup, "<b>Area-weighted</b>");
    EXPECT_TRUE(tables[1]->rows.back().fill.has_value());
    EXPECT_EQ(tables[2]->rows.size(), r.points[1].lines.size());
}

TEST(SheetContent, CalculationRowShowsTheLinesFields) {
    CalcLines lines;
    lines.add(catchpeak::test::text_calc("Peak flow", "Q = C i A / 360", "Q = 0.45 x 80 x 12", 1.2,
                                         "m3/s", "Rational Method"));
    lines.add(catchpeak::test::text_warn("Catchment above the limit", "A = 250 ha is above 80 ha",
                                         "common practice"));
    lines.add(catchpeak::test::text_note("Catchment area", "from the DEM", "project input"));
    number_lines(lines, "DP9");
    const auto calc = calc_line_row(lines.lines()[0]);
    EXPECT_EQ(calc.cells[0].markup, "<b>DP9-L1</b>");
    EXPECT_EQ(calc.cells[1].markup, "<b>Peak flow</b>\nQ = C i A / 360\nQ = 0.45 x 80 x 12");
    EXPECT_EQ(calc.cells[2].markup, "<b>1.200</b> m3/s");
    EXPECT_EQ(calc.cells[3].markup, "Rational Method");
    EXPECT_FALSE(calc.fill.has_value());
    const auto warn = calc_line_row(lines.lines()[1]);
    EXPECT_EQ(warn.cells[1].markup,
              "<b>\u26a0 WARNING: Catchment above the limit</b>\nA = 250 ha is above 80 ha");
    EXPECT_EQ(warn.cells[2].markup, "");
    ASSERT_TRUE(warn.fill.has_value());
    const auto note = calc_line_row(lines.lines()[2]);
    EXPECT_EQ(note.cells[1].markup, "<i><b>Catchment area</b>\nfrom the DEM</i>");
    EXPECT_EQ(note.cells[2].markup, ""); // no value
}

// A design point with a culvert: its heading and description, one table row per flow checked
// (a failing one shaded and marked), and the performance curve's block pointing at it, all
// before the calculation lines.
TEST(SheetContent, CulvertTableAndCurveBeforeTheCalculation) {
    auto r = test::sample_results(1, units::System::si, {10, 100});
    CulvertResult c;
    c.shape = "box";
    c.barrels = 2;
    c.span_m = 1.5;
    c.rise_m = 1.2;
    c.sized = false;
    c.inlet = "box_wingwall_30_75";
    c.inlet_invert_m = 50.0;
    c.outlet_invert_m = 49.5;
    c.length_m = 30.0;
    c.crest_elevation_m = 52.5;
    CulvertCase ok;
    ok.return_period_yr = 10.0;
    ok.design = true;
    ok.flow_m3_s = ok.culvert_flow_m3_s = 3.0;
    ok.headwater_m = 1.8;
    ok.headwater_elevation_m = 51.8;
    ok.allowed_headwater_m = 2.4;
    ok.control = "inlet";
    ok.outlet_velocity_m_per_s = 2.5;
    ok.passes = true;
    ok.headwater_line_id = "DP1-L30";
    CulvertCase bad = ok;
    bad.return_period_yr = 100.0;
    bad.design = false;
    bad.flow_m3_s = 6.0;
    bad.overtopping_flow_m3_s = 0.5;
    bad.culvert_flow_m3_s = 5.5;
    bad.headwater_m = 2.7;
    bad.headwater_elevation_m = 52.7;
    bad.passes = false;
    bad.headwater_line_id = "DP1-L44";
    c.cases = {ok, bad};
    c.curve = {{0.0, 50.0, 0.0, 0.0, 0.0}, {6.0, 52.7, 2.7, 1.0, 0.5}};
    r.points[0].culvert = c;
    const auto doc = sheet_content(r);
    const auto &s = doc.sections[2];
    const auto h = headings(s);
    const auto at = [&](const std::string &t) { return std::find(h.begin(), h.end(), t); };
    ASSERT_NE(at("Culvert at design point DP1"), h.end());
    EXPECT_LT(at("Culvert at design point DP1"), at("Calculation"));
    const auto curves = blocks_of<CulvertCurveBlock>(s);
    ASSERT_EQ(curves.size(), 1U);
    EXPECT_EQ(curves[0]->culvert, &*r.points[0].culvert);
    EXPECT_EQ(curves[0]->title, "Culvert performance curve: headwater elevation against flow");
    const TableBlock *table = nullptr;
    for (const auto *t : blocks_of<TableBlock>(s)) {
        if (t->columns.size() == 11) {
            table = t;
        }
    }
    ASSERT_NE(table, nullptr);
    ASSERT_EQ(table->rows.size(), 2U);
    const auto &row = table->rows[0].cells;
    EXPECT_TRUE(contains(row[0].markup, "10-yr (design)"));
    EXPECT_EQ(row[1].markup, "3.000");
    EXPECT_TRUE(contains(row[4].markup, "51.800"));
    EXPECT_EQ(row[5].markup, "1.500");  // HW/D = 1.8/1.2
    EXPECT_EQ(row[8].markup, "52.400"); // 50.0 + 2.4
    EXPECT_EQ(row[9].markup, "passes");
    EXPECT_EQ(row[10].markup, "DP1-L30");
    EXPECT_FALSE(table->rows[0].fill);
    const auto &fails = table->rows[1].cells;
    EXPECT_EQ(fails[3].markup, "0.5000");
    EXPECT_TRUE(contains(fails[9].markup, "fails"));
    EXPECT_TRUE(table->rows[1].fill);
    bool described = false;
    for (const auto *p : blocks_of<ParagraphBlock>(s)) {
        described = described || (contains(p->markup, "2 barrels of 1500 x 1200 mm (size given)") &&
                                  contains(p->markup, "road crest 52.500 m"));
    }
    EXPECT_TRUE(described);
}

TEST(SheetContent, ReferencesOrAWordThatNoneWasUsed) {
    auto r = test::sample_results(1, units::System::si, {10});
    auto refs = sheet_content(r).sections.back();
    const auto lists = blocks_of<ListBlock>(refs);
    ASSERT_EQ(lists.size(), 1u);
    EXPECT_FALSE(lists[0]->numbered);
    ASSERT_EQ(lists[0]->items.size(), r.references.size());
    EXPECT_TRUE(contains(lists[0]->items[0], "<b>Kirpich (1940)</b>\n"));
    r.references.clear();
    refs = sheet_content(r).sections.back();
    EXPECT_TRUE(blocks_of<ListBlock>(refs).empty());
    ASSERT_EQ(blocks_of<ParagraphBlock>(refs).size(), 1u);
    EXPECT_EQ(blocks_of<ParagraphBlock>(refs)[0]->markup,
              "No published source was used by this run.");
}

} // namespace
} // namespace catchpeak::report

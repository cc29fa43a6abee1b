// SPDX-License-Identifier: MIT
#include "catchpeak/report/sheet.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/report/sheet_units.hpp"
#include "report/sample_results.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <chrono>
#include <cstdio>
#include <memory>
#include <sstream>
#include <thread>

// Under LeakSanitizer (asan preset): fontconfig keeps its font configuration in memory that it
// reaches only through pointers LeakSanitizer cannot follow, and never frees it while pango's
// default font map lives. Every leak reported in these tests comes from libfontconfig itself;
// leaks of our own code are still reported.
// Debian 12's cairo (1.16) also keeps two blocks allocated inside cairo_surface_finish when the
// PDF embeds a subset of a CJK font (IdsAndNamesInAnyScriptAreDrawnWithRealGlyphs); LeakSanitizer's
// fast unwinder stops inside libcairo, so only the library can name it. Cairo objects of ours
// left undestroyed are still caught by the other test programs that write sheets (app and cli).
extern "C" const char *__lsan_default_suppressions() {
    return "leak:libfontconfig.so\nleak:libcairo.so\n";
}

namespace catchpeak::report {
namespace {

/// Runs a command and returns what it printed on stdout.
std::string run(const std::string &command) {
    std::unique_ptr<FILE, int (*)(FILE *)> pipe(popen(command.c_str(), "r"), pclose);
    if (!pipe) {
        return {};
    }
    std::string out;
    std::array<char, 4096> buf{};
    std::size_t n = 0;
    while ((n = std::fread(buf.data(), 1, buf.size(), pipe.get())) > 0) {
        out.append(buf.data(), n);
    }
    return out;
}

/// Whitespace runs (line breaks of wrapped text included) folded to one space.
std::string fold(const std::string &text) {
    std::string out;
    bool space = false;
    for (char c : text) {
        if (c == ' ' || c == '\n' || c == '\t' || c == '\r' || c == '\f') {
            space = true;
        } else {
            if (space && !out.empty()) {
                out += ' ';
            }
            space = false;
            out += c;
        }
    }
    return out;
}

std::string pdf_text(const std::filesystem::path &pdf) {
    return run("pdftotext -enc UTF-8 '" + pdf.string() + "' -");
}

std::size_t pdf_pages(const std::filesystem::path &pdf) {
    std::istringstream info(run("pdfinfo '" + pdf.string() + "'"));
    std::string line;
    while (std::getline(info, line)) {
        if (line.rfind("Pages:", 0) == 0) {
            return static_cast<std::size_t>(std::stoul(line.substr(6)));
        }
    }
    return 0;
}

void check_sheet(const RunResults &r, const std::filesystem::path &pdf, std::size_t pages) {
    ASSERT_TRUE(std::filesystem::exists(pdf));
    EXPECT_TRUE(test::pending_files(pdf.parent_path()).empty());
    EXPECT_EQ(pdf_pages(pdf), pages);
    const auto text = fold(pdf_text(pdf));
    ASSERT_FALSE(text.empty()) << "pdftotext gave nothing";
    for (const auto &p : r.points) {
        EXPECT_NE(text.find("Design point " + p.id), std::string::npos) << p.id;
        for (const auto &pk : p.peaks) {
            // The peak flow as the sheet shows it: the project's units, 4 significant figures.
            const auto q = sig(sheet_flow(pk.q_m3_s, r.project.units).value);
            EXPECT_NE(text.find(q), std::string::npos) << p.id << " " << q;
        }
        for (const auto &l : p.lines.lines()) {
            EXPECT_NE(text.find(l.id), std::string::npos) << l.id;
        }
    }
    const auto &notes = r.caution_notes.empty() ? default_caution_notes() : r.caution_notes;
    for (const auto &note : notes) {
        EXPECT_NE(text.find(fold(note)), std::string::npos) << note;
    }
    for (const auto &in : r.stamp.inputs) {
        EXPECT_NE(text.find(in.sha256), std::string::npos) << in.role;
    }
    for (const auto &ref : r.references) {
        EXPECT_NE(text.find(fold(ref.citation)), std::string::npos) << ref.key;
    }
    EXPECT_NE(text.find(r.project.name), std::string::npos);
    EXPECT_NE(text.find("sheet 1 of " + std::to_string(pages)), std::string::npos);
    EXPECT_NE(text.find("sheet " + std::to_string(pages) + " of " + std::to_string(pages)),
              std::string::npos);
    EXPECT_NE(text.find("catchpeak " + r.stamp.tool_version + " · commit " + r.stamp.git_commit),
              std::string::npos);

    // Every font embedded (pdffonts: the "emb" column is "yes"), and it is DejaVu Sans.
    std::istringstream fonts(run("pdffonts '" + pdf.string() + "'"));
    std::string line;
    std::getline(fonts, line); // header
    std::getline(fonts, line); // dashes
    std::size_t count = 0;
    bool dejavu = false;
    while (std::getline(fonts, line)) {
        if (line.empty()) {
            continue;
        }
        ++count;
        dejavu = dejavu || line.find("DejaVuSans") != std::string::npos;
        std::istringstream cols(line);
        std::vector<std::string> words;
        for (std::string w; cols >> w;) {
            words.push_back(w);
        }
        // name type [type2] encoding emb sub uni object ID: emb is the 5th field from the end.
        ASSERT_GE(words.size(), 7u) << line;
        EXPECT_EQ(words[words.size() - 5], "yes") << line;
    }
    EXPECT_GT(count, 0u);
    EXPECT_TRUE(dejavu);
}

TEST(Sheet, UsCustomarySheetHoldsEveryPointPeakAndCaution) {
    const auto r = test::sample_results(3, units::System::us_customary);
    const auto dir = test::scratch_dir("sheet_us");
    const auto pdf = dir / "calculation-sheet.pdf";
    const auto pages = write_sheet_pdf(r, pdf);
    EXPECT_GE(pages, 6u); // cover, summary, one or more per point, references
    check_sheet(r, pdf, pages);
    // Letter, as a US customary project defaults to: 612 x 792 pt.
    EXPECT_NE(run("pdfinfo '" + pdf.string() + "'").find("612 x 792 pts"), std::string::npos);
}

TEST(Sheet, MapGridIsLabelledInTheUnitOfTheDemsCrs) {
    // A DEM in US survey feet (1 ftUS = 1200/3937 m exactly, NIST SP 811 / the 1959 notice):
    // the catchment lies around E 1,000,000 ftUS, N 500,000 ftUS, given here in metres as the
    // program keeps coordinates inside.
    constexpr double ft_us = 1200.0 / 3937.0;
    auto r = test::sample_results(1, units::System::us_customary, {10});
    r.points[0].map = test::sample_map(1.0e6 * ft_us, 5.0e5 * ft_us, 100.0, false);
    r.points[0].map->crs_unit = "US survey foot";
    r.points[0].map->crs_unit_m = ft_us;
    const auto dir = test::scratch_dir("sheet_map_feet");
    const auto pdf = dir / "calculation-sheet.pdf";
    (void)write_sheet_pdf(r, pdf);
    const auto text = fold(pdf_text(pdf));
    EXPECT_NE(text.find("Grid coordinates in US survey feet"), std::string::npos);
    // 1,000,000 is a multiple of any grid step the map can choose, so it is an easting label.
    EXPECT_NE(text.find("1000000"), std::string::npos) << text.substr(0, 3000);
    EXPECT_EQ(text.find("304800"), std::string::npos) << "an easting labelled in metres";
}

TEST(Sheet, SiSheetOnA4WithOwnCautionNotes) {
    auto r = test::sample_results(2, units::System::si, {5, 25});
    r.caution_notes = {"Invented caution note number one, long enough to wrap across the width "
                       "of the page so that the check sees wrapped text as well as short text.",
                       "Second note & <markup> characters are shown as typed."};
    const auto dir = test::scratch_dir("sheet_si");
    const auto pdf = dir / "calculation-sheet.pdf";
    const auto pages = write_sheet_pdf(r, pdf);
    check_sheet(r, pdf, pages);
    EXPECT_NE(run("pdfinfo '" + pdf.string() + "'").find("595.276 x 841.89 pts"),
              std::string::npos);
}

TEST(Sheet, LongTextWrapsAndContinuesAcrossPages) {
    auto r = test::sample_results(1, units::System::si, {2}, false);
    auto &lines = r.points[0].lines;
    for (int k = 0; k < 80; ++k) {
        lines.add(catchpeak::test::text_calc(
            "A long label that has to wrap inside its column of the calculation table "
            "because it says a lot",
            "Q = C i A / 360 with a deliberately_long_symbol_name_without_any_spaces_at_all",
            "Q = 0.4500 x 123.4 x 5.678", 0.1 * k, "m3/s",
            "A source with a long citation, chapter 3, equation 3-14, table 3-2"));
    }
    number_lines(lines, r.points[0].id);
    const auto dir = test::scratch_dir("sheet_long");
    const auto pdf = dir / "calculation-sheet.pdf";
    const auto pages = write_sheet_pdf(r, pdf);
    EXPECT_GE(pages, 5u); // 80 wrapped lines do not fit on one page
    check_sheet(r, pdf, pages);
    EXPECT_NE(fold(pdf_text(pdf)).find("Design point DP1 (continued)"), std::string::npos);
}

TEST(Sheet, SameResultsGiveTheSamePdfBytes) {
    // The PDF carries the time of the run as its creation date, not the time it was written,
    // so a sheet can be compared byte for byte with the one a checker regenerates.
    const auto r = test::sample_results(2, units::System::si, {10, 100}, true);
    const auto dir = test::scratch_dir("sheet_bytes");
    (void)write_sheet_pdf(r, dir / "a.pdf");
    std::this_thread::sleep_for(std::chrono::milliseconds(1100)); // a different wall-clock second
    (void)write_sheet_pdf(r, dir / "b.pdf");
    const auto a = read_text_file(dir / "a.pdf");
    EXPECT_FALSE(a.empty());
    EXPECT_TRUE(a == read_text_file(dir / "b.pdf")) << "the two PDFs differ";
    const auto info = run("pdfinfo '" + (dir / "a.pdf").string() + "'");
    EXPECT_NE(info.find(r.stamp.run_time_utc.substr(0, 4)), std::string::npos) << info;
}

/// The font names pdffonts lists for a PDF (first column, subset prefix "ABCDEF+" dropped).
std::vector<std::string> pdf_font_names(const std::filesystem::path &pdf) {
    std::istringstream fonts(run("pdffonts '" + pdf.string() + "'"));
    std::vector<std::string> names;
    std::string line;
    std::getline(fonts, line); // header
    std::getline(fonts, line); // dashes
    while (std::getline(fonts, line)) {
        std::istringstream cols(line);
        std::string name;
        if (cols >> name) {
            const auto plus = name.find('+');
            names.push_back(plus == std::string::npos ? name : name.substr(plus + 1));
        }
    }
    return names;
}

TEST(Sheet, IdsAndNamesInAnyScriptAreDrawnWithRealGlyphs) {
    // A design point id in CJK ideographs and a project name in Hangul: DejaVu Sans has no
    // glyph for either, so the sheet's font list must fall back to a font that has them. A
    // character without a glyph is drawn as a box (pango's hex box), which carries no text:
    // pdftotext then does not find the id, and no CJK font is embedded.
    auto r = test::sample_results(1, units::System::si, {10}, false);
    const std::string id = "\u6392\u6c34\u53e3-7";        // three ideographs, "-7"
    const std::string name = "\ubc30\uc218 \uacc4\ud68d"; // Hangul syllables
    r.points[0].id = id;
    r.project.name = name;
    const auto dir = test::scratch_dir("sheet_scripts");
    const auto pdf = dir / "calculation-sheet.pdf";
    (void)write_sheet_pdf(r, pdf);
    const auto text = fold(pdf_text(pdf));
    EXPECT_NE(text.find("Design point " + id), std::string::npos) << text.substr(0, 2000);
    EXPECT_NE(text.find(name), std::string::npos) << text.substr(0, 2000);
    const auto names = pdf_font_names(pdf);
    EXPECT_TRUE(std::any_of(names.begin(), names.end(), [](const std::string &n) {
        return n.find("CJK") != std::string::npos;
    })) << "no CJK font embedded";
}

TEST(Sheet, PageSize) {
    ProjectInfo p;
    p.units = units::System::si;
    EXPECT_EQ(page_size_for(p), PageSize::a4);
    p.units = units::System::us_customary;
    EXPECT_EQ(page_size_for(p), PageSize::letter);
    p.page_size = PageSize::a4; // a size given wins over the unit system's
    EXPECT_EQ(page_size_for(p), PageSize::a4);
}

TEST(Sheet, DefaultCautionNotesNameTheEngineerAndTheLocalCode) {
    std::string all;
    for (const auto &n : default_caution_notes()) {
        all += n + "\n";
    }
    EXPECT_NE(all.find("licensed professional engineer"), std::string::npos);
    EXPECT_NE(all.find("local drainage code"), std::string::npos);
    EXPECT_NE(all.find("limits of applicability"), std::string::npos);
}

} // namespace
} // namespace catchpeak::report

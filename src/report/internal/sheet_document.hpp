// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/units.hpp"
#include "catchpeak/report/results.hpp"
#include "page_layout.hpp"
#include "sheet_style.hpp"

#include <string>
#include <utility>
#include <variant>
#include <vector>

/// The calculation sheet as data: sections of blocks, in the order they are printed, with
/// their words already chosen (pango markup where a block says so). `sheet_content` builds it
/// from the run's results; `render_sheet` lays it out on pages. Internal to `report`.
namespace catchpeak::report {

/// A heading in the accent colour.
struct HeadingBlock {
    std::string text; ///< plain text
    style::Style style = style::Style::heading;
};

/// A paragraph across the content width.
struct ParagraphBlock {
    std::string markup;
    style::Style style = style::Style::body;
    style::Rgb color = style::black;
};

/// Vertical space (negative: pulls the next block up).
struct SpaceBlock {
    double dy_pt = 0.0;
};

/// A table; its columns' widths are nominal and scaled to fill the content width.
struct TableBlock {
    std::vector<Column> columns;
    std::vector<Row> rows;
};

/// The cover's first lines: the document's name, then the project's.
struct CoverTitleBlock {
    std::string kicker; ///< plain text
    std::string title;  ///< plain text
};

/// Project information (key, value as plain text; an empty value shows "-") with the empty
/// box for the engineer's seal beside it.
struct InfoWithSealBlock {
    std::vector<std::pair<std::string, std::string>> items;
    std::string seal_caption;
};

/// Short key and value pairs, plain text, one a line.
struct KeyValuesBlock {
    std::vector<std::pair<std::string, std::string>> items;
};

/// Paragraphs (markup) one after the other, numbered 1., 2., ... or indented.
struct ListBlock {
    std::vector<std::string> items;
    bool numbered = false;
};

/// The shaded box of a design point's warnings; a long list continues on the next page.
struct WarningsBlock {
    std::string title;              ///< markup
    std::vector<std::string> items; ///< markup
};

/// The map of one design point. Points into the results the document was built from.
struct MapBlock {
    const MapData *map = nullptr;
    std::string point_id;
};

/// Hyetograph and hydrograph of one peak, under its heading. Points into the results.
struct ChartBlock {
    std::string title; ///< plain text
    const Hydrograph *hydrograph = nullptr;
    std::string point_id;
};

/// The performance curve of a culvert, under its heading. Points into the results.
struct CulvertCurveBlock {
    std::string title; ///< plain text
    const CulvertResult *culvert = nullptr;
};

using SheetBlock = std::variant<HeadingBlock, ParagraphBlock, SpaceBlock, TableBlock,
                                CoverTitleBlock, InfoWithSealBlock, KeyValuesBlock, ListBlock,
                                WarningsBlock, MapBlock, ChartBlock, CulvertCurveBlock>;

/// A section starts on a new page; its title is shown in the page header.
struct SheetSection {
    std::string title;
    std::vector<SheetBlock> blocks;
};

struct SheetDocument {
    std::vector<SheetSection> sections;
    units::System system = units::System::si; ///< of the values the maps and charts show
    PdfInfo pdf;
    PageFrameText frame;
};

} // namespace catchpeak::report

// SPDX-License-Identifier: MIT
#pragma once

#include "cairo_handles.hpp"
#include "catchpeak/report/sheet.hpp"
#include "sheet_style.hpp"

#include <array>
#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

/// The sheet's page-layout engine: text flowing down pages of a fixed size, page breaks that
/// continue a section ("... (continued)"), tables that repeat their header on a new page, and
/// the page header and footer drawn on every page when the PDF is written. Pages are kept as
/// cairo recording surfaces until then, so that the footer can say "sheet n of N". Knows
/// nothing of what the sheet says. Internal to `report`.
namespace catchpeak::report {

/// Text escaped for pango markup.
[[nodiscard]] std::string esc(std::string_view text);
/// Escaped text in bold markup.
[[nodiscard]] std::string bold(std::string_view text);

void set_rgb(cairo_t *cr, style::Rgb c);

struct Column {
    std::string title; ///< markup
    double width_pt;
    PangoAlignment align = PANGO_ALIGN_LEFT;
};

struct Cell {
    std::string markup;
    style::Style style = style::Style::body;
};

struct Row {
    std::vector<Cell> cells;
    std::optional<style::Rgb> fill;
};

/// Metadata of the PDF file.
struct PdfInfo {
    std::string title;
    std::string creator;
    std::string create_date; ///< ISO 8601; empty: cairo's own (the wall clock)
};

/// What the header and footer of every page say besides the section and "sheet n of N".
struct PageFrameText {
    std::string project; ///< header, left, bold
    std::string stamp;   ///< footer, left
};

class PageLayout {
  public:
    explicit PageLayout(PageSize size);

    // ----- geometry, in points from the top-left corner of the page --------------------------
    [[nodiscard]] double page_w() const { return page_w_; }
    [[nodiscard]] double page_h() const { return page_h_; }
    [[nodiscard]] double left() const { return style::margin_pt; }
    [[nodiscard]] double content_w() const { return content_w_; }
    [[nodiscard]] double top() const { return top_; }       ///< top of the content
    [[nodiscard]] double bottom() const { return bottom_; } ///< bottom of the content
    /// Where the next block goes on the current page.
    [[nodiscard]] double y() const { return y_; }
    void advance(double dy_pt) { y_ += dy_pt; }
    void set_y(double y_pt) { y_ = y_pt; }

    // ----- pages -----------------------------------------------------------------------------
    /// Starts a page of the section `section` (shown in the page header), at the top.
    void new_page(std::string section);
    /// Starts a new page (continuing the section) unless `height_pt` fits below y, or y is at
    /// the top of a page already. Returns true when a page was started.
    bool ensure(double height_pt);
    [[nodiscard]] std::size_t page_count() const { return pages_.size(); }
    [[nodiscard]] const std::string &page_section(std::size_t i) const {
        return pages_.at(i).section;
    }
    /// The recording surface of page `i` (until the PDF is written).
    [[nodiscard]] cairo_surface_t *page_surface(std::size_t i) const {
        return pages_.at(i).surface.get();
    }
    /// The drawing context of the current page.
    [[nodiscard]] cairo_t *cr() const { return cr_.get(); }

    // ----- text ------------------------------------------------------------------------------
    /// The shared layout, set up for `markup`; width <= 0 means no wrapping.
    PangoLayout *lay(const std::string &markup, style::Style st, double width_pt,
                     PangoAlignment align = PANGO_ALIGN_LEFT) const;
    [[nodiscard]] double measure(const std::string &markup, style::Style st, double width_pt) const;
    [[nodiscard]] double text_width(const std::string &markup, style::Style st) const;
    /// Draws markup with its top-left corner at (x, y); returns its height.
    double draw_text(double x, double y, const std::string &markup, style::Style st,
                     double width_pt, style::Rgb color = style::black,
                     PangoAlignment align = PANGO_ALIGN_LEFT) const;
    /// A wrapped paragraph across the content width (less `indent_pt`) at y; moves y below it.
    void paragraph(const std::string &markup, style::Style st = style::Style::body,
                   style::Rgb color = style::black, double indent_pt = 0.0);
    /// A heading in the accent colour, kept on one page with room for what follows: at least
    /// `style::heading_keep_pt`, or `keep_pt` when larger (the start of the table after it).
    void heading(const std::string &text, style::Style st = style::Style::heading,
                 double keep_pt = 0.0);
    void rule(double x0, double x1, double y, style::Rgb color, double width_pt) const;

    // ----- tables ----------------------------------------------------------------------------
    /// Columns scaled so that they fill the content width.
    [[nodiscard]] std::vector<Column> fit(std::vector<Column> cols) const;
    [[nodiscard]] double row_height(const std::vector<Column> &cols, const Row &row) const;
    /// A table at y that continues across pages, repeating its header. A table shorter than
    /// `style::keep_whole_table_share` of the content height is kept whole on one page.
    void table(const std::vector<Column> &cols, const std::vector<Row> &rows);
    /// The height `table` keeps together at its start: the whole table when it is short, else
    /// its header and first row.
    [[nodiscard]] double table_start_h(const std::vector<Column> &cols,
                                       const std::vector<Row> &rows) const;

    // ----- output ----------------------------------------------------------------------------
    /// Writes every page, with its header and footer, to `file` (under a temporary name,
    /// renamed when complete). Returns the number of pages. The pages are gone afterwards.
    std::size_t write_pdf(const std::filesystem::path &file, const PdfInfo &info,
                          const PageFrameText &frame);

  private:
    struct Page {
        SurfacePtr surface;
        std::string section;
    };

    [[nodiscard]] std::string continued_title() const;
    void table_header(const std::vector<Column> &cols);
    void draw_row(const std::vector<Column> &cols, const Row &row, double h, bool header);
    void header_footer(const PageFrameText &frame, const std::string &section, std::size_t page,
                       std::size_t pages) const;

    double page_w_ = 0.0, page_h_ = 0.0, content_w_ = 0.0, top_ = 0.0, bottom_ = 0.0;
    double y_ = 0.0;
    std::string section_;
    ContextPtr context_;
    LayoutPtr layout_;
    std::array<FontDescPtr, style::font_descriptions.size()> fonts_;
    std::vector<Page> pages_;
    CairoPtr cr_;
};

} // namespace catchpeak::report

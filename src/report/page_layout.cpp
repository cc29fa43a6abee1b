// SPDX-License-Identifier: MIT
#include "internal/page_layout.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"

#include <cairo-pdf.h>
#include <fmt/format.h>

#include <algorithm>
#include <utility>

namespace catchpeak::report {

using style::Rgb;
using style::Style;

std::string esc(std::string_view text) {
    gchar *e = g_markup_escape_text(text.data(), static_cast<gssize>(text.size()));
    std::string out(e);
    g_free(e);
    return out;
}

std::string bold(std::string_view text) { return "<b>" + esc(text) + "</b>"; }

void set_rgb(cairo_t *cr, Rgb c) { cairo_set_source_rgb(cr, c.r, c.g, c.b); }

namespace {

double height_of(PangoLayout *l) {
    int w = 0, h = 0;
    pango_layout_get_size(l, &w, &h);
    return static_cast<double>(h) / PANGO_SCALE;
}

double width_of(PangoLayout *l) {
    int w = 0, h = 0;
    pango_layout_get_size(l, &w, &h);
    return static_cast<double>(w) / PANGO_SCALE;
}

/// The width of a cell's text: the column less its padding, and less a wider gap to the next
/// column when the cell is right-aligned.
double cell_text_w(const Column &col) {
    const double right_gap = col.align == PANGO_ALIGN_RIGHT ? style::right_cell_gap_pt : 0.0;
    return col.width_pt - 2.0 * style::cell_pad_pt - right_gap;
}

Row header_row(const std::vector<Column> &cols) {
    Row head;
    for (const auto &c : cols) {
        head.cells.push_back({c.title, Style::small});
    }
    head.fill = style::header_fill;
    return head;
}

} // namespace

PageLayout::PageLayout(PageSize size) {
    page_w_ = size == PageSize::letter ? style::letter_w_pt : style::a4_w_pt;
    page_h_ = size == PageSize::letter ? style::letter_h_pt : style::a4_h_pt;
    content_w_ = page_w_ - 2.0 * style::margin_pt;
    top_ = style::margin_pt + style::header_h_pt;
    bottom_ = page_h_ - style::margin_pt - style::footer_h_pt;

    // One pango context at 72 dpi, so that a point of text is a point of the page, without
    // hinting, so that the layout does not depend on the surface.
    context_.reset(pango_font_map_create_context(pango_cairo_font_map_get_default()));
    pango_cairo_context_set_resolution(context_.get(), style::text_dpi);
    FontOptionsPtr fo(cairo_font_options_create());
    cairo_font_options_set_hint_metrics(fo.get(), CAIRO_HINT_METRICS_OFF);
    cairo_font_options_set_hint_style(fo.get(), CAIRO_HINT_STYLE_NONE);
    pango_cairo_context_set_font_options(context_.get(), fo.get());
    pango_context_set_round_glyph_positions(context_.get(), FALSE);
    layout_.reset(pango_layout_new(context_.get()));
    pango_layout_set_wrap(layout_.get(), PANGO_WRAP_WORD_CHAR);
    for (std::size_t i = 0; i < style::font_descriptions.size(); ++i) {
        fonts_[i].reset(pango_font_description_from_string(style::font_descriptions[i]));
    }
}

// ----- pages ------------------------------------------------------------------------------------

void PageLayout::new_page(std::string section) {
    cr_.reset();
    section_ = std::move(section);
    cairo_rectangle_t extents{0.0, 0.0, page_w_, page_h_};
    SurfacePtr rec(cairo_recording_surface_create(CAIRO_CONTENT_COLOR_ALPHA, &extents));
    cr_.reset(cairo_create(rec.get()));
    pages_.push_back({std::move(rec), section_});
    y_ = top_;
}

bool PageLayout::ensure(double height_pt) {
    if (y_ + height_pt <= bottom_ || y_ <= top_ + 0.5) {
        return false;
    }
    new_page(continued_title());
    return true;
}

std::string PageLayout::continued_title() const {
    const auto base = section_.substr(0, section_.find(" (continued)"));
    return base + " (continued)";
}

// ----- text -------------------------------------------------------------------------------------

PangoLayout *PageLayout::lay(const std::string &markup, Style st, double width_pt,
                             PangoAlignment align) const {
    PangoLayout *l = layout_.get();
    pango_layout_set_font_description(l, fonts_[static_cast<std::size_t>(st)].get());
    pango_layout_set_width(l, width_pt > 0.0 ? static_cast<int>(width_pt * PANGO_SCALE) : -1);
    pango_layout_set_alignment(l, align);
    pango_layout_set_markup(l, markup.c_str(), -1);
    return l;
}

double PageLayout::measure(const std::string &markup, Style st, double width_pt) const {
    return height_of(lay(markup, st, width_pt));
}

double PageLayout::text_width(const std::string &markup, Style st) const {
    return width_of(lay(markup, st, -1.0));
}

double PageLayout::draw_text(double x, double y, const std::string &markup, Style st,
                             double width_pt, Rgb color, PangoAlignment align) const {
    PangoLayout *l = lay(markup, st, width_pt, align);
    set_rgb(cr(), color);
    cairo_move_to(cr(), x, y);
    pango_cairo_show_layout(cr(), l);
    cairo_new_path(cr()); // no current point left behind for the next path
    return height_of(l);
}

void PageLayout::paragraph(const std::string &markup, Style st, Rgb color, double indent_pt) {
    const double h = measure(markup, st, content_w_ - indent_pt);
    ensure(h);
    draw_text(style::margin_pt + indent_pt, y_, markup, st, content_w_ - indent_pt, color);
    y_ += h;
}

void PageLayout::heading(const std::string &text, Style st, double keep_pt) {
    const double h = measure(esc(text), st, content_w_);
    ensure(h + std::max(keep_pt + 2.0 * style::heading_pad_pt, style::heading_keep_pt));
    y_ += style::heading_pad_pt;
    draw_text(style::margin_pt, y_, esc(text), st, content_w_, style::accent);
    y_ += h + style::heading_pad_pt;
}

void PageLayout::rule(double x0, double x1, double y, Rgb color, double width_pt) const {
    set_rgb(cr(), color);
    cairo_set_line_width(cr(), width_pt);
    cairo_move_to(cr(), x0, y);
    cairo_line_to(cr(), x1, y);
    cairo_stroke(cr());
}

// ----- tables -----------------------------------------------------------------------------------

std::vector<Column> PageLayout::fit(std::vector<Column> cols) const {
    double total = 0.0;
    for (const auto &c : cols) {
        total += c.width_pt;
    }
    for (auto &c : cols) {
        c.width_pt *= content_w_ / total;
    }
    return cols;
}

double PageLayout::row_height(const std::vector<Column> &cols, const Row &row) const {
    double h = 0.0;
    for (std::size_t i = 0; i < cols.size() && i < row.cells.size(); ++i) {
        h = std::max(h, measure(row.cells[i].markup, row.cells[i].style, cell_text_w(cols[i])));
    }
    return h + 2.0 * style::cell_pad_pt;
}

void PageLayout::table_header(const std::vector<Column> &cols) {
    const Row head = header_row(cols);
    draw_row(cols, head, row_height(cols, head), true);
}

void PageLayout::draw_row(const std::vector<Column> &cols, const Row &row, double h, bool header) {
    double x = style::margin_pt;
    double total_w = 0.0;
    for (const auto &c : cols) {
        total_w += c.width_pt;
    }
    if (row.fill) {
        set_rgb(cr(), *row.fill);
        cairo_rectangle(cr(), x, y_, total_w, h);
        cairo_fill(cr());
    }
    for (std::size_t i = 0; i < cols.size() && i < row.cells.size(); ++i) {
        draw_text(x + style::cell_pad_pt, y_ + style::cell_pad_pt, row.cells[i].markup,
                  row.cells[i].style, cell_text_w(cols[i]), style::black, cols[i].align);
        x += cols[i].width_pt;
    }
    y_ += h;
    rule(style::margin_pt, style::margin_pt + total_w, y_,
         header ? style::dark_grey : style::rule_grey,
         header ? style::head_rule_w_pt : style::row_rule_w_pt);
}

double PageLayout::table_start_h(const std::vector<Column> &cols,
                                 const std::vector<Row> &rows) const {
    const double head_h = row_height(cols, header_row(cols));
    // A short table is kept whole on one page; a long one starts with at least one row.
    double total_h = head_h;
    for (const auto &row : rows) {
        total_h += row_height(cols, row);
        if (total_h >= style::keep_whole_table_share * (bottom_ - top_)) {
            return head_h + (rows.empty() ? 0.0 : row_height(cols, rows.front()));
        }
    }
    return total_h;
}

void PageLayout::table(const std::vector<Column> &cols, const std::vector<Row> &rows) {
    std::vector<double> heights;
    heights.reserve(rows.size());
    for (const auto &row : rows) {
        heights.push_back(row_height(cols, row));
    }
    ensure(table_start_h(cols, rows));
    table_header(cols);
    for (std::size_t i = 0; i < rows.size(); ++i) {
        if (ensure(heights[i])) {
            table_header(cols);
        }
        draw_row(cols, rows[i], heights[i], false);
    }
    y_ += style::table_gap_after_pt;
}

// ----- output -----------------------------------------------------------------------------------

std::size_t PageLayout::write_pdf(const std::filesystem::path &file, const PdfInfo &info,
                                  const PageFrameText &frame) {
    cr_.reset();
    PendingFile pending(file);
    SurfacePtr pdf(cairo_pdf_surface_create(pending.temp_path().c_str(), page_w_, page_h_));
    if (cairo_surface_status(pdf.get()) != CAIRO_STATUS_SUCCESS) {
        throw_input_error(file.string(), "cannot open the file for writing",
                          "a writable output folder");
    }
    cairo_pdf_surface_set_metadata(pdf.get(), CAIRO_PDF_METADATA_TITLE, info.title.c_str());
    cairo_pdf_surface_set_metadata(pdf.get(), CAIRO_PDF_METADATA_CREATOR, info.creator.c_str());
    if (!info.create_date.empty()) {
        cairo_pdf_surface_set_metadata(pdf.get(), CAIRO_PDF_METADATA_CREATE_DATE,
                                       info.create_date.c_str());
    }
    const std::size_t n = pages_.size();
    {
        CairoPtr c(cairo_create(pdf.get()));
        for (std::size_t i = 0; i < n; ++i) {
            cairo_set_source_surface(c.get(), pages_[i].surface.get(), 0.0, 0.0);
            cairo_paint(c.get());
            cr_.reset(cairo_reference(c.get()));
            header_footer(frame, pages_[i].section, i + 1, n);
            cr_.reset();
            cairo_show_page(c.get());
            pages_[i].surface.reset(); // free as we go
        }
    }
    pages_.clear();
    cairo_surface_finish(pdf.get());
    const auto status = cairo_surface_status(pdf.get());
    pdf.reset();
    if (status != CAIRO_STATUS_SUCCESS) {
        throw_input_error(file.string(),
                          std::string("writing the PDF failed: ") + cairo_status_to_string(status),
                          "a writable output folder with free space");
    }
    pending.commit();
    return n;
}

void PageLayout::header_footer(const PageFrameText &frame, const std::string &section,
                               std::size_t page, std::size_t pages) const {
    using namespace style;
    const double half = content_w_ / 2.0;
    draw_text(margin_pt, margin_pt, bold(frame.project), Style::small, half - header_gap_pt,
              accent);
    draw_text(margin_pt + half + header_gap_pt, margin_pt, esc(section), Style::small,
              half - header_gap_pt, dark_grey, PANGO_ALIGN_RIGHT);
    rule(margin_pt, margin_pt + content_w_, margin_pt + header_h_pt - header_rule_up_pt, accent,
         header_rule_w_pt);
    const double fy = page_h_ - margin_pt - footer_h_pt + footer_rule_down_pt;
    rule(margin_pt, margin_pt + content_w_, fy, rule_grey, footer_rule_w_pt);
    const std::string sheet = fmt::format("sheet {} of {}", page, pages);
    draw_text(margin_pt, fy + footer_stamp_dy_pt, esc(frame.stamp), Style::tiny,
              content_w_ - footer_sheet_w_pt, dark_grey);
    draw_text(margin_pt + content_w_ - footer_sheet_w_pt, fy + footer_sheet_dy_pt, bold(sheet),
              Style::small, footer_sheet_w_pt, black, PANGO_ALIGN_RIGHT);
}

} // namespace catchpeak::report

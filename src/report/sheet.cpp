// SPDX-License-Identifier: MIT
#include "catchpeak/report/sheet.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/report/sheet_units.hpp"

#include <cairo-pdf.h>
#include <cairo.h>
#include <fmt/format.h>
#include <pango/pangocairo.h>

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <limits>
#include <memory>
#include <numbers>
#include <optional>
#include <utility>

namespace catchpeak::report {

const std::vector<std::string> &default_caution_notes() {
    static const std::vector<std::string> notes = {
        "Every method on this sheet holds only within its limits of applicability (catchment "
        "size, time of concentration, slopes, curve numbers and rainfall as its source states). "
        "A value outside a limit is shown as a warning line; a peak flow with warnings must not be "
        "used without the engineer's judgement.",
        "These results are computed by a program from the inputs listed in the stamp. They must "
        "be reviewed, checked and accepted by a licensed professional engineer before they are "
        "used to size any drainage structure.",
        "The local drainage code and the criteria of the reviewing agency govern over the methods, "
        "tables and defaults used here.",
        "Catchments drawn from a digital elevation model follow the terrain of that model; roads, "
        "culverts, inlets and storm drains that the model does not show can change them. Check "
        "every catchment in the field or on survey.",
    };
    return notes;
}

PageSize page_size_for(const ProjectInfo &project) {
    return project.page_size.value_or(
        project.units == units::System::us_customary ? PageSize::letter : PageSize::a4);
}

namespace {

// ---------------------------------------------------------------------------------------------
// Owning wrappers of cairo, pango and glib handles.

struct SurfaceDeleter {
    void operator()(cairo_surface_t *s) const noexcept { cairo_surface_destroy(s); }
};
struct CairoDeleter {
    void operator()(cairo_t *c) const noexcept { cairo_destroy(c); }
};
struct GObjectDeleter {
    void operator()(void *o) const noexcept { g_object_unref(o); }
};
struct FontDescDeleter {
    void operator()(PangoFontDescription *d) const noexcept { pango_font_description_free(d); }
};
struct FontOptionsDeleter {
    void operator()(cairo_font_options_t *o) const noexcept { cairo_font_options_destroy(o); }
};
using SurfacePtr = std::unique_ptr<cairo_surface_t, SurfaceDeleter>;
using CairoPtr = std::unique_ptr<cairo_t, CairoDeleter>;
using ContextPtr = std::unique_ptr<PangoContext, GObjectDeleter>;
using LayoutPtr = std::unique_ptr<PangoLayout, GObjectDeleter>;
using FontDescPtr = std::unique_ptr<PangoFontDescription, FontDescDeleter>;
using FontOptionsPtr = std::unique_ptr<cairo_font_options_t, FontOptionsDeleter>;

/// Text escaped for pango markup.
std::string esc(std::string_view text) {
    gchar *e = g_markup_escape_text(text.data(), static_cast<gssize>(text.size()));
    std::string out(e);
    g_free(e);
    return out;
}

std::string bold(std::string_view text) { return "<b>" + esc(text) + "</b>"; }

// ---------------------------------------------------------------------------------------------
// Look: a few greys, one accent blue, amber for warnings. Sizes in points.

struct Rgb {
    double r, g, b;
};
constexpr Rgb black{0.0, 0.0, 0.0};
constexpr Rgb dark_grey{0.30, 0.30, 0.30};
constexpr Rgb mid_grey{0.55, 0.55, 0.55};
constexpr Rgb rule_grey{0.75, 0.75, 0.75};
constexpr Rgb header_fill{0.90, 0.92, 0.95};
constexpr Rgb total_fill{0.95, 0.95, 0.95};
constexpr Rgb warn_fill{1.0, 0.93, 0.75};
constexpr Rgb warn_text{0.55, 0.25, 0.0};
constexpr Rgb accent{0.10, 0.25, 0.50};
constexpr Rgb catchment_rgb{0.05, 0.20, 0.65};
constexpr Rgb local_rgb{0.90, 0.45, 0.0};
constexpr Rgb path_rgb{0.80, 0.05, 0.05};
constexpr Rgb stream_rgb{0.10, 0.55, 0.90};
constexpr Rgb rain_rgb{0.60, 0.75, 0.92};
constexpr Rgb excess_rgb{0.15, 0.35, 0.75};

void set_rgb(cairo_t *cr, Rgb c) { cairo_set_source_rgb(cr, c.r, c.g, c.b); }

enum class Style { body, small, tiny, mono, heading, subheading, title, big };

constexpr double margin_pt = 42.0;
constexpr double header_h_pt = 26.0;
constexpr double footer_h_pt = 24.0;
constexpr double cell_pad_pt = 3.0;

/// A "nice" step (1, 2 or 5 times a power of ten) near `raw`.
double nice_step(double raw) {
    if (!(raw > 0.0) || !std::isfinite(raw)) {
        return 1.0;
    }
    const double p = std::pow(10.0, std::floor(std::log10(raw)));
    const double f = raw / p;
    return (f < 1.5 ? 1.0 : f < 3.5 ? 2.0 : f < 7.5 ? 5.0 : 10.0) * p;
}

/// "metres", "international feet", "US survey feet": a unit name as a plural.
std::string plural_unit(const std::string &unit) {
    if (unit.empty()) {
        return "metres";
    }
    const auto foot = unit.rfind("foot");
    if (foot != std::string::npos && foot + 4 == unit.size()) {
        return unit.substr(0, foot) + "feet";
    }
    return unit + "s";
}

/// A tick label: no decimals when the step is whole, else as many as the step needs.
std::string tick_label(double v, double step) {
    int decimals = 0;
    if (step < 1.0) {
        decimals = std::min(6, static_cast<int>(std::ceil(-std::log10(step) - 1e-9)));
    }
    if (std::abs(v) < step * 1e-6) {
        v = 0.0;
    }
    return fmt::format("{:.{}f}", v, decimals);
}

struct Column {
    std::string title; ///< markup
    double width_pt;
    PangoAlignment align = PANGO_ALIGN_LEFT;
};

struct Cell {
    std::string markup;
    Style style = Style::body;
};

struct Row {
    std::vector<Cell> cells;
    std::optional<Rgb> fill;
};

// ---------------------------------------------------------------------------------------------

class SheetWriter {
  public:
    SheetWriter(const RunResults &results, PageSize size)
        : r_(results), system_(results.project.units) {
        page_w_ = size == PageSize::letter ? 612.0 : 595.2756;
        page_h_ = size == PageSize::letter ? 792.0 : 841.8898;
        content_w_ = page_w_ - 2.0 * margin_pt;
        top_ = margin_pt + header_h_pt;
        bottom_ = page_h_ - margin_pt - footer_h_pt;

        // One pango context at 72 dpi, so that a point of text is a point of the page, without
        // hinting, so that the layout does not depend on the surface.
        context_.reset(pango_font_map_create_context(pango_cairo_font_map_get_default()));
        pango_cairo_context_set_resolution(context_.get(), 72.0);
        FontOptionsPtr fo(cairo_font_options_create());
        cairo_font_options_set_hint_metrics(fo.get(), CAIRO_HINT_METRICS_OFF);
        cairo_font_options_set_hint_style(fo.get(), CAIRO_HINT_STYLE_NONE);
        pango_cairo_context_set_font_options(context_.get(), fo.get());
        pango_context_set_round_glyph_positions(context_.get(), FALSE);
        layout_.reset(pango_layout_new(context_.get()));
        pango_layout_set_wrap(layout_.get(), PANGO_WRAP_WORD_CHAR);

        const std::array<const char *, 8> descs = {"DejaVu Sans 8",       "DejaVu Sans 7",
                                                   "DejaVu Sans 6",       "DejaVu Sans Mono 6",
                                                   "DejaVu Sans Bold 12", "DejaVu Sans Bold 9.5",
                                                   "DejaVu Sans Bold 17", "DejaVu Sans 13"};
        for (std::size_t i = 0; i < descs.size(); ++i) {
            fonts_[i].reset(pango_font_description_from_string(descs[i]));
        }
    }

    std::size_t write(const std::filesystem::path &file) {
        cover();
        summary();
        for (const auto &p : r_.points) {
            design_point(p);
        }
        references();
        finish_page();
        return output(file);
    }

  private:
    // ----- pages -------------------------------------------------------------------------------

    void new_page(std::string section) {
        finish_page();
        section_ = std::move(section);
        cairo_rectangle_t extents{0.0, 0.0, page_w_, page_h_};
        SurfacePtr rec(cairo_recording_surface_create(CAIRO_CONTENT_COLOR_ALPHA, &extents));
        cr_.reset(cairo_create(rec.get()));
        pages_.push_back({std::move(rec), section_});
        y_ = top_;
    }

    void finish_page() { cr_.reset(); }

    /// Starts a new page (continuing the section) unless `height_pt` fits below y.
    /// Returns true when a page was started.
    bool ensure(double height_pt) {
        if (y_ + height_pt <= bottom_ || y_ <= top_ + 0.5) {
            return false;
        }
        new_page(continued_title());
        return true;
    }

    std::string continued_title() const {
        const auto base = section_.substr(0, section_.find(" (continued)"));
        return base + " (continued)";
    }

    cairo_t *cr() const { return cr_.get(); }

    // ----- text --------------------------------------------------------------------------------

    /// Prepares the shared layout; width <= 0 means no wrapping.
    PangoLayout *lay(const std::string &markup, Style style, double width_pt,
                     PangoAlignment align = PANGO_ALIGN_LEFT) const {
        PangoLayout *l = layout_.get();
        pango_layout_set_font_description(l, fonts_[static_cast<std::size_t>(style)].get());
        pango_layout_set_width(l, width_pt > 0.0 ? static_cast<int>(width_pt * PANGO_SCALE) : -1);
        pango_layout_set_alignment(l, align);
        pango_layout_set_markup(l, markup.c_str(), -1);
        return l;
    }

    static double height_of(PangoLayout *l) {
        int w = 0, h = 0;
        pango_layout_get_size(l, &w, &h);
        return static_cast<double>(h) / PANGO_SCALE;
    }
    static double width_of(PangoLayout *l) {
        int w = 0, h = 0;
        pango_layout_get_size(l, &w, &h);
        return static_cast<double>(w) / PANGO_SCALE;
    }

    double measure(const std::string &markup, Style style, double width_pt) const {
        return height_of(lay(markup, style, width_pt));
    }
    double text_width(const std::string &markup, Style style) const {
        return width_of(lay(markup, style, -1.0));
    }

    /// Draws markup with its top-left corner at (x, y); returns its height.
    double draw_text(double x, double y, const std::string &markup, Style style, double width_pt,
                     Rgb color = black, PangoAlignment align = PANGO_ALIGN_LEFT) const {
        PangoLayout *l = lay(markup, style, width_pt, align);
        set_rgb(cr(), color);
        cairo_move_to(cr(), x, y);
        pango_cairo_show_layout(cr(), l);
        cairo_new_path(cr()); // no current point left behind for the next path
        return height_of(l);
    }

    /// A wrapped paragraph across the content width at y; moves y below it.
    void paragraph(const std::string &markup, Style style = Style::body, Rgb color = black,
                   double indent_pt = 0.0) {
        const double h = measure(markup, style, content_w_ - indent_pt);
        ensure(h);
        draw_text(margin_pt + indent_pt, y_, markup, style, content_w_ - indent_pt, color);
        y_ += h;
    }

    void heading(const std::string &text, Style style = Style::heading) {
        const double h = measure(esc(text), style, content_w_);
        ensure(h + 40.0); // keep a heading with what follows
        y_ += 4.0;
        draw_text(margin_pt, y_, esc(text), style, content_w_, accent);
        y_ += h + 4.0;
    }

    void rule(double x0, double x1, double y, Rgb color, double width_pt) const {
        set_rgb(cr(), color);
        cairo_set_line_width(cr(), width_pt);
        cairo_move_to(cr(), x0, y);
        cairo_line_to(cr(), x1, y);
        cairo_stroke(cr());
    }

    // ----- tables ------------------------------------------------------------------------------

    double row_height(const std::vector<Column> &cols, const Row &row) const {
        double h = 0.0;
        for (std::size_t i = 0; i < cols.size() && i < row.cells.size(); ++i) {
            const double right_gap = cols[i].align == PANGO_ALIGN_RIGHT ? 4.0 : 0.0;
            h = std::max(h, measure(row.cells[i].markup, row.cells[i].style,
                                    cols[i].width_pt - 2.0 * cell_pad_pt - right_gap));
        }
        return h + 2.0 * cell_pad_pt;
    }

    void table_header(const std::vector<Column> &cols) {
        Row head;
        for (const auto &c : cols) {
            head.cells.push_back({c.title, Style::small});
        }
        head.fill = header_fill;
        draw_row(cols, head, row_height(cols, head), true);
    }

    void draw_row(const std::vector<Column> &cols, const Row &row, double h, bool header) {
        double x = margin_pt;
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
            // Right-aligned cells keep a wider gap to the next column.
            const double right_gap = cols[i].align == PANGO_ALIGN_RIGHT ? 4.0 : 0.0;
            draw_text(x + cell_pad_pt, y_ + cell_pad_pt, row.cells[i].markup, row.cells[i].style,
                      cols[i].width_pt - 2.0 * cell_pad_pt - right_gap, black, cols[i].align);
            x += cols[i].width_pt;
        }
        y_ += h;
        rule(margin_pt, margin_pt + total_w, y_, header ? dark_grey : rule_grey,
             header ? 0.6 : 0.3);
    }

    /// A table that continues across pages, repeating its header.
    void table(const std::vector<Column> &cols, const std::vector<Row> &rows) {
        const double head_h = row_height(cols, Row{[&] {
                                                       std::vector<Cell> c;
                                                       for (const auto &col : cols) {
                                                           c.push_back({col.title, Style::small});
                                                       }
                                                       return c;
                                                   }(),
                                                   std::nullopt});
        std::vector<double> heights;
        heights.reserve(rows.size());
        for (const auto &row : rows) {
            heights.push_back(row_height(cols, row));
        }
        // A short table is kept whole on one page; a long one starts with at least one row.
        double total_h = head_h;
        for (double h : heights) {
            total_h += h;
        }
        ensure(total_h < 0.3 * (bottom_ - top_)
                   ? total_h
                   : head_h + (heights.empty() ? 0.0 : heights.front()));
        table_header(cols);
        for (std::size_t i = 0; i < rows.size(); ++i) {
            if (ensure(heights[i])) {
                table_header(cols);
            }
            draw_row(cols, rows[i], heights[i], false);
        }
        y_ += 8.0;
    }

    /// Scales column widths so that they fill the content width.
    std::vector<Column> fit(std::vector<Column> cols) const {
        double total = 0.0;
        for (const auto &c : cols) {
            total += c.width_pt;
        }
        for (auto &c : cols) {
            c.width_pt *= content_w_ / total;
        }
        return cols;
    }

    // ----- formatting --------------------------------------------------------------------------

    std::string area(double m2) const {
        const auto v = sheet_area(m2, system_);
        return sig(v.value) + " " + std::string(v.unit);
    }
    std::string length(double m) const {
        const auto v = sheet_length(m, system_);
        return sig(v.value) + " " + std::string(v.unit);
    }
    std::string slope(double s) const {
        return sig(s) + (system_ == units::System::si ? " m/m" : " ft/ft");
    }
    std::string flow(double q_m3_s) const { return sig(sheet_flow(q_m3_s, system_).value); }
    std::string flow_unit() const { return std::string(sheet_flow(0.0, system_).unit); }
    std::string area_unit() const { return std::string(sheet_area(0.0, system_).unit); }
    std::string depth_unit() const { return std::string(sheet_depth(0.0, system_).unit); }
    static std::string coord(double v) { return fmt::format("{:.1f}", v); }

    std::string run_date() const { return r_.stamp.run_time_utc.substr(0, 10); }

    std::string short_stamp() const {
        return fmt::format("catchpeak {} · commit {} · run {}", r_.stamp.tool_version,
                           r_.stamp.git_commit, r_.stamp.run_time_utc);
    }

    // ----- cover -------------------------------------------------------------------------------

    void cover() {
        new_page("Cover");
        const auto &p = r_.project;
        draw_text(margin_pt, y_, esc("Design peak flow calculation sheet"), Style::big, content_w_,
                  dark_grey);
        y_ += 22.0;
        y_ += draw_text(margin_pt, y_, esc(p.name.empty() ? "(unnamed project)" : p.name),
                        Style::title, content_w_, accent);
        y_ += 10.0;

        // Project information on the left, the seal box on the right.
        const double seal_w = 180.0;
        const double info_w = content_w_ - seal_w - 16.0;
        const double top = y_;
        const std::vector<std::pair<std::string, std::string>> info = {
            {"Project", p.name},
            {"Project number", p.number},
            {"Client", p.client},
            {"Location", p.location},
            {"Unit system of this sheet", std::string(units::to_string(system_))},
            {"Prepared by", p.prepared_by},
            {"Checked by", p.checked_by},
            {"Date of the run", run_date()},
            {"Revision", p.revision},
        };
        const double key_w = 118.0;
        for (const auto &[key, value] : info) {
            const double h =
                std::max(measure(esc(key), Style::body, key_w),
                         measure(esc(value.empty() ? "-" : value), Style::body, info_w - key_w));
            draw_text(margin_pt, y_, esc(key), Style::body, key_w, dark_grey);
            draw_text(margin_pt + key_w, y_, bold(value.empty() ? "-" : value), Style::body,
                      info_w - key_w);
            y_ += h + 3.0;
            rule(margin_pt, margin_pt + info_w, y_ - 1.5, rule_grey, 0.3);
        }
        const double seal_x = margin_pt + content_w_ - seal_w;
        set_rgb(cr(), dark_grey);
        cairo_set_line_width(cr(), 0.8);
        cairo_rectangle(cr(), seal_x, top, seal_w, seal_w);
        cairo_stroke(cr());
        draw_text(seal_x, top + seal_w + 3.0, esc("Engineer's seal, signature and date"),
                  Style::small, seal_w, dark_grey, PANGO_ALIGN_CENTER);
        y_ = std::max(y_, top + seal_w + 16.0) + 10.0;

        heading("Stamp of the run", Style::subheading);
        const std::vector<std::pair<std::string, std::string>> stamp = {
            {"Program", "catchpeak " + r_.stamp.tool_version},
            {"Commit", r_.stamp.git_commit},
            {"Time of the run (UTC)", r_.stamp.run_time_utc},
        };
        for (const auto &[key, value] : stamp) {
            draw_text(margin_pt, y_, esc(key), Style::body, key_w, dark_grey);
            y_ +=
                draw_text(margin_pt + key_w, y_, esc(value), Style::body, content_w_ - key_w) + 2.0;
        }
        y_ += 4.0;
        std::vector<Row> rows;
        for (const auto &in : r_.stamp.inputs) {
            rows.push_back({{{esc(in.role), Style::small},
                             {esc(in.path), Style::small},
                             {esc(in.sha256), Style::mono}},
                            std::nullopt});
        }
        if (!rows.empty()) {
            table(fit({{"Input", 90.0},
                       {"File (as given in the project file)", 180.0},
                       {"SHA-256", 245.0}}),
                  rows);
        }

        heading("Cautions", Style::subheading);
        const auto &notes = r_.caution_notes.empty() ? default_caution_notes() : r_.caution_notes;
        for (std::size_t i = 0; i < notes.size(); ++i) {
            const auto markup = esc(notes[i]);
            const double h = measure(markup, Style::body, content_w_ - 14.0);
            ensure(h);
            draw_text(margin_pt, y_, esc(fmt::format("{}.", i + 1)), Style::body, 14.0);
            draw_text(margin_pt + 14.0, y_, markup, Style::body, content_w_ - 14.0);
            y_ += h + 4.0;
        }
    }

    // ----- summary -----------------------------------------------------------------------------

    static std::string warning_flag(const DesignPointResult &p) {
        std::string ids;
        for (const auto &l : p.lines.lines()) {
            if (l.kind == LineKind::warning) {
                ids += (ids.empty() ? "" : ", ") + l.id;
            }
        }
        if (ids.empty()) {
            return "";
        }
        return "<b>\u26a0 " + std::to_string(p.lines.warning_count()) + "</b>: " + esc(ids);
    }

    void summary() {
        new_page("Summary");
        heading("Summary of design peak flows");
        paragraph(esc(fmt::format("{} design points. Peak flows in {}; areas in {}; time of "
                                  "concentration tc in min. A design point with warnings is "
                                  "shaded; its warning lines are listed.",
                                  r_.points.size(), flow_unit(), area_unit())),
                  Style::small, dark_grey);
        y_ += 6.0;
        const auto cols = fit({{"Design point", 62.0},
                               {esc("Area\n(" + area_unit() + ")"), 52.0, PANGO_ALIGN_RIGHT},
                               {"tc\n(min)", 42.0, PANGO_ALIGN_RIGHT},
                               {"Return\nperiod", 44.0, PANGO_ALIGN_RIGHT},
                               {"Method", 90.0},
                               {esc("Peak flow\n(" + flow_unit() + ")"), 58.0, PANGO_ALIGN_RIGHT},
                               {"Line", 54.0},
                               {"Warnings", 110.0}});
        std::vector<Row> rows;
        for (const auto &p : r_.points) {
            const auto flag = warning_flag(p);
            const std::optional<Rgb> fill =
                flag.empty() ? std::nullopt : std::optional<Rgb>(warn_fill);
            if (p.peaks.empty()) {
                rows.push_back({{{bold(p.id)},
                                 {esc(sig(sheet_area(p.catchment.area_m2, system_).value))},
                                 {esc(sig(p.tc_min))},
                                 {"-"},
                                 {esc("(no peak flow)")},
                                 {"-"},
                                 {""},
                                 {flag, Style::small}},
                                fill});
            }
            for (std::size_t k = 0; k < p.peaks.size(); ++k) {
                const auto &pk = p.peaks[k];
                const bool first = k == 0;
                rows.push_back(
                    {{{first ? bold(p.id) : "<span foreground=\"#888888\">" + esc(p.id) + "</span>",
                       first ? Style::body : Style::small},
                      {first ? esc(sig(sheet_area(p.catchment.area_m2, system_).value)) : ""},
                      {first ? esc(sig(p.tc_min)) : ""},
                      {esc(return_period_title(pk.return_period_yr))},
                      {esc(method_title(pk.method))},
                      {bold(flow(pk.q_m3_s))},
                      {esc(pk.line_id), Style::small},
                      {first ? flag : "", Style::small}},
                     fill});
            }
        }
        table(cols, rows);
    }

    // ----- design point ------------------------------------------------------------------------

    void design_point(const DesignPointResult &p) {
        new_page("Design point " + p.id);
        heading("Design point " + p.id);
        paragraph(esc(fmt::format(
                      "Given at ({}, {}); snapped to ({}, {}) (grid coordinates, m); snap "
                      "distance {}. Catchment {}.",
                      coord(p.given_xy.first), coord(p.given_xy.second), coord(p.snapped_xy.first),
                      coord(p.snapped_xy.second), length(p.snap_distance_m),
                      p.from_table ? "from the catchment table" : "delineated from the DEM")),
                  Style::small, dark_grey);
        y_ += 6.0;
        warnings_box(p);
        if (p.map) {
            map_block(p, *p.map);
        }
        figures(p);
        land_table(p);
        calc_lines(p);
        for (const auto &pk : p.peaks) {
            if (pk.hydrograph && !pk.hydrograph->q_m3_s.empty()) {
                hydrograph_plot(p, pk);
            }
        }
    }

    void warnings_box(const DesignPointResult &p) {
        if (p.lines.warning_count() == 0) {
            return;
        }
        const double inner_w = content_w_ - 12.0;
        std::vector<std::string> items;
        for (const auto &l : p.lines.lines()) {
            if (l.kind == LineKind::warning) {
                items.push_back("<b>" + esc(l.id) + "  " + esc(l.label) + ":</b> " +
                                esc(l.numbers));
            }
        }
        const std::string title =
            fmt::format("<b>\u26a0 Warnings of design point {} ({})</b>", esc(p.id), items.size());
        // Items are drawn one by one so that a long list continues on the next page.
        double h = measure(title, Style::body, inner_w) + 10.0;
        ensure(h + measure(items.front(), Style::small, inner_w));
        auto box = [&](double y0, double y1) {
            set_rgb(cr(), warn_fill);
            cairo_rectangle(cr(), margin_pt, y0, content_w_, y1 - y0);
            cairo_fill(cr());
            set_rgb(cr(), warn_text);
            cairo_set_line_width(cr(), 1.0);
            cairo_move_to(cr(), margin_pt, y0);
            cairo_line_to(cr(), margin_pt, y1);
            cairo_stroke(cr());
        };
        double y0 = y_;
        box(y0, y0 + h - 4.0);
        draw_text(margin_pt + 6.0, y_ + 4.0, title, Style::body, inner_w, warn_text);
        y_ += h - 4.0;
        for (const auto &item : items) {
            const double ih = measure(item, Style::small, inner_w) + 3.0;
            if (ensure(ih)) {
                y0 = y_;
            }
            box(y_, y_ + ih);
            draw_text(margin_pt + 6.0, y_, item, Style::small, inner_w, black);
            y_ += ih;
        }
        box(y_, y_ + 4.0);
        y_ += 12.0;
    }

    void figures(const DesignPointResult &p) {
        heading("Catchment", Style::subheading);
        const auto &c = p.catchment;
        std::vector<std::pair<std::string, std::string>> items = {
            {"Catchment area, A", area(c.area_m2)},
        };
        if (std::abs(c.local_area_m2 - c.area_m2) > 1e-9 * std::max(1.0, c.area_m2)) {
            items.emplace_back("Local area (own part, without upstream design points)",
                               area(c.local_area_m2));
        }
        items.emplace_back("Longest flow path, L", length(c.longest_flow_path_m));
        items.emplace_back("Elevation at the top of the longest flow path",
                           length(c.elevation_top_m));
        items.emplace_back("Elevation at the outlet", length(c.elevation_outlet_m));
        items.emplace_back("Slope along the longest flow path, H/L", slope(c.slope_flow_path));
        items.emplace_back("Slope between 10 % and 85 % of L", slope(c.slope_10_85));
        items.emplace_back("Mean catchment slope", slope(c.mean_slope));
        if (!c.upstream_points.empty()) {
            std::string ids;
            for (const auto &id : c.upstream_points) {
                ids += (ids.empty() ? "" : ", ") + id;
            }
            items.emplace_back("Design points upstream", ids);
        }
        items.emplace_back("Time of concentration, tc",
                           sig(p.tc_min) + " min" +
                               (p.tc_method ? " (" + std::string(key_of(*p.tc_method)) + ")" : ""));
        std::vector<Row> rows;
        for (const auto &[k, v] : items) {
            rows.push_back({{{esc(k)}, {bold(v)}}, std::nullopt});
        }
        table(fit({{"Figure", 300.0}, {"Value", 215.0}}), rows);
    }

    void land_table(const DesignPointResult &p) {
        const auto &w = p.land;
        if (w.parts.empty()) {
            return;
        }
        heading("Land cover and soils", Style::subheading);
        double total_m2 = 0.0;
        for (const auto &part : w.parts) {
            total_m2 += part.area_m2;
        }
        std::vector<Row> rows;
        for (const auto &part : w.parts) {
            rows.push_back(
                {{{esc(part.land_class)},
                  {esc(part.soil_group)},
                  {esc(sig(sheet_area(part.area_m2, system_).value))},
                  {esc(fmt::format("{:.1f}",
                                   total_m2 > 0.0 ? 100.0 * part.area_m2 / total_m2 : 0.0))},
                  {esc(sig(part.c, 3))},
                  {esc(sig(part.cn, 3))},
                  {esc(fmt::format("{:.1f}", 100.0 * part.impervious_share))}},
                 std::nullopt});
        }
        rows.push_back({{{bold("Area-weighted")},
                         {""},
                         {bold(sig(sheet_area(total_m2, system_).value))},
                         {bold("100.0")},
                         {bold(sig(w.c_weighted, 3))},
                         {bold(sig(w.cn_weighted, 3))},
                         {bold(fmt::format("{:.1f}", 100.0 * w.impervious_share))}},
                        total_fill});
        table(fit({{"Land cover", 150.0},
                   {"Soil group", 55.0},
                   {esc("Area (" + area_unit() + ")"), 65.0, PANGO_ALIGN_RIGHT},
                   {"Share (%)", 55.0, PANGO_ALIGN_RIGHT},
                   {"C", 50.0, PANGO_ALIGN_RIGHT},
                   {"CN", 50.0, PANGO_ALIGN_RIGHT},
                   {"Impervious (%)", 75.0, PANGO_ALIGN_RIGHT}}),
              rows);
        std::string tables;
        if (!w.c_table.empty()) {
            tables += "C values from " + w.c_table + ". ";
        }
        if (!w.cn_table.empty()) {
            tables += "CN values from " + w.cn_table + ".";
        }
        if (!tables.empty()) {
            y_ -= 4.0;
            paragraph(esc(tables), Style::small, dark_grey);
            y_ += 6.0;
        }
    }

    void calc_lines(const DesignPointResult &p) {
        if (p.lines.empty()) {
            return;
        }
        heading("Calculation", Style::subheading);
        std::vector<Row> rows;
        rows.reserve(p.lines.size());
        for (const auto &l : p.lines.lines()) {
            std::string main = bold(l.label);
            std::string result;
            std::optional<Rgb> fill;
            if (l.kind == LineKind::warning) {
                main = "<b>\u26a0 WARNING: " + esc(l.label) + "</b>\n" + esc(l.numbers);
                fill = warn_fill;
            } else {
                if (!l.symbols.empty()) {
                    main += "\n" + esc(l.symbols);
                }
                if (!l.numbers.empty()) {
                    main += "\n" + esc(l.numbers);
                }
                if (std::isfinite(l.value)) {
                    result = bold(sig(l.value)) + (l.unit.empty() ? "" : " " + esc(l.unit));
                }
                if (l.kind == LineKind::note) {
                    main = "<i>" + main + "</i>";
                }
            }
            rows.push_back(
                {{{bold(l.id), Style::small}, {main}, {result}, {esc(l.source), Style::tiny}},
                 fill});
        }
        table(fit({{"Line", 58.0},
                   {"Quantity, equation, numbers put in", 250.0},
                   {"Result", 82.0, PANGO_ALIGN_RIGHT},
                   {"Source", 125.0}}),
              rows);
    }

    // ----- map ---------------------------------------------------------------------------------

    struct Box {
        double min_x = std::numeric_limits<double>::infinity();
        double min_y = std::numeric_limits<double>::infinity();
        double max_x = -std::numeric_limits<double>::infinity();
        double max_y = -std::numeric_limits<double>::infinity();
        void add(double x, double y) {
            if (!std::isfinite(x) || !std::isfinite(y)) {
                return;
            }
            min_x = std::min(min_x, x);
            min_y = std::min(min_y, y);
            max_x = std::max(max_x, x);
            max_y = std::max(max_y, y);
        }
        void add(const Path &path) {
            for (const auto &[x, y] : path) {
                add(x, y);
            }
        }
        [[nodiscard]] bool valid() const { return min_x <= max_x && min_y <= max_y; }
    };

    struct MapFrame {
        double x, y, w, h; // on the page
        Box world;
        double scale; // page points per metre
        [[nodiscard]] double px(double wx) const { return x + (wx - world.min_x) * scale; }
        [[nodiscard]] double py(double wy) const { return y + (world.max_y - wy) * scale; }
    };

    void trace(const MapFrame &f, const Path &path, bool close) const {
        bool first = true;
        for (const auto &[x, y] : path) {
            if (first) {
                cairo_move_to(cr(), f.px(x), f.py(y));
                first = false;
            } else {
                cairo_line_to(cr(), f.px(x), f.py(y));
            }
        }
        if (close && !path.empty()) {
            cairo_close_path(cr());
        }
    }

    void map_block(const DesignPointResult &p, const MapData &m) {
        const double block_h = 300.0;
        const double legend_w = 128.0;
        const double label_pad = 14.0; // room for the grid labels left of and below the frame
        ensure(block_h + 10.0);
        MapFrame f{};
        f.x = margin_pt + label_pad;
        f.y = y_;
        f.w = content_w_ - legend_w - label_pad - 10.0;
        f.h = block_h - label_pad;

        Box b;
        for (const auto &poly : m.catchment) {
            for (const auto &ring : poly) {
                b.add(ring);
            }
        }
        b.add(m.longest_flow_path);
        b.add(m.given_xy.first, m.given_xy.second);
        b.add(m.snapped_xy.first, m.snapped_xy.second);
        if (!b.valid() || b.max_x - b.min_x <= 0.0 || b.max_y - b.min_y <= 0.0) {
            b.add(m.hillshade_min_x, m.hillshade_min_y);
            b.add(m.hillshade_max_x, m.hillshade_max_y);
        }
        if (!b.valid()) {
            return;
        }
        // Pad by 8 % and widen to the frame's shape, so that one scale serves both axes.
        double cx = 0.5 * (b.min_x + b.max_x), cy = 0.5 * (b.min_y + b.max_y);
        double half_w = std::max(0.54 * (b.max_x - b.min_x), 1.0);
        double half_h = std::max(0.54 * (b.max_y - b.min_y), 1.0);
        if (half_w / half_h > f.w / f.h) {
            half_h = half_w * f.h / f.w;
        } else {
            half_w = half_h * f.w / f.h;
        }
        f.world.min_x = cx - half_w;
        f.world.max_x = cx + half_w;
        f.world.min_y = cy - half_h;
        f.world.max_y = cy + half_h;
        f.scale = f.w / (2.0 * half_w);

        cairo_t *c = cr();
        cairo_save(c);
        cairo_rectangle(c, f.x, f.y, f.w, f.h);
        cairo_clip(c);
        cairo_set_source_rgb(c, 1.0, 1.0, 1.0);
        cairo_paint(c);
        hillshade(f, m);

        cairo_set_line_join(c, CAIRO_LINE_JOIN_ROUND);
        cairo_set_line_cap(c, CAIRO_LINE_CAP_ROUND);
        // Catchment: light fill, dark outline.
        cairo_set_fill_rule(c, CAIRO_FILL_RULE_EVEN_ODD);
        for (const auto &poly : m.catchment) {
            for (const auto &ring : poly) {
                trace(f, ring, true);
            }
        }
        cairo_set_source_rgba(c, catchment_rgb.r, catchment_rgb.g, catchment_rgb.b, 0.10);
        cairo_fill_preserve(c);
        set_rgb(c, catchment_rgb);
        cairo_set_line_width(c, 1.6);
        cairo_stroke(c);
        // Local catchment: dashed.
        if (!m.local_catchment.empty()) {
            for (const auto &poly : m.local_catchment) {
                for (const auto &ring : poly) {
                    trace(f, ring, true);
                }
            }
            const std::array<double, 2> dash{4.0, 2.5};
            cairo_set_dash(c, dash.data(), 2, 0.0);
            set_rgb(c, local_rgb);
            cairo_set_line_width(c, 1.2);
            cairo_stroke(c);
            cairo_set_dash(c, nullptr, 0, 0.0);
        }
        set_rgb(c, stream_rgb);
        cairo_set_line_width(c, 0.9);
        for (const auto &s : m.streams) {
            trace(f, s, false);
            cairo_stroke(c);
        }
        set_rgb(c, path_rgb);
        cairo_set_line_width(c, 1.5);
        trace(f, m.longest_flow_path, false);
        cairo_stroke(c);
        // Design point: given (hollow circle) and snapped (filled square), joined when apart.
        const double gx = f.px(m.given_xy.first), gy = f.py(m.given_xy.second);
        const double sx = f.px(m.snapped_xy.first), sy = f.py(m.snapped_xy.second);
        set_rgb(c, black);
        cairo_set_line_width(c, 0.6);
        cairo_move_to(c, gx, gy);
        cairo_line_to(c, sx, sy);
        cairo_stroke(c);
        point_symbols(gx, gy, sx, sy);
        north_arrow(f);
        scale_bar(f);
        cairo_restore(c);

        set_rgb(c, black);
        cairo_set_line_width(c, 0.7);
        cairo_rectangle(c, f.x, f.y, f.w, f.h);
        cairo_stroke(c);
        grid_labels(f, m.crs_unit_m > 0.0 ? m.crs_unit_m : 1.0);
        legend(margin_pt + content_w_ - legend_w, f.y, legend_w, m, p.id);
        y_ += block_h + 10.0;
    }

    void point_symbols(double gx, double gy, double sx, double sy) const {
        cairo_t *c = cr();
        cairo_new_path(c);
        cairo_arc(c, gx, gy, 3.6, 0.0, 2.0 * std::numbers::pi);
        cairo_set_source_rgb(c, 1.0, 1.0, 1.0);
        cairo_fill_preserve(c);
        set_rgb(c, black);
        cairo_set_line_width(c, 1.2);
        cairo_stroke(c);
        cairo_rectangle(c, sx - 2.6, sy - 2.6, 5.2, 5.2);
        set_rgb(c, black);
        cairo_fill_preserve(c);
        cairo_set_source_rgb(c, 1.0, 1.0, 1.0);
        cairo_set_line_width(c, 0.6);
        cairo_stroke(c);
    }

    void hillshade(const MapFrame &f, const MapData &m) const {
        if (m.hillshade_width == 0 || m.hillshade_height == 0 ||
            m.hillshade.size() < m.hillshade_width * m.hillshade_height ||
            !(m.hillshade_max_x > m.hillshade_min_x) || !(m.hillshade_max_y > m.hillshade_min_y)) {
            return;
        }
        const int w = static_cast<int>(m.hillshade_width);
        const int h = static_cast<int>(m.hillshade_height);
        SurfacePtr img(cairo_image_surface_create(CAIRO_FORMAT_RGB24, w, h));
        cairo_surface_flush(img.get());
        unsigned char *data = cairo_image_surface_get_data(img.get());
        const int stride = cairo_image_surface_get_stride(img.get());
        for (int row = 0; row < h; ++row) {
            auto *px = reinterpret_cast<std::uint32_t *>(data + row * stride);
            for (int col = 0; col < w; ++col) {
                // Lightened, so that the lines drawn over it stand out.
                const auto v = m.hillshade[static_cast<std::size_t>(row) * m.hillshade_width +
                                           static_cast<std::size_t>(col)];
                const auto g = static_cast<std::uint32_t>(120.0 + 0.53 * v);
                px[col] = (g << 16) | (g << 8) | g;
            }
        }
        cairo_surface_mark_dirty(img.get());
        cairo_t *c = cr();
        cairo_save(c);
        const double x0 = f.px(m.hillshade_min_x), y0 = f.py(m.hillshade_max_y);
        const double sxs = (f.px(m.hillshade_max_x) - x0) / w;
        const double sys = (f.py(m.hillshade_min_y) - y0) / h;
        cairo_translate(c, x0, y0);
        cairo_scale(c, sxs, sys);
        cairo_set_source_surface(c, img.get(), 0.0, 0.0);
        cairo_pattern_set_filter(cairo_get_source(c), CAIRO_FILTER_GOOD);
        cairo_paint(c);
        cairo_restore(c);
    }

    void north_arrow(const MapFrame &f) const {
        cairo_t *c = cr();
        const double ax = f.x + f.w - 16.0, ay = f.y + 8.0;
        cairo_set_source_rgba(c, 1.0, 1.0, 1.0, 0.85);
        cairo_rectangle(c, ax - 10.0, ay - 3.0, 20.0, 34.0);
        cairo_fill(c);
        set_rgb(c, black);
        cairo_move_to(c, ax, ay + 10.0);
        cairo_line_to(c, ax + 6.0, ay + 28.0);
        cairo_line_to(c, ax, ay + 23.0);
        cairo_close_path(c);
        cairo_fill(c);
        cairo_move_to(c, ax, ay + 10.0);
        cairo_line_to(c, ax - 6.0, ay + 28.0);
        cairo_line_to(c, ax, ay + 23.0);
        cairo_close_path(c);
        cairo_set_line_width(c, 0.7);
        cairo_stroke(c);
        draw_text(ax - 10.0, ay - 2.0, "<b>N</b>", Style::small, 20.0, black, PANGO_ALIGN_CENTER);
    }

    void scale_bar(const MapFrame &f) const {
        const bool us = system_ == units::System::us_customary;
        const double unit_m = us ? units::m_per_ft : 1.0;
        const double world_w = (f.world.max_x - f.world.min_x) / unit_m;
        double len = nice_step(world_w / 4.0);
        std::string label;
        if (!us && len >= 1000.0) {
            label = fmt::format("{:g} km", len / 1000.0);
        } else if (us && len >= 5280.0) {
            len = nice_step(world_w / 4.0 / 5280.0) * 5280.0;
            label = fmt::format("{:g} mi", len / 5280.0);
        } else {
            label = fmt::format("{:g} {}", len, us ? "ft" : "m");
        }
        const double bar_w = len * unit_m * f.scale;
        const double bx = f.x + 8.0, by = f.y + f.h - 14.0;
        cairo_t *c = cr();
        cairo_set_source_rgba(c, 1.0, 1.0, 1.0, 0.85);
        cairo_rectangle(c, bx - 4.0, by - 12.0, bar_w + 8.0 + text_width(esc(label), Style::tiny),
                        22.0);
        cairo_fill(c);
        for (int i = 0; i < 4; ++i) {
            cairo_rectangle(c, bx + bar_w * i / 4.0, by, bar_w / 4.0, 4.0);
            if (i % 2 == 0) {
                set_rgb(c, black);
            } else {
                cairo_set_source_rgb(c, 1.0, 1.0, 1.0);
            }
            cairo_fill(c);
        }
        set_rgb(c, black);
        cairo_set_line_width(c, 0.5);
        cairo_rectangle(c, bx, by, bar_w, 4.0);
        cairo_stroke(c);
        draw_text(bx - 2.0, by - 9.0, "0", Style::tiny, -1.0);
        draw_text(bx + bar_w + 3.0, by - 3.0, esc(label), Style::tiny, -1.0);
    }

    /// Grid coordinates along the frame, labelled in the linear unit of the DEM file's CRS
    /// (`unit_m` metres per unit), in which the engineer's survey gives them.
    void grid_labels(const MapFrame &f, double unit_m) const {
        cairo_t *c = cr();
        const double step = nice_step((f.world.max_x - f.world.min_x) / unit_m / 4.0) * unit_m;
        set_rgb(c, black);
        cairo_set_line_width(c, 0.5);
        // Eastings below the frame.
        for (double v = std::ceil(f.world.min_x / step) * step; v <= f.world.max_x; v += step) {
            const double x = f.px(v);
            cairo_move_to(c, x, f.y + f.h);
            cairo_line_to(c, x, f.y + f.h + 3.0);
            cairo_stroke(c);
            const auto label = tick_label(v / unit_m, step / unit_m);
            const double tw = text_width(label, Style::tiny);
            if (x - tw / 2.0 < f.x - 12.0 || x + tw / 2.0 > f.x + f.w + 4.0) {
                continue;
            }
            draw_text(x - tw / 2.0, f.y + f.h + 3.5, label, Style::tiny, -1.0);
        }
        // Northings left of the frame, turned to read upwards.
        for (double v = std::ceil(f.world.min_y / step) * step; v <= f.world.max_y; v += step) {
            const double y = f.py(v);
            cairo_move_to(c, f.x, y);
            cairo_line_to(c, f.x - 3.0, y);
            cairo_stroke(c);
            const auto label = tick_label(v / unit_m, step / unit_m);
            const double tw = text_width(label, Style::tiny);
            if (y + tw / 2.0 > f.y + f.h + 2.0 || y - tw / 2.0 < f.y - 2.0) {
                continue;
            }
            cairo_save(c);
            cairo_translate(c, f.x - 11.5, y + tw / 2.0);
            cairo_rotate(c, -std::numbers::pi / 2.0);
            draw_text(0.0, 0.0, label, Style::tiny, -1.0);
            cairo_restore(c);
        }
    }

    void legend(double x, double y, double w, const MapData &m, const std::string &id) const {
        cairo_t *c = cr();
        double yy = y;
        yy += draw_text(x, yy, "<b>" + esc("Map of " + id) + "</b>", Style::small, w) + 4.0;
        auto entry = [&](const std::string &label, auto &&symbol) {
            symbol(x, yy + 1.0);
            const double h = draw_text(x + 24.0, yy, esc(label), Style::tiny, w - 24.0);
            yy += std::max(h, 10.0) + 3.0;
        };
        entry("Catchment", [&](double sx, double sy) {
            cairo_rectangle(c, sx + 1.0, sy, 18.0, 8.0);
            cairo_set_source_rgba(c, catchment_rgb.r, catchment_rgb.g, catchment_rgb.b, 0.10);
            cairo_fill_preserve(c);
            set_rgb(c, catchment_rgb);
            cairo_set_line_width(c, 1.6);
            cairo_stroke(c);
        });
        if (!m.local_catchment.empty()) {
            entry("Local catchment (own part)", [&](double sx, double sy) {
                const std::array<double, 2> dash{4.0, 2.5};
                cairo_set_dash(c, dash.data(), 2, 0.0);
                cairo_rectangle(c, sx + 1.0, sy, 18.0, 8.0);
                set_rgb(c, local_rgb);
                cairo_set_line_width(c, 1.2);
                cairo_stroke(c);
                cairo_set_dash(c, nullptr, 0, 0.0);
            });
        }
        auto line_entry = [&](const std::string &label, Rgb color, double width) {
            entry(label, [&, color, width](double sx, double sy) {
                cairo_move_to(c, sx, sy + 4.0);
                cairo_line_to(c, sx + 20.0, sy + 4.0);
                set_rgb(c, color);
                cairo_set_line_width(c, width);
                cairo_stroke(c);
            });
        };
        line_entry("Longest flow path", path_rgb, 1.5);
        if (!m.streams.empty()) {
            line_entry("Streams", stream_rgb, 0.9);
        }
        entry("Design point as given",
              [&](double sx, double sy) { point_symbols(sx + 10.0, sy + 4.0, -100.0, -100.0); });
        entry("Design point snapped to the stream", [&](double sx, double sy) {
            cairo_rectangle(c, sx + 7.4, sy + 1.4, 5.2, 5.2);
            set_rgb(c, black);
            cairo_fill(c);
        });
        if (!m.hillshade.empty()) {
            entry("Hillshade of the DEM", [&](double sx, double sy) {
                cairo_pattern_t *g = cairo_pattern_create_linear(sx, 0.0, sx + 20.0, 0.0);
                cairo_pattern_add_color_stop_rgb(g, 0.0, 0.47, 0.47, 0.47);
                cairo_pattern_add_color_stop_rgb(g, 1.0, 0.98, 0.98, 0.98);
                cairo_rectangle(c, sx, sy, 20.0, 8.0);
                cairo_set_source(c, g);
                cairo_fill(c);
                cairo_pattern_destroy(g);
            });
        }
        yy += 4.0;
        draw_text(x, yy,
                  esc(fmt::format("Grid coordinates in {}, in the coordinate system of the DEM; "
                                  "north is grid north.",
                                  plural_unit(m.crs_unit))),
                  Style::tiny, w, dark_grey);
    }

    // ----- hydrograph --------------------------------------------------------------------------

    void hydrograph_plot(const DesignPointResult &p, const Peak &pk) {
        const auto &hg = *pk.hydrograph;
        const double block_h = 230.0;
        ensure(block_h + 20.0);
        heading(fmt::format("Hyetograph and hydrograph, {}, {}",
                            return_period_title(pk.return_period_yr), method_title(pk.method)),
                Style::subheading);
        cairo_t *c = cr();
        const double left = margin_pt + 46.0, right = margin_pt + content_w_ - 10.0;
        const double rain_top = y_ + 4.0, rain_h = 52.0;
        const double q_top = rain_top + rain_h + 14.0, q_h = 120.0;
        const std::size_t n = std::max({hg.q_m3_s.size(), hg.rain_mm.size(), hg.excess_mm.size()});
        const double step_min = hg.step_s / 60.0;
        const double t_end_min = step_min * static_cast<double>(n);
        const bool hours = t_end_min > 600.0;
        const double t_div = hours ? 60.0 : 1.0;
        const double t_end = std::max(t_end_min / t_div, 1e-9);
        auto tx = [&](double t) { return left + (right - left) * t / t_end; };

        // Rain, drawn down from the top of its panel.
        double rain_max = 0.0;
        for (double v : hg.rain_mm) {
            rain_max = std::max(rain_max, sheet_depth(v, system_).value);
        }
        const double rain_step = nice_step(std::max(rain_max, 1e-9) / 2.0);
        const double rain_axis = std::max(rain_step * std::ceil(rain_max / rain_step), rain_step);
        auto bars = [&](const std::vector<double> &depth_mm, Rgb color) {
            set_rgb(c, color);
            for (std::size_t k = 0; k < depth_mm.size(); ++k) {
                const double d = sheet_depth(depth_mm[k], system_).value;
                if (!(d > 0.0)) {
                    continue;
                }
                const double t0 = static_cast<double>(k) * step_min / t_div;
                const double x0 = tx(t0), x1 = tx(t0 + step_min / t_div);
                cairo_rectangle(c, x0, rain_top, std::max(x1 - x0, 0.3), rain_h * d / rain_axis);
            }
            cairo_fill(c);
        };
        bars(hg.rain_mm, rain_rgb);
        bars(hg.excess_mm, excess_rgb);
        axes_box(left, rain_top, right - left, rain_h);
        for (double v = 0.0; v <= rain_axis + 1e-12; v += rain_step) {
            const double y = rain_top + rain_h * v / rain_axis;
            y_tick(left, y, tick_label(v, rain_step));
        }
        y_axis_title(margin_pt, rain_top, rain_h, "Rain (" + depth_unit() + ")");

        // Flow.
        double q_max = 0.0;
        std::size_t k_max = 0;
        for (std::size_t k = 0; k < hg.q_m3_s.size(); ++k) {
            const double q = sheet_flow(hg.q_m3_s[k], system_).value;
            if (q > q_max) {
                q_max = q;
                k_max = k;
            }
        }
        const double q_step = nice_step(std::max(q_max, 1e-9) / 4.0);
        const double q_axis = std::max(q_step * std::ceil(q_max * 1.08 / q_step), q_step);
        auto qy = [&](double q) { return q_top + q_h - q_h * q / q_axis; };
        set_rgb(c, rule_grey);
        cairo_set_line_width(c, 0.3);
        for (double v = q_step; v <= q_axis + 1e-12; v += q_step) {
            cairo_move_to(c, left, qy(v));
            cairo_line_to(c, right, qy(v));
        }
        cairo_stroke(c);
        set_rgb(c, catchment_rgb);
        cairo_set_line_width(c, 1.3);
        cairo_set_line_join(c, CAIRO_LINE_JOIN_ROUND);
        for (std::size_t k = 0; k < hg.q_m3_s.size(); ++k) {
            // Flow at the end of step k.
            const double t = static_cast<double>(k + 1) * step_min / t_div;
            const double q = sheet_flow(hg.q_m3_s[k], system_).value;
            if (k == 0) {
                cairo_move_to(c, tx(0.0), qy(0.0));
            }
            cairo_line_to(c, tx(t), qy(std::isfinite(q) ? q : 0.0));
        }
        cairo_stroke(c);
        axes_box(left, q_top, right - left, q_h);
        for (double v = 0.0; v <= q_axis + 1e-12; v += q_step) {
            y_tick(left, qy(v), tick_label(v, q_step));
        }
        y_axis_title(margin_pt, q_top, q_h, "Flow (" + flow_unit() + ")");
        // Time axis below the flow panel.
        const double t_step = nice_step(t_end / 8.0);
        for (double t = 0.0; t <= t_end + 1e-9; t += t_step) {
            const double x = tx(t);
            set_rgb(c, black);
            cairo_set_line_width(c, 0.5);
            cairo_move_to(c, x, q_top + q_h);
            cairo_line_to(c, x, q_top + q_h + 3.0);
            cairo_stroke(c);
            const auto label = tick_label(t, t_step);
            const double tw = text_width(label, Style::tiny);
            draw_text(x - tw / 2.0, q_top + q_h + 4.0, label, Style::tiny, -1.0);
        }
        const std::string t_title = hours ? "Time from the start of the storm (h)"
                                          : "Time from the start of the storm (min)";
        draw_text(left, q_top + q_h + 13.0, esc(t_title), Style::small, right - left, black,
                  PANGO_ALIGN_CENTER);
        // The peak, marked and labelled.
        if (q_max > 0.0) {
            const double t_peak = static_cast<double>(k_max + 1) * step_min / t_div;
            const double px = tx(t_peak), py = qy(q_max);
            cairo_new_path(c);
            cairo_arc(c, px, py, 2.2, 0.0, 2.0 * std::numbers::pi);
            set_rgb(c, path_rgb);
            cairo_fill(c);
            const auto label = esc(fmt::format("peak {} {} at {} {}", sig(q_max), flow_unit(),
                                               sig(t_peak), hours ? "h" : "min"));
            const double tw = text_width(label, Style::tiny);
            const double lx = px + 5.0 + tw > right ? px - 5.0 - tw : px + 5.0;
            draw_text(lx, py - 11.0, label, Style::tiny, -1.0, path_rgb);
        }
        // Key.
        double kx = left;
        const double ky = q_top + q_h + 26.0;
        auto key = [&](Rgb color, const std::string &label, bool line) {
            set_rgb(c, color);
            if (line) {
                cairo_set_line_width(c, 1.3);
                cairo_move_to(c, kx, ky + 4.0);
                cairo_line_to(c, kx + 14.0, ky + 4.0);
                cairo_stroke(c);
            } else {
                cairo_rectangle(c, kx, ky, 14.0, 8.0);
                cairo_fill(c);
            }
            kx += 18.0;
            kx += draw_text(kx, ky, esc(label), Style::tiny, -1.0) * 0.0 +
                  text_width(esc(label), Style::tiny) + 14.0;
        };
        key(rain_rgb, "Rainfall", false);
        key(excess_rgb, "Rainfall excess (runoff)", false);
        key(catchment_rgb, "Hydrograph at design point " + p.id, true);
        y_ = ky + 18.0;
    }

    void axes_box(double x, double y, double w, double h) const {
        set_rgb(cr(), black);
        cairo_set_line_width(cr(), 0.6);
        cairo_rectangle(cr(), x, y, w, h);
        cairo_stroke(cr());
    }

    void y_tick(double left, double y, const std::string &label) const {
        set_rgb(cr(), black);
        cairo_set_line_width(cr(), 0.5);
        cairo_move_to(cr(), left, y);
        cairo_line_to(cr(), left - 3.0, y);
        cairo_stroke(cr());
        const double tw = text_width(label, Style::tiny);
        draw_text(left - 4.0 - tw, y - 3.5, label, Style::tiny, -1.0);
    }

    void y_axis_title(double x, double top, double h, const std::string &title) const {
        const double tw = text_width(esc(title), Style::tiny);
        cairo_save(cr());
        cairo_translate(cr(), x, top + h / 2.0 + tw / 2.0);
        cairo_rotate(cr(), -std::numbers::pi / 2.0);
        draw_text(0.0, 0.0, esc(title), Style::tiny, -1.0);
        cairo_restore(cr());
    }

    // ----- references --------------------------------------------------------------------------

    void references() {
        new_page("References");
        heading("References");
        if (r_.references.empty()) {
            paragraph(esc("No published source was used by this run."));
            return;
        }
        for (const auto &ref : r_.references) {
            const auto markup = bold(ref.key) + "\n" + esc(ref.citation);
            const double h = measure(markup, Style::body, content_w_ - 16.0);
            ensure(h);
            draw_text(margin_pt + 16.0, y_, markup, Style::body, content_w_ - 16.0);
            y_ += h + 6.0;
        }
    }

    // ----- output ------------------------------------------------------------------------------

    std::size_t output(const std::filesystem::path &file) {
        PendingFile pending(file);
        SurfacePtr pdf(cairo_pdf_surface_create(pending.temp_path().c_str(), page_w_, page_h_));
        if (cairo_surface_status(pdf.get()) != CAIRO_STATUS_SUCCESS) {
            throw_input_error(file.string(), "cannot open the file for writing",
                              "a writable output folder");
        }
        cairo_pdf_surface_set_metadata(pdf.get(), CAIRO_PDF_METADATA_TITLE,
                                       ("Calculation sheet: " + r_.project.name).c_str());
        cairo_pdf_surface_set_metadata(pdf.get(), CAIRO_PDF_METADATA_CREATOR,
                                       ("catchpeak " + r_.stamp.tool_version).c_str());
        // The creation date is the time of the run (not of writing), so that the same results
        // give the same PDF bytes; cairo would otherwise write the wall-clock time.
        if (!r_.stamp.run_time_utc.empty()) {
            cairo_pdf_surface_set_metadata(pdf.get(), CAIRO_PDF_METADATA_CREATE_DATE,
                                           r_.stamp.run_time_utc.c_str());
        }
        const std::size_t n = pages_.size();
        {
            CairoPtr c(cairo_create(pdf.get()));
            for (std::size_t i = 0; i < n; ++i) {
                cairo_set_source_surface(c.get(), pages_[i].surface.get(), 0.0, 0.0);
                cairo_paint(c.get());
                cr_.reset(cairo_reference(c.get()));
                header_footer(pages_[i].section, i + 1, n);
                cr_.reset();
                cairo_show_page(c.get());
                pages_[i].surface.reset(); // free as we go
            }
        }
        cairo_surface_finish(pdf.get());
        const auto status = cairo_surface_status(pdf.get());
        pdf.reset();
        if (status != CAIRO_STATUS_SUCCESS) {
            throw_input_error(file.string(),
                              std::string("writing the PDF failed: ") +
                                  cairo_status_to_string(status),
                              "a writable output folder with free space");
        }
        pending.commit();
        return n;
    }

    void header_footer(const std::string &section, std::size_t page, std::size_t pages) const {
        const double half = content_w_ / 2.0;
        const auto project = r_.project.number.empty()
                                 ? r_.project.name
                                 : r_.project.name + " (" + r_.project.number + ")";
        draw_text(margin_pt, margin_pt, bold(project), Style::small, half - 4.0, accent);
        draw_text(margin_pt + half + 4.0, margin_pt, esc(section), Style::small, half - 4.0,
                  dark_grey, PANGO_ALIGN_RIGHT);
        rule(margin_pt, margin_pt + content_w_, margin_pt + header_h_pt - 10.0, accent, 0.8);
        const double fy = page_h_ - margin_pt - footer_h_pt + 8.0;
        rule(margin_pt, margin_pt + content_w_, fy, rule_grey, 0.5);
        const std::string sheet = fmt::format("sheet {} of {}", page, pages);
        draw_text(margin_pt, fy + 4.0, esc(short_stamp()), Style::tiny, content_w_ - 90.0,
                  dark_grey);
        draw_text(margin_pt + content_w_ - 90.0, fy + 3.0, bold(sheet), Style::small, 90.0, black,
                  PANGO_ALIGN_RIGHT);
    }

    struct Page {
        SurfacePtr surface;
        std::string section;
    };

    const RunResults &r_;
    units::System system_;
    double page_w_ = 0.0, page_h_ = 0.0, content_w_ = 0.0, top_ = 0.0, bottom_ = 0.0;
    double y_ = 0.0;
    std::string section_;
    ContextPtr context_;
    LayoutPtr layout_;
    std::array<FontDescPtr, 8> fonts_;
    std::vector<Page> pages_;
    CairoPtr cr_;
};

} // namespace

std::size_t write_sheet_pdf(const RunResults &results, const std::filesystem::path &file) {
    SheetWriter writer(results, page_size_for(results.project));
    return writer.write(file);
}

} // namespace catchpeak::report

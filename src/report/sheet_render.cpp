// SPDX-License-Identifier: MIT
#include "internal/sheet_render.hpp"

#include "internal/sheet_chart.hpp"
#include "internal/sheet_culvert.hpp"
#include "internal/sheet_map.hpp"

#include <fmt/format.h>

#include <algorithm>

namespace catchpeak::report {

using style::Style;

namespace {

void draw(PageLayout &page, const CoverTitleBlock &b) {
    page.draw_text(page.left(), page.y(), esc(b.kicker), Style::big, page.content_w(),
                   style::dark_grey);
    page.advance(style::cover_kicker_h_pt);
    page.advance(page.draw_text(page.left(), page.y(), esc(b.title), Style::title, page.content_w(),
                                style::accent));
    page.advance(style::cover_title_gap_pt);
}

void draw(PageLayout &page, const InfoWithSealBlock &b) {
    using namespace style;
    const double x = page.left();
    const double info_w = page.content_w() - seal_w_pt - seal_gap_pt;
    const double top = page.y();
    for (const auto &[key, value] : b.items) {
        const std::string shown = value.empty() ? "-" : value;
        const double h = std::max(page.measure(esc(key), Style::body, info_key_w_pt),
                                  page.measure(esc(shown), Style::body, info_w - info_key_w_pt));
        page.draw_text(x, page.y(), esc(key), Style::body, info_key_w_pt, dark_grey);
        page.draw_text(x + info_key_w_pt, page.y(), bold(shown), Style::body,
                       info_w - info_key_w_pt);
        page.advance(h + info_row_gap_pt);
        page.rule(x, x + info_w, page.y() - info_rule_up_pt, rule_grey, row_rule_w_pt);
    }
    cairo_t *c = page.cr();
    const double seal_x = x + page.content_w() - seal_w_pt;
    set_rgb(c, dark_grey);
    cairo_set_line_width(c, seal_line_w_pt);
    cairo_rectangle(c, seal_x, top, seal_w_pt, seal_w_pt);
    cairo_stroke(c);
    page.draw_text(seal_x, top + seal_w_pt + seal_caption_dy_pt, esc(b.seal_caption), Style::small,
                   seal_w_pt, dark_grey, PANGO_ALIGN_CENTER);
    page.set_y(std::max(page.y(), top + seal_w_pt + seal_gap_pt) + seal_after_pt);
}

void draw(PageLayout &page, const KeyValuesBlock &b) {
    const double key_w = style::info_key_w_pt;
    for (const auto &[key, value] : b.items) {
        page.draw_text(page.left(), page.y(), esc(key), Style::body, key_w, style::dark_grey);
        page.advance(page.draw_text(page.left() + key_w, page.y(), esc(value), Style::body,
                                    page.content_w() - key_w) +
                     style::key_value_gap_pt);
    }
}

void draw(PageLayout &page, const ListBlock &b) {
    const double indent = b.numbered ? style::number_w_pt : style::reference_indent_pt;
    const double gap = b.numbered ? style::numbered_gap_pt : style::reference_gap_pt;
    const double w = page.content_w() - indent;
    for (std::size_t i = 0; i < b.items.size(); ++i) {
        const double h = page.measure(b.items[i], Style::body, w);
        page.ensure(h);
        if (b.numbered) {
            page.draw_text(page.left(), page.y(), esc(fmt::format("{}.", i + 1)), Style::body,
                           style::number_w_pt);
        }
        page.draw_text(page.left() + indent, page.y(), b.items[i], Style::body, w);
        page.advance(h + gap);
    }
}

void draw(PageLayout &page, const WarningsBlock &b) {
    if (b.items.empty()) {
        return;
    }
    using namespace style;
    const double inset = warn_inset_pt;
    const double inner_w = page.content_w() - 2.0 * inset;
    // Items are drawn one by one so that a long list continues on the next page.
    const double h = page.measure(b.title, Style::body, inner_w) + warn_title_pad_pt;
    page.ensure(h + page.measure(b.items.front(), Style::small, inner_w));
    auto box = [&](double y0, double y1) {
        cairo_t *c = page.cr();
        set_rgb(c, warn_fill);
        cairo_rectangle(c, page.left(), y0, page.content_w(), y1 - y0);
        cairo_fill(c);
        set_rgb(c, warn_text);
        cairo_set_line_width(c, warn_bar_w_pt);
        cairo_move_to(c, page.left(), y0);
        cairo_line_to(c, page.left(), y1);
        cairo_stroke(c);
    };
    box(page.y(), page.y() + h - warn_bottom_pt);
    page.draw_text(page.left() + inset, page.y() + warn_title_dy_pt, b.title, Style::body, inner_w,
                   warn_text);
    page.advance(h - warn_bottom_pt);
    for (const auto &item : b.items) {
        const double ih = page.measure(item, Style::small, inner_w) + warn_item_gap_pt;
        page.ensure(ih);
        box(page.y(), page.y() + ih);
        page.draw_text(page.left() + inset, page.y(), item, Style::small, inner_w, black);
        page.advance(ih);
    }
    box(page.y(), page.y() + warn_bottom_pt);
    page.advance(warn_after_pt);
}

} // namespace

void render_block(PageLayout &page, const SheetBlock &block, units::System system,
                  const SheetBlock *next) {
    std::visit(
        [&](const auto &b) {
            using B = std::decay_t<decltype(b)>;
            if constexpr (std::is_same_v<B, HeadingBlock>) {
                const auto *table = next != nullptr ? std::get_if<TableBlock>(next) : nullptr;
                page.heading(b.text, b.style,
                             table != nullptr
                                 ? page.table_start_h(page.fit(table->columns), table->rows)
                                 : 0.0);
            } else if constexpr (std::is_same_v<B, ParagraphBlock>) {
                page.paragraph(b.markup, b.style, b.color);
            } else if constexpr (std::is_same_v<B, SpaceBlock>) {
                page.advance(b.dy_pt);
            } else if constexpr (std::is_same_v<B, TableBlock>) {
                page.table(page.fit(b.columns), b.rows);
            } else if constexpr (std::is_same_v<B, MapBlock>) {
                if (b.map != nullptr) {
                    draw_map_block(page, *b.map, b.point_id, system);
                }
            } else if constexpr (std::is_same_v<B, ChartBlock>) {
                if (b.hydrograph != nullptr) {
                    draw_chart_block(page, b.title, *b.hydrograph, b.point_id, system);
                }
            } else if constexpr (std::is_same_v<B, CulvertCurveBlock>) {
                if (b.culvert != nullptr) {
                    draw_culvert_curve_block(page, b.title, *b.culvert, system);
                }
            } else {
                draw(page, b);
            }
        },
        block);
}

void render_sections(PageLayout &page, const SheetDocument &doc) {
    for (const auto &section : doc.sections) {
        page.new_page(section.title);
        for (std::size_t i = 0; i < section.blocks.size(); ++i) {
            render_block(page, section.blocks[i], doc.system,
                         i + 1 < section.blocks.size() ? &section.blocks[i + 1] : nullptr);
        }
    }
}

} // namespace catchpeak::report

// SPDX-License-Identifier: MIT
#include "internal/sheet_map.hpp"

#include "internal/axis_ticks.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <numbers>

namespace catchpeak::report {

using style::Rgb;
using style::Style;

void WorldBox::add(double x, double y) {
    if (!std::isfinite(x) || !std::isfinite(y)) {
        return;
    }
    min_x = std::min(min_x, x);
    min_y = std::min(min_y, y);
    max_x = std::max(max_x, x);
    max_y = std::max(max_y, y);
}

void WorldBox::add(const Path &path) {
    for (const auto &[x, y] : path) {
        add(x, y);
    }
}

std::optional<MapFrame> fit_map_frame(const MapData &m, double x, double y, double w, double h) {
    MapFrame f{};
    f.x = x;
    f.y = y;
    f.w = w;
    f.h = h;
    WorldBox b;
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
        return std::nullopt;
    }
    // Pad and widen to the frame's shape, so that one scale serves both axes.
    double cx = 0.5 * (b.min_x + b.max_x), cy = 0.5 * (b.min_y + b.max_y);
    double half_w =
        std::max(style::map_half_extent_factor * (b.max_x - b.min_x), style::map_min_half_extent_m);
    double half_h =
        std::max(style::map_half_extent_factor * (b.max_y - b.min_y), style::map_min_half_extent_m);
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
    return f;
}

ScaleBar scale_bar_for(double world_w_m, units::System system) {
    constexpr double ft_per_mi = 5280.0;
    const bool us = system == units::System::us_customary;
    const double unit_m = us ? units::m_per_ft : 1.0;
    const double world_w = world_w_m / unit_m;
    double len = nice_step(world_w / style::grid_parts);
    std::string label;
    if (!us && len >= 1000.0) {
        label = fmt::format("{:g} km", len / 1000.0);
    } else if (us && len >= ft_per_mi) {
        len = nice_step(world_w / style::grid_parts / ft_per_mi) * ft_per_mi;
        label = fmt::format("{:g} mi", len / ft_per_mi);
    } else {
        label = fmt::format("{:g} {}", len, us ? "ft" : "m");
    }
    return {len * unit_m, label};
}

double grid_step_m(const MapFrame &f, double unit_m) {
    return nice_step((f.world.max_x - f.world.min_x) / unit_m / style::grid_parts) * unit_m;
}

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

namespace {

void trace(cairo_t *c, const MapFrame &f, const Path &path, bool close) {
    bool first = true;
    for (const auto &[x, y] : path) {
        if (first) {
            cairo_move_to(c, f.px(x), f.py(y));
            first = false;
        } else {
            cairo_line_to(c, f.px(x), f.py(y));
        }
    }
    if (close && !path.empty()) {
        cairo_close_path(c);
    }
}

void trace_polygons(cairo_t *c, const MapFrame &f, const std::vector<Polygon> &polys) {
    for (const auto &poly : polys) {
        for (const auto &ring : poly) {
            trace(c, f, ring, true);
        }
    }
}

void catchment_style(cairo_t *c) {
    const Rgb k = style::catchment_rgb;
    cairo_set_source_rgba(c, k.r, k.g, k.b, style::catchment_fill_alpha);
    cairo_fill_preserve(c);
    set_rgb(c, k);
    cairo_set_line_width(c, style::catchment_line_w_pt);
    cairo_stroke(c);
}

void local_style(cairo_t *c) {
    cairo_set_dash(c, style::local_dash_pt.data(), static_cast<int>(style::local_dash_pt.size()),
                   0.0);
    set_rgb(c, style::local_rgb);
    cairo_set_line_width(c, style::local_line_w_pt);
    cairo_stroke(c);
    cairo_set_dash(c, nullptr, 0, 0.0);
}

void snapped_square(cairo_t *c, double sx, double sy) {
    const double half = style::snapped_side_pt / 2.0;
    cairo_rectangle(c, sx - half, sy - half, style::snapped_side_pt, style::snapped_side_pt);
}

/// Given: a hollow circle; snapped: a filled square.
void point_symbols(cairo_t *c, double gx, double gy, double sx, double sy) {
    cairo_new_path(c);
    cairo_arc(c, gx, gy, style::given_radius_pt, 0.0, 2.0 * std::numbers::pi);
    set_rgb(c, style::white);
    cairo_fill_preserve(c);
    set_rgb(c, style::black);
    cairo_set_line_width(c, style::given_line_w_pt);
    cairo_stroke(c);
    snapped_square(c, sx, sy);
    set_rgb(c, style::black);
    cairo_fill_preserve(c);
    set_rgb(c, style::white);
    cairo_set_line_width(c, style::snapped_line_w_pt);
    cairo_stroke(c);
}

void hillshade(cairo_t *c, const MapFrame &f, const MapData &m) {
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
            const auto v = m.hillshade[static_cast<std::size_t>(row) * m.hillshade_width +
                                       static_cast<std::size_t>(col)];
            const auto g = static_cast<std::uint32_t>(style::hillshade_grey_offset +
                                                      style::hillshade_grey_gain * v);
            px[col] = (g << 16) | (g << 8) | g;
        }
    }
    cairo_surface_mark_dirty(img.get());
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

/// The map's content inside the frame (clipped to it).
void draw_layers(cairo_t *c, const MapFrame &f, const MapData &m) {
    hillshade(c, f, m);
    cairo_set_line_join(c, CAIRO_LINE_JOIN_ROUND);
    cairo_set_line_cap(c, CAIRO_LINE_CAP_ROUND);
    cairo_set_fill_rule(c, CAIRO_FILL_RULE_EVEN_ODD);
    trace_polygons(c, f, m.catchment);
    catchment_style(c);
    if (!m.local_catchment.empty()) {
        trace_polygons(c, f, m.local_catchment);
        local_style(c);
    }
    set_rgb(c, style::stream_rgb);
    cairo_set_line_width(c, style::stream_line_w_pt);
    for (const auto &s : m.streams) {
        trace(c, f, s, false);
        cairo_stroke(c);
    }
    set_rgb(c, style::path_rgb);
    cairo_set_line_width(c, style::path_line_w_pt);
    trace(c, f, m.longest_flow_path, false);
    cairo_stroke(c);
    // The design point as given and as snapped, joined when apart.
    const double gx = f.px(m.given_xy.first), gy = f.py(m.given_xy.second);
    const double sx = f.px(m.snapped_xy.first), sy = f.py(m.snapped_xy.second);
    set_rgb(c, style::black);
    cairo_set_line_width(c, style::snap_line_w_pt);
    cairo_move_to(c, gx, gy);
    cairo_line_to(c, sx, sy);
    cairo_stroke(c);
    point_symbols(c, gx, gy, sx, sy);
}

void north_arrow(const PageLayout &page, const MapFrame &f) {
    cairo_t *c = page.cr();
    const double ax = f.x + f.w - style::north_inset_pt, ay = f.y + style::north_top_pt;
    cairo_set_source_rgba(c, 1.0, 1.0, 1.0, style::map_box_alpha);
    cairo_rectangle(c, ax - 10.0, ay - 3.0, 20.0, 34.0);
    cairo_fill(c);
    set_rgb(c, style::black);
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
    page.draw_text(ax - 10.0, ay - 2.0, "<b>N</b>", Style::small, 20.0, style::black,
                   PANGO_ALIGN_CENTER);
}

void scale_bar(const PageLayout &page, const MapFrame &f, units::System system) {
    const auto bar = scale_bar_for(f.world.max_x - f.world.min_x, system);
    const double bar_w = bar.length_m * f.scale;
    const double bx = f.x + style::scale_bar_inset_pt, by = f.y + f.h - style::scale_bar_up_pt;
    const double bar_h = style::scale_bar_h_pt;
    const int parts = style::scale_bar_parts;
    cairo_t *c = page.cr();
    cairo_set_source_rgba(c, 1.0, 1.0, 1.0, style::map_box_alpha);
    cairo_rectangle(c, bx - 4.0, by - 12.0,
                    bar_w + 8.0 + page.text_width(esc(bar.label), Style::tiny), 22.0);
    cairo_fill(c);
    for (int i = 0; i < parts; ++i) {
        cairo_rectangle(c, bx + bar_w * i / parts, by, bar_w / parts, bar_h);
        set_rgb(c, i % 2 == 0 ? style::black : style::white);
        cairo_fill(c);
    }
    set_rgb(c, style::black);
    cairo_set_line_width(c, 0.5);
    cairo_rectangle(c, bx, by, bar_w, bar_h);
    cairo_stroke(c);
    page.draw_text(bx - 2.0, by - 9.0, "0", Style::tiny, -1.0);
    page.draw_text(bx + bar_w + 3.0, by - 3.0, esc(bar.label), Style::tiny, -1.0);
}

/// Grid coordinates along the frame, labelled in the linear unit of the DEM file's CRS
/// (`unit_m` metres per unit), in which the engineer's survey gives them.
void grid_labels(const PageLayout &page, const MapFrame &f, double unit_m) {
    cairo_t *c = page.cr();
    const double step = grid_step_m(f, unit_m);
    const double tick = style::map_tick_pt;
    set_rgb(c, style::black);
    cairo_set_line_width(c, style::map_tick_line_w_pt);
    // Eastings below the frame.
    for (double v : ticks_between(f.world.min_x, f.world.max_x, step)) {
        const double x = f.px(v);
        cairo_move_to(c, x, f.y + f.h);
        cairo_line_to(c, x, f.y + f.h + tick);
        cairo_stroke(c);
        const auto label = tick_label(v / unit_m, step / unit_m);
        const double tw = page.text_width(label, Style::tiny);
        if (x - tw / 2.0 < f.x - 12.0 || x + tw / 2.0 > f.x + f.w + 4.0) {
            continue;
        }
        page.draw_text(x - tw / 2.0, f.y + f.h + 3.5, label, Style::tiny, -1.0);
    }
    // Northings left of the frame, turned to read upwards.
    for (double v : ticks_between(f.world.min_y, f.world.max_y, step)) {
        const double y = f.py(v);
        cairo_move_to(c, f.x, y);
        cairo_line_to(c, f.x - tick, y);
        cairo_stroke(c);
        const auto label = tick_label(v / unit_m, step / unit_m);
        const double tw = page.text_width(label, Style::tiny);
        if (y + tw / 2.0 > f.y + f.h + 2.0 || y - tw / 2.0 < f.y - 2.0) {
            continue;
        }
        cairo_save(c);
        cairo_translate(c, f.x - 11.5, y + tw / 2.0);
        cairo_rotate(c, -std::numbers::pi / 2.0);
        page.draw_text(0.0, 0.0, label, Style::tiny, -1.0);
        cairo_restore(c);
    }
}

void legend(const PageLayout &page, double x, double y, double w, const MapData &m,
            const std::string &id) {
    cairo_t *c = page.cr();
    double yy = y;
    yy += page.draw_text(x, yy, "<b>" + esc("Map of " + id) + "</b>", Style::small, w) + 4.0;
    auto entry = [&](const std::string &label, auto &&symbol) {
        symbol(x, yy + 1.0);
        const double sym_w = style::legend_symbol_w_pt;
        const double h = page.draw_text(x + sym_w, yy, esc(label), Style::tiny, w - sym_w);
        yy += std::max(h, style::legend_min_row_pt) + style::legend_row_gap_pt;
    };
    entry("Catchment", [&](double sx, double sy) {
        cairo_rectangle(c, sx + 1.0, sy, 18.0, 8.0);
        catchment_style(c);
    });
    if (!m.local_catchment.empty()) {
        entry("Local catchment (own part)", [&](double sx, double sy) {
            cairo_rectangle(c, sx + 1.0, sy, 18.0, 8.0);
            local_style(c);
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
    line_entry("Longest flow path", style::path_rgb, style::path_line_w_pt);
    if (!m.streams.empty()) {
        line_entry("Streams", style::stream_rgb, style::stream_line_w_pt);
    }
    entry("Design point as given",
          [&](double sx, double sy) { point_symbols(c, sx + 10.0, sy + 4.0, -100.0, -100.0); });
    entry("Design point snapped to the stream", [&](double sx, double sy) {
        cairo_rectangle(c, sx + 7.4, sy + 1.4, style::snapped_side_pt, style::snapped_side_pt);
        set_rgb(c, style::black);
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
    page.draw_text(x, yy,
                   esc(fmt::format("Grid coordinates in {}, in the coordinate system of the DEM; "
                                   "north is grid north.",
                                   plural_unit(m.crs_unit))),
                   Style::tiny, w, style::dark_grey);
}

} // namespace

void draw_map_block(PageLayout &page, const MapData &m, const std::string &point_id,
                    units::System system) {
    using namespace style;
    page.ensure(map_block_h_pt + map_gap_after_pt);
    const auto fitted =
        fit_map_frame(m, page.left() + map_label_pad_pt, page.y(),
                      page.content_w() - map_legend_w_pt - map_label_pad_pt - map_legend_gap_pt,
                      map_block_h_pt - map_label_pad_pt);
    if (!fitted) {
        return;
    }
    const MapFrame &f = *fitted;
    cairo_t *c = page.cr();
    cairo_save(c);
    cairo_rectangle(c, f.x, f.y, f.w, f.h);
    cairo_clip(c);
    cairo_set_source_rgb(c, 1.0, 1.0, 1.0);
    cairo_paint(c);
    draw_layers(c, f, m);
    north_arrow(page, f);
    scale_bar(page, f, system);
    cairo_restore(c);

    set_rgb(c, black);
    cairo_set_line_width(c, map_frame_line_w_pt);
    cairo_rectangle(c, f.x, f.y, f.w, f.h);
    cairo_stroke(c);
    grid_labels(page, f, m.crs_unit_m > 0.0 ? m.crs_unit_m : 1.0);
    legend(page, page.left() + page.content_w() - map_legend_w_pt, f.y, map_legend_w_pt, m,
           point_id);
    page.advance(map_block_h_pt + map_gap_after_pt);
}

} // namespace catchpeak::report

// SPDX-License-Identifier: MIT
#include "internal/sheet_chart.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/report/sheet_units.hpp"
#include "internal/axis_ticks.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

namespace catchpeak::report {

using style::Rgb;
using style::Style;

ValueAxis rain_axis(double rain_max) {
    const double step = nice_step(std::max(rain_max, 1e-9) / style::rain_ticks);
    return {step, std::max(step * std::ceil(rain_max / step), step)};
}

ValueAxis flow_axis(double q_max) {
    const double step = nice_step(std::max(q_max, 1e-9) / style::flow_ticks);
    return {step, std::max(step * std::ceil(q_max * style::flow_headroom / step), step)};
}

TimeAxis time_axis(double step_s, std::size_t steps) {
    TimeAxis t;
    t.bar_min = step_s / 60.0;
    const double t_end_min = t.bar_min * static_cast<double>(steps);
    t.hours = t_end_min > style::hours_axis_from_min;
    t.unit_min = t.hours ? 60.0 : 1.0;
    t.end = std::max(t_end_min / t.unit_min, 1e-9);
    t.step = nice_step(t.end / style::time_ticks);
    return t;
}

ChartScales chart_scales(const Hydrograph &hg, units::System system) {
    ChartScales s;
    const std::size_t n = std::max({hg.q_m3_s.size(), hg.rain_mm.size(), hg.excess_mm.size()});
    s.time = time_axis(hg.step_s, n);
    double rain_max = 0.0;
    for (double v : hg.rain_mm) {
        rain_max = std::max(rain_max, sheet_depth(v, system).value);
    }
    s.rain = rain_axis(rain_max);
    for (std::size_t k = 0; k < hg.q_m3_s.size(); ++k) {
        const double q = sheet_flow(hg.q_m3_s[k], system).value;
        if (q > s.q_max) {
            s.q_max = q;
            s.k_max = k;
        }
    }
    s.flow = flow_axis(s.q_max);
    return s;
}

namespace {

/// Where the chart's panels lie on the page.
struct ChartGeometry {
    double left, right;
    double rain_top, rain_h;
    double q_top, q_h;
    double t_end;
    [[nodiscard]] double tx(double t) const { return left + (right - left) * t / t_end; }
};

class ChartPainter {
  public:
    ChartPainter(const PageLayout &page, const ChartGeometry &g, const ChartScales &s,
                 units::System system)
        : page_(page), c_(page.cr()), g_(g), s_(s), system_(system) {}

    void rain_panel(const Hydrograph &hg) const {
        bars(hg.rain_mm, style::rain_rgb);
        bars(hg.excess_mm, style::excess_rgb);
        axes_box(g_.left, g_.rain_top, g_.right - g_.left, g_.rain_h);
        for (double v : ticks_between(0.0, s_.rain.max + 1e-12, s_.rain.step)) {
            const double y = g_.rain_top + g_.rain_h * v / s_.rain.max;
            y_tick(g_.left, y, tick_label(v, s_.rain.step));
        }
        y_axis_title(style::margin_pt, g_.rain_top, g_.rain_h,
                     "Rain (" + std::string(sheet_depth(0.0, system_).unit) + ")");
    }

    void flow_panel(const Hydrograph &hg) const {
        set_rgb(c_, style::rule_grey);
        cairo_set_line_width(c_, style::chart_grid_w_pt);
        for (double v : ticks_between(s_.flow.step, s_.flow.max + 1e-12, s_.flow.step)) {
            cairo_move_to(c_, g_.left, qy(v));
            cairo_line_to(c_, g_.right, qy(v));
        }
        cairo_stroke(c_);
        set_rgb(c_, style::catchment_rgb);
        cairo_set_line_width(c_, style::hydrograph_line_w_pt);
        cairo_set_line_join(c_, CAIRO_LINE_JOIN_ROUND);
        const auto &t = s_.time;
        for (std::size_t k = 0; k < hg.q_m3_s.size(); ++k) {
            // Flow at the end of step k.
            const double tk = static_cast<double>(k + 1) * t.bar_min / t.unit_min;
            const double q = sheet_flow(hg.q_m3_s[k], system_).value;
            if (k == 0) {
                cairo_move_to(c_, g_.tx(0.0), qy(0.0));
            }
            cairo_line_to(c_, g_.tx(tk), qy(std::isfinite(q) ? q : 0.0));
        }
        cairo_stroke(c_);
        axes_box(g_.left, g_.q_top, g_.right - g_.left, g_.q_h);
        for (double v : ticks_between(0.0, s_.flow.max + 1e-12, s_.flow.step)) {
            y_tick(g_.left, qy(v), tick_label(v, s_.flow.step));
        }
        y_axis_title(style::margin_pt, g_.q_top, g_.q_h, "Flow (" + flow_unit() + ")");
    }

    void time_ticks() const {
        const auto &t = s_.time;
        const double base = g_.q_top + g_.q_h;
        for (double v : ticks_between(0.0, t.end + 1e-9, t.step)) {
            const double x = g_.tx(v);
            set_rgb(c_, style::black);
            cairo_set_line_width(c_, style::chart_tick_w_pt);
            cairo_move_to(c_, x, base);
            cairo_line_to(c_, x, base + style::chart_tick_pt);
            cairo_stroke(c_);
            const auto label = tick_label(v, t.step);
            const double tw = page_.text_width(label, Style::tiny);
            page_.draw_text(x - tw / 2.0, base + 4.0, label, Style::tiny, -1.0);
        }
        const std::string title = t.hours ? "Time from the start of the storm (h)"
                                          : "Time from the start of the storm (min)";
        page_.draw_text(g_.left, base + 13.0, esc(title), Style::small, g_.right - g_.left,
                        style::black, PANGO_ALIGN_CENTER);
    }

    void peak_mark() const {
        if (!(s_.q_max > 0.0)) {
            return;
        }
        const auto &t = s_.time;
        const double t_peak = static_cast<double>(s_.k_max + 1) * t.bar_min / t.unit_min;
        const double px = g_.tx(t_peak), py = qy(s_.q_max);
        cairo_new_path(c_);
        cairo_arc(c_, px, py, style::peak_dot_radius_pt, 0.0, 2.0 * std::numbers::pi);
        set_rgb(c_, style::path_rgb);
        cairo_fill(c_);
        const auto label = esc(fmt::format("peak {} {} at {} {}", sig(s_.q_max), flow_unit(),
                                           sig(t_peak), t.hours ? "h" : "min"));
        const double tw = page_.text_width(label, Style::tiny);
        const double lx = px + 5.0 + tw > g_.right ? px - 5.0 - tw : px + 5.0;
        page_.draw_text(lx, py - 11.0, label, Style::tiny, -1.0, style::path_rgb);
    }

    /// The key below the time axis; returns its y.
    double key(const std::string &point_id) const {
        double kx = g_.left;
        const double ky = g_.q_top + g_.q_h + style::key_dy_pt;
        auto entry = [&](Rgb color, const std::string &label, bool line) {
            set_rgb(c_, color);
            if (line) {
                cairo_set_line_width(c_, style::hydrograph_line_w_pt);
                cairo_move_to(c_, kx, ky + style::key_swatch_h_pt / 2.0);
                cairo_line_to(c_, kx + style::key_swatch_w_pt, ky + style::key_swatch_h_pt / 2.0);
                cairo_stroke(c_);
            } else {
                cairo_rectangle(c_, kx, ky, style::key_swatch_w_pt, style::key_swatch_h_pt);
                cairo_fill(c_);
            }
            kx += style::key_swatch_w_pt + 4.0;
            page_.draw_text(kx, ky, esc(label), Style::tiny, -1.0);
            kx += page_.text_width(esc(label), Style::tiny) + style::key_swatch_w_pt;
        };
        entry(style::rain_rgb, "Rainfall", false);
        entry(style::excess_rgb, "Rainfall excess (runoff)", false);
        entry(style::catchment_rgb, "Hydrograph at design point " + point_id, true);
        return ky;
    }

  private:
    [[nodiscard]] double qy(double q) const { return g_.q_top + g_.q_h - g_.q_h * q / s_.flow.max; }
    [[nodiscard]] std::string flow_unit() const {
        return std::string(sheet_flow(0.0, system_).unit);
    }

    void bars(const std::vector<double> &depth_mm, Rgb color) const {
        const auto &t = s_.time;
        set_rgb(c_, color);
        for (std::size_t k = 0; k < depth_mm.size(); ++k) {
            const double d = sheet_depth(depth_mm[k], system_).value;
            if (!(d > 0.0)) {
                continue;
            }
            const double t0 = static_cast<double>(k) * t.bar_min / t.unit_min;
            const double x0 = g_.tx(t0), x1 = g_.tx(t0 + t.bar_min / t.unit_min);
            cairo_rectangle(c_, x0, g_.rain_top, std::max(x1 - x0, style::min_bar_w_pt),
                            g_.rain_h * d / s_.rain.max);
        }
        cairo_fill(c_);
    }

    void axes_box(double x, double y, double w, double h) const {
        set_rgb(c_, style::black);
        cairo_set_line_width(c_, style::axes_line_w_pt);
        cairo_rectangle(c_, x, y, w, h);
        cairo_stroke(c_);
    }

    void y_tick(double left, double y, const std::string &label) const {
        set_rgb(c_, style::black);
        cairo_set_line_width(c_, style::chart_tick_w_pt);
        cairo_move_to(c_, left, y);
        cairo_line_to(c_, left - style::chart_tick_pt, y);
        cairo_stroke(c_);
        const double tw = page_.text_width(label, Style::tiny);
        page_.draw_text(left - 4.0 - tw, y - 3.5, label, Style::tiny, -1.0);
    }

    void y_axis_title(double x, double top, double h, const std::string &title) const {
        const double tw = page_.text_width(esc(title), Style::tiny);
        cairo_save(c_);
        cairo_translate(c_, x, top + h / 2.0 + tw / 2.0);
        cairo_rotate(c_, -std::numbers::pi / 2.0);
        page_.draw_text(0.0, 0.0, esc(title), Style::tiny, -1.0);
        cairo_restore(c_);
    }

    const PageLayout &page_;
    cairo_t *c_;
    const ChartGeometry &g_;
    const ChartScales &s_;
    units::System system_;
};

} // namespace

void draw_chart_block(PageLayout &page, const std::string &title, const Hydrograph &hg,
                      const std::string &point_id, units::System system) {
    using namespace style;
    page.ensure(chart_block_h_pt + chart_keep_extra_pt);
    page.heading(title, Style::subheading);
    const auto scales = chart_scales(hg, system);
    ChartGeometry g{};
    g.left = page.left() + chart_left_pt;
    g.right = page.left() + page.content_w() - chart_right_pt;
    g.rain_top = page.y() + rain_panel_dy_pt;
    g.rain_h = rain_panel_h_pt;
    g.q_top = g.rain_top + g.rain_h + panel_gap_pt;
    g.q_h = flow_panel_h_pt;
    g.t_end = scales.time.end;
    const ChartPainter paint(page, g, scales, system);
    paint.rain_panel(hg);
    paint.flow_panel(hg);
    paint.time_ticks();
    paint.peak_mark();
    page.set_y(paint.key(point_id) + key_after_pt);
}

} // namespace catchpeak::report

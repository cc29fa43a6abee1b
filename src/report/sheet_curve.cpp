// SPDX-License-Identifier: MIT
// The culvert performance curve drawn with cairo: headwater elevation against the total flow
// at the crossing, the barrels' share where the road overtops, the road crest and the flows
// checked.
#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/report/sheet_units.hpp"
#include "internal/axis_ticks.hpp"
#include "internal/sheet_culvert.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <numbers>

namespace catchpeak::report {

using style::Rgb;
using style::Style;

CurveScales curve_scales(const CulvertResult &c, units::System system) {
    const auto len = [&](double m) { return sheet_length(m, system).value; };
    double q_max = 0.0;
    double el_top = len(c.inlet_invert_m);
    for (const auto &pt : c.curve) {
        q_max = std::max(q_max, sheet_flow(pt.flow_m3_s, system).value);
        el_top = std::max(el_top, len(pt.headwater_elevation_m));
    }
    for (const auto &k : c.cases) {
        q_max = std::max(q_max, sheet_flow(k.flow_m3_s, system).value);
        el_top = std::max(el_top, len(k.headwater_elevation_m));
    }
    if (c.crest_elevation_m) {
        el_top = std::max(el_top, len(*c.crest_elevation_m));
    }
    CurveScales s;
    s.flow_step = nice_step(std::max(q_max, 1e-9) / style::curve_x_ticks);
    s.flow_max = std::max(s.flow_step * std::ceil(q_max / s.flow_step - 1e-9), s.flow_step);
    const double el_min = len(c.inlet_invert_m);
    const double range = std::max(el_top - el_min, len(style::curve_min_range_m));
    s.elev_step = nice_step(range * (1.0 + style::curve_headroom) / style::curve_y_ticks);
    s.elev_min = s.elev_step * std::floor(el_min / s.elev_step);
    s.elev_max = s.elev_step * std::ceil((el_top + style::curve_headroom * range) / s.elev_step);
    return s;
}

namespace {

/// Where the curve's panel lies on the page and how values map onto it.
struct CurveFrame {
    double left, right, top, h;
    CurveScales s;
    [[nodiscard]] double x(double q) const { return left + (right - left) * q / s.flow_max; }
    [[nodiscard]] double y(double el) const {
        return top + h - h * (el - s.elev_min) / (s.elev_max - s.elev_min);
    }
};

class CurvePainter {
  public:
    CurvePainter(const PageLayout &page, const CurveFrame &f, units::System system)
        : page_(page), c_(page.cr()), f_(f), system_(system) {}

    void grid_and_axes() const {
        set_rgb(c_, style::rule_grey);
        cairo_set_line_width(c_, style::chart_grid_w_pt);
        for (double v :
             ticks_between(f_.s.elev_min + f_.s.elev_step, f_.s.elev_max - 1e-9, f_.s.elev_step)) {
            cairo_move_to(c_, f_.left, f_.y(v));
            cairo_line_to(c_, f_.right, f_.y(v));
        }
        cairo_stroke(c_);
        set_rgb(c_, style::black);
        cairo_set_line_width(c_, style::axes_line_w_pt);
        cairo_rectangle(c_, f_.left, f_.top, f_.right - f_.left, f_.h);
        cairo_stroke(c_);
        for (double v : ticks_between(f_.s.elev_min, f_.s.elev_max + 1e-9, f_.s.elev_step)) {
            tick(f_.left, f_.y(v), -style::chart_tick_pt, 0.0);
            const auto label = tick_label(v, f_.s.elev_step);
            page_.draw_text(f_.left - 4.0 - page_.text_width(label, Style::tiny), f_.y(v) - 3.5,
                            label, Style::tiny, -1.0);
        }
        const double base = f_.top + f_.h;
        for (double v : ticks_between(0.0, f_.s.flow_max + 1e-9, f_.s.flow_step)) {
            tick(f_.x(v), base, 0.0, style::chart_tick_pt);
            const auto label = tick_label(v, f_.s.flow_step);
            page_.draw_text(f_.x(v) - page_.text_width(label, Style::tiny) / 2.0, base + 4.0, label,
                            Style::tiny, -1.0);
        }
        page_.draw_text(f_.left, base + 13.0,
                        esc("Total flow at the crossing, Q (" + unit_flow() + ")"), Style::small,
                        f_.right - f_.left, style::black, PANGO_ALIGN_CENTER);
        const auto title = esc("Headwater elevation (" + unit_len() + ")");
        const double tw = page_.text_width(title, Style::tiny);
        cairo_save(c_);
        cairo_translate(c_, style::margin_pt, f_.top + f_.h / 2.0 + tw / 2.0);
        cairo_rotate(c_, -std::numbers::pi / 2.0);
        page_.draw_text(0.0, 0.0, title, Style::tiny, -1.0);
        cairo_restore(c_);
    }

    void crest(double crest_m) const {
        const double y = f_.y(len(crest_m));
        set_rgb(c_, style::dark_grey);
        cairo_set_line_width(c_, style::crest_line_w_pt);
        cairo_set_dash(c_, style::crest_dash_pt.data(), 2, 0.0);
        cairo_move_to(c_, f_.left, y);
        cairo_line_to(c_, f_.right, y);
        cairo_stroke(c_);
        cairo_set_dash(c_, nullptr, 0, 0.0);
        const auto label =
            esc(fmt::format("road crest {} {}", elevation_text(crest_m, system_), unit_len()));
        page_.draw_text(f_.right - 4.0 - page_.text_width(label, Style::tiny), y - 10.0, label,
                        Style::tiny, -1.0, style::dark_grey);
    }

    /// The headwater against a flow of each point: the total (`barrels` false) or the barrels'
    /// share Qc = Q - Qr (true, dashed).
    void curve(const std::vector<CulvertCurvePoint> &pts, bool barrels) const {
        set_rgb(c_, barrels ? style::local_rgb : style::catchment_rgb);
        cairo_set_line_width(c_, barrels ? style::barrels_line_w_pt : style::curve_line_w_pt);
        cairo_set_line_join(c_, CAIRO_LINE_JOIN_ROUND);
        if (barrels) {
            cairo_set_dash(c_, style::barrels_dash_pt.data(), 2, 0.0);
        }
        for (std::size_t i = 0; i < pts.size(); ++i) {
            const double q = pts[i].flow_m3_s - (barrels ? pts[i].overtopping_flow_m3_s : 0.0);
            const double x = f_.x(sheet_flow(q, system_).value);
            const double y = f_.y(len(pts[i].headwater_elevation_m));
            if (i == 0) {
                cairo_move_to(c_, x, y);
            } else {
                cairo_line_to(c_, x, y);
            }
        }
        cairo_stroke(c_);
        cairo_set_dash(c_, nullptr, 0, 0.0);
    }

    void cases(const std::vector<CulvertCase> &cases) const {
        for (const auto &k : cases) {
            const double x = f_.x(sheet_flow(k.flow_m3_s, system_).value);
            const double y = f_.y(len(k.headwater_elevation_m));
            cairo_new_path(c_);
            cairo_arc(c_, x, y, style::case_dot_radius_pt, 0.0, 2.0 * std::numbers::pi);
            set_rgb(c_, style::path_rgb);
            cairo_fill(c_);
            const auto label = esc(return_period_title(k.return_period_yr));
            const double tw = page_.text_width(label, Style::tiny);
            // Above the dot, clear of the curve: to the left where it rises steeply to the
            // right, to the right where the road overtops (the barrels' share rises on the left).
            const double want = k.overtopping_flow_m3_s > 0.0 ? x + 3.0 : x - tw - 3.0;
            const double lx = std::clamp(want, f_.left + 2.0, f_.right - tw - 2.0);
            page_.draw_text(lx, y - 11.0, label, Style::tiny, -1.0, style::path_rgb);
        }
    }

    /// The key below the flow axis; returns its y.
    [[nodiscard]] double key(bool overtops, bool has_crest) const {
        double kx = f_.left;
        const double ky = f_.top + f_.h + style::key_dy_pt;
        const double mid = ky + style::key_swatch_h_pt / 2.0;
        auto entry = [&](Rgb color, const std::string &label, const std::array<double, 2> *dash,
                         bool dot) {
            set_rgb(c_, color);
            if (dot) {
                cairo_new_path(c_);
                cairo_arc(c_, kx + style::key_swatch_w_pt / 2.0, mid, style::case_dot_radius_pt,
                          0.0, 2.0 * std::numbers::pi);
                cairo_fill(c_);
            } else {
                cairo_set_line_width(c_, style::curve_line_w_pt);
                cairo_set_dash(c_, dash != nullptr ? dash->data() : nullptr,
                               dash != nullptr ? 2 : 0, 0.0);
                cairo_move_to(c_, kx, mid);
                cairo_line_to(c_, kx + style::key_swatch_w_pt, mid);
                cairo_stroke(c_);
                cairo_set_dash(c_, nullptr, 0, 0.0);
            }
            kx += style::key_swatch_w_pt + 4.0;
            page_.draw_text(kx, ky, esc(label), Style::tiny, -1.0);
            kx += page_.text_width(esc(label), Style::tiny) + style::key_swatch_w_pt;
        };
        entry(style::catchment_rgb, "Headwater at the total flow", nullptr, false);
        if (overtops) {
            entry(style::local_rgb, "Flow through the barrels alone (the rest over the road)",
                  &style::barrels_dash_pt, false);
        }
        if (has_crest) {
            entry(style::dark_grey, "Road crest", &style::crest_dash_pt, false);
        }
        entry(style::path_rgb, "Flows checked", nullptr, true);
        return ky;
    }

  private:
    [[nodiscard]] double len(double m) const { return sheet_length(m, system_).value; }
    [[nodiscard]] std::string unit_len() const {
        return std::string(sheet_length(0.0, system_).unit);
    }
    [[nodiscard]] std::string unit_flow() const {
        return std::string(sheet_flow(0.0, system_).unit);
    }
    void tick(double x, double y, double dx, double dy) const {
        set_rgb(c_, style::black);
        cairo_set_line_width(c_, style::chart_tick_w_pt);
        cairo_move_to(c_, x, y);
        cairo_line_to(c_, x + dx, y + dy);
        cairo_stroke(c_);
    }

    const PageLayout &page_;
    cairo_t *c_;
    const CurveFrame &f_;
    units::System system_;
};

} // namespace

void draw_culvert_curve_block(PageLayout &page, const std::string &title, const CulvertResult &c,
                              units::System system) {
    using namespace style;
    page.ensure(curve_block_h_pt + chart_keep_extra_pt);
    page.heading(title, Style::subheading);
    const CurveFrame f{page.left() + chart_left_pt, page.left() + page.content_w() - chart_right_pt,
                       page.y() + curve_panel_dy_pt, curve_panel_h_pt, curve_scales(c, system)};
    const CurvePainter paint(page, f, system);
    paint.grid_and_axes();
    const bool overtops =
        std::any_of(c.curve.begin(), c.curve.end(),
                    [](const CulvertCurvePoint &pt) { return pt.overtopping_flow_m3_s > 0.0; });
    if (c.crest_elevation_m) {
        paint.crest(*c.crest_elevation_m);
    }
    if (overtops) {
        paint.curve(c.curve, true);
    }
    paint.curve(c.curve, false);
    paint.cases(c.cases);
    page.set_y(paint.key(overtops, c.crest_elevation_m.has_value()) + key_after_pt);
}

} // namespace catchpeak::report

// SPDX-License-Identifier: MIT
#include "catchpeak/rain/frequency.hpp"

#include "sheet_units.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

namespace catchpeak::rain {

namespace {

// Record length (common practice, no source).
constexpr Formula short_record{"ams.short_record",
                               "Short rainfall record",
                               "",
                               "{n} years of annual maxima, fewer than {n_short}; the {T} {T:u} "
                               "depth is uncertain",
                               Ref::common_practice,
                               ""};
constexpr Formula beyond_record{"ams.beyond_record",
                                "Return period beyond the record",
                                "",
                                "return period {T} {T:u} is more than twice the record length "
                                "({n} years); the depth is an extrapolation",
                                Ref::common_practice,
                                ""};

/// A calculation line whose negative numbers are shown in parentheses ("(-0.1640)"), so that a
/// substituted value never reads as "+ -0.1640" or "2^--0.1000".
CalcLine &calc_signed(CalcLines &lines, const Formula &f, std::vector<Quantity> inputs,
                      Quantity result) {
    for (auto &q : inputs) {
        q.shown = q.shown.parenthesised();
    }
    result.shown = result.shown.parenthesised();
    return lines.calc(f, std::move(inputs), std::move(result));
}

void check_return_period(double t_yr, const char *method) {
    if (!std::isfinite(t_yr) || !(t_yr > 1.0)) {
        throw_input_error(fmt::format("{} frequency analysis", method),
                          fmt::format("return period {} yr", sig(t_yr)),
                          "return periods greater than 1 yr");
    }
}

/// Checks the series and returns it in the sheet's depth unit (mm or in), sorted ascending.
std::vector<double> prepared_series(std::span<const double> mm, double t_yr, const char *method,
                                    units::System s, CalcLines &lines) {
    check_return_period(t_yr, method);
    const auto where = fmt::format("{} frequency analysis: annual maximum series", method);
    if (mm.size() < min_record_years) {
        throw_input_error(where, fmt::format("{} values", mm.size()),
                          fmt::format("at least {} years of annual maxima ({})", min_record_years,
                                      short_form(Ref::common_practice)));
    }
    std::vector<double> v;
    v.reserve(mm.size());
    for (std::size_t i = 0; i < mm.size(); ++i) {
        if (!std::isfinite(mm[i]) || mm[i] < 0.0) {
            throw_input_error(
                where, fmt::format("value {} (number {}) is {} mm", i + 1, i + 1, sig(mm[i])),
                "depths >= 0 mm");
        }
        v.push_back(s == units::System::us_customary ? units::mm_to_in(mm[i]) : mm[i]);
    }
    std::sort(v.begin(), v.end());
    if (v.front() == v.back()) {
        throw_input_error(where,
                          fmt::format("all {} values are equal ({} mm)", v.size(), sig(mm[0])),
                          "a series that varies from year to year");
    }
    const double n = static_cast<double>(v.size());
    if (v.size() < short_record_years) {
        lines.warn(short_record, {detail::count_qty("n", v.size()),
                                  detail::count_qty("n_short", short_record_years),
                                  detail::return_period_qty(t_yr)});
    }
    if (t_yr > 2.0 * n) {
        lines.warn(beyond_record,
                   {detail::return_period_qty(t_yr), detail::count_qty("n", v.size())});
    }
    return v;
}

// Gumbel (EV1) by the method of moments, Chow, Maidment & Mays (1988).
constexpr Formula series_mean{"ams.mean",          "Mean of the annual maxima",
                              "xbar = sum(x) / n", "xbar = {sum} / {n}",
                              Ref::project_input,  ": annual maximum series"};
constexpr Formula series_sd{"ams.standard_deviation",
                            "Standard deviation of the annual maxima",
                            "s = sqrt(sum((x - xbar)^2) / (n - 1))",
                            "s = sqrt({ss} / ({n} - 1))",
                            Ref::project_input,
                            ": annual maximum series"};
constexpr Formula gumbel_factor{"ams.gumbel_frequency_factor",
                                "Gumbel frequency factor",
                                "K_T = -(sqrt(6)/pi) (0.5772 + ln(ln(T/(T - 1))))",
                                "K_T = -(sqrt(6)/pi) x (0.5772 + ln(ln({T}/({T} - 1))))",
                                Ref::chow_1988,
                                ", Applied Hydrology, eq. 12.3.8"};
constexpr Formula gumbel_design_depth{"ams.gumbel_depth",   "Design depth, Gumbel, {T} {T:u}",
                                      "x_T = xbar + K_T s", "x_T = {xbar} + {K_T} x {s}",
                                      Ref::chow_1988,       ", Applied Hydrology, sec. 12.3"};

} // namespace

double gumbel_frequency_factor(double return_period_yr) {
    check_return_period(return_period_yr, "Gumbel");
    const double t = return_period_yr;
    return -(std::sqrt(6.0) / std::numbers::pi) * (0.5772 + std::log(std::log(t / (t - 1.0))));
}

WithLines<double> gumbel_depth(std::span<const double> annual_max_mm, double return_period_yr,
                               units::System sheet_units) {
    WithLines<double> out{0.0, {}};
    const auto v =
        prepared_series(annual_max_mm, return_period_yr, "Gumbel", sheet_units, out.lines);
    const Unit unit = detail::depth_unit(sheet_units);
    const double n = static_cast<double>(v.size());
    double sum = 0.0;
    for (double x : v) {
        sum += x;
    }
    const double mean = sum / n;
    double ss = 0.0;
    for (double x : v) {
        ss += (x - mean) * (x - mean);
    }
    const double sd = std::sqrt(ss / (n - 1.0));
    calc_signed(out.lines, series_mean, {qty("sum", sum, unit), detail::count_qty("n", v.size())},
                qty("xbar", mean, unit));
    calc_signed(out.lines, series_sd, {qty("ss", ss, unit), detail::count_qty("n", v.size())},
                qty("s", sd, unit));
    const double t = return_period_yr;
    const double k = gumbel_frequency_factor(t);
    calc_signed(out.lines, gumbel_factor, {detail::return_period_qty(t)}, qty("K_T", k));
    const double x = mean + k * sd;
    calc_signed(
        out.lines, gumbel_design_depth,
        {detail::return_period_qty(t), qty("xbar", mean, unit), qty("K_T", k), qty("s", sd, unit)},
        qty("x_T", x, unit));
    out.value = detail::sheet_to_mm(x, sheet_units);
    return out;
}

SampleLMoments sample_l_moments(std::span<const double> values) {
    std::vector<double> v(values.begin(), values.end());
    if (v.size() < 3) {
        throw_input_error("L-moments", fmt::format("{} values", v.size()), "at least 3 values");
    }
    std::sort(v.begin(), v.end());
    const double n = static_cast<double>(v.size());
    double b0 = 0.0;
    double b1 = 0.0;
    double b2 = 0.0;
    for (std::size_t i = 0; i < v.size(); ++i) {
        const double j = static_cast<double>(i); // j - 1 for the 1-based rank
        b0 += v[i];
        b1 += j / (n - 1.0) * v[i];
        b2 += j * (j - 1.0) / ((n - 1.0) * (n - 2.0)) * v[i];
    }
    b0 /= n;
    b1 /= n;
    b2 /= n;
    SampleLMoments m;
    m.l1 = b0;
    m.l2 = 2.0 * b1 - b0;
    const double l3 = 6.0 * b2 - 6.0 * b1 + b0;
    m.tau3 = m.l2 > 0.0 ? l3 / m.l2 : 0.0;
    return m;
}

double gev_quantile(const GevParameters &p, double non_exceedance) {
    const double y = -std::log(non_exceedance);
    if (p.shape == 0.0) {
        return p.location_mm - p.scale_mm * std::log(y);
    }
    return p.location_mm + p.scale_mm * (1.0 - std::pow(y, p.shape)) / p.shape;
}

namespace {

/// Below this |k| the GEV formulas lose precision; the Gumbel limit is used instead.
constexpr double gumbel_limit_k = 1e-8;

struct GevSteps {
    double c = 0.0;
    GevParameters p;
    double gamma = 1.0; ///< Gamma(1 + k)
};

GevSteps gev_steps(const SampleLMoments &m) {
    if (!(m.l2 > 0.0) || !std::isfinite(m.l2) || !std::isfinite(m.tau3)) {
        throw_input_error("GEV frequency analysis",
                          fmt::format("L-scale l2 = {} is not positive", sig(m.l2)),
                          "a series that varies from year to year");
    }
    GevSteps s;
    s.c = 2.0 / (3.0 + m.tau3) - std::log(2.0) / std::log(3.0);
    const double k = 7.8590 * s.c + 2.9554 * s.c * s.c;
    if (!(k > -1.0)) {
        throw_input_error("GEV frequency analysis",
                          fmt::format("L-skewness tau3 = {} gives k = {}, a GEV without a finite "
                                      "mean",
                                      sig(m.tau3), sig(k)),
                          "a series whose L-skewness gives k > -1");
    }
    s.p.shape = k;
    if (std::abs(k) < gumbel_limit_k) {
        s.p.shape = 0.0;
        s.p.scale_mm = m.l2 / std::log(2.0);
        s.p.location_mm = m.l1 - std::numbers::egamma * s.p.scale_mm;
        return s;
    }
    s.gamma = std::tgamma(1.0 + k);
    s.p.scale_mm = m.l2 * k / ((1.0 - std::pow(2.0, -k)) * s.gamma);
    s.p.location_mm = m.l1 - s.p.scale_mm * (1.0 - s.gamma) / k;
    return s;
}

} // namespace

GevParameters gev_from_l_moments(const SampleLMoments &m) { return gev_steps(m).p; }

namespace {

// GEV by L-moments: Hosking (1990); Hosking & Wallis (1997); the approximation of k from
// Hosking, Wallis & Wood (1985). x_(j) are the values sorted ascending.
constexpr std::string_view and_hw1997 = "; Hosking & Wallis (1997)";
constexpr Formula pwm_b0{
    "ams.pwm_b0",           "Probability-weighted moment b0",
    "b0 = (1/n) sum x_(j)", "b0 = (1/{n}) x sum of the {n} values",
    Ref::hosking_1990,      "; Hosking & Wallis (1997); values x_(j) sorted ascending"};
constexpr Formula pwm_b1{"ams.pwm_b1",
                         "Probability-weighted moment b1",
                         "b1 = (1/n) sum (j-1)/(n-1) x_(j)",
                         "b1 = (1/{n}) x sum (j-1)/{n-1} x_(j)",
                         Ref::hosking_1990,
                         "; Hosking & Wallis (1997); values x_(j) sorted ascending"};
constexpr Formula pwm_b2{"ams.pwm_b2",
                         "Probability-weighted moment b2",
                         "b2 = (1/n) sum (j-1)(j-2)/((n-1)(n-2)) x_(j)",
                         "b2 = (1/{n}) x sum (j-1)(j-2)/({n-1} x {n-2}) x_(j)",
                         Ref::hosking_1990,
                         "; Hosking & Wallis (1997); values x_(j) sorted ascending"};
constexpr Formula l_moment_1{"ams.l1",    "L-moment l1",     "l1 = b0",
                             "l1 = {b0}", Ref::hosking_1990, and_hw1997};
constexpr Formula l_moment_2{"ams.l2",          "L-moment l2",
                             "l2 = 2 b1 - b0",  "l2 = 2 x {b1} - {b0}",
                             Ref::hosking_1990, and_hw1997};
constexpr Formula l_moment_3{
    "ams.l3",          "L-moment l3", "l3 = 6 b2 - 6 b1 + b0", "l3 = 6 x {b2} - 6 x {b1} + {b0}",
    Ref::hosking_1990, and_hw1997};
constexpr Formula l_skewness{"ams.tau3",           "L-skewness",      "tau3 = l3 / l2",
                             "tau3 = {l3} / {l2}", Ref::hosking_1990, and_hw1997};
constexpr Formula gev_c{"ams.gev_c",
                        "GEV shape, auxiliary c",
                        "c = 2/(3 + tau3) - ln 2 / ln 3",
                        "c = 2/(3 + {tau3}) - ln 2 / ln 3",
                        Ref::hosking_wallis_wood_1985,
                        and_hw1997};
constexpr Formula gev_k{"ams.gev_k",
                        "GEV shape parameter",
                        "k = 7.8590 c + 2.9554 c^2",
                        "k = 7.8590 x {c} + 2.9554 x {c}^2",
                        Ref::hosking_wallis_wood_1985,
                        and_hw1997};
constexpr Formula gev_k_range{"ams.gev_k_outside_range",
                              "GEV shape approximation outside its range",
                              "",
                              "L-skewness tau3 = {tau3} lies outside -0.5 to 0.5, where the "
                              "approximation of k is accurate to about 9e-4",
                              Ref::hosking_wallis_wood_1985,
                              "; Hosking & Wallis (1997) (range: value from memory, not checked "
                              "against the source)"};
constexpr Formula gev_k_zero{"ams.gev_k_zero",
                             "GEV shape taken as zero",
                             "",
                             "|k| < 1e-8: the Gumbel limit alpha = l2 / ln 2, xi = l1 - 0.5772 "
                             "alpha is used",
                             Ref::hosking_1990,
                             and_hw1997};
constexpr Formula gev_scale_k_zero{"ams.gev_scale_k_zero", "GEV scale parameter",
                                   "alpha = l2 / ln 2",    "alpha = {l2} / ln 2",
                                   Ref::hosking_1990,      and_hw1997};
constexpr Formula gev_location_k_zero{"ams.gev_location_k_zero", "GEV location parameter",
                                      "xi = l1 - 0.5772 alpha",  "xi = {l1} - 0.5772 x {alpha}",
                                      Ref::hosking_1990,         and_hw1997};
constexpr Formula gev_gamma{"ams.gev_gamma",      "Gamma function",  "G = Gamma(1 + k)",
                            "G = Gamma(1 + {k})", Ref::hosking_1990, and_hw1997};
constexpr Formula gev_scale{"ams.gev_scale",
                            "GEV scale parameter",
                            "alpha = l2 k / ((1 - 2^-k) G)",
                            "alpha = {l2} x {k} / ((1 - 2^-{k}) x {G})",
                            Ref::hosking_1990,
                            and_hw1997};
constexpr Formula gev_location{"ams.gev_location",
                               "GEV location parameter",
                               "xi = l1 - alpha (1 - G) / k",
                               "xi = {l1} - {alpha} x (1 - {G}) / {k}",
                               Ref::hosking_1990,
                               and_hw1997};
constexpr Formula non_exceedance{"ams.non_exceedance",
                                 "Non-exceedance probability",
                                 "F = 1 - 1/T",
                                 "F = 1 - 1/{T}",
                                 Ref::none,
                                 "definition of the return period"};
constexpr Formula gev_depth_k_zero{"ams.gev_depth_k_zero",
                                   "Design depth, GEV, {T} {T:u}",
                                   "x_T = xi - alpha ln(-ln F)",
                                   "x_T = {xi} - {alpha} x ln(-ln {F})",
                                   Ref::hosking_1990,
                                   and_hw1997};
constexpr Formula gev_design_depth{"ams.gev_depth",
                                   "Design depth, GEV, {T} {T:u}",
                                   "x_T = xi + alpha (1 - (-ln F)^k) / k",
                                   "x_T = {xi} + {alpha} x (1 - (-ln {F})^{k}) / {k}",
                                   Ref::hosking_1990,
                                   and_hw1997};

/// The unbiased probability-weighted moments of the sorted series (sheet units).
struct Pwm {
    double b0 = 0.0;
    double b1 = 0.0;
    double b2 = 0.0;
};

Pwm probability_weighted_moments(const std::vector<double> &v, Unit unit, CalcLines &lines) {
    const double n = static_cast<double>(v.size());
    Pwm b;
    for (std::size_t i = 0; i < v.size(); ++i) {
        const double j = static_cast<double>(i + 1);
        b.b0 += v[i];
        b.b1 += (j - 1.0) / (n - 1.0) * v[i];
        b.b2 += (j - 1.0) * (j - 2.0) / ((n - 1.0) * (n - 2.0)) * v[i];
    }
    b.b0 /= n;
    b.b1 /= n;
    b.b2 /= n;
    const auto size = detail::count_qty("n", v.size());
    calc_signed(lines, pwm_b0, {size}, qty("b0", b.b0, unit));
    calc_signed(lines, pwm_b1, {size, detail::count_qty("n-1", v.size() - 1)},
                qty("b1", b.b1, unit));
    calc_signed(
        lines, pwm_b2,
        {size, detail::count_qty("n-1", v.size() - 1), detail::count_qty("n-2", v.size() - 2)},
        qty("b2", b.b2, unit));
    return b;
}

SampleLMoments l_moments_of(const Pwm &b, Unit unit, CalcLines &lines) {
    SampleLMoments m;
    m.l1 = b.b0;
    m.l2 = 2.0 * b.b1 - b.b0;
    const double l3 = 6.0 * b.b2 - 6.0 * b.b1 + b.b0;
    m.tau3 = l3 / m.l2;
    const auto b0 = qty("b0", b.b0, unit);
    const auto b1 = qty("b1", b.b1, unit);
    calc_signed(lines, l_moment_1, {b0}, qty("l1", m.l1, unit));
    calc_signed(lines, l_moment_2, {b1, b0}, qty("l2", m.l2, unit));
    calc_signed(lines, l_moment_3, {qty("b2", b.b2, unit), b1, b0}, qty("l3", l3, unit));
    calc_signed(lines, l_skewness, {qty("l3", l3, unit), qty("l2", m.l2, unit)},
                qty("tau3", m.tau3));
    return m;
}

/// The shape k from tau3, then the scale and location (lines in the sheet's unit).
GevSteps gev_parameters(const SampleLMoments &m, Unit unit, CalcLines &lines) {
    const auto s = gev_steps(m);
    calc_signed(lines, gev_c, {qty("tau3", m.tau3)}, qty("c", s.c));
    const double k_raw = 7.8590 * s.c + 2.9554 * s.c * s.c;
    calc_signed(lines, gev_k, {qty("c", s.c)}, qty("k", k_raw));
    if (m.tau3 < -0.5 || m.tau3 > 0.5) {
        lines.warn(gev_k_range, {qty("tau3", m.tau3)});
    }
    const auto &p = s.p;
    const auto l1 = qty("l1", m.l1, unit);
    const auto l2 = qty("l2", m.l2, unit);
    const auto alpha = qty("alpha", p.scale_mm, unit);
    const auto xi = qty("xi", p.location_mm, unit);
    if (p.shape == 0.0) {
        lines.note(gev_k_zero);
        calc_signed(lines, gev_scale_k_zero, {l2}, alpha);
        calc_signed(lines, gev_location_k_zero, {l1, alpha}, xi);
        return s;
    }
    const auto k = qty("k", p.shape);
    const auto g = qty("G", s.gamma);
    calc_signed(lines, gev_gamma, {k}, g);
    calc_signed(lines, gev_scale, {l2, k, g}, alpha);
    calc_signed(lines, gev_location, {l1, alpha, g, k}, xi);
    return s;
}

/// x_T = x(1 - 1/T), in the sheet's unit.
double gev_design_value(const GevParameters &p, double t, Unit unit, CalcLines &lines) {
    const double f = 1.0 - 1.0 / t;
    const auto f_q = qty("F", f);
    calc_signed(lines, non_exceedance, {detail::return_period_qty(t)}, f_q);
    const double x = gev_quantile(p, f);
    const auto xi = qty("xi", p.location_mm, unit);
    const auto alpha = qty("alpha", p.scale_mm, unit);
    const auto x_t = qty("x_T", x, unit);
    if (p.shape == 0.0) {
        calc_signed(lines, gev_depth_k_zero, {detail::return_period_qty(t), xi, alpha, f_q}, x_t);
    } else {
        calc_signed(lines, gev_design_depth,
                    {detail::return_period_qty(t), xi, alpha, f_q, qty("k", p.shape)}, x_t);
    }
    return x;
}

} // namespace

WithLines<double> gev_depth(std::span<const double> annual_max_mm, double return_period_yr,
                            units::System sheet_units) {
    WithLines<double> out{0.0, {}};
    const auto v = prepared_series(annual_max_mm, return_period_yr, "GEV", sheet_units, out.lines);
    const Unit unit = detail::depth_unit(sheet_units);
    const auto b = probability_weighted_moments(v, unit, out.lines);
    const auto m = l_moments_of(b, unit, out.lines);
    const auto s = gev_parameters(m, unit, out.lines);
    const double x = gev_design_value(s.p, return_period_yr, unit, out.lines);
    out.value = detail::sheet_to_mm(x, sheet_units);
    return out;
}

} // namespace catchpeak::rain

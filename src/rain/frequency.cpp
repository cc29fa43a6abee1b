// SPDX-License-Identifier: MIT
#include "catchpeak/rain/frequency.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

namespace catchpeak::rain {

namespace {

constexpr const char *chow = "Chow, Maidment & Mays (1988), Applied Hydrology";
constexpr const char *hosking = "Hosking (1990); Hosking & Wallis (1997)";
constexpr const char *record_rule = "common practice, no source";

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
        throw_input_error(
            where, fmt::format("{} values", mm.size()),
            fmt::format("at least {} years of annual maxima ({})", min_record_years, record_rule));
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
        lines.warn("Short rainfall record",
                   fmt::format("{} years of annual maxima, fewer than {}; the {} yr depth is "
                               "uncertain",
                               v.size(), short_record_years, sig(t_yr)),
                   record_rule);
    }
    if (t_yr > 2.0 * n) {
        lines.warn("Return period beyond the record",
                   fmt::format("return period {} yr is more than twice the record length ({} "
                               "years); the depth is an extrapolation",
                               sig(t_yr), v.size()),
                   record_rule);
    }
    return v;
}

std::string depth_unit(units::System s) { return s == units::System::us_customary ? "in" : "mm"; }

/// A number for the numbers column, in parentheses when negative ("(-0.1640)"), so that a
/// substituted value never reads as "+ -0.1640" or "2^--0.1000".
std::string num(double v) { return v < 0.0 ? fmt::format("({})", sig(v)) : sig(v); }

double sheet_to_mm(double v, units::System s) {
    return s == units::System::us_customary ? units::in_to_mm(v) : v;
}

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
    const auto unit = depth_unit(sheet_units);
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
    out.lines.calc("Mean of the annual maxima", "xbar = sum(x) / n",
                   fmt::format("xbar = {} / {}", num(sum), v.size()), mean, unit,
                   "project input: annual maximum series");
    out.lines.calc("Standard deviation of the annual maxima",
                   "s = sqrt(sum((x - xbar)^2) / (n - 1))",
                   fmt::format("s = sqrt({} / ({} - 1))", num(ss), v.size()), sd, unit,
                   "project input: annual maximum series");
    const double t = return_period_yr;
    const double k = gumbel_frequency_factor(t);
    out.lines.calc(
        "Gumbel frequency factor", "K_T = -(sqrt(6)/pi) (0.5772 + ln(ln(T/(T - 1))))",
        fmt::format("K_T = -(sqrt(6)/pi) x (0.5772 + ln(ln({}/({} - 1))))", num(t), num(t)), k, "",
        fmt::format("{}, eq. 12.3.8", chow));
    const double x = mean + k * sd;
    out.lines.calc(fmt::format("Design depth, Gumbel, {} yr", num(t)), "x_T = xbar + K_T s",
                   fmt::format("x_T = {} + {} x {}", num(mean), num(k), num(sd)), x, unit,
                   fmt::format("{}, sec. 12.3", chow));
    out.value = sheet_to_mm(x, sheet_units);
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

WithLines<double> gev_depth(std::span<const double> annual_max_mm, double return_period_yr,
                            units::System sheet_units) {
    WithLines<double> out{0.0, {}};
    const auto v = prepared_series(annual_max_mm, return_period_yr, "GEV", sheet_units, out.lines);
    const auto unit = depth_unit(sheet_units);
    const double n = static_cast<double>(v.size());
    double b0 = 0.0;
    double b1 = 0.0;
    double b2 = 0.0;
    for (std::size_t i = 0; i < v.size(); ++i) {
        const double j = static_cast<double>(i + 1);
        b0 += v[i];
        b1 += (j - 1.0) / (n - 1.0) * v[i];
        b2 += (j - 1.0) * (j - 2.0) / ((n - 1.0) * (n - 2.0)) * v[i];
    }
    b0 /= n;
    b1 /= n;
    b2 /= n;
    const auto pwm_source = fmt::format("{}; values x_(j) sorted ascending", hosking);
    out.lines.calc("Probability-weighted moment b0", "b0 = (1/n) sum x_(j)",
                   fmt::format("b0 = (1/{}) x sum of the {} values", v.size(), v.size()), b0, unit,
                   pwm_source);
    out.lines.calc("Probability-weighted moment b1", "b1 = (1/n) sum (j-1)/(n-1) x_(j)",
                   fmt::format("b1 = (1/{}) x sum (j-1)/{} x_(j)", v.size(), v.size() - 1), b1,
                   unit, pwm_source);
    out.lines.calc("Probability-weighted moment b2", "b2 = (1/n) sum (j-1)(j-2)/((n-1)(n-2)) x_(j)",
                   fmt::format("b2 = (1/{}) x sum (j-1)(j-2)/({} x {}) x_(j)", v.size(),
                               v.size() - 1, v.size() - 2),
                   b2, unit, pwm_source);
    SampleLMoments m;
    m.l1 = b0;
    m.l2 = 2.0 * b1 - b0;
    const double l3 = 6.0 * b2 - 6.0 * b1 + b0;
    m.tau3 = l3 / m.l2;
    out.lines.calc("L-moment l1", "l1 = b0", fmt::format("l1 = {}", num(b0)), m.l1, unit, hosking);
    out.lines.calc("L-moment l2", "l2 = 2 b1 - b0",
                   fmt::format("l2 = 2 x {} - {}", num(b1), num(b0)), m.l2, unit, hosking);
    out.lines.calc("L-moment l3", "l3 = 6 b2 - 6 b1 + b0",
                   fmt::format("l3 = 6 x {} - 6 x {} + {}", num(b2), num(b1), num(b0)), l3, unit,
                   hosking);
    out.lines.calc("L-skewness", "tau3 = l3 / l2",
                   fmt::format("tau3 = {} / {}", num(l3), num(m.l2)), m.tau3, "", hosking);
    const auto s = gev_steps(m);
    const auto k_source = "Hosking, Wallis & Wood (1985); Hosking & Wallis (1997)";
    out.lines.calc("GEV shape, auxiliary c", "c = 2/(3 + tau3) - ln 2 / ln 3",
                   fmt::format("c = 2/(3 + {}) - ln 2 / ln 3", num(m.tau3)), s.c, "", k_source);
    const double k_raw = 7.8590 * s.c + 2.9554 * s.c * s.c;
    out.lines.calc("GEV shape parameter", "k = 7.8590 c + 2.9554 c^2",
                   fmt::format("k = 7.8590 x {} + 2.9554 x {}^2", num(s.c), num(s.c)), k_raw, "",
                   k_source);
    if (m.tau3 < -0.5 || m.tau3 > 0.5) {
        out.lines.warn(
            "GEV shape approximation outside its range",
            fmt::format("L-skewness tau3 = {} lies outside -0.5 to 0.5, where the "
                        "approximation of k is accurate to about 9e-4",
                        sig(m.tau3)),
            fmt::format("{} (range: value from memory, not checked against the source)", k_source));
    }
    const double t = return_period_yr;
    const double f = 1.0 - 1.0 / t;
    const auto &p = s.p;
    if (p.shape == 0.0) {
        out.lines.note("GEV shape taken as zero",
                       "|k| < 1e-8: the Gumbel limit alpha = l2 / ln 2, xi = l1 - 0.5772 alpha "
                       "is used",
                       hosking);
        out.lines.calc("GEV scale parameter", "alpha = l2 / ln 2",
                       fmt::format("alpha = {} / ln 2", num(m.l2)), p.scale_mm, unit, hosking);
        out.lines.calc("GEV location parameter", "xi = l1 - 0.5772 alpha",
                       fmt::format("xi = {} - 0.5772 x {}", num(m.l1), num(p.scale_mm)),
                       p.location_mm, unit, hosking);
    } else {
        out.lines.calc("Gamma function", "G = Gamma(1 + k)",
                       fmt::format("G = Gamma(1 + {})", num(p.shape)), s.gamma, "", hosking);
        out.lines.calc("GEV scale parameter", "alpha = l2 k / ((1 - 2^-k) G)",
                       fmt::format("alpha = {} x {} / ((1 - 2^-{}) x {})", num(m.l2), num(p.shape),
                                   num(p.shape), num(s.gamma)),
                       p.scale_mm, unit, hosking);
        out.lines.calc("GEV location parameter", "xi = l1 - alpha (1 - G) / k",
                       fmt::format("xi = {} - {} x (1 - {}) / {}", num(m.l1), num(p.scale_mm),
                                   num(s.gamma), num(p.shape)),
                       p.location_mm, unit, hosking);
    }
    out.lines.calc("Non-exceedance probability", "F = 1 - 1/T", fmt::format("F = 1 - 1/{}", num(t)),
                   f, "", "definition of the return period");
    const double x = gev_quantile(p, f);
    if (p.shape == 0.0) {
        out.lines.calc(
            fmt::format("Design depth, GEV, {} yr", num(t)), "x_T = xi - alpha ln(-ln F)",
            fmt::format("x_T = {} - {} x ln(-ln {})", num(p.location_mm), num(p.scale_mm), num(f)),
            x, unit, hosking);
    } else {
        out.lines.calc(fmt::format("Design depth, GEV, {} yr", num(t)),
                       "x_T = xi + alpha (1 - (-ln F)^k) / k",
                       fmt::format("x_T = {} + {} x (1 - (-ln {})^{}) / {}", num(p.location_mm),
                                   num(p.scale_mm), num(f), num(p.shape), num(p.shape)),
                       x, unit, hosking);
    }
    out.value = sheet_to_mm(x, sheet_units);
    return out;
}

} // namespace catchpeak::rain

// SPDX-License-Identifier: MIT
#include "catchpeak/app/point_hydrology.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydro/curve_number.hpp"
#include "catchpeak/hydro/rational.hpp"
#include "catchpeak/hydro/tc.hpp"
#include "catchpeak/hydro/tr55_peak.hpp"
#include "catchpeak/hydro/unit_hydrograph.hpp"
#include "catchpeak/io/hydro_tables.hpp"
#include "catchpeak/io/idf_csv.hpp"
#include "catchpeak/io/storm_table.hpp"
#include "catchpeak/rain/frequency.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <set>
#include <string_view>
#include <utility>

namespace catchpeak::app {

using project::KerbyParameters;
using project::PointOverride;
using project::Problems;
using project::Project;
using project::Rainfall;
using project::SegmentalParameters;

namespace {

// The wording of every line of a design point's hydrology, declared once. `{source}` is the
// source text of the catchment's figures (PointInputs::source, profile_source), `{file}` the
// project file's name.

// The catchment's figures restated.
constexpr Formula area_note{"point.area",    "Catchment area", "",
                            "A = {A} {A:u}", Ref::none,        "{source}"};
constexpr Formula length_note{"point.flow_path_length",
                              "Longest flow path length",
                              "",
                              "L = {L} {L:u}",
                              Ref::none,
                              "{source}"};
constexpr Formula slope_note{
    "point.slope", "Slope of the longest flow path", "", "S = {S} {S:u}", Ref::none, "{source}"};
constexpr Formula c_note{"point.c", "Runoff coefficient", "", "C = {C}", Ref::none, "{source}"};
constexpr Formula cn_note{"point.cn", "Curve number", "", "CN = {CN}", Ref::none, "{source}"};

// Time of concentration given, and the lag method's slope.
constexpr Formula tc_given_point{
    "point.tc_given_point", "Time of concentration, given", "", "tc = {tc} {tc:u}",
    Ref::project_input,     " ({file}, line {n})"};
constexpr Formula tc_given_input{
    "point.tc_given", "Time of concentration, given", "", "tc = {tc} {tc:u}", Ref::none,
    "{source}"};
constexpr Formula lag_slope_mean{"point.lag_slope_mean",
                                 "Watershed slope for the lag method",
                                 "",
                                 "Y = mean catchment slope = {Y} {Y:u}",
                                 Ref::none,
                                 "{source}"};
constexpr Formula lag_slope_flow_path{
    "point.lag_slope_flow_path",
    "Watershed slope for the lag method",
    "",
    "Y = slope of the longest flow path = {Y} {Y:u} (no mean catchment slope given; the method "
    "asks for the average land slope)",
    Ref::none,
    "{source}"};

// The 24-hour design depth.
constexpr Formula depth_given{
    "point.depth_24h",  "24-hour rainfall depth, {T}-year", "", "P = {P} {P:u}",
    Ref::project_input, " ({file}, [rainfall] {key})"};
constexpr Formula depth_given_p2{"point.depth_24h_p2",
                                 "24-hour rainfall depth, {T}-year (P2 for sheet flow)",
                                 "",
                                 "P = {P} {P:u}",
                                 Ref::project_input,
                                 " ({file}, [rainfall] {key})"};
constexpr Formula depth_fitted{"point.depth_24h_fitted",
                               "24-hour rainfall depth, {T}-year",
                               "",
                               "P = x_T = {P} {P:u}",
                               Ref::none,
                               "design depth of the line above: {fit} fit of {series}"};
constexpr Formula depth_fitted_p2{"point.depth_24h_fitted_p2",
                                  "24-hour rainfall depth, {T}-year (P2 for sheet flow)",
                                  "",
                                  "P = x_T = {P} {P:u}",
                                  Ref::none,
                                  "design depth of the line above: {fit} fit of {series}"};
/// The note that lists the annual maximum series a design depth is fitted to.
constexpr std::string_view ams_series_key = "rain.ams_series";
constexpr Formula ams_series_note{ams_series_key,
                                  "Annual maximum series of 24-hour depths",
                                  "",
                                  "n = {n} {n:u}, {first} to {last} (column {column})",
                                  Ref::project_input,
                                  " ({series})"};

// The parts of the longest flow path and their slopes.
constexpr std::string_view split_where = "split of the longest flow path by the project's "
                                         "settings ([settings] sheet_flow_max_length_m, "
                                         "shallow_length_m)";
constexpr std::string_view overland_where =
    "[settings] sheet_flow_max_length_m: the first part of the longest flow path";
constexpr Formula sheet_flow_length{
    "point.sheet_flow_length", "Sheet flow length", "L1 = min(L, L1 max)",
    "L1 = min({L}, {L1max})",  Ref::none,           overland_where};
constexpr Formula overland_flow_length{"point.overland_flow_length",
                                       "Overland flow length",
                                       "L1 = min(L, L1 max)",
                                       "L1 = min({L}, {L1max})",
                                       Ref::none,
                                       overland_where};
constexpr Formula segment_slope_whole{
    "point.segment_slope_whole",
    "Slope, {segment}",
    "",
    "s = slope of the longest flow path = {s} {s:u} (the inputs give no slope per segment)",
    Ref::none,
    "{source}"};
constexpr Formula segment_not_downhill{
    "point.segment_not_downhill",
    "Slope, {segment}: not downhill on the DEM",
    "",
    "the DEM falls {dz} {dz:u} over this segment ({z0} {z0:u} at {x0} {x0:u} from the top, {z1} "
    "{z1:u} at {x1} {x1:u}): an embankment, a pit or a flat on the DEM as given; the slope of the "
    "whole flow path, {S} {S:u}, is used",
    Ref::none,
    "{source}"};
constexpr Formula segment_slope_calc{
    "point.segment_slope",       "Slope, {segment}", "s = (Z start - Z end) / length",
    "s = ({z0} - {z1}) / {len}", Ref::none,          "{source}"};

// TR-55 segmental tc.
constexpr Formula tr55_segmental_note{
    "point.tr55_segmental",
    "Time of concentration, TR-55 segmental",
    "",
    "tc = sum of the travel times of sheet, shallow concentrated and channel flow",
    Ref::tr55_1986,
    " ch. 3"};
constexpr Formula shallow_length_set{
    "point.shallow_length_set", "Shallow concentrated flow length",
    "L2 = min(L - L1, L2 set)", "L2 = min({L} - {L1}, {L2set})",
    Ref::project_input,         " ({file}, [methods.tr55_segmental]): shallow_length_m"};
constexpr Formula shallow_length_rest{"point.shallow_length",
                                      "Shallow concentrated flow length",
                                      "L2 = L - L1",
                                      "L2 = {L} - {L1}",
                                      Ref::none,
                                      split_where};
constexpr Formula channel_start_missing{
    "point.channel_start_missing",
    "Where the channel starts is not given",
    "",
    "no shallow_length_m in [methods.tr55_segmental]: the whole flow path after the sheet flow is "
    "taken as shallow concentrated flow, which is slower than channel flow; give the length to "
    "where the flow enters a channel",
    Ref::tr55_1986,
    " ch. 3"};
constexpr Formula channel_length{"point.channel_length",
                                 "Channel flow length",
                                 "L3 = L - L1 - L2",
                                 "L3 = {L} - {L1} - {L2}",
                                 Ref::none,
                                 split_where};
constexpr Formula sheet_manning_note{"point.sheet_manning_n",
                                     "Manning roughness, sheet flow",
                                     "",
                                     "n = {n}",
                                     Ref::project_input,
                                     " ({file}, [methods.tr55_segmental]): sheet_manning_n (TR-55 "
                                     "Table 3-1)"};
constexpr Formula channel_section_note{
    "point.channel_section",
    "Channel section and roughness",
    "",
    "n = {n}, a = {a} {a:u}, pw = {pw} {pw:u}",
    Ref::project_input,
    " ({file}, [methods.tr55_segmental]): channel_manning_n, channel_flow_area_m2, "
    "channel_wetted_perimeter_m"};

// Kerby-Kirpich tc.
constexpr std::string_view kerby_kirpich_where = " ch. 4, Kerby-Kirpich (Roussel et al. 2005)";
constexpr Formula kerby_kirpich_note{
    "point.kerby_kirpich",
    "Time of concentration, Kerby-Kirpich",
    "",
    "tc = tov (Kerby, overland flow) + tch (Kirpich, channel flow)",
    Ref::txdot_hdm,
    kerby_kirpich_where};
constexpr Formula retardance_note{"point.kerby_retardance",
                                  "Retardance coefficient N",
                                  "",
                                  "N = {N}",
                                  Ref::project_input,
                                  " ({file}, [methods.kerby_kirpich]: retardance_n; Kerby's table "
                                  "in the TxDOT Hydraulic Design Manual ch. 4)"};
constexpr Formula kerby_channel_length{"point.kerby_channel_length",
                                       "Channel flow length",
                                       "L2 = L - L1",
                                       "L2 = {L} - {L1}",
                                       Ref::none,
                                       split_where};
constexpr Formula kerby_kirpich_tc{"point.kerby_kirpich_tc", "Time of concentration, Kerby-Kirpich",
                                   "tc = tov + tch",         "tc = {tov} + {tch}",
                                   Ref::txdot_hdm,           kerby_kirpich_where};
constexpr Formula kerby_kirpich_area{"point.kerby_kirpich_area",
                                     "Kerby-Kirpich: catchment area outside the method's range",
                                     "",
                                     "catchment area {A} {A:u} lies outside {min} to {max} {max:u}",
                                     Ref::txdot_hdm,
                                     " ch. 4 (Roussel et al. 2005)"};

// The peak methods' own lines.
constexpr Formula tr55_ia_005{
    "point.tr55_ia_005",
    "Ia = 0.05 S with the TR-55 graphical method",
    "",
    "the unit peak discharge coefficients were derived with Ia = 0.2 S; with Ia = 0.05 S the "
    "ratio Ia/P is outside the basis of the table and the peak is an extrapolation of the method",
    Ref::tr55_1986,
    " ch. 4"};
constexpr Formula ponds_point{"point.ponds_point",
                              "Ponds and swamps",
                              "",
                              "share of the catchment = {F} {F:u}",
                              Ref::project_input,
                              " ({file}, [[methods.point]] line {n})"};
constexpr Formula ponds_setting{"point.ponds_setting",
                                "Ponds and swamps",
                                "",
                                "share of the catchment = {F} {F:u}",
                                Ref::project_input,
                                " ({file}, [settings] pond_swamp_percent)"};
constexpr Formula ponds_none{"point.ponds_none",
                             "Ponds and swamps",
                             "",
                             "no share of ponds and swamps is given in the project: 0 %, Fp = 1",
                             Ref::project_input,
                             " ([settings] pond_swamp_percent not given)"};
constexpr Formula cn_weighting_runoff{
    "point.cn_weighting_runoff",
    "Curve number weighting: runoff of the land parts",
    "",
    "the runoff depth Q of every return period is the area-weighted runoff of the {n} land "
    "parts, each from its own CN, not the runoff of the composite CN {CN}{methods}",
    Ref::project_input,
    " ({file}, [methods] cn_weighting = \"runoff\"; TR-55 (1986) ch. 2 and NRCS NEH 630 ch. 10 "
    "discuss weighting the runoff of the parts, from memory, not checked)"};

/// The short line of a unit-hydrograph peak whose storm's most intense rain the table spreads
/// over more than one of the unit hydrograph's steps; the caution note of the run says why.
constexpr std::string_view peak_averaged_key = "point.peak_averaged";
constexpr std::string_view averaging_caution_title = "Storm table averaging";
constexpr Formula peak_averaged{
    peak_averaged_key,
    "Peak averaged over a table interval",
    "",
    "{T}-year peak: the storm's most intense rain, {h0} to {h1} {h1:u} of the table ({gap} "
    "{gap:u}), is spread evenly over more than one unit hydrograph step D = {D} {D:u}, so the "
    "peak may be too low; see the caution '{title}' on the cover",
    Ref::none,
    "linear interpolation of the storm table (property of the method)"};
constexpr Formula storm_shorter_than_tc{
    "point.storm_shorter_than_tc",
    "Storm shorter than the time of concentration",
    "",
    "the alternating-block storm lasts {td} {td:u}, less than tc = {tc} {tc:u}: rain from the "
    "whole catchment does not reach the design point at once and the peak may be too low; choose "
    "a storm_duration_min of at least tc",
    Ref::common_practice,
    ""};
constexpr Formula storm_step_long{
    "point.storm_step_long",
    "Storm time step long for the unit hydrograph",
    "",
    "storm time step {dt} {dt:u} exceeds 0.2 tp = 0.2 x {tp} {tp:u} = {tp02} {tp02:u}: the "
    "rainfall of a step is spread evenly over the unit hydrograph's shorter steps and the peak "
    "may be too low; choose a shorter storm_time_step_min",
    Ref::none,
    "NRCS NEH 630 ch. 16: a time step of no more than about 0.2 tp (from memory, not checked)"};

bool us_sheet(const Project &p) { return p.info.units == units::System::us_customary; }

/// A length for the sheet: ft on a US sheet, m on an SI sheet.
Quantity length_q(std::string symbol, double m, bool us) {
    return qty(std::move(symbol), us ? units::m_to_ft(m) : m, us ? Unit::ft : Unit::m);
}
/// A slope for the sheet: ft/ft on a US sheet, m/m on an SI sheet.
Quantity slope_q(std::string symbol, double s, bool us) {
    return qty(std::move(symbol), s, us ? Unit::ft_per_ft : Unit::m_per_m);
}
/// A depth for the sheet: in on a US sheet, mm on an SI sheet.
Quantity depth_q(std::string symbol, double mm, bool us) {
    return qty(std::move(symbol), us ? units::mm_to_in(mm) : mm, us ? Unit::in : Unit::mm);
}
Quantity minutes(std::string symbol, double min) { return qty(std::move(symbol), min, Unit::min); }
Quantity file_word(const Project &p) { return word("file", p.file.filename().string()); }
Quantity source_word(const std::string &source) { return word("source", source); }
template <typename N> Quantity line_number(N n) {
    return qty("n", static_cast<double>(n), Unit::none, Shown::integer());
}

const PointOverride *override_for(const Project &p, const std::string &id) {
    for (const auto &o : p.methods.points) {
        if (o.id == id) {
            return &o;
        }
    }
    return nullptr;
}

/// Index of the last calculation line of `part` once appended to `lines`.
std::size_t last_calculation_index(const CalcLines &lines, const CalcLines &part) {
    std::size_t at = lines.size();
    for (std::size_t k = 0; k < part.size(); ++k) {
        if (part.lines()[k].kind == LineKind::calculation) {
            at = lines.size() + k;
        }
    }
    return at;
}

/// Index of the last calculation line of `part` with key `key`, once appended to `lines`;
/// lines.size() + part.size() when there is none.
std::size_t calculation_index(const CalcLines &lines, const CalcLines &part, std::string_view key) {
    std::size_t at = lines.size() + part.size();
    for (std::size_t k = 0; k < part.size(); ++k) {
        const auto &l = part.lines()[k];
        if (l.kind == LineKind::calculation && l.key == key) {
            at = lines.size() + k;
        }
    }
    return at;
}

/// Drops a warning that repeats word for word one given earlier for the same design point (the
/// Rational Method's area limit, say, is the same for every return period): the sheet shows it
/// once. `indices` (of calculation lines) are mapped to the shortened list.
void drop_repeated_warnings(CalcLines &lines, std::vector<std::size_t> &indices) {
    auto &all = lines.lines();
    std::vector<std::size_t> new_index(all.size() + 1, 0);
    std::vector<CalcLine> kept;
    kept.reserve(all.size());
    for (std::size_t k = 0; k < all.size(); ++k) {
        const auto &l = all[k];
        const bool repeated = l.kind == LineKind::warning &&
                              std::any_of(kept.begin(), kept.end(),
                                          [&](const CalcLine &e) { return same_content(e, l); });
        new_index[k] = kept.size();
        if (!repeated) {
            kept.push_back(l);
        }
    }
    new_index[all.size()] = kept.size();
    for (auto &i : indices) {
        i = new_index[std::min(i, all.size())];
    }
    all = std::move(kept);
}

hydro::IaRatio ia_ratio(const Project &p) {
    return p.settings.initial_abstraction_ratio < 0.1 ? hydro::IaRatio::r005 : hydro::IaRatio::r020;
}

/// The depths of `h` re-binned to steps of `step_s` (linear within each step of `h`), `n` steps,
/// zero after the end of `h`.
std::vector<double> rebin(const rain::Hyetograph &h, double step_s, std::size_t n) {
    std::vector<double> cum(h.depth_mm.size() + 1, 0.0);
    for (std::size_t k = 0; k < h.depth_mm.size(); ++k) {
        cum[k + 1] = cum[k] + h.depth_mm[k];
    }
    auto at = [&](double t_s) {
        if (h.step_s <= 0.0 || h.depth_mm.empty()) {
            return 0.0;
        }
        const double x = t_s / h.step_s;
        if (x >= static_cast<double>(h.depth_mm.size())) {
            return cum.back();
        }
        const auto k = static_cast<std::size_t>(std::floor(x));
        return cum[k] + (x - static_cast<double>(k)) * h.depth_mm[k];
    };
    std::vector<double> out(n, 0.0);
    for (std::size_t k = 0; k < n; ++k) {
        out[k] = at(static_cast<double>(k + 1) * step_s) - at(static_cast<double>(k) * step_s);
    }
    return out;
}

/// Appends the lines of `part` to `lines`, leaving out every line already shown (the same
/// content in `shown`): the fit of the annual maximum series repeats its mean, moments and
/// warnings for every return period, and the sheet shows them once.
void append_once(CalcLines &lines, const CalcLines &part, CalcLines &shown) {
    for (const auto &l : part.lines()) {
        const bool seen = std::any_of(shown.lines().begin(), shown.lines().end(),
                                      [&](const CalcLine &e) { return same_content(e, l); });
        if (!seen) {
            shown.add(l);
            lines.add(l);
        }
    }
}

/// The wording of the 24-hour depth's note: of a return period's design depth, or of P2 for
/// the sheet flow.
struct DepthWording {
    const Formula &given;
    const Formula &fitted;
};
constexpr DepthWording design_depth_wording{depth_given, depth_fitted};
constexpr DepthWording p2_wording{depth_given_p2, depth_fitted_p2};

/// The 24-hour design depth of return period `rp`, mm, with its lines: the depth given in
/// [rainfall] depths_24h, or the depth fitted to the annual maximum series by the project's
/// distribution. `shown` holds the frequency-analysis lines already on this point's sheet.
double design_depth_24h_mm(const Project &p, const HydrologyTables &tables, double rp,
                           CalcLines &lines, CalcLines &shown,
                           const DepthWording &wording = design_depth_wording) {
    const bool us = us_sheet(p);
    const Quantity period = qty("T", rp, Unit::yr, Shown::exact());
    const auto depth = p.rainfall.depth_24h_mm.find(rp);
    if (depth != p.rainfall.depth_24h_mm.end()) {
        const double p_mm = depth->second;
        lines.note(wording.given, {period, file_word(p), word("key", p.rainfall.depth_24h_key)},
                   depth_q("P", p_mm, us));
        return p_mm;
    }
    if (tables.ams == nullptr) {
        throw_input_error(fmt::format("{}: [rainfall] depths_24h", p.file.string()),
                          fmt::format("no 24-hour depth for the {}-year return period", rp),
                          "one depth for every return period in return_periods_yr, or an "
                          "annual maximum series");
    }
    const AnnualMaximumSeries &ams = *tables.ams;
    CalcLines part;
    const auto [first, last] = std::minmax_element(ams.years.begin(), ams.years.end());
    part.note(ams_series_note,
              {qty("first", *first, Unit::none, Shown::integer()),
               qty("last", *last, Unit::none, Shown::integer()), word("column", ams.column),
               word("series", ams.source)},
              qty("n", static_cast<double>(ams.depth_mm.size()), Unit::years, Shown::integer()));
    const bool gev = p.rainfall.ams_distribution == project::AmsDistribution::gev;
    WithLines<double> fit{0.0, {}};
    try {
        fit = gev ? rain::gev_depth(ams.depth_mm, rp, p.info.units)
                  : rain::gumbel_depth(ams.depth_mm, rp, p.info.units);
    } catch (const InputError &e) {
        throw InputError(fmt::format("{}: {}", ams.source, e.what()));
    }
    part.append(fit.lines);
    append_once(lines, part, shown);
    const double p_mm = fit.value;
    lines.note(wording.fitted,
               {period, word("fit", gev ? "GEV (L-moments)" : "Gumbel (moments)"),
                word("series", ams.source)},
               depth_q("P", p_mm, us));
    return p_mm;
}

/// The first part of the longest flow path, overland (sheet) flow: L1 = min(L, L max). A line.
double overland_length_m(const Project &p, const PointInputs &in, const Formula &f,
                         CalcLines &lines) {
    const bool us = us_sheet(p);
    const double l1 = std::min(in.longest_flow_path_m, p.settings.sheet_flow_max_length_m);
    lines.calc(f,
               {length_q("L", in.longest_flow_path_m, us),
                length_q("L1max", p.settings.sheet_flow_max_length_m, us)},
               length_q("L1", l1, us));
    return l1;
}

/// The elevation at `distance_m` from the top of the flow path, linear between the profile's
/// cells (the profile is not empty).
double profile_elevation_m(const std::vector<std::pair<double, double>> &profile,
                           double distance_m) {
    if (distance_m <= profile.front().first) {
        return profile.front().second;
    }
    if (distance_m >= profile.back().first) {
        return profile.back().second;
    }
    const auto hi =
        std::lower_bound(profile.begin(), profile.end(), distance_m,
                         [](const std::pair<double, double> &s, double d) { return s.first < d; });
    const auto lo = hi - 1;
    const double t = (distance_m - lo->first) / (hi->first - lo->first);
    return lo->second + t * (hi->second - lo->second);
}

/// The slope of the part of the flow path from `from_m` to `to_m` (distances from its top):
/// from the DEM profile when there is one and it falls along the segment, else the slope of
/// the whole flow path. Lines say which.
double segment_slope(const PointInputs &in, bool us, const std::string &segment, double from_m,
                     double to_m, CalcLines &lines) {
    if (in.profile.size() < 2 || !(to_m > from_m)) {
        lines.note(segment_slope_whole, {word("segment", segment), source_word(in.source)},
                   slope_q("s", in.slope, us));
        return in.slope;
    }
    const double z0 = profile_elevation_m(in.profile, from_m);
    const double z1 = profile_elevation_m(in.profile, to_m);
    const double s = (z0 - z1) / (to_m - from_m);
    if (!(s > 0.0)) {
        lines.warn(segment_not_downhill,
                   {word("segment", segment), length_q("dz", z0 - z1, us), length_q("z0", z0, us),
                    length_q("x0", from_m, us), length_q("z1", z1, us), length_q("x1", to_m, us),
                    slope_q("S", in.slope, us), source_word(in.profile_source)});
        return in.slope;
    }
    lines.calc(segment_slope_calc,
               {word("segment", segment), length_q("z0", z0, us), length_q("z1", z1, us),
                length_q("len", to_m - from_m, us), source_word(in.profile_source)},
               slope_q("s", s, us));
    return s;
}

/// The lengths of the three parts of the flow path of the TR-55 segmental tc, m, with their
/// lines: sheet flow (L1), shallow concentrated flow (L2), channel flow (L3).
std::array<double, 3> tr55_segment_lengths_m(const Project &p, const PointInputs &in,
                                             const SegmentalParameters &sp, CalcLines &lines) {
    const bool us = us_sheet(p);
    const double l = in.longest_flow_path_m;
    const double l1 = overland_length_m(p, in, sheet_flow_length, lines);
    double l2 = l - l1;
    if (sp.shallow_length_m) {
        l2 = std::min(l - l1, *sp.shallow_length_m);
        lines.calc(shallow_length_set,
                   {length_q("L", l, us), length_q("L1", l1, us),
                    length_q("L2set", *sp.shallow_length_m, us), file_word(p)},
                   length_q("L2", l2, us));
    } else {
        lines.calc(shallow_length_rest, {length_q("L", l, us), length_q("L1", l1, us)},
                   length_q("L2", l2, us));
        if (l2 > 0.0) {
            lines.warn(channel_start_missing);
        }
    }
    const double l3 = l - l1 - l2;
    if (l3 > 0.0) {
        lines.calc(channel_length,
                   {length_q("L", l, us), length_q("L1", l1, us), length_q("L2", l2, us)},
                   length_q("L3", l3, us));
    }
    return {l1, l2, l3};
}

/// The parameters of the segmental methods: the point's own in [[methods.point]], else the
/// project's.
const SegmentalParameters &segmental_parameters(const Project &p, const PointOverride *o) {
    return o != nullptr ? o->tr55_segmental : p.methods.tr55_segmental;
}
const KerbyParameters &kerby_parameters(const Project &p, const PointOverride *o) {
    return o != nullptr ? o->kerby_kirpich : p.methods.kerby_kirpich;
}

/// What a tc method computes from.
struct TcContext {
    const Project &p;
    const PointInputs &in;
    const PointOverride *o; ///< the point's [[methods.point]], or null
    const HydrologyTables &tables;
    CalcLines &shown; ///< frequency-analysis lines already on this point's sheet
};

/// TR-55 segmental tc (TR-55 ch. 3): sheet, shallow concentrated and channel flow along the
/// longest flow path, split by the settings; P2 from the rainfall inputs.
double tr55_segmental_tc_min(const TcContext &c, CalcLines &lines) {
    const Project &p = c.p;
    const PointInputs &in = c.in;
    const SegmentalParameters &sp = segmental_parameters(p, c.o);
    const bool us = us_sheet(p);
    lines.note(tr55_segmental_note);
    const auto [l1, l2, l3] = tr55_segment_lengths_m(p, in, sp, lines);
    const double l = in.longest_flow_path_m;
    std::vector<double> times;
    {
        const double p2_mm = design_depth_24h_mm(p, c.tables, 2.0, lines, c.shown, p2_wording);
        lines.note(sheet_manning_note, {file_word(p)}, qty("n", sp.sheet_manning_n));
        const auto limit = p.settings.sheet_flow_max_length_m <= units::ft_to_m(100.0) + 1e-9
                               ? hydro::SheetFlowLimit::neh630_100_ft
                               : hydro::SheetFlowLimit::tr55_300_ft;
        const double s1 = segment_slope(in, us, "sheet flow", 0.0, l1, lines);
        auto t = hydro::sheet_flow_tt_min(sp.sheet_manning_n, l1, p2_mm, s1, limit, p.info.units);
        lines.append(t.lines);
        times.push_back(t.value);
    }
    if (l2 > 0.0) {
        const double s2 = segment_slope(in, us, "shallow concentrated flow", l1, l1 + l2, lines);
        auto t = hydro::shallow_flow_tt_min(l2, s2, sp.shallow_surface, p.info.units);
        lines.append(t.lines);
        times.push_back(t.value);
    }
    if (l3 > 0.0) {
        lines.note(channel_section_note,
                   {qty("n", sp.channel_manning_n),
                    us ? qty("a", units::m2_to_ft2(sp.channel_flow_area_m2), Unit::ft2)
                       : qty("a", sp.channel_flow_area_m2, Unit::m2),
                    length_q("pw", sp.channel_wetted_perimeter_m, us), file_word(p)});
        const double s3 = segment_slope(in, us, "channel flow", l1 + l2, l, lines);
        auto t = hydro::channel_flow_tt_min(sp.channel_manning_n, sp.channel_flow_area_m2,
                                            sp.channel_wetted_perimeter_m, s3, l3, p.info.units);
        lines.append(t.lines);
        times.push_back(t.value);
    }
    auto sum = hydro::sum_travel_times_min(times, p.info.units);
    lines.append(sum.lines);
    return sum.value;
}

/// Kerby-Kirpich tc (TxDOT Hydraulic Design Manual ch. 4, after Roussel et al. 2005): Kerby
/// overland flow over the first part of the flow path, Kirpich for the rest.
double kerby_kirpich_tc_min(const TcContext &c, CalcLines &lines) {
    const Project &p = c.p;
    const PointInputs &in = c.in;
    const KerbyParameters &kp = kerby_parameters(p, c.o);
    const bool us = us_sheet(p);
    lines.note(kerby_kirpich_note);
    const double l = in.longest_flow_path_m;
    const double l1 = overland_length_m(p, in, overland_flow_length, lines);
    const double l2 = l - l1;
    lines.note(retardance_note, {file_word(p)}, qty("N", kp.retardance_n));
    const double s1 = segment_slope(in, us, "overland flow", 0.0, l1, lines);
    auto ov = hydro::kerby_tov_min(l1, kp.retardance_n, s1, p.info.units);
    lines.append(ov.lines);
    double tch = 0.0;
    if (l2 > 0.0) {
        lines.calc(kerby_channel_length, {length_q("L", l, us), length_q("L1", l1, us)},
                   length_q("L2", l2, us));
        const double s2 = segment_slope(in, us, "channel flow", l1, l, lines);
        auto ch = hydro::kirpich_tc_min(l2, s2, in.area_m2, p.info.units);
        lines.append(ch.lines);
        tch = ch.value;
    }
    const double tc = ov.value + tch;
    lines.calc(kerby_kirpich_tc, {minutes("tov", ov.value), minutes("tch", tch)},
               minutes("tc", tc));
    return tc;
}

/// Kirpich tc along the longest flow path.
double kirpich_tc(const TcContext &c, CalcLines &lines) {
    auto k =
        hydro::kirpich_tc_min(c.in.longest_flow_path_m, c.in.slope, c.in.area_m2, c.p.info.units);
    lines.append(k.lines);
    return k.value;
}

/// NRCS lag tc (NEH 630 ch. 15), with the mean catchment slope when the inputs give it.
double nrcs_lag_tc(const TcContext &c, CalcLines &lines) {
    const PointInputs &in = c.in;
    const Quantity src = source_word(in.source);
    double slope = in.slope;
    if (in.mean_slope) {
        slope = *in.mean_slope;
        lines.note(lag_slope_mean, {src}, qty("Y", 100.0 * slope, Unit::percent));
    } else {
        lines.note(lag_slope_flow_path, {src}, qty("Y", 100.0 * slope, Unit::percent));
    }
    auto k = hydro::nrcs_lag_tc_min(c.in.longest_flow_path_m, *in.cn, 100.0 * slope, in.area_m2,
                                    c.p.info.units);
    lines.append(k.lines);
    return k.value;
}

/// A tc given by the engineer: for the point in [[methods.point]], else in the catchment input.
double given_tc(const TcContext &c, CalcLines &lines) {
    if (c.o != nullptr && c.o->tc_min) {
        lines.note(tc_given_point, {file_word(c.p), line_number(c.o->line)},
                   minutes("tc", *c.o->tc_min));
        return *c.o->tc_min;
    }
    if (!c.in.tc_min) {
        throw InternalError("a given tc without a tc");
    }
    lines.note(tc_given_input, {source_word(c.in.source)}, minutes("tc", *c.in.tc_min));
    return *c.in.tc_min;
}

/// The catchment areas a tc method applies to, and the warning outside them (null: the method
/// has no limits of its own here).
struct AreaLimits {
    double min_mi2 = 0.0;
    double max_mi2 = 0.0;
    const Formula *warning = nullptr;
};

/// One tc method: what it needs, the publications it rests on, its applicability and its
/// computation.
struct TcRegistration {
    TcMethod method;
    MethodNeeds needs;
    std::string_view cn_for; ///< the method, in the message of a missing curve number
    std::array<Ref, 4> refs; ///< for the references page, in order (Ref::none: unused)
    AreaLimits area_mi2;
    double (*compute)(const TcContext &, CalcLines &);
};

// TxDOT gives 0.25-150 mi2 for the combined method (checked secondary, REFERENCES.md 3).
constexpr AreaLimits kerby_kirpich_area_mi2{0.25, 150.0, &kerby_kirpich_area};

/// In the order of TcMethod.
constexpr std::array<TcRegistration, 5> tc_methods{{
    {TcMethod::kirpich, {}, "", {Ref::kirpich_1940, Ref::txdot_hdm}, {}, kirpich_tc},
    {TcMethod::nrcs_lag,
     {.cn = true},
     "the NRCS lag method",
     {Ref::neh630_ch15_2010},
     {},
     nrcs_lag_tc},
    {TcMethod::tr55_segmental, {}, "", {Ref::tr55_1986}, {}, tr55_segmental_tc_min},
    {TcMethod::kerby_kirpich,
     {},
     "",
     {Ref::txdot_hdm, Ref::kirpich_1940, Ref::kerby_1959, Ref::roussel_2005},
     kerby_kirpich_area_mi2,
     kerby_kirpich_tc_min},
    {TcMethod::given, {}, "", {}, {}, given_tc},
}};

const TcRegistration &registration(TcMethod m) {
    const auto &r = tc_methods[static_cast<std::size_t>(m)];
    if (r.method != m) {
        throw InternalError("the tc methods are not registered in the order of TcMethod");
    }
    return r;
}

/// What a peak method computes from, for every return period.
struct PeakContext {
    const Project &p;
    const PointInputs &in;
    const PointOverride *o; ///< the point's [[methods.point]], or null
    const HydrologyTables &tables;
    double tc_min = 0.0;
    hydro::IaRatio ratio = hydro::IaRatio::r020;
    hydro::RationalSettings rational;
    double pond_percent = 0.0; ///< set by the TR-55 graphical method's preparation
    /// [methods] cn_weighting = "runoff" and the catchment has land parts: the SCS runoff is the
    /// area-weighted runoff of the parts (set by point_peaks).
    bool weighted_runoff = false;
    /// With weighted_runoff: the composite CN's S and Ia are shown, for the TR-55 graphical
    /// method's Ia/P.
    bool composite_ia_shown = false;
};

/// The land parts of a catchment with their curve numbers, for the weighted runoff.
std::vector<hydro::CnPart> cn_parts(const PointInputs &in) {
    std::vector<hydro::CnPart> parts;
    parts.reserve(in.land_parts.size());
    for (const auto &lp : in.land_parts) {
        parts.push_back({lp.area_m2, lp.cn, lp.name});
    }
    return parts;
}

/// The design storm of one return period and its SCS runoff, shared by the Curve Number methods:
/// the alternating block from the IDF (then only the unit hydrograph uses it: the project
/// refuses it with the TR-55 graphical method), or the 24-hour depth of the NRCS storm.
struct ScsRain {
    double p_mm = 0.0;
    std::optional<rain::Hyetograph> block_storm;
    hydro::CnRunoff runoff;
};

/// A peak of one method and return period, with the index of the line that gives its Q.
struct PeakOut {
    report::Peak peak;
    std::size_t q_line = 0;
};

ScsRain scs_rain(const PeakContext &c, double rp, CalcLines &lines, CalcLines &shown) {
    const Project &p = c.p;
    ScsRain r;
    if (p.rainfall.alternating_block()) {
        if (c.tables.idf == nullptr) {
            throw InternalError("IDF not loaded for the alternating-block storm");
        }
        auto storm =
            rain::alternating_block_hyetograph(*c.tables.idf, p.rainfall.storm_duration_min,
                                               p.settings.storm_time_step_min, rp, p.info.units);
        lines.append(storm.lines);
        if (p.rainfall.storm_duration_min < c.tc_min) {
            lines.warn(storm_shorter_than_tc,
                       {minutes("td", p.rainfall.storm_duration_min), minutes("tc", c.tc_min)});
        }
        r.p_mm = storm.value.total_mm();
        r.block_storm = std::move(storm.value);
    } else {
        r.p_mm = design_depth_24h_mm(p, c.tables, rp, lines, shown);
    }
    if (c.weighted_runoff) {
        // Ia of the catchment from its composite CN; Q from the parts (the note of point_peaks).
        auto ia = hydro::cn_initial_abstraction(r.p_mm, *c.in.cn, p.info.units, c.ratio);
        if (c.composite_ia_shown) {
            lines.append(ia.lines);
        }
        r.runoff = ia.value;
        auto q = hydro::weighted_runoff(cn_parts(c.in), r.p_mm, p.info.units, c.ratio);
        lines.append(q.lines);
        r.runoff.runoff_mm = q.value;
        return r;
    }
    auto runoff = hydro::cn_runoff(r.p_mm, *c.in.cn, p.info.units, c.ratio);
    lines.append(runoff.lines);
    r.runoff = runoff.value;
    if (!c.in.land_parts.empty()) {
        auto comp = hydro::composite_runoff(cn_parts(c.in), r.p_mm, p.info.units, c.ratio);
        lines.append(comp.lines);
    }
    return r;
}

std::optional<PeakOut> rational_peak(const PeakContext &c, const ScsRain *, double rp,
                                     CalcLines &lines) {
    const auto &t = c.tables;
    if (t.idf == nullptr || t.frequency_factors == nullptr || !c.in.c) {
        return std::nullopt;
    }
    auto i = t.idf->intensity(c.tc_min, rp, c.p.info.units);
    lines.append(i.lines);
    auto cf = hydro::frequency_factor(*t.frequency_factors, rp);
    lines.append(cf.lines);
    auto q = hydro::rational_peak_m3_s(*c.in.c, cf.value, i.value, c.in.area_m2, c.p.info.units,
                                       c.rational);
    // The line that gives Q: the last calculation line of the Rational Method's lines.
    PeakOut out;
    out.q_line = last_calculation_index(lines, q.lines);
    lines.append(q.lines);
    out.peak.return_period_yr = rp;
    out.peak.method = PeakMethod::rational;
    out.peak.q_m3_s = q.value;
    // The product Cf C the peak used, after the cap Cf C <= 1, so that Q follows from the
    // stored figures: Q = cf_c_used x i x A.
    const CalcLine *capped = q.lines.find_last(hydro::keys::rational_cf_c_capped);
    const CalcLine *product =
        capped != nullptr ? capped : q.lines.find_last(hydro::keys::rational_cf_c);
    out.peak.intermediates = {{"c", *c.in.c},
                              {"cf", cf.value},
                              {"cf_c_used", product != nullptr ? product->value() : std::nan("")},
                              {"intensity_mm_per_h", i.value},
                              {"duration_min", c.tc_min}};
    return out;
}

/// Before the return periods: the TR-55 graphical method's warning on Ia = 0.05 S and the share
/// of ponds and swamps.
void prepare_tr55_peak(PeakContext &c, CalcLines &lines) {
    const Project &p = c.p;
    if (c.ratio == hydro::IaRatio::r005) {
        lines.warn(tr55_ia_005);
    }
    if (c.o != nullptr && c.o->pond_swamp_percent) {
        c.pond_percent = *c.o->pond_swamp_percent;
        lines.note(ponds_point, {file_word(p), line_number(c.o->line)},
                   qty("F", c.pond_percent, Unit::percent));
    } else if (p.settings.pond_swamp_percent) {
        c.pond_percent = *p.settings.pond_swamp_percent;
        lines.note(ponds_setting, {file_word(p)}, qty("F", c.pond_percent, Unit::percent));
    } else {
        lines.note(ponds_none);
    }
}

std::optional<PeakOut> tr55_graphical_peak(const PeakContext &c, const ScsRain *rain, double rp,
                                           CalcLines &lines) {
    const auto &t = c.tables;
    if (t.peak_coefficients == nullptr || t.pond_factors == nullptr || rain == nullptr) {
        throw InternalError("TR-55 tables not loaded");
    }
    const Project &p = c.p;
    auto q = hydro::tr55_peak(*t.peak_coefficients, *t.pond_factors,
                              p.rainfall.required_storm_type(p.file.string()), c.in.area_m2,
                              c.tc_min, rain->p_mm, rain->runoff.ia_mm, rain->runoff.runoff_mm,
                              c.pond_percent, p.info.units);
    // The line that gives Q: the last calculation line of the TR-55 peak's lines.
    PeakOut out;
    out.q_line = last_calculation_index(lines, q.lines);
    lines.append(q.lines);
    out.peak.return_period_yr = rp;
    out.peak.method = PeakMethod::tr55_graphical;
    out.peak.q_m3_s = q.value.peak_m3_s;
    out.peak.intermediates = {{"rainfall_depth_mm", rain->p_mm},
                              {"runoff_depth_mm", rain->runoff.runoff_mm},
                              {"initial_abstraction_mm", rain->runoff.ia_mm},
                              {"cn", *c.in.cn},
                              {"ia_over_p", q.value.ia_over_p},
                              {"unit_peak_csm_per_in", q.value.unit_peak_csm_per_in},
                              {"fp", q.value.fp},
                              {"tc_min", c.tc_min}};
    return out;
}

/// The hydrograph's figures for the report: flow, and rainfall and excess re-binned to its step.
report::Hydrograph hydrograph_plot(const hydro::Hydrograph &hg, const rain::Hyetograph &rain,
                                   const rain::Hyetograph &excess) {
    report::Hydrograph plot;
    plot.step_s = hg.step_s;
    plot.q_m3_s = hg.flow_m3_s;
    const std::size_t n = hg.flow_m3_s.size();
    plot.rain_mm = rebin(rain, hg.step_s, n);
    plot.excess_mm = rebin(excess, hg.step_s, n);
    return plot;
}

/// True when the table interval lies inside one step of the unit hydrograph (steps of `d_s`
/// from the start of the storm): the unit hydrograph takes the interval's rain as one block
/// anyway, and spreading it inside the interval changes nothing.
bool within_one_step(const rain::TableInterval &interval, double d_s) {
    const double first = interval.start_h * units::s_per_h / d_s;
    const double last = interval.end_h * units::s_per_h / d_s;
    return std::floor(first + 1e-9) == std::floor(last - 1e-9);
}

std::optional<PeakOut> unit_hydrograph_peak(const PeakContext &c, const ScsRain *r, double rp,
                                            CalcLines &lines) {
    const auto &t = c.tables;
    if (r == nullptr || t.unit_hydrograph == nullptr || (!r->block_storm && t.storm == nullptr)) {
        throw InternalError("unit hydrograph or storm table not loaded");
    }
    const Project &p = c.p;
    const double cn = *c.in.cn;
    const double step_min = p.settings.storm_time_step_min;
    // The alternating block's lines are on the sheet already, before the runoff.
    auto rain = r->block_storm ? WithLines<rain::Hyetograph>{*r->block_storm, {}}
                               : rain::storm_hyetograph(*t.storm, r->p_mm, step_min, p.info.units);
    lines.append(rain.lines);
    auto h =
        c.weighted_runoff
            ? hydro::unit_hydrograph_from_parts(*t.unit_hydrograph, rain.value, cn_parts(c.in),
                                                c.in.area_m2, c.tc_min, p.info.units, {}, c.ratio)
            : hydro::unit_hydrograph_from_rainfall(*t.unit_hydrograph, rain.value, cn, c.in.area_m2,
                                                   c.tc_min, p.info.units, {}, c.ratio);
    const double tp_min = h.value.tp_h * 60.0;
    // Where the storm table is coarser than the step around the peak, a shorter step would not
    // help: the averaging line below applies instead of the step's.
    const auto interval =
        r->block_storm ? std::nullopt : rain::peak_table_interval(*t.storm, rain.value);
    if (step_min > 0.2 * tp_min && !interval) {
        h.lines.warn(storm_step_long, {minutes("dt", step_min), minutes("tp", tp_min),
                                       minutes("tp02", 0.2 * tp_min)});
    }
    if (interval && !within_one_step(*interval, h.value.step_s)) {
        h.lines
            .warn(peak_averaged,
                  {qty("T", rp, Unit::yr, Shown::exact()), qty("h0", interval->start_h, Unit::h),
                   qty("h1", interval->end_h, Unit::h),
                   minutes("gap", units::h_to_min(interval->end_h - interval->start_h)),
                   minutes("D", h.value.step_s / 60.0),
                   word("title", std::string(averaging_caution_title))})
            .flags.averaged = true;
    }
    PeakOut out;
    out.q_line = calculation_index(lines, h.lines, hydro::keys::uh_peak);
    lines.append(h.lines);
    const auto &hg = h.value;
    out.peak.return_period_yr = rp;
    out.peak.method = PeakMethod::scs_unit_hydrograph;
    out.peak.q_m3_s = hg.peak_m3_s;
    out.peak.intermediates = {{"rainfall_depth_mm", r->p_mm},
                              {"runoff_depth_mm", hg.runoff_mm},
                              {"cn", cn},
                              {"time_to_peak_min", hg.time_to_peak_s / 60.0},
                              {"unit_hydrograph_tp_min", hg.tp_h * 60.0},
                              {"step_min", hg.step_s / 60.0},
                              {"volume_m3", hg.volume_m3},
                              {"tc_min", c.tc_min}};
    out.peak.hydrograph = hydrograph_plot(
        hg, rain.value,
        c.weighted_runoff ? hydro::weighted_excess_hyetograph(rain.value, cn_parts(c.in), c.ratio)
                          : hydro::excess_hyetograph(rain.value, cn, c.ratio));
    return out;
}

/// One peak method: what it needs, the publications it rests on, a preparation once per design
/// point (may be null) and its computation for one return period (given the SCS rain when it
/// needs a curve number). A computation may give no peak (the Rational Method without C).
struct PeakRegistration {
    PeakMethod method;
    MethodNeeds needs;
    std::string_view cn_for; ///< the methods, in the message of a missing curve number
    std::array<Ref, 4> refs; ///< for the references page, before the design storm's
    void (*prepare)(PeakContext &, CalcLines &);
    std::optional<PeakOut> (*compute)(const PeakContext &, const ScsRain *, double, CalcLines &);
};

constexpr std::string_view scs_methods = "the SCS Curve Number methods";

/// In the order of PeakMethod (the order of the peaks of a return period).
constexpr std::array<PeakRegistration, 3> peak_methods{{
    {PeakMethod::rational,
     {.c = true, .frequency_factors = true},
     "",
     {Ref::txdot_hdm},
     nullptr,
     rational_peak},
    {PeakMethod::tr55_graphical,
     {.cn = true, .tr55_tables = true},
     scs_methods,
     {Ref::tr55_1986},
     prepare_tr55_peak,
     tr55_graphical_peak},
    {PeakMethod::scs_unit_hydrograph,
     {.cn = true, .unit_hydrograph = true, .design_storm = true},
     scs_methods,
     {Ref::tr55_1986, Ref::neh630_ch16_2007},
     nullptr,
     unit_hydrograph_peak},
}};

const PeakRegistration &registration(PeakMethod m) {
    const auto &r = peak_methods[static_cast<std::size_t>(m)];
    if (r.method != m) {
        throw InternalError("the peak methods are not registered in the order of PeakMethod");
    }
    return r;
}

/// The publication of the design storm a method's hyetograph follows.
Ref design_storm_ref(const Project &p) {
    if (p.rainfall.alternating_block()) {
        return Ref::chow_1988;
    }
    // A project's own table names its source on its line; it is no publication of ours.
    return p.rainfall.storm_table ? Ref::none : Ref::tp149_1973;
}

/// Restates the catchment's figures (area, flow path, slope, C and CN, or the land weighting).
void restate_inputs(const Project &p, const PointInputs &in, CalcLines &lines) {
    const bool us = us_sheet(p);
    const Quantity src = source_word(in.source);
    lines.note(area_note, {src},
               us ? qty("A", units::m2_to_acre(in.area_m2), Unit::ac)
                  : qty("A", units::m2_to_ha(in.area_m2), Unit::ha));
    lines.note(length_note, {src}, length_q("L", in.longest_flow_path_m, us));
    lines.note(slope_note, {src}, slope_q("S", in.slope, us));
    if (!in.land_lines.empty()) {
        lines.append(in.land_lines);
        return;
    }
    if (in.c) {
        lines.note(c_note, {src}, qty("C", *in.c));
    }
    if (in.cn) {
        lines.note(cn_note, {src}, qty("CN", *in.cn));
    }
}

/// The tc method of the design point: a tc given for the point in [[methods.point]] or in the
/// catchment input (unless the point chooses another method), else the point's or the
/// project's method.
TcMethod chosen_tc_method(const Project &p, const PointInputs &in, const PointOverride *o) {
    if (o != nullptr && o->tc_min && (!o->tc_method || *o->tc_method == TcMethod::given)) {
        return TcMethod::given;
    }
    if (in.tc_min && (o == nullptr || !o->tc_method)) {
        return TcMethod::given;
    }
    return (o != nullptr && o->tc_method) ? *o->tc_method : p.methods.tc_method;
}

void require_cn(const PointInputs &in, const std::string &id, std::string_view cn_for) {
    if (!in.cn) {
        throw_input_error(in.source, fmt::format("design point '{}' has no curve number", id),
                          fmt::format("a CN for {} (column 'cn')", cn_for));
    }
}

/// The time of concentration with its method's lines and the minimum tc, min.
double point_tc_min(const TcContext &c, TcMethod method, const std::string &id, CalcLines &lines) {
    const TcRegistration &r = registration(method);
    if (r.needs.cn) {
        require_cn(c.in, id, r.cn_for);
    }
    const double tc = r.compute(c, lines);
    const AreaLimits &range = r.area_mi2;
    const double area_mi2 = c.in.area_m2 / units::m2_per_mi2;
    if (range.warning != nullptr && (area_mi2 < range.min_mi2 || area_mi2 > range.max_mi2)) {
        lines.warn(*range.warning, {qty("A", area_mi2, Unit::mi2),
                                    qty("min", range.min_mi2, Unit::mi2, Shown::exact()),
                                    qty("max", range.max_mi2, Unit::mi2, Shown::exact())});
    }
    auto m = hydro::apply_minimum_tc(tc, c.p.settings.minimum_tc_min);
    lines.append(m.lines);
    return m.value;
}

/// With [methods] cn_weighting = "runoff" and land parts: sets the context's choice and states
/// it once, before the return periods, with what each chosen SCS method takes from it.
void state_cn_weighting(PeakContext &c, const std::vector<const PeakRegistration *> &used,
                        CalcLines &lines) {
    const bool scs = std::any_of(used.begin(), used.end(), [](auto *r) { return r->needs.cn; });
    c.weighted_runoff =
        scs && c.p.methods.cn_weighting == project::CnWeighting::runoff && !c.in.land_parts.empty();
    if (!c.weighted_runoff) {
        return;
    }
    auto uses = [&](PeakMethod m) {
        return std::any_of(used.begin(), used.end(), [&](auto *r) { return r->method == m; });
    };
    c.composite_ia_shown = uses(PeakMethod::tr55_graphical);
    std::string methods;
    if (c.composite_ia_shown) {
        methods += "; the TR-55 graphical method takes Ia, for its ratio Ia/P, from the composite "
                   "CN (its unit peak table is entered with the catchment's Ia) and this Q";
    }
    if (uses(PeakMethod::scs_unit_hydrograph)) {
        methods += "; the unit hydrograph convolves the area-weighted incremental excess of the "
                   "parts, whose sum is this Q";
    }
    lines.note(cn_weighting_runoff,
               {qty("n", static_cast<double>(c.in.land_parts.size()), Unit::none, Shown::integer()),
                qty("CN", *c.in.cn), word("methods", methods), file_word(c.p)});
}

/// The peaks of every return period by the point's peak methods, in the order of the return
/// periods and, within one, of PeakMethod. Appends the lines; `shown` holds the
/// frequency-analysis lines already on the sheet.
std::vector<PeakOut> point_peaks(PeakContext &c, const std::vector<PeakMethod> &chosen,
                                 const std::string &id, CalcLines &lines, CalcLines &shown) {
    std::vector<const PeakRegistration *> used;
    for (const auto &r : peak_methods) {
        if (std::find(chosen.begin(), chosen.end(), r.method) != chosen.end()) {
            used.push_back(&r);
        }
    }
    for (const auto *r : used) {
        if (r->needs.cn) {
            require_cn(c.in, id, r->cn_for);
        }
    }
    for (const auto *r : used) {
        if (r->prepare != nullptr) {
            r->prepare(c, lines);
        }
    }
    state_cn_weighting(c, used, lines);
    std::vector<PeakOut> out;
    for (double rp : c.p.rainfall.return_periods_yr) {
        std::optional<ScsRain> rain;
        for (const auto *r : used) {
            if (r->needs.cn && !rain) {
                rain = scs_rain(c, rp, lines, shown);
            }
            if (auto pk = r->compute(c, rain ? &*rain : nullptr, rp, lines)) {
                out.push_back(std::move(*pk));
            }
        }
    }
    return out;
}

/// Puts the peaks on the design point: drops repeated warnings, numbers the lines and gives each
/// peak the id of the line of its Q.
void assemble_peaks(std::vector<PeakOut> peaks, report::DesignPointResult &dp) {
    std::vector<std::size_t> q_line_index;
    q_line_index.reserve(peaks.size());
    for (auto &pk : peaks) {
        q_line_index.push_back(pk.q_line);
        dp.peaks.push_back(std::move(pk.peak));
    }
    drop_repeated_warnings(dp.lines, q_line_index);
    number_lines(dp.lines, dp.id);
    for (std::size_t k = 0; k < dp.peaks.size(); ++k) {
        if (q_line_index[k] < dp.lines.size()) {
            dp.peaks[k].line_id = dp.lines.lines()[q_line_index[k]].id;
        }
    }
}

} // namespace

const MethodNeeds &needs_of(TcMethod m) { return registration(m).needs; }
const MethodNeeds &needs_of(PeakMethod m) { return registration(m).needs; }

MethodNeeds needs_of(const Project &p) {
    MethodNeeds all;
    for (const auto &r : peak_methods) {
        if (p.uses_method(r.method)) {
            const MethodNeeds &n = r.needs;
            all.c = all.c || n.c;
            all.cn = all.cn || n.cn;
            all.frequency_factors = all.frequency_factors || n.frequency_factors;
            all.tr55_tables = all.tr55_tables || n.tr55_tables;
            all.unit_hydrograph = all.unit_hydrograph || n.unit_hydrograph;
            all.design_storm = all.design_storm || n.design_storm;
        }
    }
    return all;
}

void compute_point_hydrology(const Project &p, const PointInputs &in, const HydrologyTables &tables,
                             report::DesignPointResult &dp) {
    auto &lines = dp.lines;
    if (in.restate_inputs) {
        restate_inputs(p, in, lines);
    }
    CalcLines ams_shown; // frequency-analysis lines already on this sheet
    const PointOverride *o = override_for(p, dp.id);
    const TcMethod tc_method = chosen_tc_method(p, in, o);
    const double tc = point_tc_min({p, in, o, tables, ams_shown}, tc_method, dp.id, lines);
    dp.tc_min = tc;
    dp.tc_method = tc_method;

    hydro::RationalSettings rational;
    rational.max_area_m2 = units::ha_to_m2(p.settings.rational_area_limit_ha);
    PeakContext c{p, in, o, tables, tc, ia_ratio(p), rational, 0.0};
    if (!in.land_parts.empty()) {
        dp.land.cn_weighting = option_key(project::cn_weighting_options, p.methods.cn_weighting);
    }
    const auto &chosen =
        (o != nullptr && o->peak_methods) ? *o->peak_methods : p.methods.peak_methods;
    assemble_peaks(point_peaks(c, chosen, dp.id, lines, ams_shown), dp);
}

std::optional<std::string>
storm_averaging_caution(const HydrologyTables &tables,
                        const std::vector<report::DesignPointResult> &points) {
    const CalcLine *first = nullptr;
    std::size_t peaks = 0;
    std::size_t affected_points = 0;
    for (const auto &dp : points) {
        const auto n = static_cast<std::size_t>(
            std::count_if(dp.lines.lines().begin(), dp.lines.lines().end(),
                          [](const CalcLine &l) { return l.key == peak_averaged_key; }));
        if (n > 0 && first == nullptr) {
            first = dp.lines.find_last(peak_averaged_key);
        }
        peaks += n;
        affected_points += n > 0 ? 1 : 0;
    }
    if (first == nullptr || tables.storm == nullptr) {
        return std::nullopt;
    }
    auto value_of = [&](std::string_view symbol) {
        for (const auto &q : first->inputs) {
            if (q.symbol == symbol) {
                return q.value;
            }
        }
        return std::nan("");
    };
    const rain::StormDistribution &d = *tables.storm;
    return fmt::format(
        "{}: {} unit-hydrograph peak{} at {} design point{} carry the warning 'Peak averaged over "
        "a table interval'. The storm table '{}' ({}) gives the cumulative rainfall at {} h and "
        "{} h around the storm's most intense part and no point between: between its points the "
        "rain is interpolated linearly, that is spread evenly, so the most intense {} min of the "
        "storm fall at their average intensity. The unit hydrograph of these catchments computes "
        "in steps D shorter than that (D about 0.133 tc) and would answer a sharper burst, so "
        "their peaks are lower than a table with more points near the peak would give. A shorter "
        "or longer storm_time_step_min does not change this; a storm table with more points "
        "near its peak ([rainfall] storm_table) does. Peaks of catchments whose unit hydrograph "
        "takes the interval as one step are not affected and carry no such warning.",
        averaging_caution_title, peaks, peaks == 1 ? "" : "s", affected_points,
        affected_points == 1 ? "" : "s", d.project_file.empty() ? d.name : d.project_file, d.source,
        sig(value_of("h0")), sig(value_of("h1")),
        sig(units::h_to_min(value_of("h1") - value_of("h0"))));
}

void check_storm_idf(const Project &p, const rain::Idf &idf, Problems &problems) {
    const Rainfall &r = p.rainfall;
    const auto range = idf.duration_range_min();
    if (!r.alternating_block() || !(r.storm_duration_min > 0.0) || !range) {
        return;
    }
    const double dt = p.settings.storm_time_step_min;
    const double td = r.storm_duration_min;
    const auto [lo, hi] = *range;
    // Relative 1e-9: a duration equal to a table's end, written with other digits, is inside.
    if (dt >= lo * (1.0 - 1e-9) && td <= hi * (1.0 + 1e-9)) {
        return;
    }
    problems.add(input_message(
        fmt::format("{}:{}: [rainfall] storm_duration_min", p.file.string(), r.storm_duration_line),
        fmt::format("the alternating-block storm of {} min in blocks of {} min needs intensities "
                    "of the IDF '{}' from {} to {} min, but the IDF covers {} to {} min only; it "
                    "is not extrapolated",
                    sig(td), sig(dt), r.idf ? r.idf->given : idf.name(), sig(dt), sig(td), sig(lo),
                    sig(hi)),
        fmt::format("a storm_duration_min of at most {} min and a [settings] storm_time_step_min "
                    "of at least {} min, or an IDF that covers {} to {} min",
                    sig(hi), sig(lo), sig(dt), sig(td))));
}

rain::StormDistribution read_project_storm_table(const project::InputPath &file) {
    try {
        rain::StormDistribution d = io::read_storm_table(file.resolved, 24.0);
        d.project_file = file.given;
        return d;
    } catch (const InputError &e) {
        throw InputError(fmt::format("[rainfall] storm_table \"{}\": {}", file.given, e.what()));
    }
}

HydrologyTables LoadedTables::view() const {
    HydrologyTables t;
    t.idf = idf ? &*idf : nullptr;
    t.frequency_factors = &frequency_factors;
    t.peak_coefficients = &peak_coefficients;
    t.pond_factors = &pond_factors;
    t.unit_hydrograph = &unit_hydrograph;
    t.storm = storm ? &*storm : nullptr;
    t.ams = ams ? &*ams : nullptr;
    return t;
}

LoadedTables load_hydrology_tables(const Project &p, const std::filesystem::path &config) {
    LoadedTables t;
    if (p.rainfall.idf) {
        t.idf = io::read_idf_csv(p.rainfall.idf->resolved);
    }
    if (p.rainfall.annual_maximum_series) {
        t.ams = read_annual_maximum_series(p.rainfall.annual_maximum_series->resolved,
                                           p.rainfall.annual_maximum_series->given);
    }
    const MethodNeeds needs = needs_of(p);
    auto read = [&](const std::string &role, const std::string &name, auto reader, auto &into) {
        into = reader(config / name);
        t.config_files.emplace_back(role, std::filesystem::path(name));
    };
    if (needs.frequency_factors) {
        read("frequency factor table", std::string(frequency_factor_file),
             io::read_frequency_factor_table, t.frequency_factors);
    }
    if (needs.tr55_tables) {
        read("TR-55 peak coefficients", "tr55_peak_coefficients.csv",
             io::read_peak_coefficient_table, t.peak_coefficients);
        read("TR-55 pond factors", "tr55_pond_factors.csv", io::read_pond_factor_table,
             t.pond_factors);
    }
    if (needs.unit_hydrograph) {
        read("dimensionless unit hydrograph", "scs_dimensionless_unit_hydrograph.csv",
             io::read_dimensionless_unit_hydrograph, t.unit_hydrograph);
    }
    if (needs.design_storm && p.rainfall.storm_table && !p.rainfall.alternating_block()) {
        t.storm = read_project_storm_table(*p.rainfall.storm_table);
    } else if (needs.design_storm && !p.rainfall.alternating_block()) {
        const auto file =
            io::nrcs_storm_file(config, p.rainfall.required_storm_type(p.file.string()));
        t.storm = io::read_storm_table(file);
        t.config_files.emplace_back("design storm",
                                    std::filesystem::path("storms") / file.filename());
    }
    return t;
}

void add_method_references(const Project &p, const report::DesignPointResult &dp,
                           std::vector<report::Reference> &refs) {
    auto add = [&](Ref r) {
        const std::string key(short_form(r));
        if (r == Ref::none ||
            std::any_of(refs.begin(), refs.end(),
                        [&](const report::Reference &e) { return e.key == key; })) {
            return;
        }
        refs.push_back({key, std::string(citation(r))});
    };
    if (dp.tc_method) {
        for (Ref r : registration(*dp.tc_method).refs) {
            add(r);
        }
    }
    for (const auto &pk : dp.peaks) {
        const PeakRegistration &m = registration(pk.method);
        for (Ref r : m.refs) {
            add(r);
        }
        if (m.needs.design_storm) {
            add(design_storm_ref(p));
        }
    }
    const bool ams = dp.lines.has(ams_series_key);
    if (ams && p.rainfall.ams_distribution == project::AmsDistribution::gev) {
        add(Ref::hosking_1990);
        add(Ref::hosking_wallis_1997);
        add(Ref::hosking_wallis_wood_1985);
    } else if (ams) {
        add(Ref::chow_1988);
    }
}

} // namespace catchpeak::app

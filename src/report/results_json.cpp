// SPDX-License-Identifier: MIT
#include "catchpeak/report/results_json.hpp"

#include "catchpeak/report/line_text.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"

#include <array>
#include <nlohmann/json.hpp>

#include <cmath>
#include <initializer_list>
#include <limits>
#include <string>
#include <string_view>
#include <type_traits>
#include <utility>

namespace catchpeak::report {

namespace {

using Json = nlohmann::ordered_json;

constexpr std::string_view results_format = "catchpeak results";
constexpr std::string_view run_record_format = "catchpeak run record";
constexpr int format_version = 1;

// ---------------------------------------------------------------------------------------------
// Writing

/// A number, or null when it is not finite (JSON has no NaN). nlohmann writes doubles with
/// round-trip precision and '.' as decimal point whatever the locale.
Json number(double v) { return std::isfinite(v) ? Json(v) : Json(nullptr); }

Json numbers(const std::vector<double> &values) {
    Json a = Json::array();
    for (double v : values) {
        a.push_back(number(v));
    }
    return a;
}

Json strings(const std::vector<std::string> &values) {
    Json a = Json::array();
    for (const auto &v : values) {
        a.push_back(v);
    }
    return a;
}

Json project_json(const ProjectInfo &p) {
    Json j;
    j["name"] = p.name;
    j["number"] = p.number;
    j["client"] = p.client;
    j["location"] = p.location;
    j["prepared_by"] = p.prepared_by;
    j["checked_by"] = p.checked_by;
    j["revision"] = p.revision;
    j["unit_system"] = p.units == units::System::si ? "SI" : "US";
    j["page_size"] = p.page_size ? option_key(page_size_options, *p.page_size) : std::string_view();
    return j;
}

Json catchment_json(const CatchmentFigures &c) {
    Json j;
    j["area_m2"] = number(c.area_m2);
    j["local_area_m2"] = number(c.local_area_m2);
    j["longest_flow_path_m"] = number(c.longest_flow_path_m);
    j["elevation_top_m"] = number(c.elevation_top_m);
    j["elevation_outlet_m"] = number(c.elevation_outlet_m);
    j["slope_flow_path_m_per_m"] = number(c.slope_flow_path);
    j["slope_10_85_m_per_m"] = number(c.slope_10_85);
    j["mean_slope_m_per_m"] = number(c.mean_slope);
    j["upstream_points"] = strings(c.upstream_points);
    return j;
}

Json land_json(const LandWeighting &w) {
    Json j;
    j["c_table"] = w.c_table;
    j["cn_table"] = w.cn_table;
    j["c_weighted"] = number(w.c_weighted);
    j["cn_weighted"] = number(w.cn_weighted);
    j["cn_weighting"] = w.cn_weighting.empty() ? Json(nullptr) : Json(w.cn_weighting);
    j["impervious_share"] = number(w.impervious_share);
    Json parts = Json::array();
    for (const auto &p : w.parts) {
        Json pj;
        pj["land_class"] = p.land_class;
        pj["soil_group"] = p.soil_group;
        pj["area_m2"] = number(p.area_m2);
        pj["c"] = number(p.c);
        pj["cn"] = number(p.cn);
        pj["impervious_share"] = number(p.impervious_share);
        parts.push_back(std::move(pj));
    }
    j["parts"] = std::move(parts);
    return j;
}

Json peak_json(const Peak &p) {
    Json j;
    j["return_period_yr"] = number(p.return_period_yr);
    j["method"] = key_of(p.method);
    j["q_m3_s"] = number(p.q_m3_s);
    j["line_id"] = p.line_id;
    Json inter = Json::object();
    for (const auto &[key, value] : p.intermediates) { // std::map: sorted, deterministic
        inter[key] = number(value);
    }
    j["intermediates"] = std::move(inter);
    if (p.hydrograph) {
        Json h;
        h["step_s"] = number(p.hydrograph->step_s);
        h["q_m3_s"] = numbers(p.hydrograph->q_m3_s);
        h["rain_mm"] = numbers(p.hydrograph->rain_mm);
        h["excess_mm"] = numbers(p.hydrograph->excess_mm);
        j["hydrograph"] = std::move(h);
    } else {
        j["hydrograph"] = nullptr;
    }
    return j;
}

Json line_json(const CalcLine &l) {
    const LineText t = text_of(l);
    Json j;
    j["id"] = l.id;
    j["kind"] = std::string(to_string(l.kind));
    j["label"] = t.label;
    j["symbols"] = t.symbols;
    j["numbers"] = t.numbers;
    j["value"] = number(l.value());
    j["unit"] = t.unit;
    j["source"] = t.source;
    return j;
}

Json culvert_json(const CulvertResult &c) {
    Json j;
    j["shape"] = c.shape;
    j["barrels"] = c.barrels;
    j["span_m"] = number(c.span_m);
    j["rise_m"] = number(c.rise_m);
    j["sized"] = c.sized;
    j["size_found"] = c.size_found;
    j["inlet"] = c.inlet;
    j["inlet_invert_m"] = number(c.inlet_invert_m);
    j["outlet_invert_m"] = number(c.outlet_invert_m);
    j["length_m"] = number(c.length_m);
    j["crest_elevation_m"] = c.crest_elevation_m ? number(*c.crest_elevation_m) : Json(nullptr);
    Json cases = Json::array();
    for (const auto &k : c.cases) {
        Json kj;
        kj["return_period_yr"] = number(k.return_period_yr);
        kj["design"] = k.design;
        kj["flow_m3_per_s"] = number(k.flow_m3_s);
        kj["culvert_flow_m3_per_s"] = number(k.culvert_flow_m3_s);
        kj["overtopping_flow_m3_per_s"] = number(k.overtopping_flow_m3_s);
        kj["tailwater_m"] = number(k.tailwater_m);
        kj["inlet_control_headwater_m"] = number(k.inlet_control_headwater_m);
        kj["outlet_control_headwater_m"] = number(k.outlet_control_headwater_m);
        kj["headwater_m"] = number(k.headwater_m);
        kj["headwater_elevation_m"] = number(k.headwater_elevation_m);
        kj["allowed_headwater_m"] = number(k.allowed_headwater_m);
        kj["control"] = k.control;
        kj["outlet_velocity_m_per_s"] = number(k.outlet_velocity_m_per_s);
        kj["passes"] = k.passes;
        kj["headwater_line_id"] = k.headwater_line_id;
        kj["flow_line_id"] = k.flow_line_id;
        cases.push_back(std::move(kj));
    }
    j["cases"] = std::move(cases);
    Json curve = Json::array();
    for (const auto &pt : c.curve) {
        curve.push_back(
            Json::array({number(pt.flow_m3_s), number(pt.headwater_elevation_m),
                         number(pt.inlet_control_headwater_m),
                         number(pt.outlet_control_headwater_m), number(pt.overtopping_flow_m3_s)}));
    }
    j["performance_curve_columns"] =
        strings({"flow_m3_per_s", "headwater_elevation_m", "inlet_control_headwater_m",
                 "outlet_control_headwater_m", "overtopping_flow_m3_per_s"});
    j["performance_curve"] = std::move(curve);
    return j;
}

Json snap_json(const SnapFigures &s) {
    Json j;
    j["rule"] = option_key(snap_rule_options, s.rule);
    j["radius_m"] = number(s.radius_m);
    j["stream_threshold_m2"] = number(s.stream_threshold_m2);
    j["given_cell_area_m2"] = number(s.given_cell_area_m2);
    j["snapped_area_m2"] = number(s.snapped_area_m2);
    j["min_area_within_radius_m2"] = number(s.min_area_within_radius_m2);
    j["max_area_within_radius_m2"] = number(s.max_area_within_radius_m2);
    j["no_stream_within_radius"] = s.no_stream_within_radius;
    j["direction"] = s.direction;
    j["area_factor"] = number(s.area_factor);
    return j;
}

Json point_json(const DesignPointResult &p) {
    Json j;
    j["id"] = p.id;
    j["given_x_m"] = number(p.given_xy.first);
    j["given_y_m"] = number(p.given_xy.second);
    j["snapped_x_m"] = number(p.snapped_xy.first);
    j["snapped_y_m"] = number(p.snapped_xy.second);
    j["snap_distance_m"] = number(p.snap_distance_m);
    if (p.snap) { // only design points of a DEM have the member
        j["snap"] = snap_json(*p.snap);
    }
    j["catchment_source"] = p.from_table ? "table" : "dem";
    j["catchment"] = catchment_json(p.catchment);
    j["land"] = land_json(p.land);
    j["tc_min"] = number(p.tc_min);
    j["tc_method"] = p.tc_method ? key_of(*p.tc_method) : std::string_view();
    Json peaks = Json::array();
    for (const auto &pk : p.peaks) {
        peaks.push_back(peak_json(pk));
    }
    j["peaks"] = std::move(peaks);
    j["warning_count"] = p.lines.warning_count();
    Json lines = Json::array();
    for (const auto &l : p.lines.lines()) {
        lines.push_back(line_json(l));
    }
    j["lines"] = std::move(lines);
    if (p.culvert) { // only design points with a culvert have the member
        j["culvert"] = culvert_json(*p.culvert);
    }
    return j;
}

// ---------------------------------------------------------------------------------------------
// Reading

/// Reads members of one JSON object and names the file and the member path in errors.
class Reader {
  public:
    Reader(const Json &j, std::string where) : j_(j), where_(std::move(where)) {
        if (!j_.is_object()) {
            fail("is not an object");
        }
    }

    [[nodiscard]] const Json &member(std::string_view key) const {
        auto it = j_.find(key);
        if (it == j_.end()) {
            throw_input_error(where_, "member '" + std::string(key) + "' is missing",
                              "a file written by catchpeak run");
        }
        return *it;
    }

    /// True when the member is there and not null (members added in later versions).
    [[nodiscard]] bool given(std::string_view key) const {
        auto it = j_.find(key);
        return it != j_.end() && !it->is_null();
    }

    [[nodiscard]] std::string str(std::string_view key) const {
        const auto &v = member(key);
        if (!v.is_string()) {
            bad(key, "a string");
        }
        return v.get<std::string>();
    }

    /// The value of an option written by its text.
    template <class E, std::size_t N>
    [[nodiscard]] E option(std::string_view key, const OptionTable<E, N> &table) const {
        const std::string text = str(key);
        if (const auto v = find_option(table, text)) {
            return *v;
        }
        std::string accepted;
        for (const auto &o : table) {
            accepted += (accepted.empty() ? "" : ", ") + std::string(o.key);
        }
        throw_input_error(sub(key), "'" + text + "' is not known", accepted);
    }

    [[nodiscard]] double num(std::string_view key) const { return to_number(member(key), key); }

    [[nodiscard]] std::vector<double> nums(std::string_view key) const {
        const auto &v = member(key);
        if (!v.is_array()) {
            bad(key, "an array of numbers");
        }
        std::vector<double> out;
        out.reserve(v.size());
        for (const auto &e : v) {
            out.push_back(to_number(e, key));
        }
        return out;
    }

    [[nodiscard]] std::vector<std::string> strs(std::string_view key) const {
        const auto &v = member(key);
        if (!v.is_array()) {
            bad(key, "an array of strings");
        }
        std::vector<std::string> out;
        for (const auto &e : v) {
            if (!e.is_string()) {
                bad(key, "an array of strings");
            }
            out.push_back(e.get<std::string>());
        }
        return out;
    }

    [[nodiscard]] const Json &array(std::string_view key) const {
        const auto &v = member(key);
        if (!v.is_array()) {
            bad(key, "an array");
        }
        return v;
    }

    [[nodiscard]] Reader object(std::string_view key) const {
        return Reader(member(key), sub(key));
    }

    [[nodiscard]] std::string sub(std::string_view key) const {
        return where_ + "." + std::string(key);
    }
    [[nodiscard]] std::string item(std::string_view key, std::size_t i) const {
        return where_ + "." + std::string(key) + "[" + std::to_string(i) + "]";
    }
    [[nodiscard]] const Json &json() const noexcept { return j_; }
    [[nodiscard]] const std::string &where() const noexcept { return where_; }

    [[noreturn]] void fail(const std::string &what) const {
        throw_input_error(where_, what, "a file written by catchpeak run");
    }

  private:
    [[nodiscard]] double to_number(const Json &v, std::string_view key) const {
        if (v.is_null()) {
            return std::numeric_limits<double>::quiet_NaN();
        }
        if (!v.is_number()) {
            bad(key, "a number or null");
        }
        return v.get<double>();
    }

    [[noreturn]] void bad(std::string_view key, std::string_view accepted) const {
        throw_input_error(sub(key), "has the wrong type", std::string(accepted));
    }

    const Json &j_;
    std::string where_;
};

Json parse(std::string_view text, std::string_view where) {
    Json j = Json::parse(text.begin(), text.end(), nullptr, /*allow_exceptions=*/false);
    if (j.is_discarded()) {
        throw_input_error(std::string(where), "is not valid JSON",
                          "a file written by catchpeak run");
    }
    return j;
}

void check_format(const Reader &r, std::string_view format) {
    if (r.str("format") != format) {
        r.fail("member 'format' is '" + r.str("format") + "', expected '" + std::string(format) +
               "'");
    }
    const double version = r.num("format_version");
    if (version != static_cast<double>(format_version)) {
        r.fail("format_version " + full(version) +
               " is not supported; accepted: " + std::to_string(format_version));
    }
}

/// Takes a reader of a JSON object and pairs (member name, field of `into`); reads each member,
/// in the order given, into its field: a number into a double, a text into a string.
template <typename V, typename T>
void read_members(const Reader &r, T &into,
                  std::initializer_list<std::pair<std::string_view, V T::*>> members) {
    for (const auto &[key, field] : members) {
        if constexpr (std::is_same_v<V, double>) {
            into.*field = r.num(key);
        } else {
            into.*field = r.str(key);
        }
    }
}

LineKind parse_kind(const Reader &r) {
    const auto k = r.str("kind");
    if (k == "calculation") {
        return LineKind::calculation;
    }
    if (k == "warning") {
        return LineKind::warning;
    }
    if (k == "note") {
        return LineKind::note;
    }
    throw_input_error(r.sub("kind"), "unknown line kind '" + k + "'",
                      "\"calculation\", \"warning\" or \"note\"");
}

bool flag(const Reader &r, std::string_view key) {
    const auto &v = r.member(key);
    if (!v.is_boolean()) {
        throw_input_error(r.sub(key), "has the wrong type", "true or false");
    }
    return v.get<bool>();
}

/// A string member that a results.json of an older run may lack ("" then).
std::string optional_str(const Reader &r, std::string_view key) {
    return r.json().contains(std::string(key)) ? r.str(key) : std::string();
}

CulvertResult parse_culvert(const Reader &r) {
    CulvertResult c;
    c.shape = r.str("shape");
    c.barrels = static_cast<int>(r.num("barrels"));
    c.span_m = r.num("span_m");
    c.rise_m = r.num("rise_m");
    c.sized = flag(r, "sized");
    c.size_found = flag(r, "size_found");
    c.inlet = r.str("inlet");
    c.inlet_invert_m = r.num("inlet_invert_m");
    c.outlet_invert_m = r.num("outlet_invert_m");
    c.length_m = r.num("length_m");
    if (!r.member("crest_elevation_m").is_null()) {
        c.crest_elevation_m = r.num("crest_elevation_m");
    }
    const auto &cases = r.array("cases");
    for (std::size_t i = 0; i < cases.size(); ++i) {
        const Reader k(cases[i], r.item("cases", i));
        c.cases.push_back({k.num("return_period_yr"), flag(k, "design"), k.num("flow_m3_per_s"),
                           k.num("culvert_flow_m3_per_s"), k.num("overtopping_flow_m3_per_s"),
                           k.num("tailwater_m"), k.num("inlet_control_headwater_m"),
                           k.num("outlet_control_headwater_m"), k.num("headwater_m"),
                           k.num("headwater_elevation_m"), k.num("allowed_headwater_m"),
                           k.str("control"), k.num("outlet_velocity_m_per_s"), flag(k, "passes"),
                           optional_str(k, "headwater_line_id"), optional_str(k, "flow_line_id")});
    }
    const auto &curve = r.array("performance_curve");
    for (std::size_t i = 0; i < curve.size(); ++i) {
        const auto &row = curve[i];
        if (!row.is_array() || row.size() != 5) {
            throw_input_error(r.item("performance_curve", i), "has the wrong type",
                              "an array of 5 numbers");
        }
        std::array<double, 5> v{};
        for (std::size_t k = 0; k < 5; ++k) {
            if (!row[k].is_number()) {
                throw_input_error(r.item("performance_curve", i), "has the wrong type",
                                  "an array of 5 numbers");
            }
            v[k] = row[k].get<double>();
        }
        c.curve.push_back({v[0], v[1], v[2], v[3], v[4]});
    }
    return c;
}

SnapFigures parse_snap(const Reader &r) {
    SnapFigures s;
    s.rule = r.option("rule", snap_rule_options);
    using S = SnapFigures;
    read_members<double>(r, s,
                         {{"radius_m", &S::radius_m},
                          {"stream_threshold_m2", &S::stream_threshold_m2},
                          {"given_cell_area_m2", &S::given_cell_area_m2},
                          {"snapped_area_m2", &S::snapped_area_m2},
                          {"min_area_within_radius_m2", &S::min_area_within_radius_m2},
                          {"max_area_within_radius_m2", &S::max_area_within_radius_m2},
                          {"area_factor", &S::area_factor}});
    s.no_stream_within_radius = flag(r, "no_stream_within_radius");
    s.direction = r.str("direction");
    return s;
}

DesignPointResult parse_point(const Reader &r) {
    DesignPointResult p;
    p.id = r.str("id");
    p.given_xy = {r.num("given_x_m"), r.num("given_y_m")};
    p.snapped_xy = {r.num("snapped_x_m"), r.num("snapped_y_m")};
    p.snap_distance_m = r.num("snap_distance_m");
    if (r.json().contains("snap")) {
        p.snap = parse_snap(r.object("snap"));
    }
    const auto source = r.str("catchment_source");
    if (source != "dem" && source != "table") {
        throw_input_error(r.sub("catchment_source"), "unknown value '" + source + "'",
                          "\"dem\" or \"table\"");
    }
    p.from_table = source == "table";

    const auto c = r.object("catchment");
    using C = CatchmentFigures;
    read_members<double>(c, p.catchment,
                         {{"area_m2", &C::area_m2},
                          {"local_area_m2", &C::local_area_m2},
                          {"longest_flow_path_m", &C::longest_flow_path_m},
                          {"elevation_top_m", &C::elevation_top_m},
                          {"elevation_outlet_m", &C::elevation_outlet_m},
                          {"slope_flow_path_m_per_m", &C::slope_flow_path},
                          {"slope_10_85_m_per_m", &C::slope_10_85},
                          {"mean_slope_m_per_m", &C::mean_slope}});
    p.catchment.upstream_points = c.strs("upstream_points");

    const auto w = r.object("land");
    p.land.c_table = w.str("c_table");
    p.land.cn_table = w.str("cn_table");
    p.land.c_weighted = w.num("c_weighted");
    p.land.cn_weighted = w.num("cn_weighted");
    p.land.impervious_share = w.num("impervious_share");
    if (w.given("cn_weighting")) { // not written before the option
        p.land.cn_weighting = w.str("cn_weighting");
    }
    const auto &parts = w.array("parts");
    for (std::size_t i = 0; i < parts.size(); ++i) {
        const Reader pr(parts[i], w.item("parts", i));
        LandPart part;
        part.land_class = pr.str("land_class");
        part.soil_group = pr.str("soil_group");
        part.area_m2 = pr.num("area_m2");
        part.c = pr.num("c");
        part.cn = pr.num("cn");
        part.impervious_share = pr.num("impervious_share");
        p.land.parts.push_back(std::move(part));
    }

    p.tc_min = r.num("tc_min");
    if (!r.str("tc_method").empty()) {
        p.tc_method = r.option("tc_method", tc_method_options);
    }

    const auto &peaks = r.array("peaks");
    for (std::size_t i = 0; i < peaks.size(); ++i) {
        const Reader kr(peaks[i], r.item("peaks", i));
        Peak pk;
        pk.return_period_yr = kr.num("return_period_yr");
        pk.method = kr.option("method", peak_method_options);
        pk.q_m3_s = kr.num("q_m3_s");
        pk.line_id = kr.str("line_id");
        const auto &inter = kr.member("intermediates");
        if (!inter.is_object()) {
            throw_input_error(kr.sub("intermediates"), "has the wrong type", "an object");
        }
        const Reader ir(inter, kr.sub("intermediates"));
        for (const auto &item : inter.items()) {
            pk.intermediates[item.key()] = ir.num(item.key());
        }
        if (!kr.member("hydrograph").is_null()) {
            const auto h = kr.object("hydrograph");
            Hydrograph hg;
            hg.step_s = h.num("step_s");
            hg.q_m3_s = h.nums("q_m3_s");
            hg.rain_mm = h.nums("rain_mm");
            hg.excess_mm = h.nums("excess_mm");
            pk.hydrograph = std::move(hg);
        }
        p.peaks.push_back(std::move(pk));
    }

    const auto &lines = r.array("lines");
    for (std::size_t i = 0; i < lines.size(); ++i) {
        const Reader lr(lines[i], r.item("lines", i));
        CalcLine l;
        l.id = lr.str("id");
        l.kind = parse_kind(lr);
        l.text = LineText{lr.str("label"), lr.str("symbols"), lr.str("numbers"), lr.str("unit"),
                          lr.str("source")};
        l.result.value = lr.num("value");
        p.lines.add(std::move(l));
    }
    if (r.json().contains("culvert")) {
        p.culvert = parse_culvert(r.object("culvert"));
    }
    return p;
}

std::string dump(const Json &j) { return j.dump(2, ' ', /*ensure_ascii=*/false) + "\n"; }

} // namespace

std::string results_json(const RunResults &results) {
    Json j;
    j["format"] = results_format;
    j["format_version"] = format_version;
    j["project"] = project_json(results.project);
    Json points = Json::array();
    for (const auto &p : results.points) {
        points.push_back(point_json(p));
    }
    j["design_points"] = std::move(points);
    Json refs = Json::array();
    for (const auto &r : results.references) {
        Json rj;
        rj["key"] = r.key;
        rj["citation"] = r.citation;
        refs.push_back(std::move(rj));
    }
    j["references"] = std::move(refs);
    j["caution_notes"] = strings(results.caution_notes);
    return dump(j);
}

RunResults parse_results_json(std::string_view text, std::string_view where) {
    const Json j = parse(text, where);
    const Reader r(j, std::string(where));
    check_format(r, results_format);

    RunResults out;
    const auto p = r.object("project");
    read_members<std::string>(p, out.project,
                              {{"name", &ProjectInfo::name},
                               {"number", &ProjectInfo::number},
                               {"client", &ProjectInfo::client},
                               {"location", &ProjectInfo::location},
                               {"prepared_by", &ProjectInfo::prepared_by},
                               {"checked_by", &ProjectInfo::checked_by},
                               {"revision", &ProjectInfo::revision}});
    out.project.units = units::parse_system(p.str("unit_system"), p.sub("unit_system"));
    if (!p.str("page_size").empty()) {
        out.project.page_size = p.option("page_size", page_size_options);
    }

    const auto &points = r.array("design_points");
    for (std::size_t i = 0; i < points.size(); ++i) {
        out.points.push_back(parse_point(Reader(points[i], r.item("design_points", i))));
    }
    const auto &refs = r.array("references");
    for (std::size_t i = 0; i < refs.size(); ++i) {
        const Reader rr(refs[i], r.item("references", i));
        out.references.push_back({rr.str("key"), rr.str("citation")});
    }
    out.caution_notes = r.strs("caution_notes");
    return out;
}

std::string run_record_json(const Stamp &stamp) {
    Json j;
    j["format"] = run_record_format;
    j["format_version"] = format_version;
    j["tool_version"] = stamp.tool_version;
    j["git_commit"] = stamp.git_commit;
    j["run_time_utc"] = stamp.run_time_utc;
    Json inputs = Json::array();
    for (const auto &in : stamp.inputs) {
        Json ij;
        ij["role"] = in.role;
        ij["path"] = in.path;
        ij["sha256"] = in.sha256;
        inputs.push_back(std::move(ij));
    }
    j["inputs"] = std::move(inputs);
    Json outputs = Json::array();
    for (const auto &o : stamp.outputs) {
        Json oj;
        oj["path"] = o.path;
        oj["sha256"] = o.sha256;
        outputs.push_back(std::move(oj));
    }
    j["outputs"] = std::move(outputs);
    if (!stamp.project_file_from_output.empty()) {
        j["project_file_from_output"] = stamp.project_file_from_output;
    }
    return dump(j);
}

Stamp parse_run_record_json(std::string_view text, std::string_view where) {
    const Json j = parse(text, where);
    const Reader r(j, std::string(where));
    check_format(r, run_record_format);
    Stamp s;
    read_members<std::string>(r, s,
                              {{"tool_version", &Stamp::tool_version},
                               {"git_commit", &Stamp::git_commit},
                               {"run_time_utc", &Stamp::run_time_utc}});
    const auto &inputs = r.array("inputs");
    for (std::size_t i = 0; i < inputs.size(); ++i) {
        const Reader ir(inputs[i], r.item("inputs", i));
        s.inputs.push_back({ir.str("role"), ir.str("path"), ir.str("sha256")});
    }
    // A record written before the outputs were hashed has no "outputs".
    if (j.contains("outputs")) {
        const auto &outputs = r.array("outputs");
        for (std::size_t i = 0; i < outputs.size(); ++i) {
            const Reader orr(outputs[i], r.item("outputs", i));
            s.outputs.push_back({orr.str("path"), orr.str("sha256")});
        }
    }
    if (j.contains("project_file_from_output")) {
        s.project_file_from_output = r.str("project_file_from_output");
    }
    return s;
}

void write_results_json(const RunResults &results, const std::filesystem::path &dir) {
    write_text_file_atomic(dir / results_file_name, results_json(results));
}

RunResults read_results_json(const std::filesystem::path &dir) {
    const auto file = dir / results_file_name;
    return parse_results_json(read_text_file(file), file.string());
}

void write_run_record(const Stamp &stamp, const std::filesystem::path &dir) {
    write_text_file_atomic(dir / run_record_file_name, run_record_json(stamp));
}

Stamp read_run_record(const std::filesystem::path &dir) {
    const auto file = dir / run_record_file_name;
    return parse_run_record_json(read_text_file(file), file.string());
}

} // namespace catchpeak::report

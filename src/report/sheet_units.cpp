// SPDX-License-Identifier: MIT
#include "catchpeak/report/sheet_units.hpp"

#include <fmt/format.h>

#include <cmath>

namespace catchpeak::report {

namespace {
bool us(units::System s) { return s == units::System::us_customary; }
} // namespace

SheetValue sheet_area(double area_m2, units::System system) noexcept {
    return us(system) ? SheetValue{units::m2_to_acre(area_m2), "acre"}
                      : SheetValue{units::m2_to_ha(area_m2), "ha"};
}

SheetValue sheet_length(double length_m, units::System system) noexcept {
    return us(system) ? SheetValue{units::m_to_ft(length_m), "ft"} : SheetValue{length_m, "m"};
}

SheetValue sheet_flow(double q_m3_s, units::System system) noexcept {
    return us(system) ? SheetValue{units::m3s_to_cfs(q_m3_s), "cfs"} : SheetValue{q_m3_s, "m3/s"};
}

SheetValue sheet_depth(double depth_mm, units::System system) noexcept {
    return us(system) ? SheetValue{units::mm_to_in(depth_mm), "in"} : SheetValue{depth_mm, "mm"};
}

SheetValue sheet_velocity(double v_m_s, units::System system) noexcept {
    return us(system) ? SheetValue{units::m_to_ft(v_m_s), "ft/s"} : SheetValue{v_m_s, "m/s"};
}

std::string_view area_key_unit(units::System system) noexcept { return us(system) ? "acre" : "ha"; }

std::string_view flow_key_unit(units::System system) noexcept {
    return us(system) ? "cfs" : "m3_s";
}

std::string_view length_key_unit(units::System system) noexcept { return us(system) ? "ft" : "m"; }

std::string_view velocity_key_unit(units::System system) noexcept {
    return us(system) ? "ft_s" : "m_s";
}

std::string culvert_size_title(bool box, double span_m, double rise_m, units::System system) {
    const bool in = us(system);
    const auto len = [&](double m) {
        return in ? fmt::format("{:g}", std::round(units::m_to_ft(m) * 120.0) / 10.0)
                  : fmt::format("{:g}", std::round(m * 1000.0));
    };
    const std::string_view unit = in ? "in" : "mm";
    return box ? fmt::format("{} x {} {}", len(span_m), len(rise_m), unit)
               : fmt::format("{} {}", len(rise_m), unit);
}

std::string method_title(PeakMethod method) {
    switch (method) {
    case PeakMethod::rational:
        return "Rational Method";
    case PeakMethod::tr55_graphical:
        return "TR-55 graphical peak";
    case PeakMethod::scs_unit_hydrograph:
        return "SCS unit hydrograph";
    }
    return std::string(key_of(method));
}

std::string method_title(TcMethod method) {
    switch (method) {
    case TcMethod::kirpich:
        return "Kirpich";
    case TcMethod::nrcs_lag:
        return "NRCS lag";
    case TcMethod::tr55_segmental:
        return "TR-55 segmental";
    case TcMethod::kerby_kirpich:
        return "Kerby-Kirpich";
    case TcMethod::given:
        return "given by the engineer";
    }
    return std::string(key_of(method));
}

std::string return_period_title(double return_period_yr) {
    return fmt::format("{:g}-yr", return_period_yr);
}

} // namespace catchpeak::report

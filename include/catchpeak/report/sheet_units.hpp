// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/methods.hpp"
#include "catchpeak/core/units.hpp"

#include <string>
#include <string_view>

/// The units the calculation sheet, summary.csv and the summary page show, by unit system.
/// Values inside are SI; these convert them for display only.
///
///   quantity      SI sheet   US customary sheet
///   area          ha         acre
///   length        m          ft
///   elevation     m          ft
///   flow          m3/s       cfs
///   depth         mm         in
namespace catchpeak::report {

/// A value converted for the sheet, with its unit label.
struct SheetValue {
    double value;
    std::string_view unit;
};

[[nodiscard]] SheetValue sheet_area(double area_m2, units::System system) noexcept;
[[nodiscard]] SheetValue sheet_length(double length_m, units::System system) noexcept;
[[nodiscard]] SheetValue sheet_flow(double q_m3_s, units::System system) noexcept;
[[nodiscard]] SheetValue sheet_depth(double depth_mm, units::System system) noexcept;
/// A velocity: m/s, or ft/s on a US customary sheet.
[[nodiscard]] SheetValue sheet_velocity(double v_m_s, units::System system) noexcept;

/// Unit label of each quantity as it appears in CSV column names ("ha", "acre", "m3_s", "cfs").
[[nodiscard]] std::string_view area_key_unit(units::System system) noexcept;
[[nodiscard]] std::string_view flow_key_unit(units::System system) noexcept;
/// ... of a length ("m", "ft") and a velocity ("m_s", "ft_s").
[[nodiscard]] std::string_view length_key_unit(units::System system) noexcept;
[[nodiscard]] std::string_view velocity_key_unit(units::System system) noexcept;

/// A culvert barrel's size: its diameter ("1200 mm") or span x rise ("1500 x 1200 mm"), in
/// whole millimetres, or in inches to 0.1 in on a US customary sheet ("48 in", "72 x 48 in").
[[nodiscard]] std::string culvert_size_title(bool box, double span_m, double rise_m,
                                             units::System system);

/// Name of a peak flow method for the sheet: "Rational Method", "TR-55 graphical peak",
/// "SCS unit hydrograph".
[[nodiscard]] std::string method_title(PeakMethod method);
/// Name of a tc method for the sheet: "Kirpich", "NRCS lag", "TR-55 segmental",
/// "Kerby-Kirpich", "given by the engineer".
[[nodiscard]] std::string method_title(TcMethod method);

/// A return period for the sheet: 10 -> "10-yr", 2.33 -> "2.33-yr".
[[nodiscard]] std::string return_period_title(double return_period_yr);

} // namespace catchpeak::report

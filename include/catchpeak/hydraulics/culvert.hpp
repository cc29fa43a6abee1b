// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydraulics/inlets.hpp"
#include "catchpeak/hydraulics/section.hpp"

#include <cstdint>
#include <optional>
#include <string_view>
#include <vector>

/// Culvert headwater after FHWA HDS-5 (2012): inlet control (appendix A equations), outlet
/// control (full-flow losses), the controlling headwater, the check against a headwater limit,
/// and sizing from a list of standard sizes. SI inside; each equation is evaluated in the
/// published form of the sheet's unit system.
namespace catchpeak::hydraulics {

namespace keys {
inline constexpr std::string_view hw_inlet = "culvert.hw_inlet";
inline constexpr std::string_view hw_outlet = "culvert.hw_outlet";
inline constexpr std::string_view hw = "culvert.hw";
inline constexpr std::string_view hw_over_limit = "culvert.hw_over_limit";
inline constexpr std::string_view adverse_slope = "culvert.adverse_slope";
inline constexpr std::string_view beyond_charts = "culvert.beyond_charts";
inline constexpr std::string_view no_size_passes = "culvert.no_size_passes";
} // namespace keys

/// One culvert: its barrels, their length, slope and roughness, and its inlet.
struct Culvert {
    Section section;
    int barrels = 1;
    double length_m = 0.0;
    double slope_m_per_m = 0.0; ///< barrel slope So, positive falling toward the outlet
    double manning_n = 0.0;
    InletRow inlet;
};

/// The allowed headwater: an elevation, a ratio HW/D, or both (the stricter governs).
struct HeadwaterLimit {
    std::optional<double> elevation_m;
    std::optional<double> hw_over_d;
};

/// Where the culvert sits: the inlet invert, the tailwater depth above the outlet invert (for
/// instance normal_depth_m of the outlet channel) and the headwater limit.
struct Site {
    double inlet_invert_m = 0.0;
    double tailwater_depth_m = 0.0;
    HeadwaterLimit limit;
};

enum class Control : std::uint8_t { inlet, outlet };

[[nodiscard]] std::string_view to_string(Control c) noexcept;

/// Which inlet control equation gave the headwater.
enum class InletRegime : std::uint8_t { unsubmerged, transition, submerged };

struct InletControl {
    double x = 0.0;         ///< Ku Q/(A D^0.5), the US customary number in both systems
    double hw_over_d = 0.0; ///< HWi/D
    double hw_m = 0.0;      ///< HWi above the inlet invert
    InletRegime regime = InletRegime::unsubmerged;
};

/// Inlet control headwater of one barrel carrying Q/N: unsubmerged HDS-5 (2012) eq. A.1 (form
/// 1) or A.2 (form 2) for Ku Q/(A D^0.5) <= 3.5, submerged eq. A.3 for >= 4.0, between them the
/// straight line joining the two at 3.5 and 4.0. Ku = 1.811 SI, 1.0 US.
[[nodiscard]] WithLines<InletControl> inlet_control(const Culvert &c, double q_m3_s,
                                                    units::System system);

struct OutletControl {
    double velocity_full_m_s = 0.0; ///< V = Q/A of the full barrel
    double head_loss_m = 0.0;       ///< H
    double critical_depth_m = 0.0;
    double ho_m = 0.0;        ///< max(TW, (dc + D)/2)
    double hw_m = 0.0;        ///< HWo above the inlet invert
    bool partly_full = false; ///< HWo < 0.75 D: the approximate method is rough there
};

/// Outlet control headwater: H = (1 + ke + Ku n^2 L/R^1.33) V^2/(2g), Ku = 19.63 SI, 29 US;
/// ho = max(TW, (dc + D)/2); HWo = H + ho - L So.
[[nodiscard]] WithLines<OutletControl> outlet_control(const Culvert &c, double q_m3_s,
                                                      double tailwater_m, units::System system);

struct CulvertResult {
    InletControl inlet;
    OutletControl outlet;
    Control control = Control::inlet;
    double hw_m = 0.0; ///< the larger of HWi and HWo
    double hw_over_d = 0.0;
    double allowed_hw_m = 0.0; ///< the stricter of the limits, as a depth above the inlet invert
    bool passes = false;
    double outlet_velocity_m_s = 0.0;
};

/// Inlet and outlet control, the controlling headwater, the check against the limit and the
/// outlet velocity (inlet control: at normal depth in the barrel; outlet control: at dc, TW or
/// D, HDS-5 (2012) ch. 3).
[[nodiscard]] WithLines<CulvertResult> analyse(const Culvert &c, double q_m3_s, const Site &site,
                                               units::System system);

struct Sizing {
    std::optional<std::size_t> chosen; ///< index into the sizes given
    std::optional<CulvertResult> chosen_result;
    std::optional<std::size_t> next_smaller; ///< the next smaller size, which fails
    std::optional<CulvertResult> next_smaller_result;
    std::size_t largest_tried = 0; ///< index of the largest size (when none passes)
};

/// The smallest of `sizes` (by full area) for which `culvert` with that section passes, the next
/// smaller with the reason it fails, or a warning naming the largest size when none passes.
[[nodiscard]] WithLines<Sizing> size_culvert(const Culvert &culvert,
                                             const std::vector<Section> &sizes, double q_m3_s,
                                             const Site &site, units::System system);

} // namespace catchpeak::hydraulics

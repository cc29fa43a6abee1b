// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <string>
#include <vector>

/// SCS Curve Number runoff (TR-55 ch. 2).
namespace catchpeak::hydro {

/// Initial abstraction ratio Ia/S.
enum class IaRatio {
    r020, ///< Ia = 0.2 S (TR-55 eq. 2-2)
    r005, ///< Ia = 0.05 S with the CN converted (Hawkins et al. 2002; formula from memory)
};

struct CnRunoff {
    double runoff_mm = 0.0; ///< direct runoff depth Q
    double s_mm = 0.0;      ///< potential maximum retention S (for the Ia ratio used)
    double ia_mm = 0.0;     ///< initial abstraction Ia
    double cn_used = 0.0;   ///< CN the S belongs to (converted for Ia = 0.05 S)
};

/// TR-55 runoff: Q = (P - Ia)^2 / (P - Ia + S) for P > Ia, else 0; S = 1000/CN - 10 (in) or
/// 25400/CN - 254 (mm). With Ia = 0.05 S: S0.05 = 1.33 S0.20^1.15 (S in in; Hawkins et al.
/// 2002, from memory). CN accepted in limits::curve_number ([30, 100]); P >= 0.
[[nodiscard]] WithLines<CnRunoff> cn_runoff(double rainfall_mm, double cn, units::System system,
                                            IaRatio ratio = IaRatio::r020);

/// Potential maximum retention in inches, S = 1000/CN - 10 (TR-55 eq. 2-4); CN in
/// limits::curve_number.
[[nodiscard]] double cn_retention_in(double cn);

/// The runoff depth only (no lines): for hyetographs, where each step would need a line.
[[nodiscard]] double cn_runoff_depth_mm(double rainfall_mm, double cn,
                                        IaRatio ratio = IaRatio::r020);

/// One part of a catchment with its own curve number.
struct CnPart {
    double area_m2 = 0.0;
    double cn = 0.0;
    std::string name{}; ///< e.g. "meadow, soil group B", for the sheet; may be empty
};

struct CompositeRunoff {
    double composite_cn = 0.0;        ///< area-weighted CN
    double runoff_composite_mm = 0.0; ///< runoff of the composite CN
    double runoff_weighted_mm = 0.0;  ///< area-weighted runoff of the parts
    double relative_difference = 0.0; ///< |weighted - composite| / weighted (0 if no runoff)
};

/// Area-weighted CN (TR-55 ch. 2, Ex. 2-1), without rounding.
[[nodiscard]] WithLines<double> composite_cn(const std::vector<CnPart> &parts,
                                             units::System system);

/// Runoff of the composite CN and the area-weighted runoff of the parts, both computed; warns
/// when they differ by more than `warn_relative_difference` (a setting, common practice, no
/// source).
[[nodiscard]] WithLines<CompositeRunoff> composite_runoff(const std::vector<CnPart> &parts,
                                                          double rainfall_mm, units::System system,
                                                          IaRatio ratio = IaRatio::r020,
                                                          double warn_relative_difference = 0.05);

/// The retention S and initial abstraction Ia of `cn` with their lines (TR-55 eq. 2-4, 2-2),
/// without the runoff: the Ia of a catchment whose runoff is weighted over its parts. The value
/// holds the runoff of `cn` too, which no line shows.
[[nodiscard]] WithLines<CnRunoff> cn_initial_abstraction(double rainfall_mm, double cn,
                                                         units::System system,
                                                         IaRatio ratio = IaRatio::r020);

/// The runoff depth of each part from its own CN, each with its lines (a note naming the part,
/// then TR-55 eq. 2-4, 2-2 and 2-1), and their area-weighted depth Q = sum(Q A) / sum(A), mm
/// (the line with one row per part). Parts as for composite_cn.
[[nodiscard]] WithLines<double> weighted_runoff(const std::vector<CnPart> &parts,
                                                double rainfall_mm, units::System system,
                                                IaRatio ratio = IaRatio::r020);

/// Antecedent moisture condition I (dry): CN(I) = 4.2 CN / (10 - 0.058 CN) (Chow et al. 1988
/// eq. 5.5.4, from memory).
[[nodiscard]] WithLines<double> cn_amc_i(double cn);
/// Antecedent moisture condition III (wet): CN(III) = 23 CN / (10 + 0.13 CN) (Chow et al. 1988
/// eq. 5.5.5, from memory).
[[nodiscard]] WithLines<double> cn_amc_iii(double cn);

} // namespace catchpeak::hydro

// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydraulics/gutter.hpp"

/// Street inlets: a curb opening on grade (the length for total interception, its efficiency,
/// the intercepted and bypassed flow) and curb openings and grates in a sag (weir and orifice
/// flow), after FHWA HEC-22, 3rd ed. (2009), ch. 4. SI in and out; every equation is evaluated
/// in the sheet's units. (The culvert inlets are in inlets.hpp.)
namespace catchpeak::hydraulics {

/// What an inlet on grade takes of the gutter flow.
struct InletOnGrade {
    double gutter_flow_m3_s = 0.0;
    double spread_m = 0.0;         ///< T of the gutter flow arriving
    double length_total_m = 0.0;   ///< LT, the curb opening that would take all of it
    double efficiency = 0.0;       ///< E, intercepted over arriving
    double intercepted_m3_s = 0.0; ///< Qi = E Q
    double bypass_m3_s = 0.0;      ///< Qb = Q - Qi, passed on down the gutter
};

/// A curb opening of length L on grade in `gutter`, taking the gutter flow Q. LT = Ku Q^0.42
/// SL^0.3 (1/(n Sx))^0.6 (HEC-22 eq. 4-22, Ku = 0.817 SI, 0.6 US); in a composite gutter Sx
/// is replaced by the equivalent cross slope Se = Sx + S'w Eo, S'w = a/W (eq. 4-24), with Eo
/// of the gutter flow (eq. 4-4). E = 1 - (1 - L/LT)^1.8 for L < LT, else 1 (eq. 4-23).
[[nodiscard]] WithLines<InletOnGrade> curb_on_grade(const Gutter &gutter, double length_m,
                                                    double q_m3_s, units::System system);

/// A curb opening in a sag: its length L along the curb and the height h of the opening.
struct CurbInSag {
    double length_m = 0.0;         ///< L
    double opening_height_m = 0.0; ///< h
};

/// How an inlet in a sag flows at a depth.
enum class SagRegime : std::uint8_t { weir, transition, orifice };

/// The capacity of an inlet in a sag at one depth.
struct SagCapacity {
    double capacity_m3_s = 0.0;
    double weir_m3_s = 0.0;
    double orifice_m3_s = 0.0;
    SagRegime regime = SagRegime::weir;
};

/// A curb opening in a sag at depth d at the curb, measured from the pavement's cross slope
/// extended to the curb (d = T Sx: GutterFlow::depth_m less the depression a). The depth at
/// the opening's lip is di = d + a in a composite gutter.
/// Weir: Q = Cw (L + 1.8 W) d^1.5 in a depressed gutter (Cw = 1.25 SI, 2.3 US), Q = Cw L d^1.5
/// without depression or when L > 3.6 m (12 ft) (Cw = 1.60 SI, 3.0 US). Orifice: Q = Co h L
/// (2 g do)^0.5, Co = 0.67, do = di - h/2. Weir while di <= h, orifice from di >= 1.4 h, the
/// lesser of the two between (HEC-22 (2009) ch. 4; TxDOT Hydraulic Design Manual ch. 10).
[[nodiscard]] WithLines<SagCapacity> curb_in_sag(const Gutter &gutter, const CurbInSag &inlet,
                                                 double depth_m, units::System system);

/// A grate in a sag: its weir perimeter (for a grate against the curb, L + 2 W: the curb side
/// takes no flow), its clear opening area, and the share of both taken as clogged.
struct GrateInSag {
    double perimeter_m = 0.0;      ///< P
    double clear_area_m2 = 0.0;    ///< A, the openings between the bars
    double clogging_percent = 0.0; ///< C, 0 <= C < 100
};

/// A grate in a sag at depth d over the grate. Weir: Q = Cw P (1 - C/100) d^1.5 (Cw = 1.66
/// SI, 3.0 US); orifice: Q = Co A (1 - C/100) (2 g d)^0.5, Co = 0.67; the capacity is the lesser
/// of the two (HEC-22 (2009) ch. 4; TxDOT Hydraulic Design Manual ch. 10). A grate without a
/// clogging allowance gets a warning line.
[[nodiscard]] WithLines<SagCapacity> grate_in_sag(const GrateInSag &grate, double depth_m,
                                                  units::System system);

} // namespace catchpeak::hydraulics

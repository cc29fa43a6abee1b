// SPDX-License-Identifier: MIT
#include "catchpeak/core/references.hpp"

namespace catchpeak {

namespace {

struct Entry {
    std::string_view short_form;
    std::string_view citation;
};

// clang-format off
constexpr std::string_view tr55 =
    "USDA Soil Conservation Service (1986). Urban Hydrology for Small Watersheds, Technical "
    "Release 55 (TR-55), 2nd ed., June 1986.";
constexpr std::string_view txdot =
    "Texas Department of Transportation, Hydraulic Design Manual, chapter 4 Hydrology.";
// clang-format on

Entry entry(Ref r) noexcept {
    switch (r) {
    case Ref::none:
        return {"", ""};
    case Ref::project_input:
        return {"project input", ""};
    case Ref::project_setting:
        return {"project setting", ""};
    case Ref::common_practice:
        return {"common practice, no source", ""};
    case Ref::tr55_1986:
        return {"TR-55 (1986)", tr55};
    case Ref::tp149_1973:
        return {"TP-149 (1973)",
                "USDA Soil Conservation Service (1973). A Method for Estimating Volume and Rate "
                "of Runoff in Small Watersheds, Technical Paper 149 (TP-149), rev. April 1973."};
    case Ref::neh630_ch15_2010:
        return {"NEH 630 ch. 15 (2010)",
                "USDA Natural Resources Conservation Service. National Engineering Handbook "
                "Part 630 Hydrology, chapter 15 Time of Concentration (2010)."};
    case Ref::neh630_ch16_2007:
        return {"NEH 630 ch. 16 (2007)",
                "USDA Natural Resources Conservation Service. National Engineering Handbook "
                "Part 630 Hydrology, chapter 16 Hydrographs (2007)."};
    case Ref::kirpich_1940:
        return {"Kirpich (1940)", "Kirpich, Z.P. (1940). Time of concentration of small "
                                  "agricultural watersheds. Civil Engineering 10(6), 362."};
    case Ref::kerby_1959:
        return {"Kerby (1959)", "Kerby, W.S. (1959). Time of concentration for overland flow. "
                                "Civil Engineering 29(3), 174."};
    case Ref::roussel_2005:
        return {"Roussel et al. (2005)",
                "Roussel, M.C., Thompson, D.B., Fang, X., Cleveland, T.G. and Garcia, C.A. "
                "(2005). Time-parameter estimation for applicable Texas watersheds. Research "
                "report for the Texas Department of Transportation (citation from memory, not "
                "checked)."};
    case Ref::txdot_hdm:
        return {"TxDOT Hydraulic Design Manual", txdot};
    case Ref::chow_1988:
        return {"Chow, Maidment & Mays (1988)",
                "Chow, V.T., Maidment, D.R. and Mays, L.W. (1988). Applied Hydrology. "
                "McGraw-Hill, New York."};
    case Ref::hawkins_2002:
        return {"Hawkins et al. (2002)", ""};
    case Ref::hosking_1990:
        return {"Hosking (1990)",
                "Hosking, J.R.M. (1990). L-moments: analysis and estimation of distributions "
                "using linear combinations of order statistics. Journal of the Royal Statistical "
                "Society, Series B 52(1), 105-124."};
    case Ref::hosking_wallis_1997:
        return {"Hosking & Wallis (1997)",
                "Hosking, J.R.M. and Wallis, J.R. (1997). Regional Frequency Analysis: an "
                "approach based on L-moments. Cambridge University Press."};
    case Ref::hosking_wallis_wood_1985:
        return {"Hosking, Wallis & Wood (1985)",
                "Hosking, J.R.M., Wallis, J.R. and Wood, E.F. (1985). Estimation of the "
                "generalized extreme-value distribution by the method of probability-weighted "
                "moments. Technometrics 27(3), 251-261."};
    case Ref::ocallaghan_mark_1984:
        return {"O'Callaghan & Mark 1984",
                "O'Callaghan, J.F. and Mark, D.M. (1984). The extraction of drainage networks "
                "from digital elevation data. Computer Vision, Graphics, and Image Processing "
                "28, 323-344."};
    case Ref::barnes_2014:
        return {"Barnes et al. 2014",
                "Barnes, R., Lehman, C. and Mulla, D. (2014). Priority-flood: an optimal "
                "depression-filling and watershed-labeling algorithm for digital elevation "
                "models. Computers & Geosciences 62, 117-127."};
    case Ref::horn_1981:
        return {"Horn (1981)", "Horn, B.K.P. (1981). Hill shading and the reflectance map. "
                               "Proceedings of the IEEE 69(1), 14-47."};
    case Ref::nist_sp811:
        return {"NIST SP 811", "Thompson, A. and Taylor, B.N. (2008). Guide for the Use of the "
                               "International System of Units (SI). NIST Special Publication "
                               "811."};
    case Ref::hds5_2012:
        return {"HDS-5 (2012)",
                "Schall, J.D., Thompson, P.L., Zerges, S.M., Kilgore, R.T. and Morris, J.L. "
                "(2012). Hydraulic Design of Highway Culverts, third edition. FHWA-HIF-12-026, "
                "Hydraulic Design Series No. 5. Federal Highway Administration."};
    case Ref::chow_1959:
        return {"Chow (1959)",
                "Chow, V.T. (1959). Open-Channel Hydraulics. McGraw-Hill, New York."};
    case Ref::hec22_2009:
        return {"FHWA HEC-22, 3rd ed. (2009)",
                "Brown, S.A., Schall, J.D., Morris, J.L., Doherty, C.L., Stein, S.M. and Warner, "
                "J.C. (2009). Urban Drainage Design Manual, Hydraulic Engineering Circular No. 22, "
                "third edition. FHWA-NHI-10-009. Federal Highway Administration (citation from "
                "memory, not checked)."};
    }
    return {"", ""};
}

} // namespace

std::string_view short_form(Ref r) noexcept { return entry(r).short_form; }

std::string_view citation(Ref r) noexcept { return entry(r).citation; }

} // namespace catchpeak

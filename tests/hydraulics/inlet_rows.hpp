// SPDX-License-Identifier: MIT
// The inlet table of config/culvert_inlets.csv built in memory, for the tests and the benchmark:
// K, M, c, Y, Ks from HDS-5 (2012) Table A.1, ke from its table of entrance loss coefficients.
#pragma once

#include "catchpeak/hydraulics/inlets.hpp"

namespace catchpeak::test {

inline hydraulics::InletTable hds5_inlets() {
    using hydraulics::InletForm;
    using hydraulics::Shape;
    const auto row = [](const char *key, Shape shape, double k, double m, double c, double y,
                        double ks, double ke, const char *source) {
        return hydraulics::InletRow{key, shape, InletForm::form1, k, m, c, y, ks, ke, source};
    };
    return hydraulics::InletTable({
        row("concrete_square_headwall", Shape::circular, 0.0098, 2.0, 0.0398, 0.67, -0.5, 0.5,
            "Table A.1, circular concrete, square edge with headwall"),
        row("concrete_groove_headwall", Shape::circular, 0.0018, 2.0, 0.0292, 0.74, -0.5, 0.2,
            "Table A.1, circular concrete, groove end with headwall"),
        row("concrete_groove_projecting", Shape::circular, 0.0045, 2.0, 0.0317, 0.69, -0.5, 0.2,
            "Table A.1, circular concrete, groove end projecting"),
        row("cmp_headwall", Shape::circular, 0.0078, 2.0, 0.0379, 0.69, -0.5, 0.5,
            "Table A.1, circular CMP, headwall"),
        row("cmp_mitered", Shape::circular, 0.0210, 1.33, 0.0463, 0.75, 0.7, 0.7,
            "Table A.1, circular CMP, mitered to slope"),
        row("cmp_projecting", Shape::circular, 0.0340, 1.50, 0.0553, 0.54, -0.5, 0.9,
            "Table A.1, circular CMP, projecting"),
        row("box_wingwall_30_75", Shape::box, 0.026, 1.0, 0.0347, 0.81, -0.5, 0.4,
            "Table A.1, rectangular concrete box, 30 to 75 degree wingwall flares"),
        row("box_wingwall_0", Shape::box, 0.061, 0.75, 0.0423, 0.82, -0.5, 0.7,
            "Table A.1, rectangular concrete box, 0 degree wingwall flares"),
    });
}

} // namespace catchpeak::test

// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/land/tables.hpp"
#include "catchpeak/report/results.hpp"

#include <compare>
#include <optional>
#include <string>
#include <vector>

/// Weighting of the land parts of one catchment: C, CN and impervious share per part from the
/// land tables, the area-weighted C, the composite CN, the impervious share, and their
/// calculation lines. Plain values in, no geometry: the overlay of polygons (LandOverlay) and
/// the land parts of a catchment table both end here.
namespace catchpeak::land {

/// One part of a catchment: a land-cover class on a hydrologic soil group, with its area.
struct PartArea {
    std::string land_class;
    SoilGroup soil_group = SoilGroup::d;
    double area_m2 = 0.0;
    /// Where the part comes from, for messages: "land.gpkg, feature 12",
    /// "catchment-land.csv, line 4".
    std::string origin;
};

/// The source a line cites, given by the caller: a reference and what follows its short form,
/// a template filled with `inputs` (e.g. Ref::project_input, " ({file}, line {n})"). The
/// symbols of `inputs` must differ from those of the lines it is put on (A, S, i, class,
/// group, C, CN, I, P, sum, what): name them after what they are (file, n, layer).
struct LineSource {
    Ref ref = Ref::none;
    std::string where;
    std::vector<Quantity> inputs;

    LineSource() = default;
    LineSource(Ref r, std::string where_template, std::vector<Quantity> where_inputs = {});
    /// A source given as finished text, printed as it stands.
    LineSource(std::string text); // NOLINT: implicit, a finished text is a source
    LineSource(const char *text); // NOLINT: implicit, as above
};

/// A dual hydrologic soil group found in a catchment: as the soil layer writes it ("B/D") and
/// the group used for it by the project's setting ("D").
struct DualGroup {
    std::string written;
    std::string used;
    friend auto operator<=>(const DualGroup &, const DualGroup &) = default;
};

/// What the lines say about the catchment and where its parts come from.
struct PartsContext {
    std::string label;              ///< the catchment, in messages ("DP3", "DP3 local")
    double catchment_area_m2 = 0.0; ///< the area the parts should add up to
    /// Notes that open the lines (the catchment's area, where the parts come from, e.g. the
    /// layers overlaid).
    CalcLines input_notes;
    /// Source of the part lines ("overlay of the catchment with land.gpkg and soils.gpkg").
    LineSource parts_source;
    /// Source of the warning when the parts do not add up to the catchment ("GEOS overlay").
    LineSource area_check_source;
    /// Dual soil groups found, as "B/D -> D", each once; a note states their resolution.
    std::vector<DualGroup> dual_groups;
    bool drained = false; ///< the setting that resolved them
    /// Slope (percent) for the slope bands of the C table, what it is and its source; needed
    /// only when a part's class has slope bands.
    std::optional<double> slope_percent;
    std::string slope_text = "mean slope of the catchment";
    LineSource slope_source{Ref::none, "terrain"};
    /// Warning lines of the caller, placed after the table notes (coverage of layers).
    CalcLines warnings;
    /// Parts below this area (after parts of the same class and group are added) are added
    /// to the largest part, with a line naming each; 0: none.
    double min_part_area_m2 = 0.0;
    units::System units = units::System::si; ///< unit system of the lines
};

/// An area as the lines show it: in ha on an SI sheet, in ac on a US customary one.
[[nodiscard]] Quantity sheet_area(std::string symbol, double area_m2, units::System system);

/// The weighting of one catchment's parts.
struct PartsWeighting {
    /// Parts (land-cover class, soil group) sorted by class then group, with C, CN and
    /// impervious share (NaN where the table was not given); the weighted C, CN and impervious
    /// share (NaN when the table was not given); the table names.
    report::LandWeighting weighting;
    CalcLines lines; ///< the sheet's lines (not numbered yet)
};

/// Weights the parts of one catchment. Parts of the same class and soil group are added into
/// one (in the order given; the first part's origin names it in messages). The weights are the
/// parts' areas: the weighted values divide by their sum, and a sum that differs from
/// `catchment_area_m2` by more than 1e-6 of it is a warning line.
///
/// Throws InputError naming the table, the class, the part's origin and the catchment when a
/// class is missing from a table that is given, or when the C table has no single row for a
/// class, soil group and slope; and when there are no parts or a part's area is not positive.
[[nodiscard]] PartsWeighting weight_parts(const std::vector<PartArea> &parts,
                                          const LandTables &tables, const PartsContext &context);

} // namespace catchpeak::land

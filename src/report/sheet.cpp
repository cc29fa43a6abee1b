// SPDX-License-Identifier: MIT
#include "catchpeak/report/sheet.hpp"

#include "catchpeak/core/error.hpp"
#include "internal/page_layout.hpp"
#include "internal/sheet_content.hpp"
#include "internal/sheet_render.hpp"

#include <algorithm>
#include <cctype>

namespace catchpeak::report {

const std::vector<std::string> &default_caution_notes() {
    static const std::vector<std::string> notes = {
        "Every method on this sheet holds only within its limits of applicability (catchment "
        "size, time of concentration, slopes, curve numbers and rainfall as its source states). "
        "A value outside a limit is shown as a warning line; a peak flow with warnings must not be "
        "used without the engineer's judgement.",
        "These results are computed by a program from the inputs listed in the stamp. They must "
        "be reviewed, checked and accepted by a licensed professional engineer before they are "
        "used to size any drainage structure.",
        "The local drainage code and the criteria of the reviewing agency govern over the methods, "
        "tables and defaults used here.",
        "Catchments drawn from a digital elevation model follow the terrain of that model; roads, "
        "culverts, inlets and storm drains that the model does not show can change them. Check "
        "every catchment in the field or on survey.",
    };
    return notes;
}

PageSize page_size_for(const ProjectInfo &project) {
    return project.page_size.value_or(
        project.units == units::System::us_customary ? PageSize::letter : PageSize::a4);
}

std::size_t write_sheet_pdf(const RunResults &results, const std::filesystem::path &file) {
    PageLayout page(page_size_for(results.project));
    const SheetDocument doc = sheet_content(results);
    render_sections(page, doc);
    return page.write_pdf(file, doc.pdf, doc.frame);
}

} // namespace catchpeak::report

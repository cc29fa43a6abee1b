// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/report/results.hpp"

#include <cstddef>
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

/// The calculation sheet: a PDF drawn with cairo and pango, DejaVu Sans embedded.
///
/// Pages: a cover (project information, stamp with the SHA-256 of every input, an empty box for
/// the engineer's seal and signature, caution notes); a summary of every design point; per
/// design point its map, catchment figures, land and soil weighting, numbered calculation lines,
/// hydrograph plots and warnings; the references. Every page carries the project name,
/// "sheet n of N" and the short stamp. Values are shown in the project's unit system.
namespace catchpeak::report {

inline constexpr std::string_view sheet_file_name = "calculation-sheet.pdf";

/// The page size of a project: ProjectInfo::page_size when set, else Letter for a US customary
/// sheet and A4 for an SI sheet.
[[nodiscard]] PageSize page_size_for(const ProjectInfo &project);

/// The caution notes printed on the cover when RunResults::caution_notes is empty: the methods'
/// limits of applicability, review by a licensed professional engineer, and that the local
/// drainage code and the reviewing agency's criteria govern.
[[nodiscard]] const std::vector<std::string> &default_caution_notes();

/// Renders the sheet to `file` (written to a temporary name, renamed when complete).
/// Returns the number of pages.
std::size_t write_sheet_pdf(const RunResults &results, const std::filesystem::path &file);

} // namespace catchpeak::report

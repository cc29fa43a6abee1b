// SPDX-License-Identifier: MIT
#pragma once

#include <array>
#include <string_view>

/// Every constant of the calculation sheet's look, in one place. Lengths are in PDF points
/// (1/72 in) and carry `_pt` in their names; colours are RGB in 0..1; font sizes are in points
/// inside the font descriptions. Internal to `report`.
namespace catchpeak::report::style {

struct Rgb {
    double r, g, b;
};

// ----- colours: a few greys, one accent blue, amber for warnings --------------------------------
inline constexpr Rgb black{0.0, 0.0, 0.0};
inline constexpr Rgb white{1.0, 1.0, 1.0};
inline constexpr Rgb dark_grey{0.30, 0.30, 0.30};
inline constexpr Rgb mid_grey{0.55, 0.55, 0.55};
inline constexpr Rgb rule_grey{0.75, 0.75, 0.75};
inline constexpr Rgb header_fill{0.90, 0.92, 0.95};
inline constexpr Rgb total_fill{0.95, 0.95, 0.95};
inline constexpr Rgb warn_fill{1.0, 0.93, 0.75};
inline constexpr Rgb warn_text{0.55, 0.25, 0.0};
inline constexpr Rgb accent{0.10, 0.25, 0.50};
inline constexpr Rgb catchment_rgb{0.05, 0.20, 0.65};
inline constexpr Rgb local_rgb{0.90, 0.45, 0.0};
inline constexpr Rgb path_rgb{0.80, 0.05, 0.05};
inline constexpr Rgb stream_rgb{0.10, 0.55, 0.90};
inline constexpr Rgb rain_rgb{0.60, 0.75, 0.92};
inline constexpr Rgb excess_rgb{0.15, 0.35, 0.75};
/// Pango markup colour of a design point's id on its second and later summary rows.
inline constexpr std::string_view repeated_id_markup_colour = "#888888";

// ----- fonts ------------------------------------------------------------------------------------
enum class Style { body, small, tiny, mono, heading, subheading, title, big };
/// Pango font descriptions of the styles, in the order of `Style`; sizes in points. Each names
/// a list of families: DejaVu first (Latin, Greek, Cyrillic: the sheet's look), then Noto Sans
/// CJK for Chinese, Japanese and Korean ids and names, then Noto Sans; a character none of them
/// has is drawn with whatever font fontconfig finds for it (the other Noto families of
/// fonts-noto-core), so that ids and names in any script show their glyphs, not boxes.
inline constexpr std::array<const char *, 8> font_descriptions = {
    "DejaVu Sans,Noto Sans CJK JP,Noto Sans 8",                // body
    "DejaVu Sans,Noto Sans CJK JP,Noto Sans 7",                // small
    "DejaVu Sans,Noto Sans CJK JP,Noto Sans 6",                // tiny
    "DejaVu Sans Mono,Noto Sans Mono CJK JP,Noto Sans Mono 6", // mono (checksums)
    "DejaVu Sans,Noto Sans CJK JP,Noto Sans Bold 12",          // heading
    "DejaVu Sans,Noto Sans CJK JP,Noto Sans Bold 9.5",         // subheading
    "DejaVu Sans,Noto Sans CJK JP,Noto Sans Bold 17",          // title (project name)
    "DejaVu Sans,Noto Sans CJK JP,Noto Sans 13",               // big (name of the document)
};
/// Resolution of the text layout: 72 dpi, so that a point of text is a point of the page.
inline constexpr double text_dpi = 72.0;

// ----- page -------------------------------------------------------------------------------------
inline constexpr double letter_w_pt = 612.0;
inline constexpr double letter_h_pt = 792.0;
inline constexpr double a4_w_pt = 595.2756; // 210 mm
inline constexpr double a4_h_pt = 841.8898; // 297 mm
inline constexpr double margin_pt = 42.0;
inline constexpr double header_h_pt = 26.0; ///< band above the content for the page header
inline constexpr double footer_h_pt = 24.0; ///< band below the content for the page footer

// Page header and footer (drawn on every page when the PDF is written).
inline constexpr double header_gap_pt = 4.0;      ///< between project name and section title
inline constexpr double header_rule_up_pt = 10.0; ///< header rule above the content top
inline constexpr double header_rule_w_pt = 0.8;
inline constexpr double footer_rule_down_pt = 8.0; ///< footer rule below the content bottom
inline constexpr double footer_rule_w_pt = 0.5;
inline constexpr double footer_stamp_dy_pt = 4.0;
inline constexpr double footer_sheet_dy_pt = 3.0;
inline constexpr double footer_sheet_w_pt = 90.0; ///< "sheet n of N" at the right

// ----- flowing text -----------------------------------------------------------------------------
inline constexpr double heading_keep_pt = 40.0; ///< room kept below a heading for what follows
inline constexpr double heading_pad_pt = 4.0;   ///< above and below a heading

// ----- tables -----------------------------------------------------------------------------------
inline constexpr double cell_pad_pt = 3.0;
inline constexpr double right_cell_gap_pt = 4.0; ///< extra gap after a right-aligned cell
inline constexpr double table_gap_after_pt = 8.0;
inline constexpr double head_rule_w_pt = 0.6;
inline constexpr double row_rule_w_pt = 0.3;
/// A table shorter than this share of the content height is kept whole on one page.
inline constexpr double keep_whole_table_share = 0.3;

// Nominal column widths; every table is scaled to fill the content width.
inline constexpr std::array<double, 3> stamp_columns_pt = {90.0, 180.0, 245.0};
inline constexpr std::array<double, 8> summary_columns_pt = {62.0, 52.0, 42.0, 44.0,
                                                             90.0, 58.0, 54.0, 110.0};
inline constexpr std::array<double, 2> figure_columns_pt = {300.0, 215.0};
inline constexpr std::array<double, 7> land_columns_pt = {150.0, 55.0, 65.0, 55.0,
                                                          50.0,  50.0, 75.0};
inline constexpr std::array<double, 4> line_columns_pt = {58.0, 250.0, 82.0, 125.0};
inline constexpr std::array<double, 11> culvert_columns_pt = {72.0, 42.0, 44.0, 42.0, 50.0, 40.0,
                                                              40.0, 42.0, 52.0, 42.0, 52.0};

// ----- blocks -----------------------------------------------------------------------------------
inline constexpr double note_gap_after_pt = 6.0; ///< after a small note under a heading
inline constexpr double table_note_pull_up_pt = 4.0;

// Cover.
inline constexpr double cover_kicker_h_pt = 22.0; ///< line of the document's name
inline constexpr double cover_title_gap_pt = 10.0;
inline constexpr double seal_w_pt = 180.0; ///< square box for the engineer's seal
inline constexpr double seal_gap_pt = 16.0;
inline constexpr double seal_line_w_pt = 0.8;
inline constexpr double seal_caption_dy_pt = 3.0;
inline constexpr double seal_after_pt = 10.0;
inline constexpr double info_key_w_pt = 118.0;
inline constexpr double info_row_gap_pt = 3.0;
inline constexpr double info_rule_up_pt = 1.5;
inline constexpr double key_value_gap_pt = 2.0;
inline constexpr double key_values_after_pt = 4.0;
inline constexpr double number_w_pt = 14.0; ///< numbers of the caution notes
inline constexpr double numbered_gap_pt = 4.0;
inline constexpr double reference_indent_pt = 16.0;
inline constexpr double reference_gap_pt = 6.0;

// Warnings box.
inline constexpr double warn_inset_pt = 6.0;
inline constexpr double warn_title_pad_pt = 10.0;
inline constexpr double warn_title_dy_pt = 4.0;
inline constexpr double warn_item_gap_pt = 3.0;
inline constexpr double warn_bottom_pt = 4.0;
inline constexpr double warn_after_pt = 12.0;
inline constexpr double warn_bar_w_pt = 1.0;

// ----- map --------------------------------------------------------------------------------------
inline constexpr double map_block_h_pt = 300.0;
inline constexpr double map_gap_after_pt = 10.0;
inline constexpr double map_legend_w_pt = 128.0;
inline constexpr double map_label_pad_pt = 14.0; ///< room for grid labels left of and below
inline constexpr double map_legend_gap_pt = 10.0;
/// Half the frame spans this times half the extent of what it shows (8 % padding a side).
inline constexpr double map_half_extent_factor = 0.54;
inline constexpr double map_min_half_extent_m = 1.0;
inline constexpr double map_frame_line_w_pt = 0.7;
inline constexpr double catchment_fill_alpha = 0.10;
inline constexpr double catchment_line_w_pt = 1.6;
inline constexpr double local_line_w_pt = 1.2;
inline constexpr std::array<double, 2> local_dash_pt = {4.0, 2.5};
inline constexpr double stream_line_w_pt = 0.9;
inline constexpr double path_line_w_pt = 1.5;
inline constexpr double snap_line_w_pt = 0.6;
inline constexpr double given_radius_pt = 3.6;
inline constexpr double given_line_w_pt = 1.2;
inline constexpr double snapped_side_pt = 5.2;
inline constexpr double snapped_line_w_pt = 0.6;
/// Hillshade grey = offset + gain * value (0-255), lightened so that lines over it stand out.
inline constexpr double hillshade_grey_offset = 120.0;
inline constexpr double hillshade_grey_gain = 0.53;
inline constexpr double map_box_alpha = 0.85; ///< white behind the north arrow and scale bar
inline constexpr double north_inset_pt = 16.0;
inline constexpr double north_top_pt = 8.0;
inline constexpr double scale_bar_inset_pt = 8.0;
inline constexpr double scale_bar_up_pt = 14.0;
inline constexpr double scale_bar_h_pt = 4.0;
inline constexpr int scale_bar_parts = 4;
inline constexpr double map_tick_pt = 3.0;
inline constexpr double map_tick_line_w_pt = 0.5;
inline constexpr double grid_parts = 4.0; ///< about this many grid steps across the frame
inline constexpr double legend_symbol_w_pt = 24.0;
inline constexpr double legend_min_row_pt = 10.0;
inline constexpr double legend_row_gap_pt = 3.0;

// ----- hydrograph chart -------------------------------------------------------------------------
inline constexpr double chart_block_h_pt = 230.0;
inline constexpr double chart_keep_extra_pt = 20.0;
inline constexpr double chart_left_pt = 46.0;  ///< room for the flow and rain axis labels
inline constexpr double chart_right_pt = 10.0; ///< inset from the right of the content
inline constexpr double rain_panel_dy_pt = 4.0;
inline constexpr double rain_panel_h_pt = 52.0;
inline constexpr double panel_gap_pt = 14.0;
inline constexpr double flow_panel_h_pt = 120.0;
inline constexpr double min_bar_w_pt = 0.3;
inline constexpr double chart_grid_w_pt = 0.3;
inline constexpr double hydrograph_line_w_pt = 1.3;
inline constexpr double axes_line_w_pt = 0.6;
inline constexpr double chart_tick_pt = 3.0;
inline constexpr double chart_tick_w_pt = 0.5;
inline constexpr double peak_dot_radius_pt = 2.2;
inline constexpr double key_dy_pt = 26.0; ///< key below the flow panel
inline constexpr double key_after_pt = 18.0;
inline constexpr double key_swatch_w_pt = 14.0;
inline constexpr double key_swatch_h_pt = 8.0;
/// Minutes beyond which the time axis is in hours.
inline constexpr double hours_axis_from_min = 600.0;
inline constexpr double rain_ticks = 2.0;     ///< about this many steps on the rain axis
inline constexpr double flow_ticks = 4.0;     ///< ... on the flow axis
inline constexpr double time_ticks = 8.0;     ///< ... on the time axis
inline constexpr double flow_headroom = 1.08; ///< the flow axis reaches 8 % above the peak

// ----- culvert performance curve ----------------------------------------------------------------
inline constexpr double curve_block_h_pt = 250.0;
inline constexpr double curve_panel_dy_pt = 6.0;
inline constexpr double curve_panel_h_pt = 170.0;
inline constexpr double curve_line_w_pt = 1.4;
inline constexpr double barrels_line_w_pt = 1.1;
inline constexpr std::array<double, 2> barrels_dash_pt = {4.0, 2.5};
inline constexpr double crest_line_w_pt = 0.9;
inline constexpr std::array<double, 2> crest_dash_pt = {1.5, 2.0};
inline constexpr double case_dot_radius_pt = 2.4;
inline constexpr double curve_x_ticks = 5.0;     ///< about this many steps on the flow axis
inline constexpr double curve_y_ticks = 4.0;     ///< ... on the elevation axis
inline constexpr double curve_headroom = 0.10;   ///< share of the elevation range above the top
inline constexpr double curve_min_range_m = 0.1; ///< elevation range of a flat curve

} // namespace catchpeak::report::style

// SPDX-License-Identifier: MIT
// `catchpeak run` and `catchpeak check` on bad input: data-driven records (STYLE.md 7). Each
// record changes one thing in a valid table project and states the exit code, the text the
// message must hold, and that nothing was written.
#include "catchpeak/cli/run.hpp"
#include "catchpeak/core/error.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>

#include <fstream>
#include <map>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

using catchpeak::ExitCode;
namespace fs = std::filesystem;

// Under LeakSanitizer (asan preset): the run renders the calculation sheet, and fontconfig keeps
// its font configuration in memory for the life of the process. Only leaks from libfontconfig
// itself are suppressed.
extern "C" const char *__lsan_default_suppressions() { return "leak:libfontconfig.so\n"; }

namespace {

using catchpeak::test::read_file;
using catchpeak::test::TestProject;

const char *const base_catchments = "id,area_ha,length_m,relief_m,c,cn\n"
                                    "IN-1,0.8,120,3.6,0.65,85\n"
                                    "IN-2,1.1,150,3.0,0.55,80\n";

const char *const base_idf = "# unit: mm/h\n"
                             "duration_min,2,10\n"
                             "5,100,150\n"
                             "10,80,120\n"
                             "60,30,45\n";

struct Replace {
    std::string from;
    std::string to;
};

struct BadCase {
    std::string name;
    std::string command;                                     // "run" or "check"
    std::vector<Replace> project_changes;                    // applied in order to the project text
    std::map<std::string, std::optional<std::string>> files; // replaced (nullopt: removed)
    std::vector<std::string> expect_err;                     // each must appear on stderr
};

std::string replaced(std::string s, const std::vector<Replace> &changes) {
    for (const auto &c : changes) {
        s = catchpeak::test::replaced(s, c.from, c.to);
    }
    return s;
}

const std::vector<BadCase> &cases() {
    static const std::vector<BadCase> c = {
        {"syntax_unterminated_text",
         "run",
         {{"name = \"Larkspur Rise subdivision\"", "name = \"Larkspur Rise"}},
         {},
         {"project.toml:2:", "not valid TOML"}},
        {"syntax_missing_equals",
         "run",
         {{"tc = \"kirpich\"", "tc \"kirpich\""}},
         {},
         {"project.toml:13:", "not valid TOML"}},
        {"unknown_key_with_suggestion",
         "run",
         {{"units = \"SI\"", "unitz = \"SI\""}},
         {},
         {"project.toml:3: [project]: unknown key 'unitz' (did you mean 'units'?)"}},
        {"unknown_table_with_suggestion",
         "check",
         {{"[settings]", "[setings]"}},
         {},
         {"project.toml:16", "unknown table 'setings' (did you mean '[settings]'?)"}},
        {"unknown_setting_with_suggestion",
         "run",
         {{"minimum_tc_min = 5", "minimum_tc = 5"}},
         {},
         {"project.toml:17: [settings]: unknown key 'minimum_tc'",
          "did you mean 'minimum_tc_min'?"}},
        {"wrong_type_units",
         "run",
         {{"units = \"SI\"", "units = 5"}},
         {},
         {"project.toml:3: [project] units: expected a text, found a whole number"}},
        {"wrong_type_return_periods",
         "run",
         {{"return_periods_yr = [2, 10]", "return_periods_yr = \"2, 10\""}},
         {},
         {"project.toml:10: [rainfall] return_periods_yr: expected a list, found a text"}},
        {"return_period_not_a_number",
         "run",
         {{"[2, 10]", "[2, \"ten\"]"}},
         {},
         {"project.toml:10: [rainfall] return_periods_yr: expected a number, found a text"}},
        {"return_period_out_of_range",
         "run",
         {{"[2, 10]", "[0.5, 10]"}},
         {},
         {"project.toml:10: [rainfall] return_periods_yr: 0.5 is out of range",
          "accepted: a number > 1"}},
        {"return_period_twice", "run", {{"[2, 10]", "[2, 2]"}}, {}, {"2 is listed twice"}},
        {"unknown_unit_system",
         "run",
         {{"units = \"SI\"", "units = \"imperial\""}},
         {},
         {"project.toml:3: [project] units: 'imperial' is not known", "\"SI\", \"US\""}},
        {"unknown_peak_method_with_suggestion",
         "run",
         {{"[\"rational\"]", "[\"rationnal\"]"}},
         {},
         {"project.toml:14: [methods] peak: 'rationnal' is not known (did you mean 'rational'?)"}},
        {"unknown_tc_method_with_suggestion",
         "run",
         {{"tc = \"kirpich\"", "tc = \"kirpch\""}},
         {},
         {"project.toml:13: [methods] tc: 'kirpch' is not known (did you mean 'kirpich'?)"}},
        {"missing_project_name",
         "run",
         {{"name = \"Larkspur Rise subdivision\"\n", ""}},
         {},
         {"project.toml:1: [project]: required key 'name' is missing"}},
        {"missing_project_table",
         "run",
         {{"[project]\nname = \"Larkspur Rise subdivision\"\nunits = \"SI\"\n", ""}},
         {},
         {"the table [project] is missing"}},
        {"missing_return_periods",
         "run",
         {{"return_periods_yr = [2, 10]\n", ""}},
         {},
         {"[rainfall]: required key 'return_periods_yr' is missing"}},
        {"no_catchment_source",
         "run",
         {{"catchment_table = \"catchments.csv\"\n", ""}},
         {},
         {"project.toml:5: [inputs]: required key 'dem' is missing",
          "either 'dem' and 'design_points', or 'catchment_table'"}},
        {"dem_and_table_both",
         "run",
         {{"[inputs]\n", "[inputs]\ndem = \"dem.tif\"\ndesign_points = \"p.gpkg\"\n"}},
         {},
         {"both a DEM with design points and a catchment table are given"}},
        {"dem_without_design_points",
         "run",
         {{"catchment_table = \"catchments.csv\"", "dem = \"dem.tif\""}},
         {},
         {"required key 'design_points' is missing"}},
        {"catchment_table_missing",
         "run",
         {},
         {{"catchments.csv", std::nullopt}},
         {"project.toml:6: [inputs] catchment_table: file 'catchments.csv' does not exist"}},
        {"idf_missing",
         "check",
         {},
         {{"idf.csv", std::nullopt}},
         {"project.toml:9: [rainfall] idf: file 'idf.csv' does not exist"}},
        {"return_period_missing_from_idf",
         "run",
         {{"[2, 10]", "[2, 10, 25]"}},
         {},
         {"the 25-year return period is not in the IDF 'idf.csv'",
          "return periods of the IDF: 2, 10"}},
        {"idf_bad_column_name",
         "run",
         {},
         {{"idf.csv", "# unit: mm/h\nduration_min,2yr,10yr\n5,100,150\n10,80,120\n"}},
         {"idf.csv: header, column 2", "'2yr' is not a number"}},
        {"idf_value_not_a_number",
         "run",
         {},
         {{"idf.csv", "# unit: mm/h\nduration_min,2,10\n5,100,150\n10,80,abc\n"}},
         {"idf.csv:4: column '10'", "'abc' is not a number"}},
        {"idf_durations_not_increasing",
         "run",
         {},
         {{"idf.csv", "# unit: mm/h\nduration_min,2,10\n10,80,120\n5,100,150\n"}},
         {"idf.csv:4: column 'duration_min'", "duration 5.000 min after 10.00 min"}},
        {"tc_outside_idf_durations",
         "run",
         {},
         {{"idf.csv", "# unit: mm/h\nduration_min,2,10\n10,80,120\n60,30,45\n"}},
         {"duration 5.000 min lies outside the table's durations (10.00 to 60.00 min)",
          "not extrapolated"}},
        {"catchment_table_empty",
         "run",
         {},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c\n"}},
         {"catchments.csv: the table has no catchments"}},
        {"catchment_table_no_area_column",
         "run",
         {},
         {{"catchments.csv", "id,size,length_m,relief_m,c\nIN-1,0.8,120,3.6,0.65\n"}},
         {"catchments.csv: no column for the area", "area_ha"}},
        {"catchment_table_two_area_columns",
         "run",
         {},
         {{"catchments.csv", "id,area_ha,area_ac,length_m,relief_m,c\nIN-1,0.8,2,120,3.6,0.65\n"}},
         {"the area is given twice, in columns 'area_ha' and 'area_ac'"}},
        {"catchment_negative_area",
         "run",
         {},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c\nIN-1,-0.8,120,3.6,0.65\n"}},
         {"catchments.csv:2: column 'area_ha'", "-0.8 is not positive"}},
        {"catchment_c_out_of_range",
         "run",
         {},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c\nIN-1,0.8,120,3.6,1.5\n"}},
         {"catchments.csv:2: column 'c'", "C = 1.5 is out of range", "(0, 1]"}},
        {"catchment_cn_out_of_range",
         "run",
         {},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c,cn\nIN-1,0.8,120,3.6,0.5,20\n"}},
         {"catchments.csv:2: column 'cn'", "CN = 20 is out of range"}},
        {"catchment_duplicate_id",
         "run",
         {},
         {{"catchments.csv",
           "id,area_ha,length_m,relief_m,c\nIN-1,0.8,120,3.6,0.5\nIN-1,0.5,90,2,0.5\n"}},
         {"catchments.csv:3: column 'id'", "id 'IN-1' is used twice"}},
        {"catchment_without_c_for_rational",
         "run",
         {},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c\nIN-1,0.8,120,3.6,\n"}},
         {"catchments.csv:2", "catchment 'IN-1' has no runoff coefficient"}},
        // Land parts per catchment ([inputs] catchment_land_table).
        {"land_parts_beside_c_and_cn",
         "run",
         {{"catchments.csv\"\n", "catchments.csv\"\ncatchment_land_table = \"land.csv\"\n"}},
         {{"land.csv", "id,class,soil_group,area_ha\nIN-1,paved_parking_roofs,C,0.8\n"}},
         {"catchments.csv:2: catchment 'IN-1' gives 'c' and 'cn' and has land parts",
          "land.csv, line 2", "not both"}},
        {"land_parts_do_not_add_up",
         "run",
         {{"catchments.csv\"\n", "catchments.csv\"\ncatchment_land_table = \"land.csv\"\n"}},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c,cn\nIN-1,0.8,120,3.6,,\n"},
          {"land.csv", "id,class,soil_group,area_ha\nIN-1,paved_parking_roofs,C,0.5\n"
                       "IN-1,open_space_good,B,0.2\n"}},
         {"land.csv:2: catchment 'IN-1' (lines 2 and 3)",
          "the land parts add up to 0.7000 ha, the catchment table gives 0.8000 ha",
          "catchments.csv:2", "within 0.5 % (common practice, no source)"}},
        {"land_part_of_an_unknown_catchment",
         "check",
         {{"catchments.csv\"\n", "catchments.csv\"\ncatchment_land_table = \"land.csv\"\n"}},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c,cn\nIN-1,0.8,120,3.6,,\n"},
          {"land.csv", "id,class,soil_group,area_ha\nIN-1,paved_parking_roofs,C,0.8\n"
                       "IN-7,open_space_good,B,0.2\n"}},
         {"land.csv:3: column 'id'", "catchment 'IN-7' is not in the catchment table",
          "(did you mean 'IN-1'?)"}},
        {"land_class_not_in_the_tables",
         "run",
         {{"catchments.csv\"\n", "catchments.csv\"\ncatchment_land_table = \"land.csv\"\n"}},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c,cn\nIN-1,0.8,120,3.6,,\n"},
          {"land.csv", "id,class,soil_group,area_ha\nIN-1,parking_deck,C,0.8\n"}},
         {"land.csv:2: column 'class'", "land-cover class 'parking_deck' (1 part, 0.8000 ha)",
          "runoff coefficient table"}},
        // Issue 17: every table that misses the class is named (the check stopped at the
        // first), with the closest class, the parts and their area.
        {"land_class_misspelt_in_every_table",
         "check",
         {{"catchments.csv\"\n", "catchments.csv\"\ncatchment_land_table = \"land.csv\"\n"}},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c,cn\nIN-1,0.8,120,3.6,,\n"},
          {"land.csv", "id,class,soil_group,area_ha\nIN-1,paved_parking_roof,C,0.5\n"
                       "IN-1,paved_parking_roof,B,0.3\n"}},
         {"land.csv:2: column 'class': land-cover class 'paved_parking_roof' (2 parts, 0.8000 "
          "ha) is not in the runoff coefficient table runoff_coefficients.csv",
          "is not in the curve number table curve_numbers.csv",
          "is not in the impervious share table impervious_shares.csv",
          "(did you mean 'paved_parking_roofs'?)", "[inputs] impervious_table"}},
        // Issue 17: the project's own impervious share table ([inputs] impervious_table).
        {"own_impervious_table_is_read",
         "check",
         {{"catchments.csv\"\n", "catchments.csv\"\ncatchment_land_table = \"land.csv\"\n"
                                 "impervious_table = \"imp.csv\"\n"}},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c,cn\nIN-1,0.8,120,3.6,,\n"},
          {"land.csv", "id,class,soil_group,area_ha\nIN-1,paved_parking_roofs,C,0.8\n"},
          {"imp.csv", "class,impervious_percent\ncommercial,85\n"}},
         {"land.csv:2: column 'class': land-cover class 'paved_parking_roofs' (1 part, 0.8000 "
          "ha) is not in the impervious share table imp.csv"}},
        {"land_soil_group_unknown",
         "run",
         {{"catchments.csv\"\n", "catchments.csv\"\ncatchment_land_table = \"land.csv\"\n"}},
         {{"catchments.csv", "id,area_ha,length_m,relief_m,c,cn\nIN-1,0.8,120,3.6,,\n"},
          {"land.csv", "id,class,soil_group,area_ha\nIN-1,paved_parking_roofs,E,0.8\n"}},
         {"land.csv:2: column 'soil_group'", "'E'"}},
        {"land_table_missing",
         "run",
         {{"catchments.csv\"\n", "catchments.csv\"\ncatchment_land_table = \"land.csv\"\n"}},
         {},
         {"project.toml:7: [inputs] catchment_land_table: file 'land.csv' does not exist"}},
        {"scs_method_without_depths_or_storm",
         "check",
         {{"[\"rational\"]", "[\"rational\", \"tr55_graphical\"]"}},
         {},
         {"the SCS Curve Number methods need 24-hour depths",
          "the SCS Curve Number methods need a storm type"}},
        {"depth_for_a_return_period_missing",
         "check",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\nstorm_type = \"II\"\ndepths_24h_mm = { \"2\" = 70.0 }"},
          {"[\"rational\"]", "[\"rational\", \"tr55_graphical\"]"}},
         {},
         {"project.toml:12: [rainfall] depths_24h_mm",
          "no 24-hour depth for the 10-year return period"}},
        {"depth_for_a_return_period_missing_run",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\nstorm_type = \"II\"\ndepths_24h_in = { \"2\" = 3.0 }"},
          {"[\"rational\"]", "[\"scs_unit_hydrograph\"]"}},
         {},
         {"project.toml:12: [rainfall] depths_24h_in",
          "no 24-hour depth for the 10-year return period"}},
        {"depth_key_not_a_return_period",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\ndepths_24h_mm = { \"ten\" = 70.0 }"}},
         {},
         {"project.toml:11: [rainfall] depths_24h_mm: 'ten' is not a return period"}},
        {"override_for_unknown_point_with_suggestion",
         "run",
         {{"peak = [\"rational\"]\n", "peak = [\"rational\"]\n[[methods.point]]\nid = \"IN-3\"\n"
                                      "tc = \"given\"\ntc_min = 12\n"}},
         {},
         {"project.toml:15: [[methods.point]] id: design point 'IN-3' is not in the catchment "
          "table (did you mean 'IN-1'?)"}},
        {"given_tc_without_value",
         "run",
         {{"peak = [\"rational\"]\n",
           "peak = [\"rational\"]\n[[methods.point]]\nid = \"IN-1\"\ntc = \"given\"\n"}},
         {},
         {"[methods.point]: required key 'tc_min' is missing"}},
        {"unknown_key_in_point_override",
         "run",
         {{"peak = [\"rational\"]\n",
           "peak = [\"rational\"]\n[[methods.point]]\nid = \"IN-1\"\ntc_minutes = 12\n"}},
         {},
         {"project.toml:17: [methods.point]: unknown key 'tc_minutes' (did you mean 'tc_min'?)"}},
        {"setting_out_of_range",
         "run",
         {{"minimum_tc_min = 5", "minimum_tc_min = -1"}},
         {},
         {"project.toml:17: [settings] minimum_tc_min: -1 is out of range"}},
        {"every_problem_at_once",
         "check",
         {{"units = \"SI\"", "unitz = \"SI\""}, {"minimum_tc_min = 5", "minimum_tc_min = 500"}},
         {{"idf.csv", std::nullopt}},
         {"3 problems found", "unknown key 'unitz'", "minimum_tc_min: 500 is out of range",
          "file 'idf.csv' does not exist"}},
        {"idf_without_unit",
         "run",
         {},
         {{"idf.csv", "duration_min,2,10\n5,100,150\n10,80,120\n"}},
         {"idf.csv", "no '# unit:' line"}},
        {"project_file_missing", "run", {}, {{"project.toml", std::nullopt}}, {"project.toml"}},
        {"storm_step_does_not_divide_24h",
         "run",
         {{"minimum_tc_min = 5", "minimum_tc_min = 5\nstorm_time_step_min = 7"}},
         {},
         {"project.toml:18: [settings] storm_time_step_min: 7 min does not divide the 24-hour "
          "storm into whole steps",
          "a step that divides 1440 min"}},
        {"storm_step_zero",
         "run",
         {{"minimum_tc_min = 5", "minimum_tc_min = 5\nstorm_time_step_min = 0"}},
         {},
         {"project.toml:18: [settings] storm_time_step_min: 0 is out of range",
          "a number > 0 and <= 60"}},
        {"storm_step_with_typo",
         "run",
         {{"minimum_tc_min = 5", "minimum_tc_min = 5\nstorm_timestep_min = 6"}},
         {},
         {"project.toml:18: [settings]: unknown key 'storm_timestep_min' (did you mean "
          "'storm_time_step_min'?)"}},
        {"pond_share_out_of_range",
         "run",
         {{"minimum_tc_min = 5", "minimum_tc_min = 5\npond_swamp_percent = 150"}},
         {},
         {"project.toml:18: [settings] pond_swamp_percent: 150 is out of range",
          "a number >= 0 and <= 100"}},
        {"point_pond_share_not_a_number",
         "run",
         {{"peak = [\"rational\"]\n", "peak = [\"rational\"]\n[[methods.point]]\nid = "
                                      "\"IN-1\"\npond_swamp_percent = \"2\"\n"}},
         {},
         {"project.toml:17: [methods.point] pond_swamp_percent: expected a number, found a "
          "text"}},
        {"tr55_segmental_without_p2",
         "run",
         {{"tc = \"kirpich\"", "tc = \"tr55_segmental\""}},
         {},
         {"[methods] tc = \"tr55_segmental\"",
          "TR-55 sheet flow needs the 2-year 24-hour rainfall depth P2"}},
        {"tr55_segmental_unknown_key_with_suggestion",
         "run",
         {{"peak = [\"rational\"]\n",
           "peak = [\"rational\"]\n[methods.tr55_segmental]\nsheet_maning_n = 0.15\n"}},
         {},
         {"project.toml:16: [methods.tr55_segmental]: unknown key 'sheet_maning_n' (did you "
          "mean 'sheet_manning_n'?)"}},
        {"tr55_segmental_unknown_surface",
         "run",
         {{"peak = [\"rational\"]\n",
           "peak = [\"rational\"]\n[methods.tr55_segmental]\nshallow_surface = \"gravel\"\n"}},
         {},
         {"project.toml:16: [methods.tr55_segmental] shallow_surface: 'gravel' is not known",
          "\"unpaved\", \"paved\""}},
        {"kerby_retardance_out_of_range",
         "run",
         {{"peak = [\"rational\"]\n",
           "peak = [\"rational\"]\n[methods.kerby_kirpich]\nretardance_n = 2\n"}},
         {},
         {"project.toml:16: [methods.kerby_kirpich] retardance_n: 2 is out of range",
          "a number > 0 and <= 1"}},
        {"point_channel_n_not_a_number",
         "run",
         {{"peak = [\"rational\"]\n", "peak = [\"rational\"]\n[[methods.point]]\nid = "
                                      "\"IN-1\"\nchannel_manning_n = \"0.05\"\n"}},
         {},
         {"project.toml:17: [methods.point] channel_manning_n: expected a number, found a text"}},
        {"ams_and_depths_both",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\nannual_maximum_series = \"ams.csv\"\n"
           "depths_24h_mm = { \"2\" = 70.0, \"10\" = 110.0 }"}},
         {{"ams.csv", "year,depth_24h_mm\n2001,50\n2002,61\n2003,55\n2004,72\n2005,48\n2006,"
                      "90\n2007,66\n2008,58\n2009,81\n2010,63\n"}},
         {"project.toml:12: [rainfall]",
          "both 24-hour depths and an annual maximum series (line 11) are given"}},
        {"ams_distribution_unknown_with_suggestion",
         "run",
         {{"return_periods_yr = [2, 10]", "return_periods_yr = [2, 10]\nannual_maximum_series = "
                                          "\"ams.csv\"\nams_distribution = \"gumbal\""}},
         {{"ams.csv", "year,depth_24h_mm\n2001,50\n2002,61\n2003,55\n2004,72\n2005,48\n2006,"
                      "90\n2007,66\n2008,58\n2009,81\n2010,63\n"}},
         {"project.toml:12: [rainfall] ams_distribution: 'gumbal' is not known (did you mean "
          "'gumbel'?)"}},
        {"ams_distribution_without_series",
         "check",
         {{"return_periods_yr = [2, 10]", "return_periods_yr = [2, 10]\nams_distribution = "
                                          "\"gev\""}},
         {},
         {"project.toml:11: [rainfall] ams_distribution", "no annual maximum series is given"}},
        {"ams_unknown_key_with_suggestion",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\nannual_maximum_serie = \"ams.csv\""}},
         {},
         {"project.toml:11: [rainfall]: unknown key 'annual_maximum_serie' (did you mean "
          "'annual_maximum_series'?)"}},
        {"ams_too_short",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\nannual_maximum_series = \"ams.csv\""}},
         {{"ams.csv", "year,depth_24h_mm\n2001,50\n2002,61\n2003,55\n"}},
         {"ams.csv: 3 years of annual maxima", "at least 10 years"}},
        {"ams_year_twice",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\nannual_maximum_series = \"ams.csv\""}},
         {{"ams.csv", "year,depth_24h_mm\n2001,50\n2001,61\n"}},
         {"ams.csv:3: column 'year'", "year 2001 is listed twice"}},
        {"ams_no_depth_column",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\nannual_maximum_series = \"ams.csv\""}},
         {{"ams.csv", "year,depth\n2001,50\n"}},
         {"ams.csv: no column for the annual maximum 24-hour depth", "depth_24h_mm"}},
        {"ams_negative_depth",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\nannual_maximum_series = \"ams.csv\""}},
         {{"ams.csv", "year,depth_24h_in\n2001,2.5\n2002,-1\n"}},
         {"ams.csv:3: column 'depth_24h_in'", "depth -1 is negative"}},
        // The alternating-block storm (base IDF: 5 to 60 min).
        {"block_storm_longer_than_the_idf",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\ndesign_storm = \"alternating_block\"\n"
           "storm_duration_min = 120"},
          {"[\"rational\"]", "[\"scs_unit_hydrograph\"]"}},
         {},
         {"project.toml:12: [rainfall] storm_duration_min",
          "the alternating-block storm of 120.0 min in blocks of 6.000 min",
          "IDF 'idf.csv' from 6.000 to 120.0 min, but the IDF covers 5.000 to 60.00 min only",
          "not extrapolated"}},
        {"block_storm_step_shorter_than_the_idf",
         "check",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\ndesign_storm = \"alternating_block\"\n"
           "storm_duration_min = 60"},
          {"[\"rational\"]", "[\"scs_unit_hydrograph\"]"},
          {"minimum_tc_min = 5", "minimum_tc_min = 5\nstorm_time_step_min = 2"}},
         {},
         {"project.toml:12: [rainfall] storm_duration_min", "blocks of 2.000 min",
          "covers 5.000 to 60.00 min only"}},
        {"block_storm_with_tr55_graphical",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\ndesign_storm = \"alternating_block\"\n"
           "storm_duration_min = 60"},
          {"[\"rational\"]", "[\"tr55_graphical\"]"}},
         {},
         {"project.toml:11: [rainfall] design_storm",
          "the TR-55 graphical method cannot use the alternating-block storm",
          "NRCS 24-hour rainfall distributions", "(TR-55 1986, ch. 4)"}},
        {"block_storm_unknown_name_with_suggestion",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\ndesign_storm = \"alternating_blocks\"\n"
           "storm_duration_min = 60"},
          {"[\"rational\"]", "[\"scs_unit_hydrograph\"]"}},
         {},
         {"project.toml:11: [rainfall] design_storm: 'alternating_blocks' is not known (did you "
          "mean 'alternating_block'?)"}},
        {"block_storm_without_duration",
         "check",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\ndesign_storm = \"alternating_block\""},
          {"[\"rational\"]", "[\"scs_unit_hydrograph\"]"}},
         {},
         {"project.toml:11: [rainfall] design_storm",
          "the alternating-block storm needs a duration"}},
        {"block_storm_not_whole_blocks",
         "run",
         {{"return_periods_yr = [2, 10]",
           "return_periods_yr = [2, 10]\ndesign_storm = \"alternating_block\"\n"
           "storm_duration_min = 50"},
          {"[\"rational\"]", "[\"scs_unit_hydrograph\"]"}},
         {},
         {"project.toml:12: [rainfall] storm_duration_min",
          "50 min is not a whole number of blocks of 6 min (the default storm_time_step_min)"}},
        {"storm_duration_with_the_nrcs_storm",
         "run",
         {{"return_periods_yr = [2, 10]", "return_periods_yr = [2, 10]\nstorm_duration_min = 60"}},
         {},
         {"project.toml:11: [rainfall] storm_duration_min",
          "a storm duration is given but the design storm is the NRCS 24-hour storm"}},
    };
    return c;
}

[[maybe_unused]] void PrintTo(const BadCase &c, std::ostream *os) { *os << c.name; }

class BadInput : public ::testing::TestWithParam<BadCase> {};

// The valid project every record changes. Line numbers matter: messages are checked against
// them (project.toml: [project] on line 1, [inputs] 5, [rainfall] 8, [methods] 12, [settings]
// 16, [output] 19).
TestProject larkspur_rise(const std::string &scratch_name) {
    TestProject p(scratch_name);
    p.project.text("name", "Larkspur Rise subdivision");
    p.rainfall.set("return_periods_yr", "[2, 10]");
    p.methods.text("tc", "kirpich").set("peak", "[\"rational\"]");
    p.settings.set("minimum_tc_min", "5");
    p.catchments(base_catchments).idf(base_idf);
    return p;
}

} // namespace

TEST(BadInputCases, AtLeastTwentyFive) { EXPECT_GE(cases().size(), 25u); }

TEST_P(BadInput, ExitTwoWithMessageAndNothingWritten) {
    const auto &c = GetParam();
    auto p = larkspur_rise("bad_" + c.name);
    const auto &dir = p.dir();
    const std::string project_text = replaced(p.toml(), c.project_changes);
    p.project_text(project_text);
    for (const auto &[name, text] : c.files) {
        if (text) {
            p.with_file(name, *text);
        }
    }
    (void)p.write();
    for (const auto &[name, text] : c.files) {
        if (!text) {
            fs::remove(dir / name);
        }
    }
    const auto r = p.command(c.command);
    const int code = r.code;
    EXPECT_EQ(code, static_cast<int>(ExitCode::bad_input)) << r.err;
    for (const auto &e : c.expect_err) {
        EXPECT_NE(r.err.find(e), std::string::npos) << "expected: " << e << "\nstderr:\n" << r.err;
    }
    EXPECT_FALSE(fs::exists(dir / "out" / "results.json"));
    EXPECT_TRUE(catchpeak::test::pending_files(dir).empty());
    // Input files are never modified: the project file is as written.
    if (c.files.count("project.toml") == 0) {
        EXPECT_EQ(read_file(dir / "project.toml"), project_text);
    }
}

INSTANTIATE_TEST_SUITE_P(Records, BadInput, ::testing::ValuesIn(cases()),
                         [](const auto &param_info) { return param_info.param.name; });

TEST(ProjectCommands, CheckAndRunAValidProject) {
    auto p = larkspur_rise("good_project");
    const auto &dir = p.dir();
    const auto check = p.command("check");
    EXPECT_EQ(check.code, 0) << check.err;
    EXPECT_NE(check.out.find("no problems found"), std::string::npos);
    const auto run = p.command("run", {"--out", (dir / "elsewhere").string()});
    EXPECT_EQ(run.code, 0) << run.err;
    EXPECT_TRUE(fs::exists(dir / "elsewhere" / "results.json"));
    EXPECT_TRUE(fs::exists(dir / "elsewhere" / "summary.csv"));
    EXPECT_TRUE(fs::exists(dir / "elsewhere" / "run-record.json"));
    EXPECT_TRUE(catchpeak::test::pending_files(dir).empty());
    EXPECT_NE(run.out.find("IN-2"), std::string::npos) << run.out;
}

TEST(ProjectCommands, CheckAndRunAcceptTheScsMethods) {
    auto p = larkspur_rise("good_scs_project");
    p.rainfall.text("storm_type", "II").set("depths_24h_mm", "{ \"2\" = 70.0, \"10\" = 110.0 }");
    p.methods.set("peak", "[\"rational\", \"tr55_graphical\", \"scs_unit_hydrograph\"]");
    p.methods.text("tc", "nrcs_lag");
    const auto check = p.command("check");
    EXPECT_EQ(check.code, 0) << check.err;
    const auto run = p.command("run");
    EXPECT_EQ(run.code, 0) << run.err;
    // The summary table on stdout has a column per method (and a row per return period).
    EXPECT_NE(run.out.find("TR-55 m3/s"), std::string::npos) << run.out;
    EXPECT_NE(run.out.find("SCS UH m3/s"), std::string::npos) << run.out;
    EXPECT_NE(run.out.find("rational m3/s"), std::string::npos) << run.out;
    const std::string summary = read_file(p.out_dir() / "summary.csv");
    EXPECT_NE(summary.find("tr55_graphical"), std::string::npos) << summary;
    EXPECT_NE(summary.find("scs_unit_hydrograph"), std::string::npos) << summary;
}

TEST(ProjectCommands, InitRefusesToOverwrite) {
    const auto dir = catchpeak::test::scratch_dir("init_cli");
    std::ostringstream out;
    std::ostringstream err;
    EXPECT_EQ(catchpeak::cli::run({"init", (dir / "p").string()}, out, err), 0) << err.str();
    EXPECT_TRUE(fs::exists(dir / "p" / "project.toml"));
    EXPECT_EQ(catchpeak::cli::run({"init", (dir / "p").string()}, out, err),
              static_cast<int>(ExitCode::bad_input));
    EXPECT_NE(err.str().find("exists already and is not overwritten"), std::string::npos);
}

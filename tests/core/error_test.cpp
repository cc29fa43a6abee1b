// SPDX-License-Identifier: MIT
#include "catchpeak/core/error.hpp"

#include <gtest/gtest.h>

using catchpeak::ExitCode;

TEST(Error, ExitCodesAreTheDocumentedNumbers) {
    // README "Exit codes": 0 success, 1 internal error, 2 bad input, and for recheck alone
    // 3 not reproduced, 4 inputs changed. A checker's script relies on these numbers.
    EXPECT_EQ(static_cast<int>(ExitCode::success), 0);
    EXPECT_EQ(static_cast<int>(ExitCode::internal_error), 1);
    EXPECT_EQ(static_cast<int>(ExitCode::bad_input), 2);
    EXPECT_EQ(static_cast<int>(ExitCode::not_reproduced), 3);
    EXPECT_EQ(static_cast<int>(ExitCode::inputs_changed), 4);
}

TEST(Error, InputErrorMapsToBadInput) {
    const catchpeak::InputError e("x");
    EXPECT_EQ(e.exit_code(), ExitCode::bad_input);
    const catchpeak::InternalError i("y");
    EXPECT_EQ(i.exit_code(), ExitCode::internal_error);
}

TEST(Error, MessageNamesWhereWhatAndAccepted) {
    EXPECT_EQ(catchpeak::input_message("points.gpkg: field 'id'", "value missing on feature 4",
                                       "a non-empty text"),
              "points.gpkg: field 'id': value missing on feature 4; accepted: a non-empty text");
    EXPECT_EQ(catchpeak::input_message("", "no design points"), "no design points");
    EXPECT_THROW(catchpeak::throw_input_error("a", "b"), catchpeak::InputError);
}

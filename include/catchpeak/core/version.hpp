// SPDX-License-Identifier: MIT
#pragma once

#include <string_view>

namespace catchpeak {

/// The release version, e.g. "0.1.0".
[[nodiscard]] std::string_view version() noexcept;
/// The git commit the program was built from (short hash, with "-dirty" when the work tree had
/// uncommitted changes), or "unknown" when built outside a git checkout.
[[nodiscard]] std::string_view git_commit() noexcept;

} // namespace catchpeak

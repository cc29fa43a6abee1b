// SPDX-License-Identifier: MIT
#pragma once
// "Did you mean ...?" suggestions for a misspelt key, option or id, shared by the project
// file's parser, the table readers and the command line.

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace catchpeak {

/// The Levenshtein distance between two strings (for "did you mean" suggestions).
[[nodiscard]] std::size_t edit_distance(std::string_view a, std::string_view b);

/// The closest of `candidates` to `word` when it is close enough to be a likely typo, else "".
[[nodiscard]] std::string closest_match(std::string_view word,
                                        const std::vector<std::string> &candidates);

} // namespace catchpeak

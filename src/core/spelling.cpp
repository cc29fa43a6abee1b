// SPDX-License-Identifier: MIT
#include "catchpeak/core/spelling.hpp"

#include <algorithm>
#include <vector>

namespace catchpeak {

std::size_t edit_distance(std::string_view a, std::string_view b) {
    std::vector<std::size_t> prev(b.size() + 1);
    std::vector<std::size_t> cur(b.size() + 1);
    for (std::size_t j = 0; j <= b.size(); ++j) {
        prev[j] = j;
    }
    for (std::size_t i = 1; i <= a.size(); ++i) {
        cur[0] = i;
        for (std::size_t j = 1; j <= b.size(); ++j) {
            const std::size_t subst = prev[j - 1] + (a[i - 1] == b[j - 1] ? 0 : 1);
            cur[j] = std::min({prev[j] + 1, cur[j - 1] + 1, subst});
        }
        std::swap(prev, cur);
    }
    return prev[b.size()];
}

std::string closest_match(std::string_view word, const std::vector<std::string> &candidates) {
    std::string best;
    std::size_t best_d = static_cast<std::size_t>(-1);
    for (const auto &c : candidates) {
        const std::size_t d = edit_distance(word, c);
        if (d < best_d) {
            best_d = d;
            best = c;
        }
    }
    // Close enough to be a typo: at most a third of the word's letters, and at least one.
    const std::size_t limit = std::max<std::size_t>(1, std::max(word.size(), best.size()) / 3);
    if (best_d <= limit) {
        return best;
    }
    // Or one starts with the other ("tc_minutes" for "tc_min").
    for (const auto &c : candidates) {
        const std::size_t n = std::min(word.size(), c.size());
        if (n >= 4 && word.substr(0, n) == std::string_view(c).substr(0, n)) {
            return c;
        }
    }
    return {};
}

} // namespace catchpeak

// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/error.hpp"

#include <array>
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

/// A choice of the project file: the text that names it and its value. Each option has one
/// table, defined once beside its enum; the project parser, its messages ("accepted: ...") and
/// every output that names the choice read that table, so the text of a choice is spelled in
/// one place (and in config/project-template.toml, which documents it).
namespace catchpeak {

template <class E> struct OptionKey {
    std::string_view key;
    E value;
};

template <class E, std::size_t N> using OptionTable = std::array<OptionKey<E>, N>;

/// The text of `value`. Every value of the enum has a row (the tests check it); a value
/// without one is a programming error.
template <class E, std::size_t N>
[[nodiscard]] std::string_view option_key(const OptionTable<E, N> &table, E value) {
    for (const auto &o : table) {
        if (o.value == value) {
            return o.key;
        }
    }
    throw InternalError("an option value has no row in its table");
}

/// The value named exactly by `key`, or nothing.
template <class E, std::size_t N>
[[nodiscard]] constexpr std::optional<E> find_option(const OptionTable<E, N> &table,
                                                     std::string_view key) {
    for (const auto &o : table) {
        if (o.key == key) {
            return o.value;
        }
    }
    return std::nullopt;
}

/// The texts of the table in its order, for messages and suggestions.
template <class E, std::size_t N>
[[nodiscard]] std::vector<std::string> option_keys(const OptionTable<E, N> &table) {
    std::vector<std::string> keys;
    keys.reserve(N);
    for (const auto &o : table) {
        keys.emplace_back(o.key);
    }
    return keys;
}

} // namespace catchpeak

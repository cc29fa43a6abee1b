// SPDX-License-Identifier: MIT
// Reading catchpeak's JSON outputs in the tests (results.json, catchments.json).
#pragma once

#include "catchpeak/core/files.hpp"

#include <nlohmann/json.hpp>

#include <filesystem>
#include <stdexcept>
#include <string>

namespace catchpeak::test {

/// A JSON file, parsed.
inline nlohmann::json read_json(const std::filesystem::path &path) {
    return nlohmann::json::parse(read_text_file(path));
}

/// The entry of design point `id` in a document's "design_points"; throws std::runtime_error
/// when there is none.
inline const nlohmann::json &point(const nlohmann::json &doc, const std::string &id) {
    for (const auto &p : doc.at("design_points")) {
        if (p.at("id") == id) {
            return p;
        }
    }
    throw std::runtime_error("no design point " + id);
}

} // namespace catchpeak::test

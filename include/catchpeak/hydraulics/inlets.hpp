// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/hydraulics/section.hpp"

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

/// The inlet control coefficients of FHWA HDS-5 (2012) appendix A and the entrance loss
/// coefficients ke, one row per inlet (config/culvert_inlets.csv; the io module reads the file,
/// this is the plain table it fills).
namespace catchpeak::hydraulics {

/// The unsubmerged equation of an inlet: HDS-5 (2012) eq. A.1 (form 1) or A.2 (form 2).
enum class InletForm : std::uint8_t { form1 = 1, form2 = 2 };

struct InletRow {
    std::string key; ///< e.g. "concrete_square_headwall"
    Shape shape = Shape::circular;
    InletForm form = InletForm::form1;
    double k = 0.0;     ///< unsubmerged K
    double m = 0.0;     ///< unsubmerged M
    double c = 0.0;     ///< submerged c
    double y = 0.0;     ///< submerged Y
    double ks = -0.5;   ///< slope correction Ks: -0.5, +0.7 for an inlet mitered to the slope
    double ke = 0.0;    ///< entrance loss coefficient (outlet control)
    std::string source; ///< the publication's table and row, e.g. "HDS-5 (2012) Table A.1, ..."
};

class InletTable {
  public:
    InletTable() = default;
    /// Checks every row (a key, positive K, M, c; no key twice); throws InputError naming the
    /// row otherwise.
    explicit InletTable(std::vector<InletRow> rows);

    /// The row of `key`; throws InputError naming the keys it has otherwise.
    [[nodiscard]] const InletRow &at(std::string_view key) const;
    [[nodiscard]] const std::vector<InletRow> &rows() const noexcept { return rows_; }

  private:
    std::vector<InletRow> rows_;
};

} // namespace catchpeak::hydraulics

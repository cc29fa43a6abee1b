// SPDX-License-Identifier: MIT
#pragma once

#include <stdexcept>
#include <string>

namespace catchpeak {

/// Process exit codes, listed once. README documents them; tests check them by name.
enum class ExitCode : int {
    success = 0,
    internal_error = 1, ///< a bug or an unexpected failure of a library
    bad_input = 2,      ///< the user's input is wrong; the message says where and what is accepted
    /// `recheck`: every recorded input is unchanged, but a calculation line or peak of the run
    /// is not reproduced by recomputing it (or the project no longer computes).
    not_reproduced = 3,
    /// `recheck`: a recorded input changed or is missing since the run (its SHA-256 differs or
    /// the file is gone), so the run cannot be verified from the inputs at hand.
    inputs_changed = 4,
    /// `recheck`: every recorded input is unchanged and every line and peak is reproduced, but
    /// an output the run wrote (results.json, summary.csv, the sheet, catchments.gpkg) changed
    /// or is missing since the run (its SHA-256 differs or the file is gone).
    outputs_changed = 5,
};

/// Base of every exception catchpeak throws on purpose.
class Error : public std::runtime_error {
  public:
    using std::runtime_error::runtime_error;
    [[nodiscard]] virtual ExitCode exit_code() const noexcept { return ExitCode::internal_error; }
};

/// Bad input: a file, field, value or option the user can fix. Exit code 2.
///
/// The message must name where the problem is (file, layer, field, line, design point),
/// what was found, and what is accepted, e.g.
/// "points.gpkg: design point 'DP-7' at (512300, 4093210) lies outside the DEM extent".
class InputError : public Error {
  public:
    using Error::Error;
    [[nodiscard]] ExitCode exit_code() const noexcept override { return ExitCode::bad_input; }
};

/// A failure that is not the user's fault (a broken invariant, a library failure). Exit code 1.
class InternalError : public Error {
  public:
    using Error::Error;
};

/// Builds the standard bad-input message: "<where>: <what>; accepted: <accepted>".
/// `accepted` may be empty, then the last part is left out.
[[nodiscard]] std::string input_message(const std::string &where, const std::string &what,
                                        const std::string &accepted = {});

/// Throws InputError with input_message(where, what, accepted).
[[noreturn]] void throw_input_error(const std::string &where, const std::string &what,
                                    const std::string &accepted = {});

} // namespace catchpeak

// SPDX-License-Identifier: MIT
#pragma once

#include <ostream>
#include <string>
#include <vector>

namespace catchpeak::cli {

/// Runs the command line. `args` are the arguments after the program name. Normal output goes
/// to `out`, messages and progress to `err`. Returns the process exit code (see ExitCode).
/// `main` only forwards to this, so tests call it directly.
int run(const std::vector<std::string> &args, std::ostream &out, std::ostream &err);

} // namespace catchpeak::cli

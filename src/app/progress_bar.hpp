// SPDX-License-Identifier: MIT
// Progress of one step in the style of GDAL's command-line tools:
// "<step>: 0...10...20...30...40...50...60...70...80...90...100 - done."
// A tick every 2.5 %: a number at each 10 %, a dot between. Private to app.
#pragma once

#include <algorithm>
#include <cmath>
#include <ostream>
#include <string>
#include <string_view>

namespace catchpeak::app::detail {

class ProgressBar {
  public:
    explicit ProgressBar(std::ostream *out) : out_(out) {}
    ~ProgressBar() { finish(); }
    ProgressBar(const ProgressBar &) = delete;
    ProgressBar &operator=(const ProgressBar &) = delete;
    ProgressBar(ProgressBar &&) = delete;
    ProgressBar &operator=(ProgressBar &&) = delete;

    /// Ends the current step (if any) and starts `step`.
    void start(std::string_view step) {
        finish();
        if (out_ == nullptr) {
            return;
        }
        *out_ << step << ": 0" << std::flush;
        ticks_ = 0;
        open_ = true;
    }
    /// Fraction (0..1) of the current step done.
    void update(double fraction) {
        if (!open_) {
            return;
        }
        const int target = static_cast<int>(std::floor(std::clamp(fraction, 0.0, 1.0) * 40.0));
        for (int i = ticks_ + 1; i <= target; ++i) {
            if (i % 4 == 0) {
                *out_ << (i / 4) * 10;
            } else {
                *out_ << '.';
            }
        }
        ticks_ = std::max(ticks_, target);
        *out_ << std::flush;
    }
    /// Completes the current step: "... 100 - done."
    void finish() {
        if (!open_) {
            return;
        }
        update(1.0);
        *out_ << " - done.\n" << std::flush;
        open_ = false;
    }

  private:
    std::ostream *out_;
    int ticks_ = 0;
    bool open_ = false;
};

} // namespace catchpeak::app::detail

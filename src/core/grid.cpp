// SPDX-License-Identifier: MIT
#include "catchpeak/core/grid.hpp"

#if defined(__linux__)
#include <sys/mman.h>
#endif

namespace catchpeak::detail {

void advise_huge_pages(void *p, std::size_t bytes) noexcept {
#if defined(__linux__) && defined(MADV_HUGEPAGE)
    // Advice only: a kernel without transparent huge pages refuses it, and 4 KiB pages serve.
    (void)madvise(p, bytes, MADV_HUGEPAGE);
#else
    (void)p;
    (void)bytes;
#endif
}

} // namespace catchpeak::detail

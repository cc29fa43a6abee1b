// SPDX-License-Identifier: MIT
#pragma once

#include "page_layout.hpp"
#include "sheet_document.hpp"

/// Lays the sheet's document out on pages: each section from a new page, each block with the
/// layout engine, the map renderer or the chart renderer. Internal to `report`.
namespace catchpeak::report {

/// Draws every section of `doc` on pages of `page`.
void render_sections(PageLayout &page, const SheetDocument &doc);

/// Draws one block at the layout's y and moves y below it.
/// Draws one block. `next` is the block after it, if any: a heading is kept on the page of the
/// start of the table that follows it.
void render_block(PageLayout &page, const SheetBlock &block, units::System system,
                  const SheetBlock *next = nullptr);

} // namespace catchpeak::report

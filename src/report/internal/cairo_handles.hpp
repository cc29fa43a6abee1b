// SPDX-License-Identifier: MIT
#pragma once

#include <cairo.h>
#include <pango/pangocairo.h>

#include <memory>

/// Owning wrappers of cairo, pango and glib handles. Internal to `report`.
namespace catchpeak::report {

struct SurfaceDeleter {
    void operator()(cairo_surface_t *s) const noexcept { cairo_surface_destroy(s); }
};
struct CairoDeleter {
    void operator()(cairo_t *c) const noexcept { cairo_destroy(c); }
};
struct GObjectDeleter {
    void operator()(void *o) const noexcept { g_object_unref(o); }
};
struct FontDescDeleter {
    void operator()(PangoFontDescription *d) const noexcept { pango_font_description_free(d); }
};
struct FontOptionsDeleter {
    void operator()(cairo_font_options_t *o) const noexcept { cairo_font_options_destroy(o); }
};
using SurfacePtr = std::unique_ptr<cairo_surface_t, SurfaceDeleter>;
using CairoPtr = std::unique_ptr<cairo_t, CairoDeleter>;
using ContextPtr = std::unique_ptr<PangoContext, GObjectDeleter>;
using LayoutPtr = std::unique_ptr<PangoLayout, GObjectDeleter>;
using FontDescPtr = std::unique_ptr<PangoFontDescription, FontDescDeleter>;
using FontOptionsPtr = std::unique_ptr<cairo_font_options_t, FontOptionsDeleter>;

} // namespace catchpeak::report

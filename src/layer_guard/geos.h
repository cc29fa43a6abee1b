// SPDX-License-Identifier: MIT
// Layer guard: this header stands in for <geos.h> in the pure modules (terrain, rain, hydro),
// whose include path searches src/layer_guard first. They compute on plain values in memory;
// GEOS belongs in io, land, report or app (DESIGN.md, "Data flow").
#error "catchpeak layer rule: no GEOS in terrain, rain or hydro"

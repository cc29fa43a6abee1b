// SPDX-License-Identifier: MIT
// Layer guard: this header stands in for <pango/pango.h> in the pure modules (terrain, rain,
// hydro), whose include path searches src/layer_guard first. They compute on plain values in
// memory; pango belongs in io, land, report or app (DESIGN.md, "Data flow").
#error "catchpeak layer rule: no pango in terrain, rain or hydro"

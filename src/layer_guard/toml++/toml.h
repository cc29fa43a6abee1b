// SPDX-License-Identifier: MIT
// Layer guard: this header stands in for <toml++/toml.h> in the pure modules (terrain, rain,
// hydro), whose include path searches src/layer_guard first. They compute on plain values in
// memory; TOML belongs in io, land, report or app (DESIGN.md, "Data flow").
#error "catchpeak layer rule: no TOML in terrain, rain or hydro"

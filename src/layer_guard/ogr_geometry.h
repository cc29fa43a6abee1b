// SPDX-License-Identifier: MIT
// Layer guard: this header stands in for <ogr_geometry.h> in the pure modules (terrain, rain,
// hydro), whose include path searches src/layer_guard first. They compute on plain values in
// memory; GDAL belongs in io, land, report or app (DESIGN.md, "Data flow").
#error "catchpeak layer rule: no GDAL in terrain, rain or hydro"

#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Terrain benchmark: synthetic DEMs of 1M, 16M (and 100M) cells, the whole terrain chain (read,
# condition, D8, accumulation, catchments, longest paths, slopes) for 1, 100 and 10,000 design
# points, and GDAL's slope on the same file for scale. Each case runs in a fresh process so its
# peak memory is its own. Prints wall and CPU time; on a shared machine CPU time is the steadier
# figure.
#
#   bash tests/bench/run_terrain_bench.sh <build-dir> <work-dir> [cells...]
#   e.g. bash tests/bench/run_terrain_bench.sh build/dev build/bench-data 1000000 16000000
set -euo pipefail
build=${1:?build folder with terrain_bench}
work=${2:?folder for the generated DEMs}
shift 2
sizes=("$@")
[ ${#sizes[@]} -gt 0 ] || sizes=(1000000 16000000 100000000)
bench="$build/tests/bench/terrain_bench"
mkdir -p "$work"
field() { sed -nE "s/.* $1=([0-9.]+).*/\1/p" <<<"$2"; }
for n in "${sizes[@]}"; do
    dem="$work/dem_$n.tif"
    # DEMs generated before they carried a CRS are made again (catchpeak's reader needs one).
    if [ ! -f "$dem" ] || ! gdalinfo "$dem" | grep -q '^Coordinate System is:'; then
        "$bench" generate "$dem" "$n"
    fi
    rm -f "$work/slope_$n.tif"
    gdal_line=$("$bench" gdal-slope "$dem" "$work/slope_$n.tif")
    echo "$gdal_line cells=$n"
    rm -f "$work/slope_$n.tif"
    for p in 1 100 10000; do
        out=$("$bench" run "$dem" "$p")
        echo "$out"
        awk -v t="$(field total_s "$out")" -v g="$(field total_s "$gdal_line")" \
            -v tc="$(field cpu_s "$out")" -v gc="$(field cpu_s "$gdal_line")" -v n="$n" -v p="$p" \
            'BEGIN { printf "RATIO cells=%s points=%s wall chain/gdal_slope=%.2f cpu chain/gdal_slope=%.2f\n", n, p, t / g, tc / gc }'
    done
done

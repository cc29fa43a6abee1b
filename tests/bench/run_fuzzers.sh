#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Runs every libFuzzer target of tests/fuzz for a bounded time each and prints one line of
# figures per target (runs, executions per second, coverage, corpus size). Exits non-zero when
# a target finds a crash, a leak, undefined behaviour or a timeout; the input that did it is
# kept in <build>/fuzz-artifacts/, and is replayed with `<build>/tests/fuzz/<target> <file>`.
#
#   bash tests/bench/run_fuzzers.sh SECONDS [build-dir]   (build-dir: build/fuzz, the preset's)
#   e.g. cmake --preset fuzz && cmake --build --preset fuzz && bash tests/bench/run_fuzzers.sh 60
#
# The corpus of each target grows in <build>/fuzz-corpus/<target> from run to run; it starts
# from the seeds in tests/fuzz/seeds/<target> and the shipped files of the same kind.
set -euo pipefail
seconds=${1:?seconds per target}
top=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
build=${2:-$top/build/fuzz}
build=$(cd "$build" && pwd)

# The seeds of a target: its own folder, and the files of the project of the same kind.
seeds() {
    case "$1" in
    project) ls "$top"/config/project-template.toml "$top"/demo-data/*.toml ;;
    idf_table) ls "$top"/config/idf_example.csv ;;
    storm_table) ls "$top"/config/storms/*.csv ;;
    land_tables) ls "$top"/config/land/*.csv ;;
    *) ;;
    esac
    find "$top/tests/fuzz/seeds/$1" -type f 2>/dev/null || true
}

failed=()
for target in project catchment_table idf_table storm_table land_tables; do
    exe="$build/tests/fuzz/${target}_fuzz"
    [ -x "$exe" ] || { echo "run_fuzzers: $exe not built (cmake --build --preset fuzz)" >&2; exit 2; }
    corpus="$build/fuzz-corpus/$target"
    artifacts="$build/fuzz-artifacts"
    mkdir -p "$corpus" "$artifacts"
    while read -r f; do
        [ -n "$f" ] && cp -n "$f" "$corpus/seed-$(basename "$f")"
    done < <(seeds "$target")
    log="$build/fuzz-$target.log"
    rc=0
    # Leaks are found by LeakSanitizer at the end of each input; UBSan stops at the first report.
    UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
        "$exe" -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 -print_final_stats=1 \
        -artifact_prefix="$artifacts/$target-" "$corpus" >"$log" 2>&1 || rc=$?
    stat() { sed -nE "s/^stat::$1: *([0-9]+).*/\1/p" "$log" | tail -1; }
    cov=$(grep -oE 'cov: [0-9]+ ft: [0-9]+' "$log" | tail -1 || true)
    result=ok
    if [ "$rc" -ne 0 ]; then
        result="FAILED (exit $rc; log $log)"
        failed+=("$target")
    fi
    echo "fuzz $target: seconds=$seconds runs=$(stat number_of_executed_units)" \
        "execs_per_s=$(stat average_exec_per_sec) ${cov:-cov: ?} corpus=$(ls "$corpus" | wc -l)" \
        "peak_rss_mb=$(stat peak_rss_mb) result=$result"
done
if [ ${#failed[@]} -gt 0 ]; then
    echo "run_fuzzers: findings in ${failed[*]}; inputs in $build/fuzz-artifacts" >&2
    exit 1
fi

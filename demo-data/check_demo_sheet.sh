#!/usr/bin/env bash
# The demo from the DEM, end to end: generate the data, run the project, and check that the
# calculation sheet (pdftotext) holds every design point id, every peak flow as summary.csv gives
# it in the sheet's units, and the caution notes.
# Usage: check_demo_sheet.sh WORK_DIR PROJECT_TOML GENERATOR CATCHPEAK
set -euo pipefail
work=$1 project=$2 generator=$3 exe=$4
rm -rf "$work"
mkdir -p "$work"
cp "$project" "$work/demo.toml"
"$generator" "$work/generated" >/dev/null
"$exe" run --quiet "$work/demo.toml" --out "$work/out" >/dev/null
pdftotext -layout "$work/out/calculation-sheet.pdf" "$work/sheet.txt"
missing=0
checked=0
while IFS=$'\t' read -r id q; do
    for text in "$id" "$q"; do
        if ! grep -qF -- "$text" "$work/sheet.txt"; then
            echo "not on the sheet: '$text' (design point $id)" >&2
            missing=$((missing + 1))
        fi
    done
    checked=$((checked + 1))
done < <(awk -F, 'NR == 1 { for (i = 1; i <= NF; i++) { if ($i == "design_point") d = i; if ($i ~ /^q_/) q = i }; next }
                  { print $d "\t" $q }' "$work/out/summary.csv")
for note in "licensed professional engineer" "local drainage code"; do
    if ! grep -qiF -- "$note" "$work/sheet.txt"; then
        echo "caution note missing from the sheet: '$note'" >&2
        missing=$((missing + 1))
    fi
done
if [ "$checked" -eq 0 ]; then
    echo "summary.csv has no peaks" >&2
    exit 1
fi
echo "$checked peaks checked on the sheet, $missing missing"
[ "$missing" -eq 0 ]

#!/usr/bin/env bash
# Writes every command's text, JSON and CSV output and every sheet (SVG) for the example
# layouts and a set of generated windings into DIR, so that two builds can be compared
# byte for byte (`diff -r before after`). Usage: scripts/outputs.sh BINARY DIR
set -uo pipefail
bin=$(realpath "$1"); out=$2
here=$(cd "$(dirname "$0")/.." && pwd)
mkdir -p "$out/gen"
# Generated windings: rotary stators over slots, poles, layers and spans.
for s in 12 18 24 27 36 48; do for p in 2 4 6 8; do for l in 1 2; do
  f="$out/gen/r${s}-${p}-${l}.toml"
  printf 'title = "generated %s/%s/%s"\n[machine]\ntopology = "rotary"\nslots = %s\npoles = %s\n[winding]\nlayers = %s\nturns_per_coil = 12\nconnection = "star"\n[core]\nbore_mm = 150.0\nstack_mm = 120.0\n[supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n' $s $p $l $s $p $l > "$f"
done; done; done
files=$(ls "$here"/layouts/*.toml "$out"/gen/*.toml)
for f in $files; do
  n=$(basename "$f" .toml); d="$out/run/$n"; mkdir -p "$d"
  for c in plan factors field pitch card thrust inductance loading size speeds plates; do
    for fmt in text json csv; do
      "$bin" $c "$f" --format $fmt > "$d/$c.$fmt" 2> "$d/$c.$fmt.err"; echo "exit $?" >> "$d/$c.$fmt.err"
    done
  done
  "$bin" audit "$f" > "$d/audit.text" 2>&1; echo "exit $?" >> "$d/audit.text"
  for fmt in text json csv; do
    "$bin" rewind "$here/layouts/hoist-rewind-sound.toml" "$f" --wire-diameter-mm 1.12 --format $fmt > "$d/rewind.$fmt" 2>&1; echo "exit $?" >> "$d/rewind.$fmt"
  done
  "$bin" audit "$f" --format json > "$d/audit.json" 2>&1
  for sh in slots connections star field card thrust; do
    (cd "$d" && "$bin" draw "$f" --sheet $sh -o "$sh.svg" > "$sh.draw.out" 2>&1; echo "exit $?" >> "$sh.draw.out")
  done
  "$bin" field "$f" --svg "$d/field-chart.svg" > /dev/null 2>&1
  "$bin" pitch "$f" --svg "$d/pitch-chart.svg" > /dev/null 2>&1
  (cd "$d" && "$bin" report "$f" -o report.html > report.out 2>&1)
done
"$bin" survey --slots 6..=48 --poles 2..=12 --layers 1,2 > "$out/survey.text" 2>&1
"$bin" survey --slots 6..=48 --poles 2..=12 --layers 1,2 --format csv > "$out/survey.csv" 2>&1
"$bin" survey --slots 6..=48 --poles 2..=12 --layers 1,2 --format json > "$out/survey.json" 2>&1

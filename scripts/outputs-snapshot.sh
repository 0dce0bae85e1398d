#!/usr/bin/env bash
# Runs every command on the demo designs and keeps each output, its stderr and its exit code in
# one folder, so two builds can be compared byte for byte:
#   scripts/outputs-snapshot.sh /tmp/before        # on one commit (after npm run build)
#   scripts/outputs-snapshot.sh /tmp/after         # on another
#   diff -r /tmp/before /tmp/after
# Run both from the same checkout folder: paths appear in the outputs. Monte Carlo and sweep run one
# thread. Outside tools are not needed unless SNAPSHOT_CONFIRM=1 (confirm runs ngspice).
# A subset for a quick comparison (the whole run takes over an hour):
#   SNAPSHOT_DESIGNS="doubler doubler-pump"   only these demo designs (file names without .yaml)
#   SNAPSHOT_ONLY='\.(draw|report|confirm)'    only the outputs whose name matches the regex
#   SNAPSHOT_CONFIRM=1                        also confirm on the worst corners (ngspice, seconds a design)
set -u
out=${1:?usage: outputs-snapshot.sh OUTPUT_FOLDER}
root=$(cd "$(dirname "$0")/.." && pwd)
bin="$root/dist/src/cli/main.js"
mkdir -p "$out"
out=$(cd "$out" && pwd)
# A fixed date, and reports written to one fixed scratch folder before they move into $out: the
# date and the -o path are recorded in the outputs, and two snapshots must not differ by them.
export SOURCE_DATE_EPOCH=${SOURCE_DATE_EPOCH:-1700000000}
scratch=${TMPDIR:-/tmp}/phasegap-snapshot-scratch
rm -rf "$scratch" && mkdir -p "$scratch"

# run NAME ARGS...: stdout to NAME.out, stderr to NAME.err, exit code to NAME.code
# SNAPSHOT_ONLY=REGEX runs only the outputs whose name matches.
wanted() { [[ -z "${SNAPSHOT_ONLY:-}" || "$1" =~ $SNAPSHOT_ONLY ]]; }
run() {
  local name=$1; shift
  wanted "$name" || return 0
  (cd "$root" && node "$bin" "$@" >"$out/$name.out" 2>"$out/$name.err"; echo $? >"$out/$name.code")
}

run schema schema
run init init -o -
for design in "$root"/fixtures/designs/*.yaml; do
  d=$(basename "$design" .yaml)
  [[ -n "${SNAPSHOT_DESIGNS:-}" && " $SNAPSHOT_DESIGNS " != *" $d "* ]] && continue
  f=fixtures/designs/$d.yaml
  run "$d.check" check "$f"
  run "$d.check-json" check --json "$f"
  run "$d.check-analytic" --model analytic check --json "$f"
  run "$d.draw-worst" draw "$f" -o -
  run "$d.draw-all" draw --corner all --nets all "$f" -o -
  run "$d.draw-margins" draw --chart margins "$f" -o -
  run "$d.waves" waves --nets all "$f" -o -
  run "$d.spice" spice --corner worst "$f" -o -
  run "$d.verilog" verilog --corner worst --testbench "$f" -o -
  run "$d.fmax" fmax "$f"
  run "$d.fmax-json" fmax --json "$f"
  run "$d.tune" tune --margin 0 "$f"
  run "$d.tune-json" tune --margin 0 --json "$f"
  run "$d.mc" mc --samples 200 --workers 1 "$f"
  run "$d.mc-json" mc --samples 200 --workers 1 --json "$f"
  run "$d.mc-replay" mc --samples 200 --workers 1 --replay 7 "$f"
  run "$d.sweep" sweep --workers 1 --vary vdd=1.6,1.8 --vary clock.frequency=10MHz:40MHz:3 "$f" -o -
  run "$d.sweep-json" sweep --workers 1 --json --vary temperature=-40,125 "$f" -o -
  if wanted "$d.check-json" && wanted "$d.check-analytic"; then
    cp "$out/$d.check-json.out" "$scratch/old.json" && cp "$out/$d.check-analytic.out" "$scratch/new.json"
    run "$d.diff" diff "$scratch/old.json" "$scratch/new.json"
  fi
  if [[ "${SNAPSHOT_CONFIRM:-}" == 1 ]]; then
    run "$d.confirm" confirm --corners worst "$f"
    run "$d.confirm-json" confirm --corners worst --json "$f"
  fi
  if wanted "$d.report"; then
    run "$d.report" report --mc 100 "$f" -o "$scratch/report.html"
    mv "$scratch/report.html" "$out/$d.report.html" 2>/dev/null
  fi
  if wanted "$d.report-md"; then
    mkdir -p "$scratch/md"
    run "$d.report-md" report --format md --no-fmax "$f" -o "$scratch/md/report.md"
    rm -rf "$out/$d.md" && mv "$scratch/md" "$out/$d.md"
  fi
done
# bad input: message and exit code
for design in "$root"/fixtures/designs/bad/*.yaml; do
  d=$(basename "$design" .yaml)
  run "bad.$d" check "fixtures/designs/bad/$d.yaml"
done
rm -rf "$scratch"

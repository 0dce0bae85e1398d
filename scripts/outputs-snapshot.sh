#!/usr/bin/env bash
# Runs every command on every demo design and keeps each output, its stderr, its exit code and the
# files it writes in one folder, so two builds can be compared byte for byte:
#   npm run build && scripts/outputs-snapshot.sh /tmp/before     # on one commit
#   npm run build && scripts/outputs-snapshot.sh /tmp/after      # on another, same checkout folder
#   diff -r /tmp/before /tmp/after                               # empty: nothing changed
# Run both from the same checkout folder: the absolute model path appears in SPICE decks.
# By default it is sized to take about five minutes of one core: every command runs on 6 corners
# (ss and ff at every supply, 125 C; test/golden pins every corner's numbers), Monte Carlo on 10 dies
# with a fixed seed, tune on a small search space without ngspice. Every design gets check (text,
# JSON, JUnit), waves, spice, verilog, mc, sweep and the HTML review page (with fmax, the drawings and
# Monte Carlo); five designs also get tune (about 7 s a design), the Markdown page, the analytic
# model and diff, fmax --json and draw; the text forms of JSON outputs run on the doubler. Monte
# Carlo and sweep run one thread; no outside tool is needed unless SNAPSHOT_CONFIRM=1.
#   SNAPSHOT_FULL=1                           every command on every design at every corner, 200 dies (over an hour)
#   SNAPSHOT_DESIGNS="doubler doubler-pump"   only these demo designs (file names without .yaml)
#   SNAPSHOT_ONLY='\.(draw|report|confirm)'    only the outputs whose name matches the regex
#   SNAPSHOT_CONFIRM=1                        also confirm on the worst corners (ngspice, seconds a design)
set -u
out=${1:?usage: outputs-snapshot.sh OUTPUT_FOLDER}
root=$(cd "$(dirname "$0")/.." && pwd)
bin="$root/dist/src/cli/main.js"
[[ -f "$bin" ]] || { echo "outputs-snapshot.sh: $bin is missing; run npm run build first" >&2; exit 2; }
mkdir -p "$out"
out=$(cd "$out" && pwd)
# A fixed date, and files written to one scratch folder before they move into $out: the date and
# the -o path are recorded in the outputs, and two snapshots must not differ by them. The folder is
# named after the checkout, so snapshots of two checkouts can run at the same time.
export SOURCE_DATE_EPOCH=${SOURCE_DATE_EPOCH:-1700000000}
scratch=${TMPDIR:-/tmp}/phasegap-snapshot-$(printf '%s' "$root" | sha256sum | cut -c1-12)
rm -rf "$scratch" && mkdir -p "$scratch"

if [[ "${SNAPSHOT_FULL:-}" == 1 ]]; then
  few=()
  dies=200
  tune_space=()
  some=" $(cd "$root/fixtures/designs" && ls -- *.yaml | sed 's/\.yaml$//' | tr '\n' ' ') "
else
  few=(--set 'corners.process=[ss,ff]' --set 'corners.temperature=[125]')
  dies=10
  tune_space=(--stages 4,6 --sizes 1 --step 5fF)
  # nand with level shifters up, nor, netlist (refused by tune), a pump with shifters down
  some=" doubler too-tight sc-integrator lp-netlist negative-pump "
fi

# run NAME ARGS...: stdout to NAME.out, stderr to NAME.err, exit code to NAME.code
# SNAPSHOT_ONLY=REGEX runs only the outputs whose name matches.
wanted() { [[ -z "${SNAPSHOT_ONLY:-}" || "$1" =~ $SNAPSHOT_ONLY ]]; }
run() {
  local name=$1
  shift
  wanted "$name" || return 0
  (cd "$root" && node "$bin" "$@" >"$out/$name.out" 2>"$out/$name.err"; echo $? >"$out/$name.code")
}
# keep NAME FILE...: move the files a command wrote into the scratch folder to $out as NAME.<file name>
keep() {
  local name=$1
  shift
  for file in "$@"; do
    [[ -e "$scratch/$file" ]] && mv "$scratch/$file" "$out/$name.$file"
  done
  return 0
}

run schema schema
run init-nand init -o -
run init-nor init --template nor -o -
for design in "$root"/fixtures/designs/*.yaml; do
  d=$(basename "$design" .yaml)
  [[ -n "${SNAPSHOT_DESIGNS:-}" && " $SNAPSHOT_DESIGNS " != *" $d "* ]] && continue
  f=fixtures/designs/$d.yaml
  run "$d.check" check --junit "$scratch/check.xml" "${few[@]}" "$f"
  keep "$d.check" check.xml
  run "$d.check-json" check --json "${few[@]}" "$f"
  run "$d.waves" waves --nets all "${few[@]}" "$f" -o -
  run "$d.spice" spice --corner worst "${few[@]}" "$f" -o -
  run "$d.verilog" verilog --corner worst --testbench "${few[@]}" "$f" -o -
  run "$d.mc" mc --samples "$dies" --seed 7 --workers 1 --histogram "$scratch/histogram.svg" "${few[@]}" "$f"
  keep "$d.mc" histogram.svg
  run "$d.sweep-json" sweep --workers 1 --json --vary clock.frequency=10MHz,40MHz "${few[@]}" "$f" -o -
  # the review page: worst-corner drawing, margin chart, fmax text, the Monte Carlo section
  run "$d.report" report --no-tune --mc "$dies" --seed 7 "${few[@]}" "$f" -o "$scratch/report.html"
  keep "$d.report" report.html
  if [[ "$some" == *" $d "* ]]; then
    run "$d.draw-all" draw --corner all --nets all "${few[@]}" "$f" -o -
    run "$d.fmax-json" fmax --json "${few[@]}" "$f"
    if wanted "$d.report-md"; then
      mkdir -p "$scratch/md"
      run "$d.report-md" report --format md --no-fmax --no-tune "${few[@]}" "$f" -o "$scratch/md/report.md"
      rm -rf "$out/$d.md" && mv "$scratch/md" "$out/$d.md"
    fi
    run "$d.tune" tune --no-confirm --margin 0 "${tune_space[@]}" "${few[@]}" "$f"
    run "$d.check-analytic" --model analytic check --json "${few[@]}" "$f"
    if wanted "$d.diff"; then
      cp "$out/$d.check-json.out" "$scratch/old.json" && cp "$out/$d.check-analytic.out" "$scratch/new.json"
      run "$d.diff" diff "$scratch/old.json" "$scratch/new.json"
    fi
  fi
  if [[ "${SNAPSHOT_CONFIRM:-}" == 1 ]]; then
    run "$d.confirm" confirm --corners worst "$f"
    run "$d.confirm-json" confirm --corners worst --json "$f"
  fi
done
# The text forms of the JSON outputs above and the other variants, on one design: they render the
# same numbers, so one design shows a renderer's bytes.
if [[ -z "${SNAPSHOT_DESIGNS:-}" || " $SNAPSHOT_DESIGNS " == *" doubler "* ]]; then
  f=fixtures/designs/doubler.yaml
  run doubler.fmax fmax "${few[@]}" "$f"
  run doubler.tune-json tune --no-confirm --margin 0 --json "${tune_space[@]}" "${few[@]}" "$f"
  run doubler.mc-json mc --samples "$dies" --seed 7 --workers 1 --json "${few[@]}" "$f"
  run doubler.mc-replay mc --samples "$dies" --seed 7 --workers 1 --replay 3 "${few[@]}" "$f"
  run doubler.sweep sweep --workers 1 --vary vdd=1.6,1.8 "${few[@]}" "$f" -o -
  run doubler.draw-worst draw "${few[@]}" "$f" -o -
  run doubler.draw-margins draw --chart margins "${few[@]}" "$f" -o -
fi
# the review page with the delay-chain proposals (tune's whole search space: about 15 s)
if [[ "${SNAPSHOT_FULL:-}" == 1 ]] && wanted too-tight.report-tune; then
  mkdir -p "$scratch/md"
  run too-tight.report-tune report --format md --no-fmax fixtures/designs/too-tight.yaml -o "$scratch/md/report.md"
  rm -rf "$out/too-tight.report-tune.md" && mv "$scratch/md" "$out/too-tight.report-tune.md"
fi
# bad input: message and exit code
for design in "$root"/fixtures/designs/bad/*.yaml; do
  d=$(basename "$design" .yaml)
  run "bad.$d" check "fixtures/designs/bad/$d.yaml"
done
rm -rf "$scratch"

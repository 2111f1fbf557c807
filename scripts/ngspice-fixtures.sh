#!/usr/bin/env bash
# Regenerates the circuit simulator's results that tests/network_spice.rs
# compares the network solver with: for each case in tests/networks/cases.txt
# (mod, state, setting of tests/networks/crosscheck.kdl), writes the netlist
# with `ampreport netlist`, runs ngspice's AC analysis on it in batch mode and
# keeps the printed rows (index, frequency, vdb, vp in radians) as
# tests/networks/ngspice/modM-STATE-sS.txt. Needs ngspice (Debian package
# `ngspice`).
set -euo pipefail
cd "$(dirname "$0")/.."
job=tests/networks/crosscheck.kdl
out=tests/networks/ngspice
command -v ngspice >/dev/null || { echo "ngspice is not installed (apt-get install ngspice)" >&2; exit 3; }
mkdir -p "$out"
cargo build --quiet
bin="$PWD/target/debug/ampreport"
version=$(ngspice --version 2>/dev/null | grep -o 'ngspice-[0-9]*' | head -1)
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
while read -r m state setting; do
    case "$m" in '' | '#'*) continue ;; esac
    flag=""
    if [ "$state" = after ]; then flag="--after"; fi
    name="mod$m-$state-s$setting"
    "$bin" netlist "$job" --mod "$m" $flag --setting "$setting" -o "$tmp/$name.cir"
    (cd "$tmp" && ngspice -b "$name.cir" >"$name.log" 2>&1)
    {
        echo "# $version AC analysis (.ac dec, batch mode) of: ampreport netlist $job --mod $m ${flag:+$flag }--setting $setting"
        echo "# index frequency_hz vdb vp_radians"
        grep -E '^[0-9]+[[:space:]]' "$tmp/$name.log" | awk '{print $1, $2, $3, $4}'
    } >"$out/$name.txt"
    echo "wrote $out/$name.txt"
done <tests/networks/cases.txt

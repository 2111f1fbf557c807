#!/usr/bin/env bash
# Prints an invented job file with N measurement sets (default 10): a 230 V
# head with four EL34 (transformer-resistance method, screen resistors,
# four nodes, droppers and filter capacitors), each set reading every node,
# valve and the heater, with figures that vary from set to set. The one
# generator of this job: scripts/perf.sh, the tests and the benches
# (benches/common/mod.rs: derive.rs cuts it to a number of lines,
# document.rs takes whole sets) all run this script.
set -euo pipefail
n="${1:-10}"
cat <<'HEAD'
job-format 1
job id="BENCH-1" received="2026-01-05" technician="Bench"
unit make="Benchmark" model="Generated" serial="G-1"
mains nominal="230V" frequency="50Hz" tolerance="10%" design="240V"
valves {
    valve V1 type=ECC83 role=preamp
    valve V3 type=EL34 role=output
    valve V4 type=EL34 role=output
    valve V5 type=EL34 role=output
    valve V6 type=EL34 role=output
}
circuit {
    bias fixed
    half-primary resistance="38R" valves="V3 V5"
    half-primary resistance="41R" valves="V4 V6"
    screen-resistor R60 value="1k" rating="5W" valve=V3 supply=B+2
    screen-resistor R61 value="1k" rating="5W" valve=V4 supply=B+2
    screen-resistor R62 value="1k" rating="5W" valve=V5 supply=B+2
    screen-resistor R63 value="1k" rating="5W" valve=V6 supply=B+2
    node B+1 chart="480V" tolerance="10%"
    node B+2 chart="470V" tolerance="10%"
    node B+3 chart="400V" tolerance="10%"
    node B+4 chart="300V" tolerance="20%"
    dropper R70 value="1k" rating="5W" from=B+1 to=B+2
    dropper R71 value="10k" rating="2W" from=B+2 to=B+3
    dropper R72 value="22k" rating="2W" from=B+3 to=B+4
    filter-capacitor C50 value="100u" rating="800V" node=B+1
    filter-capacitor C51 value="50u" rating="700V" node=B+2
    high-voltage-winding rms="365V" primary="240V"
    rectifier silicon
}
HEAD
awk -v n="$n" 'BEGIN {
    for (set = 1; set <= n; set++) {
        d = (set % 17) * 0.5
        printf "measurements \"reading %05d\" mains=\"%dV\" {\n", set, 226 + set % 9
        printf "    node B+1 \"%gV\"\n    node B+2 \"%gV\"\n    node B+3 \"%gV\"\n    node B+4 \"%gV\"\n", 468 + d, 458 + d, 392 + d, 301 + d
        printf "    valve V3 plate=\"%gV\" screen=\"453V\" primary-drop=\"%gV\"\n", 465 + d, 3.0 + d / 10
        printf "    valve V4 plate=\"%gV\" screen=\"453.2V\" primary-drop=\"%gV\"\n", 465 + d, 3.1 + d / 10
        printf "    valve V5 plate=\"%gV\" screen=\"452.8V\" primary-drop=\"%gV\"\n", 465 + d, 3.0 + d / 10
        printf "    valve V6 plate=\"%gV\" screen=\"453.1V\" primary-drop=\"%gV\"\n", 465 + d, 3.1 + d / 10
        printf "    heater \"%gV\"\n}\n", 6.3 + d / 50
    }
}'

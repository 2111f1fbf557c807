#!/usr/bin/env bash
# Runs ampreport's whole test suite, first installing what the tests need
# beyond cargo: the typst command (pinned to the version the templates are
# tested with), poppler-utils (pdftotext, pdftoppm, pdfinfo) and ngspice
# (the circuit simulator the network solver is cross-checked against).
# Anything already present is left alone.
set -euo pipefail
cd "$(dirname "$0")/.."
export PATH="$HOME/.cargo/bin:$PATH"
bash scripts/need-typst.sh
missing=()
if ! command -v pdftotext >/dev/null || ! command -v pdfinfo >/dev/null; then
    missing+=(poppler-utils)
fi
if ! command -v ngspice >/dev/null; then
    missing+=(ngspice)
fi
if [ ${#missing[@]} -gt 0 ]; then
    sudo=""
    if [ "$(id -u)" -ne 0 ]; then sudo="sudo"; fi
    $sudo apt-get update -qq
    $sudo apt-get install -y -qq "${missing[@]}"
fi
cargo test "$@"

#!/usr/bin/env bash
# Runs ampreport's whole test suite, first installing what the tests need
# beyond cargo: the typst command (pinned to the version the templates are
# tested with), poppler-utils (pdftotext, pdftoppm, pdfinfo), ngspice
# (the circuit simulator the network solver is cross-checked against), the
# shells whose completion scripts are checked (zsh, fish; bash is there
# already) and groff and man-db, which the manual pages are rendered with.
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
for tool in zsh fish; do
    if ! command -v "$tool" >/dev/null; then missing+=("$tool"); fi
done
if ! command -v groff >/dev/null; then missing+=(groff-base); fi
if ! command -v man >/dev/null; then missing+=(man-db); fi
if [ ${#missing[@]} -gt 0 ]; then
    sudo=""
    if [ "$(id -u)" -ne 0 ]; then sudo="sudo"; fi
    $sudo apt-get update -qq
    $sudo apt-get install -y -qq "${missing[@]}"
fi
cargo test "$@"

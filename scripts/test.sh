#!/usr/bin/env bash
# Runs ampreport's whole test suite, first installing what the tests need
# beyond cargo: the typst command (pinned to the version the templates are
# tested with) and poppler-utils (pdftotext, pdftoppm, pdfinfo).
set -euo pipefail
cd "$(dirname "$0")/.."
export PATH="$HOME/.cargo/bin:$PATH"
bash scripts/need-typst.sh
if ! command -v pdftotext >/dev/null || ! command -v pdfinfo >/dev/null; then
    sudo=""
    if [ "$(id -u)" -ne 0 ]; then sudo="sudo"; fi
    $sudo apt-get update -qq
    $sudo apt-get install -y -qq poppler-utils
fi
cargo test "$@"

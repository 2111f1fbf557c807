#!/usr/bin/env bash
# Renders a demo job into a PDF hand-over document, installing typst first
# when it is missing. Prints where the PDF went.
set -euo pipefail
cd "$(dirname "$0")/.."
export PATH="$HOME/.cargo/bin:$PATH"
bash scripts/need-typst.sh
cargo run --release --quiet -- render jobs/combo-el84-cathode.kdl -o combo-el84-cathode.pdf

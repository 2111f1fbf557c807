#!/usr/bin/env bash
# Installs the typst command when it is missing or not the version the
# templates are tested with. Building it takes about ten minutes on two cores.
set -euo pipefail
want="0.15.1"
export PATH="$HOME/.cargo/bin:$PATH"
if command -v typst >/dev/null && typst --version | grep -q "typst $want"; then
    exit 0
fi
echo "installing typst $want (cargo install --locked typst-cli)…" >&2
cargo install --locked typst-cli --version "$want"

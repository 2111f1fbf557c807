#!/usr/bin/env bash
# Checks that `cargo install --path . --locked` gives a program that runs
# from any folder: installs into a temporary root, copies a demo job into a
# temporary folder, then, from `/` and with the source tree hidden (a
# private mount namespace lays an empty folder over it, where the machine
# allows one), runs --version, check, calc, tubes, man and render with the
# real typst, and reads the PDF back. Templates, fonts and ratings must
# come from inside the binary.
#
#   bash scripts/check-install.sh           # release build, as users get it
#   bash scripts/check-install.sh --debug   # reuses the test build (CI)
set -euo pipefail
cd "$(dirname "$0")/.."
repo=$PWD
export PATH="$HOME/.cargo/bin:$PATH"
profile=()
if [ "${1:-}" = "--debug" ]; then profile=(--debug); fi
root=$(mktemp -d)
work=$(mktemp -d)
trap 'rm -rf "$root" "$work"' EXIT
cargo install --quiet --path . --locked --root "$root" --target-dir "$repo/target" "${profile[@]}"
cp jobs/combo-el84-cathode.kdl "$work/job.kdl"
mkdir "$work/home"

cat > "$work/run.sh" <<EOF
set -euo pipefail
cd /
bin="$root/bin/ampreport"
export HOME="$work/home"
unset XDG_CONFIG_HOME XDG_CACHE_HOME AMPREPORT_TYPST
test ! -e "$repo/Cargo.toml" && echo "source tree hidden: $repo is empty"
"\$bin" --version | tee "$work/version.txt"
"\$bin" check "$work/job.kdl" > "$work/check.txt"
"\$bin" calc --json "$work/job.kdl" > "$work/calc.json"
"\$bin" tubes EL84 > "$work/tubes.txt"
mkdir "$work/man" && "\$bin" -q man "$work/man"
"\$bin" render "$work/job.kdl" -o "$work/job.pdf"
"\$bin" render - -o - < "$work/job.kdl" > "$work/piped.pdf"
EOF
if unshare -m true 2>/dev/null; then
    unshare -m bash -c "mount -t tmpfs none '$repo' && bash '$work/run.sh'"
else
    echo "note: no private mount namespace here; the source tree stays visible"
    bash "$work/run.sh"
fi

grep -q "as found" "$work/check.txt"
schema=$(sed -n 's/^JSON schema //p' "$work/version.txt")
grep -q "\"schema\": $schema," "$work/calc.json"
grep -q "^typst .* at /" "$work/version.txt"
grep -q "^EL84 (output pentode)" "$work/tubes.txt"
test -s "$work/man/ampreport-render.1"
cmp "$work/job.pdf" "$work/piped.pdf"
text=$(pdftotext "$work/job.pdf" -)
grep -q "D-2611-014" <<<"$text"
grep -q "Local electrical codes come first." <<<"$text"
test -d "$work/home/.cache/ampreport"
echo "install check passed: the installed ampreport ran from / with templates, fonts and ratings embedded"

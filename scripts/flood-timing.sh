#!/usr/bin/env bash
# Times `ampreport check` (release build) on hostile files of about 1 MB:
# garbage, one long line, 100,000 unknown nodes, and deep nesting. Each
# must be reported in well under a second; prints seconds, peak memory and
# the bytes written to stderr. Not part of the test suite (the tests hold a
# generous bound instead); see docs/job-format.md, "Input limits".
set -euo pipefail
cd "$(dirname "$0")/.."
cargo build --release --quiet
bin="$PWD/target/release/ampreport"
dir="$(mktemp -d)"
trap 'rm -rf "$dir"' EXIT
python3 - "$dir" <<'PY'
import random, sys
d = sys.argv[1]
random.seed(1)
files = {
    "garbage": "".join(random.choice('ab{}"=;/*-#()\\ \n0123') for _ in range(1_000_000)),
    "one-long-line": "x=1 " * 250_000,
    "unknown-nodes": "job-format 1\n" + "".join(f"bogus{i} 1\n" for i in range(100_000)),
    "slash-dash": "/- " * 1000,
    "comments": "/*" * 500_000,
}
for name, text in files.items():
    open(f"{d}/{name}.kdl", "w").write(text)
PY
printf '%-16s %9s %10s %12s\n' file seconds "peak KB" "stderr bytes"
for f in garbage one-long-line unknown-nodes slash-dash comments; do
    /usr/bin/time -f "%e %M" -o "$dir/time" "$bin" check "$dir/$f.kdl" >/dev/null 2>"$dir/err" || true
    read -r secs kb <"$dir/time"
    printf '%-16s %9s %10s %12s\n' "$f" "$secs" "$kb" "$(wc -c <"$dir/err")"
done

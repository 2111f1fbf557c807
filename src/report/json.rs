//! The `calc --json` output: every derived figure, `"schema": 1` first.

use crate::calc::Findings;

/// Pretty-printed JSON with a trailing newline.
pub fn render(findings: &Findings) -> String {
    // Serialising plain data with string keys cannot fail.
    let mut s = serde_json::to_string_pretty(findings)
        .unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"));
    s.push('\n');
    s
}

/// The same document on one line, for JSON Lines (several jobs).
pub fn render_line(findings: &Findings) -> String {
    let mut s =
        serde_json::to_string(findings).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"));
    s.push('\n');
    s
}

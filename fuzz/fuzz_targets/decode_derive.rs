//! cargo-fuzz target for decode + derive: any bytes that are UTF-8 text go
//! through the same check as the proptest fallback and the long run
//! (`tests/fuzz_support`), which fails on a panic, a span outside the text
//! or a non-finite number in any output. Every eighth input also builds
//! the document's Typst source and charts.
//!
//! `cargo +nightly fuzz run decode_derive -- -max_total_time=600`; seed it
//! with `tests/fuzz-corpus/` and the demo jobs.

#![no_main]

#[path = "../../tests/fuzz_support/mod.rs"]
mod fuzz_support;

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    if let Ok(text) = std::str::from_utf8(data) {
        let build = data.len() % 8 == 0;
        if let Err(e) = fuzz_support::check_job_text(text, build) {
            panic!("{e}");
        }
    }
});

//! The shop profile through the real binary: which `shop.kdl` a job uses
//! (beside or above the job, else `--shop`, else the user's configuration
//! folder; `--no-shop` none), problems in it reported at their own
//! `file:line:column`, `init --shop`, and what the rendered document takes
//! from it (header, footer, metadata, paper, warranty), read back from the
//! PDF.

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

use serde_json::Value;

const BIN: &str = env!("CARGO_BIN_EXE_ampreport");

fn repo() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// Runs ampreport in `dir` with `config_home` as `XDG_CONFIG_HOME` and a
/// font cache under the build's temporary folder.
fn run(dir: &Path, config_home: &Path, args: &[&str]) -> Output {
    Command::new(BIN)
        .current_dir(dir)
        .args(args)
        .env("XDG_CONFIG_HOME", config_home)
        .env(
            "XDG_CACHE_HOME",
            Path::new(env!("CARGO_TARGET_TMPDIR")).join("shop-cache-home"),
        )
        .env_remove("AMPREPORT_TYPST")
        // What the document says is checked here, not how fast it is made
        // (see `TYPST_TIME_LIMIT` in render.rs).
        .env("AMPREPORT_TIMEOUT", "1800")
        .env("NO_COLOR", "1")
        .output()
        .expect("run ampreport")
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

fn status(o: &Output) -> i32 {
    o.status.code().expect("an exit status")
}

/// A small cathode-biased job with safety readings and no limits of its own.
const JOB: &str = r#"job-format 1
job id="S-1" completed="2026-11-09"
unit make="Tollan" model="Test 1"
mains nominal="230V"
safety class=I {
    earth-continuity "0.08R"
    insulation "200M"
}
"#;

/// A profile whose cathode-bias caution band is `pct` %, with safety limits.
fn profile(name: &str, pct: u32) -> String {
    format!(
        r#"shop-format 1
shop "{name}"
settings {{
    cathode-bias-caution "{pct}%"
}}
safety {{
    earth-continuity limit="0.1R"
    insulation test-voltage="500V" minimum="1M"
}}
"#
    )
}

/// The cathode-bias caution band `calc --json` used for `job`.
fn band_used(dir: &Path, config_home: &Path, job: &str, extra: &[&str]) -> Result<f64, String> {
    let mut args = vec!["calc", "--json", job];
    args.extend(extra);
    let o = run(dir, config_home, &args);
    if status(&o) != 0 {
        return Err(stderr(&o));
    }
    let v: Value = serde_json::from_slice(&o.stdout).expect("JSON");
    Ok(v["settings"]["cathode_bias_caution_pct"]
        .as_f64()
        .expect("the band is in the JSON"))
}

#[test]
fn discovery_order_beside_the_job_then_named_then_user_config() {
    let root = tempfile::tempdir().unwrap();
    let repo_dir = root.path().join("jobs-repo");
    let jobs = repo_dir.join("2026").join("november");
    std::fs::create_dir_all(&jobs).unwrap();
    std::fs::write(jobs.join("job.kdl"), JOB).unwrap();
    let config_home = root.path().join("config");
    std::fs::create_dir_all(config_home.join("ampreport")).unwrap();
    let named = root.path().join("named-shop.kdl");
    std::fs::write(&named, profile("Named", 82)).unwrap();
    let named = named.to_str().unwrap();
    let job = "job.kdl";

    // No profile anywhere: the job's limits are missing.
    let err = band_used(&jobs, &config_home, job, &[]).unwrap_err();
    assert!(err.contains("needs a `limit` property"), "{err}");
    // The user's configuration folder.
    std::fs::write(
        config_home.join("ampreport/shop.kdl"),
        profile("Config", 83),
    )
    .unwrap();
    assert_eq!(band_used(&jobs, &config_home, job, &[]), Ok(83.0));
    // --shop comes before it.
    assert_eq!(
        band_used(&jobs, &config_home, job, &["--shop", named]),
        Ok(82.0)
    );
    // A shop.kdl two folders above the job comes before both, with a note
    // that --shop was not used.
    std::fs::write(repo_dir.join("shop.kdl"), profile("Repo", 84)).unwrap();
    assert_eq!(
        band_used(&jobs, &config_home, job, &["--shop", named]),
        Ok(84.0)
    );
    let o = run(&jobs, &config_home, &["check", job, "--shop", named]);
    assert!(stderr(&o).contains("--shop"), "{}", stderr(&o));
    // The nearest folder wins.
    std::fs::write(jobs.join("shop.kdl"), profile("Here", 85)).unwrap();
    assert_eq!(band_used(&jobs, &config_home, job, &[]), Ok(85.0));
    // --no-shop uses none: the built-in 90 % and no default limits.
    let err = band_used(&jobs, &config_home, job, &["--no-shop"]).unwrap_err();
    assert!(err.contains("shop profile's `safety` block"), "{err}");
    // The two options do not go together.
    let o = run(
        &jobs,
        &config_home,
        &["check", job, "--no-shop", "--shop", named],
    );
    assert_eq!(status(&o), 2);
}

#[test]
fn a_named_profile_that_is_missing_is_an_error() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("job.kdl"), JOB).unwrap();
    let o = run(
        dir.path(),
        dir.path(),
        &["check", "job.kdl", "--shop", "nope.kdl"],
    );
    assert_eq!(status(&o), 1);
    assert!(
        stderr(&o).contains("cannot read the shop profile nope.kdl"),
        "{}",
        stderr(&o)
    );
}

/// "file:line:column" of the `n`th `needle` in `text`, worked out here.
fn at(file: &str, text: &str, needle: &str) -> String {
    let offset = text.find(needle).expect("needle present");
    let before = &text[..offset];
    let line = before.matches('\n').count() + 1;
    let column = before.rsplit('\n').next().unwrap().chars().count() + 1;
    format!("{file}:{line}:{column}")
}

#[test]
fn problems_in_the_profile_are_reported_at_their_line_and_column() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("job.kdl"), JOB).unwrap();
    let text = r#"shop-format 1
shop "Larkmoor Valve Bench" {
    adress "Unit 3"
}
paper "legal"
safety {
    insulation minimum="1 kV"
}
"#;
    std::fs::write(dir.path().join("shop.kdl"), text).unwrap();
    let o = run(dir.path(), dir.path(), &["check", "job.kdl"]);
    assert_eq!(status(&o), 1);
    let err = stderr(&o);
    for (needle, words) in [
        ("adress", "did you mean `address`?"),
        ("\"legal\"", "unknown paper size `legal`"),
        ("V\"", "expected a resistance"),
    ] {
        let place = at("shop.kdl", text, needle);
        assert!(err.contains(&place), "{place} missing from:\n{err}");
        assert!(err.contains(words), "{words} missing from:\n{err}");
    }
    assert!(err.contains("ampreport::shop::unknown-node"), "{err}");
    assert!(
        err.contains("3 problems stop this shop profile from being read"),
        "{err}"
    );
}

#[test]
fn init_writes_an_annotated_profile_that_serves_a_job() {
    let dir = tempfile::tempdir().unwrap();
    let o = run(dir.path(), dir.path(), &["init", "--shop", "shop.kdl"]);
    assert_eq!(status(&o), 0, "{}", stderr(&o));
    let written = std::fs::read_to_string(dir.path().join("shop.kdl")).unwrap();
    assert!(written.contains("shop-format 1") && written.contains("docs/shop.md"));
    // The job leaves its safety limits to the profile, which has them.
    std::fs::write(dir.path().join("job.kdl"), JOB).unwrap();
    let o = run(dir.path(), dir.path(), &["check", "job.kdl"]);
    assert_eq!(status(&o), 0, "{}", stderr(&o));
    // Never replaced.
    std::fs::write(dir.path().join("shop.kdl"), "mine\n").unwrap();
    let o = run(dir.path(), dir.path(), &["init", "--shop", "shop.kdl"]);
    assert_eq!(status(&o), 1);
    assert_eq!(
        std::fs::read_to_string(dir.path().join("shop.kdl")).unwrap(),
        "mine\n"
    );
    // A job file and a profile in one go.
    let o = run(
        dir.path(),
        dir.path(),
        &["init", "new-job.kdl", "--shop", "sub-shop.kdl"],
    );
    assert_eq!(status(&o), 0, "{}", stderr(&o));
    assert!(dir.path().join("new-job.kdl").is_file() && dir.path().join("sub-shop.kdl").is_file());
    // Neither: a usage error.
    assert_eq!(status(&run(dir.path(), dir.path(), &["init"])), 2);
}

// ----- the rendered document -------------------------------------------------

/// Whether typst is here; under CI it must be.
fn have_typst() -> bool {
    match Command::new("typst").arg("--version").output() {
        Ok(o) if o.status.success() => true,
        _ if std::env::var_os("CI").is_none() => {
            eprintln!("note: skipping render tests: no typst on PATH");
            false
        }
        _ => panic!("typst is needed for these tests under CI"),
    }
}

/// `pdfinfo`'s value for `key` ("Page size", "Author" …).
fn pdfinfo(pdf: &Path, key: &str) -> String {
    let out = Command::new("pdfinfo")
        .arg(pdf)
        .output()
        .expect("pdfinfo (poppler-utils)");
    let info = String::from_utf8_lossy(&out.stdout).into_owned();
    info.lines()
        .find_map(|l| l.strip_prefix(&format!("{key}:")))
        .map(|v| v.trim().to_string())
        .unwrap_or_default()
}

/// Page `page`'s text, whitespace runs (and no-break spaces) made one space.
fn page_text(pdf: &Path, page: usize) -> String {
    let p = page.to_string();
    let out = Command::new("pdftotext")
        .args(["-f", &p, "-l", &p, "-enc", "UTF-8"])
        .arg(pdf)
        .arg("-")
        .output()
        .expect("pdftotext (poppler-utils)");
    String::from_utf8_lossy(&out.stdout)
        .split(|c: char| c.is_whitespace())
        .filter(|w| !w.is_empty())
        .collect::<Vec<_>>()
        .join(" ")
}

fn render_demo(name: &str, out: &Path, extra: &[&str]) -> Output {
    let job = repo().join("jobs").join(format!("{name}.kdl"));
    let mut args = vec!["render", job.to_str().unwrap(), "-o", out.to_str().unwrap()];
    args.extend(extra);
    let o = run(&repo(), out.parent().unwrap(), &args);
    assert_eq!(status(&o), 0, "{name}: {}", stderr(&o));
    o
}

#[test]
fn the_demo_shop_heads_and_signs_the_document_on_the_mains_paper() {
    if !have_typst() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    // A 120 V job: US Letter, 8.5 × 11 in = 612 × 792 pt.
    let pdf = dir.path().join("letter.pdf");
    render_demo("combo-el84-cathode", &pdf, &[]);
    assert!(
        pdfinfo(&pdf, "Page size").starts_with("612 x 792 pts"),
        "{}",
        pdfinfo(&pdf, "Page size")
    );
    // The metadata names the technician and the shop.
    let author = pdfinfo(&pdf, "Author");
    assert!(
        author.contains("Rowan Ilesby") && author.contains("Larkmoor Valve Bench"),
        "{author}"
    );
    let first = page_text(&pdf, 1);
    for line in [
        "Larkmoor Valve Bench",
        "Unit 3, 212 Orchard Row",
        "Larkmoor LM4 7QD",
        "bench@larkmoor.example",
    ] {
        assert!(first.contains(line), "{line} missing from page 1: {first}");
    }
    assert!(!first.contains("ampreport bench report"));
    let pages: usize = pdfinfo(&pdf, "Pages").parse().unwrap();
    for page in 1..=pages {
        let text = page_text(&pdf, page);
        assert!(
            text.contains("Larkmoor Valve Bench · Job D-2611-014"),
            "footer of page {page}: {text}"
        );
    }
    let all: String = (1..=pages)
        .map(|p| page_text(&pdf, p))
        .collect::<Vec<_>>()
        .join(" ");
    // Completed 9 November 2026; 90 days on: 21 days to 30 November, 31 in
    // December, 31 in January (83), 7 more: 7 February 2027.
    assert!(
        all.contains("Warranty period: 90 days, from the completion date to 7 February 2027"),
        "{all}"
    );
    assert!(all.contains("Payment is due on collection."));
    // The signature block: the technician with the completion date, and
    // the customer's line with the date left to fill in.
    for words in [
        "TECHNICIAN",
        "Signature · Rowan Ilesby",
        "Date 9 November 2026",
        "CUSTOMER",
        "Signature · Tamsin Okoro-Vale",
        "Date ....",
    ] {
        assert!(all.contains(words), "{words} missing: {all}");
    }

    // A 230 V job: A4, 210 × 297 mm = 595.28 × 841.89 pt.
    let a4 = dir.path().join("a4.pdf");
    render_demo("head-el34-quad", &a4, &[]);
    assert!(
        pdfinfo(&a4, "Page size").starts_with("595.276 x 841.89 pts"),
        "{}",
        pdfinfo(&a4, "Page size")
    );
}

#[test]
fn without_a_profile_the_neutral_heading_stays() {
    if !have_typst() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("neutral.pdf");
    render_demo("combo-6v6-fixed", &pdf, &["--no-shop"]);
    let first = page_text(&pdf, 1);
    assert!(first.contains("ampreport bench report"), "{first}");
    assert!(!first.contains("Larkmoor"));
    assert!(!pdfinfo(&pdf, "Author").contains("Larkmoor"));
    // The mains still decides the paper: 120 V, US Letter.
    assert!(pdfinfo(&pdf, "Page size").starts_with("612 x 792 pts"));
}

#[test]
fn the_profile_sets_the_paper_and_its_logo_travels_as_a_plain_file() {
    if !have_typst() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let shop_dir = dir.path().join("shop");
    std::fs::create_dir(&shop_dir).unwrap();
    let logo = std::fs::read(repo().join("jobs/larkmoor-logo.svg")).unwrap();
    std::fs::write(shop_dir.join("mark.svg"), &logo).unwrap();
    std::fs::write(
        shop_dir.join("shop.kdl"),
        "shop-format 1\nshop \"Tollan Amp Care\" {\n    contact \"0555 0100\"\n}\nlogo \"mark.svg\"\npaper a4\n",
    )
    .unwrap();
    let job = shop_dir.join("job.kdl");
    std::fs::copy(repo().join("jobs/combo-el84-cathode.kdl"), &job).unwrap();
    let pdf = shop_dir.join("job.pdf");
    let emitted = dir.path().join("emitted");
    let o = run(
        &shop_dir,
        dir.path(),
        &[
            "render",
            "job.kdl",
            "--emit-source",
            emitted.to_str().unwrap(),
        ],
    );
    assert_eq!(status(&o), 0, "{}", stderr(&o));
    // `paper a4` wins over the 120 V mains.
    assert!(pdfinfo(&pdf, "Page size").starts_with("595.276 x 841.89 pts"));
    assert!(page_text(&pdf, 1).contains("Tollan Amp Care"));
    let copied = emitted.join("shop/logo.svg");
    let meta = std::fs::symlink_metadata(&copied).unwrap();
    assert!(meta.file_type().is_file(), "the logo is a regular file");
    assert_eq!(std::fs::read(&copied).unwrap(), logo);

    // The output may be neither the profile nor its logo (under any name);
    // both are left untouched (exit status 2, as for any input).
    for (output, file) in [("shop.kdl", "shop.kdl"), ("./mark.svg", "mark.svg")] {
        let before = std::fs::read(shop_dir.join(file)).unwrap();
        let o = run(&shop_dir, dir.path(), &["render", "job.kdl", "-o", output]);
        assert_eq!(status(&o), 2, "{}", stderr(&o));
        assert!(stderr(&o).contains("shop"), "{}", stderr(&o));
        assert_eq!(std::fs::read(shop_dir.join(file)).unwrap(), before);
    }
}

#[test]
fn charges_come_to_the_penny_with_the_shops_tax_and_stay_out_on_request() {
    if !have_typst() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("charges.pdf");
    render_demo("combo-6v6-fixed", &pdf, &[]);
    let pages: usize = pdfinfo(&pdf, "Pages").parse().unwrap();
    let all: String = (1..=pages)
        .map(|p| page_text(&pdf, p))
        .collect::<Vec<_>>()
        .join(" ");
    // By hand, from the demo job's lines and the demo shop's 20 % VAT:
    // labour 1.5 h × 48.00 = 72.00, 0.75 h × 48.00 = 36.00, 15.00 fixed:
    // 123.00; parts 7.85 + 1.20 + 2.35 = 11.40; subtotal 134.40; VAT
    // 134.40 × 0.20 = 26.88; total 161.28.
    for figure in [
        "72.00",
        "36.00",
        "123.00",
        "11.40",
        "134.40",
        "VAT at 20 %",
        "26.88",
        "Total, GBP 161.28",
    ] {
        assert!(all.contains(figure), "{figure} missing: {all}");
    }
    let bare = dir.path().join("no-charges.pdf");
    render_demo("combo-6v6-fixed", &bare, &["--no-charges"]);
    let pages: usize = pdfinfo(&bare, "Pages").parse().unwrap();
    let all: String = (1..=pages)
        .map(|p| page_text(&bare, p))
        .collect::<Vec<_>>()
        .join(" ");
    assert!(!all.contains("161.28") && !all.contains("Charges"), "{all}");
    // The hand-over block stays.
    assert!(all.contains("Warranty period: 90 days"));
}

#[test]
fn a_bad_charges_line_is_reported_at_its_place() {
    let dir = tempfile::tempdir().unwrap();
    let text = format!(
        "{JOB}charges currency=\"GBP\" {{\n    labour \"Bench\" hours=\"1.5\"\n    part \"Valve\" price=\"£7\"\n    part \"Fuse\" quantity=0 price=\"0.40\"\n}}\n"
    );
    std::fs::write(dir.path().join("job.kdl"), &text).unwrap();
    std::fs::write(dir.path().join("shop.kdl"), profile("Here", 90)).unwrap();
    let o = run(dir.path(), dir.path(), &["check", "job.kdl"]);
    assert_eq!(status(&o), 1);
    let err = stderr(&o);
    for (needle, words) in [
        (
            "labour",
            "`labour` needs `hours` and `rate`, or an `amount`",
        ),
        ("\"£7\"", "must be a plain decimal number"),
        ("0 price", "`quantity` cannot be zero"),
    ] {
        let place = at("job.kdl", &text, needle);
        assert!(err.contains(&place), "{place} missing from:\n{err}");
        assert!(err.contains(words), "{words} missing from:\n{err}");
    }
}

// ----- hostile profiles ----------------------------------------------------------

mod hostile {
    use ampreport::job::{self, JobDiagnostics};
    use ampreport::ratings::RatingsTable;
    use ampreport::shop;
    use proptest::prelude::*;

    const PROFILES: [&str; 2] = [
        include_str!("../jobs/shop.kdl"),
        include_str!("../templates/shop-skeleton.kdl"),
    ];
    const JOB: &str = include_str!("../jobs/combo-6v6-fixed.kdl");

    fn spans_inside(text: &str, d: &JobDiagnostics) -> Result<(), String> {
        for p in &d.problems {
            let (start, end) = (p.span.offset(), p.span.offset() + p.span.len());
            if end > text.len() || !text.is_char_boundary(start) || !text.is_char_boundary(end) {
                return Err(format!(
                    "{} span {start}..{end} is off the text: {}",
                    p.code, p.message
                ));
            }
        }
        Ok(())
    }

    /// Decodes a profile; when it decodes, a demo job decodes over its
    /// defaults and derives. Nothing may panic; every span lies inside.
    fn decode_everything(text: &str) -> Result<(), String> {
        match shop::decode("shop.kdl", text) {
            Ok(decoded) => {
                spans_inside(text, &decoded.diagnostics)?;
                static RATINGS: std::sync::OnceLock<RatingsTable> = std::sync::OnceLock::new();
                let ratings = RATINGS.get_or_init(RatingsTable::builtin);
                if let Ok(j) =
                    job::decode_with_defaults("job.kdl", JOB, ratings, &decoded.profile.defaults)
                {
                    ampreport::calc::derive(&j.job, ratings);
                }
                Ok(())
            }
            Err(d) if !d.has_errors() => Err("a refused profile reports no error".into()),
            Err(d) => spans_inside(text, &d),
        }
    }

    proptest! {
        // A quick run by default; `PROPTEST_CASES=20000 cargo test --release
        // --test shop hostile` hunts longer.
        #![proptest_config(ProptestConfig::with_cases(
            std::env::var("PROPTEST_CASES").ok().and_then(|c| c.parse().ok()).unwrap_or(64)
        ))]

        #[test]
        fn mutated_profiles_never_panic(
            which in 0usize..2,
            cut in any::<prop::sample::Index>(),
            len in 0usize..12,
            insert in "[\"{}=#\\-0-9a-zµ%. \n]{0,6}",
        ) {
            let base = PROFILES[which];
            let mut at = cut.index(base.len() + 1);
            while !base.is_char_boundary(at) {
                at -= 1;
            }
            let mut end = (at + len).min(base.len());
            while !base.is_char_boundary(end) {
                end -= 1;
            }
            let text = format!("{}{}{}", &base[..at], insert, &base[end..]);
            prop_assert_eq!(decode_everything(&text), Ok(()));
        }

        #[test]
        fn arbitrary_text_never_panics(text in "\\PC{0,200}") {
            prop_assert_eq!(decode_everything(&text), Ok(()));
        }
    }
}

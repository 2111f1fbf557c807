//! Runs the real `ampreport render` (and the real typst) on the demo jobs and
//! on hostile job files: the PDF must hold the figures `calc --json` gives,
//! the cautions, every user string literally, be byte-for-byte reproducible
//! (also from `--emit-source`), and a failed run must leave the destination
//! folder exactly as it was. Skipped, with a note, only where typst is not
//! installed (and never under CI, where it must be).

use std::collections::BTreeSet;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};

use sha2::{Digest, Sha256};

const BIN: &str = env!("CARGO_BIN_EXE_ampreport");
const DEMO_JOBS: [&str; 3] = ["combo-el84-cathode", "combo-6v6-fixed", "head-el34-quad"];

fn repo() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn demo(name: &str) -> PathBuf {
    repo().join("jobs").join(format!("{name}.kdl"))
}

/// The typst on this machine (its `--version` line), or `None` with a note.
fn typst_version() -> Option<String> {
    match Command::new("typst").arg("--version").output() {
        Ok(out) if out.status.success() => {
            let line = String::from_utf8_lossy(&out.stdout)
                .lines()
                .next()
                .unwrap_or("")
                .to_string();
            line.split_whitespace().nth(1).map(str::to_string)
        }
        _ if std::env::var_os("CI").is_none() => {
            eprintln!("note: skipping render tests: no typst on PATH");
            None
        }
        _ => panic!("typst is needed for these tests under CI"),
    }
}

/// The font cache these tests use: the build's temporary folder, not the
/// user's own cache.
fn test_cache_home() -> PathBuf {
    PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("render-cache-home")
}

fn ampreport(args: &[&std::ffi::OsStr]) -> Output {
    ampreport_with_cache(args, &test_cache_home())
}

/// The time limit on typst in these tests. They check what the document
/// says, not how fast it is made; a long document's compile took 8 to 15 s
/// with the machine's ordinary load and several times that with four
/// renders at once, so the 120 s default (or a limit set in the caller's
/// environment) made their outcome depend on the machine's load. The limit
/// itself is tested with stand-in typst programs in `typst_faults.rs`.
const TYPST_TIME_LIMIT: &str = "1800";

/// Runs ampreport with `XDG_CACHE_HOME` set to `cache_home`.
fn ampreport_with_cache(args: &[&std::ffi::OsStr], cache_home: &Path) -> Output {
    Command::new(BIN)
        .args(args)
        .env_remove("AMPREPORT_TYPST")
        .env("AMPREPORT_TIMEOUT", TYPST_TIME_LIMIT)
        .env("XDG_CACHE_HOME", cache_home)
        // No shop profile from the user's own configuration folder.
        .env("XDG_CONFIG_HOME", cache_home.join("no-config-home"))
        .output()
        .expect("run ampreport")
}

fn render(job: &Path, pdf: &Path, extra: &[&str]) -> Output {
    let mut args: Vec<&std::ffi::OsStr> = vec![
        "render".as_ref(),
        job.as_os_str(),
        "-o".as_ref(),
        pdf.as_os_str(),
    ];
    args.extend(extra.iter().map(|a| std::ffi::OsStr::new(*a)));
    ampreport(&args)
}

fn assert_ok(out: &Output, what: &str) {
    assert!(
        out.status.success(),
        "{what} failed with {}:\n{}",
        out.status,
        String::from_utf8_lossy(&out.stderr)
    );
}

fn pdftotext(pdf: &Path) -> String {
    pdftotext_mode(pdf, None)
}

/// `pdftotext` in its reading-order mode, or with a mode flag such as
/// `-raw` (content-stream order, which keeps a hyphen that ends a line;
/// the reading-order mode joins such lines and drops the hyphen).
fn pdftotext_mode(pdf: &Path, mode: Option<&str>) -> String {
    pdftotext_args(pdf, mode.as_slice())
}

/// The text above the footer of every page (the bottom margin is 21 mm =
/// 59.5 pt, so on A4, 841.9 pt tall, the body ends 782 pt from the top and
/// the footer text starts 802 pt down; 44 pt above the bottom edge leaves
/// room for descenders), so a field that runs over a page break reads on
/// without the footer in between. The same holds on US Letter.
fn body_text(pdf: &Path, mode: Option<&str>) -> String {
    let (width, height) = page_size(pdf);
    let (w, h) = (
        format!("{}", width.ceil()),
        format!("{}", (height - 44.0).floor()),
    );
    let mut args = vec!["-x", "0", "-y", "0", "-W", &w, "-H", &h];
    args.extend(mode);
    pdftotext_args(pdf, &args)
}

/// The first page's width and height in points, from `pdfinfo`, which
/// must find nothing wrong with the file. Its one complaint about typst's
/// output, "Suspects object is wrong type (boolean)", is poppler's own
/// slip (it takes the valid `/Suspects false` of `/MarkInfo`, a boolean
/// by ISO 32000-1 section 14.7.1, from memory, for a wrong type;
/// `/Suspects true` passes), so it is
/// let through only while the file says exactly that (see docs/faults.md).
fn page_size(pdf: &Path) -> (f64, f64) {
    let out = Command::new("pdfinfo")
        .arg(pdf)
        .output()
        .expect("pdfinfo (poppler-utils)");
    assert!(out.status.success(), "pdfinfo failed on {}", pdf.display());
    let bytes = std::fs::read(pdf).unwrap();
    let says_no_suspects = bytes
        .windows(b"/Suspects false".len())
        .any(|w| w == b"/Suspects false");
    let complaints: Vec<String> = String::from_utf8_lossy(&out.stderr)
        .lines()
        .filter(|l| {
            !(says_no_suspects && *l == "Syntax Error: Suspects object is wrong type (boolean)")
        })
        .map(str::to_owned)
        .collect();
    assert!(
        complaints.is_empty(),
        "pdfinfo complains about {}: {complaints:?}",
        pdf.display()
    );
    let info = String::from_utf8_lossy(&out.stdout);
    let line = info
        .lines()
        .find(|l| l.starts_with("Page size:"))
        .expect("pdfinfo prints the page size");
    // "Page size:      612 x 792 pts (letter)"
    let words: Vec<&str> = line.split_whitespace().collect();
    (words[2].parse().unwrap(), words[4].parse().unwrap())
}

fn pdftotext_args(pdf: &Path, args: &[&str]) -> String {
    let out = Command::new("pdftotext")
        .args(args)
        .args(["-enc", "UTF-8"])
        .arg(pdf)
        .arg("-")
        .output()
        .expect("pdftotext (poppler-utils) is needed for these tests");
    assert!(
        out.status.success(),
        "pdftotext failed on {}",
        pdf.display()
    );
    String::from_utf8(out.stdout).unwrap()
}

fn page_count(pdf: &Path) -> usize {
    let out = Command::new("pdfinfo")
        .arg(pdf)
        .output()
        .expect("pdfinfo (poppler-utils)");
    let info = String::from_utf8_lossy(&out.stdout);
    let line = info
        .lines()
        .find(|l| l.starts_with("Pages:"))
        .expect("pdfinfo prints Pages");
    line.trim_start_matches("Pages:").trim().parse().unwrap()
}

/// Drops whitespace (pdftotext rewraps lines; no-break spaces glue numbers
/// to units), the zero-width spaces the template puts into very long words
/// so they wrap, and the direction marks pdftotext adds around
/// right-to-left runs.
fn normalise(text: &str) -> String {
    text.chars()
        .filter(|c| !c.is_whitespace() && *c != '\u{200b}')
        .filter(|c| !matches!(c, '\u{200e}' | '\u{200f}' | '\u{202a}'..='\u{202e}' | '\u{2066}'..='\u{2069}'))
        .collect()
}

/// Files in `dir`, by name.
fn listing(dir: &Path) -> BTreeSet<String> {
    std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect()
}

fn calc_json(job: &Path) -> serde_json::Value {
    let out = ampreport(&["calc".as_ref(), job.as_os_str(), "--json".as_ref()]);
    assert_ok(&out, "calc --json");
    serde_json::from_slice(&out.stdout).unwrap()
}

/// The cautions every document carries, as phrases that must appear.
const CAUTION_PHRASES: &[&str] = &[
    "MAINS SAFETY: READ BEFORE USING OR OPENING THIS UNIT",
    "voltages that can kill",
    "can keep a dangerous charge long after the amplifier is switched off and unplugged",
    "Only a person trained and equipped for this work should open the chassis",
    "discharge the capacitors and measure",
    "Never remove, cut or bypass the protective-earth conductor",
    "never use an adapter or plug that lifts the earth",
    "Replace a fuse only with one of the type and rating marked on the unit",
    "not a certification of electrical safety",
    "describe the unit on the dates given",
];
const DEFERRAL_PHRASES: &[&str] = &[
    "Local electrical codes come first",
    "must follow the electrical code and regulations in force where the unit is used",
    "the practice of a licensed electrician",
];

#[test]
fn each_demo_job_renders_with_its_figures_and_cautions() {
    let Some(typst) = typst_version() else { return };
    let dir = tempfile::tempdir().unwrap();
    let (mut mod_figures, mut rectifier_loads) = (0, 0);
    for name in DEMO_JOBS {
        let job = demo(name);
        let pdf = dir.path().join(format!("{name}.pdf"));
        let out = render(&job, &pdf, &[]);
        assert_ok(&out, name);
        let text = pdftotext(&pdf);
        let flat = normalise(&text);
        let words: BTreeSet<&str> = text.split_whitespace().collect();
        let json = calc_json(&job);

        // The first page names the page the mains-safety notice is on
        // (the template sets a stand-in number in typst's first layout
        // pass, which knows no pages; the finished document has the real one).
        let page_text =
            |p: usize| pdftotext_args(&pdf, &["-f", &p.to_string(), "-l", &p.to_string()]);
        let notice_page = (1..=page_count(&pdf))
            .find(|&p| normalise(&page_text(p)).contains(&normalise(CAUTION_PHRASES[0])))
            .unwrap_or_else(|| panic!("{name}: no page holds the notice"));
        let pointer = normalise(&format!("mains-safety notice on page {notice_page}."));
        assert!(
            normalise(&page_text(1)).contains(&pointer),
            "{name}: the first page does not point at page {notice_page}"
        );

        // The unit serial, from the job file itself.
        let job_text = std::fs::read_to_string(&job).unwrap();
        let serial = job_text
            .split("serial=\"")
            .nth(1)
            .and_then(|s| s.split('"').next())
            .unwrap();
        assert!(text.contains(serial), "{name}: serial {serial} missing");

        // Every valve position of the line-up (all types are rated, so
        // ratings_used lists every position).
        let mut positions = 0;
        for rating in json["ratings_used"].as_array().unwrap() {
            for p in rating["positions"].as_array().unwrap() {
                let p = p.as_str().unwrap();
                assert!(words.contains(p), "{name}: valve position {p} missing");
                positions += 1;
            }
        }
        assert!(positions >= 5, "{name}: only {positions} positions");

        // Every plate and screen dissipation, to 0.1 W, as a table cell.
        let mut figures = 0;
        for set in json["sets"].as_array().unwrap() {
            for v in set["valves"].as_array().unwrap() {
                for key in ["plate_dissipation_w", "screen_dissipation_w"] {
                    if let Some(w) = v[key].as_f64() {
                        let cell = format!("{w:.1}");
                        assert!(
                            words.contains(cell.as_str()),
                            "{name}: {key} {cell} of {} missing",
                            v["position"]
                        );
                        figures += 1;
                    }
                }
            }
        }
        assert!(figures >= 4, "{name}: only {figures} dissipation figures");

        // Every worked figure of a modification: its number and its formula.
        for m in json["mods"].as_array().unwrap() {
            for f in m["figures"].as_array().unwrap() {
                let number = match (f["frequency_hz"].as_f64(), f["gain"].as_f64()) {
                    (Some(hz), _) => format!("{hz:.0} Hz"),
                    (None, Some(gain)) => format!("gain about {gain:.0}"),
                    (None, None) => panic!("{name}: a figure with no number: {f}"),
                };
                assert!(
                    flat.contains(&normalise(&number)),
                    "{name}: mod figure {number:?} missing"
                );
                let formula = f["formula"].as_str().unwrap();
                assert!(
                    flat.contains(&normalise(formula)),
                    "{name}: formula {formula:?} missing"
                );
                mod_figures += 1;
            }
        }

        // A valve rectifier's load (a lower bound) and its rating, per set.
        for set in json["sets"].as_array().unwrap() {
            let r = &set["rectifier"];
            if r.is_null() {
                continue;
            }
            let load = format!("{:.1}", r["load_at_least_ma"].as_f64().unwrap());
            let rating = format!("{:.0}mA", r["rating_ma"].as_f64().unwrap());
            assert!(
                words.contains(load.as_str()),
                "{name}: rectifier load {load} mA of {} missing",
                set["label"]
            );
            assert!(
                flat.contains(&rating),
                "{name}: rectifier rating {rating} missing"
            );
            rectifier_loads += 1;
        }

        for phrase in CAUTION_PHRASES.iter().chain(DEFERRAL_PHRASES) {
            assert!(
                flat.contains(&normalise(phrase)),
                "{name}: caution text {phrase:?} missing"
            );
        }
        for phrase in [
            "AT A GLANCE",
            "Method and assumptions",
            "from memory of manufacturer data; verify",
        ] {
            assert!(
                flat.contains(&normalise(phrase)),
                "{name}: {phrase:?} missing"
            );
        }

        // Footer: every page says "Page n of m", with the versions and the
        // job file's checksum.
        let pages = page_count(&pdf);
        assert!(pages >= 3, "{name}: {pages} pages");
        for n in 1..=pages {
            assert!(
                flat.contains(&format!("Page{n}of{pages}")),
                "{name}: footer of page {n} missing"
            );
        }
        // The footer names the job file's commit (with a mark when the
        // file differs from it) when git knows the file, else the first
        // 12 hex digits of its SHA-256: the JSON says which.
        let mark = match json["job"]["git"].as_object() {
            Some(git) => format!(
                "commit{}{}",
                git["commit"].as_str().expect("commit"),
                if git["uncommitted_changes"] == true {
                    "+edits"
                } else {
                    ""
                }
            ),
            None => {
                let digest: String = Sha256::digest(job_text.as_bytes())
                    .iter()
                    .take(6)
                    .map(|b| format!("{b:02x}"))
                    .collect();
                format!("SHA-256{digest}")
            }
        };
        assert_eq!(
            flat.matches(&mark).count(),
            pages,
            "{name}: {mark} not on every page"
        );
        let versions = normalise(&format!(
            "ampreport {} · typst {typst}",
            env!("CARGO_PKG_VERSION")
        ));
        assert_eq!(
            flat.matches(&versions).count(),
            pages,
            "{name}: versions not on every page"
        );
    }
    // The demo jobs include a mod with a cathode-bypass corner and two
    // stage gains, and two jobs with a valve rectifier (two sets each).
    assert_eq!(mod_figures, 3, "worked figures checked");
    assert_eq!(rectifier_loads, 4, "rectifier loads checked");
}

/// A figure as the document prints it with an SI prefix: three
/// significant figures, trailing zeros dropped ("49.9", "13").
fn sig3(v: f64) -> String {
    if v == 0.0 {
        return "0".into();
    }
    let digits = 2 - v.abs().log10().floor() as i32;
    let scale = 10f64.powi(digits);
    let r = (v * scale).round() / scale;
    format!("{r}")
}

/// A frequency as the document prints it: "49.9 Hz", "13 kHz".
fn hz(v: f64) -> String {
    if v >= 1000.0 {
        format!("{} kHz", sig3(v / 1000.0))
    } else {
        format!("{} Hz", sig3(v))
    }
}

/// A signed figure to 0.1 with a typographic minus.
fn signed(v: f64) -> String {
    let s = format!("{:.1}", v.abs());
    if s == "0.0" {
        s
    } else if v < 0.0 {
        format!("\u{2212}{s}")
    } else {
        format!("+{s}")
    }
}

#[test]
fn bench_tests_and_the_resistor_suggestion_reach_the_document() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = demo("combo-el84-cathode");
    let pdf = dir.path().join("el84.pdf");
    assert_ok(&render(&job, &pdf, &[]), "render");
    let flat = normalise(&pdftotext(&pdf));
    let json = calc_json(&job);
    let has = |what: &str, s: &str| {
        assert!(flat.contains(&normalise(s)), "{what}: {s:?} missing");
    };
    let mut checked = 0;
    for set in json["sets"].as_array().unwrap() {
        let b = &set["bench"];
        for p in b["output_power"].as_array().unwrap() {
            has(
                "output power",
                &format!("{:.1} W", p["output_power_w"].as_f64().unwrap()),
            );
            if let Some(pct) = p["output_power_pct_of_rated"].as_f64() {
                has("% of rated", &format!("{pct:.0} % of"));
            }
            checked += 1;
        }
        for h in b["hum_noise"].as_array().unwrap() {
            has(
                "hum dBV",
                &format!("{} dBV", signed(h["hum_noise_dbv"].as_f64().unwrap())),
            );
            if let Some(db) = h["hum_noise_db_below_full"].as_f64() {
                has("hum below full", &format!("{db:.1} dB"));
            }
            checked += 1;
        }
        for r in b["responses"].as_array().unwrap() {
            for p in r["points"].as_array().unwrap() {
                has("response point", &hz(p["frequency_hz"].as_f64().unwrap()));
                has("response dB", &signed(p["response_db"].as_f64().unwrap()));
                checked += 1;
            }
            for key in ["minus_3db_low_hz", "minus_3db_high_hz"] {
                let f = r[key]
                    .as_f64()
                    .expect("the demo response reaches −3 dB on both sides");
                has(key, &hz(f));
            }
        }
        for g in b["gains"].as_array().unwrap() {
            has("gain", &format!("{:.1} dB", g["gain_db"].as_f64().unwrap()));
            checked += 1;
        }
        for s in set["cathode_resistor_suggestions"].as_array().unwrap() {
            let exact = s["exact_ohms"].as_f64().unwrap();
            has("exact resistor", &format!("gives {} Ω", sig3(exact)));
            for o in s["options"].as_array().unwrap() {
                let series = o["series"].as_str().unwrap();
                has(
                    "option",
                    &format!(
                        "{series} {} Ω",
                        sig3(o["resistance_ohms"].as_f64().unwrap())
                    ),
                );
                has(
                    "option dissipation",
                    &format!("{:.1} W", o["plate_dissipation_w"].as_f64().unwrap()),
                );
                has(
                    "resistor power",
                    &format!("{:.2} W", o["resistor_power_w"].as_f64().unwrap()),
                );
                has(
                    "rating",
                    &format!("a {} W part", o["resistor_rating_w"].as_f64().unwrap()),
                );
            }
            checked += 1;
        }
    }
    // The demo: one output power, two hum readings, a seven-point response,
    // one gain and one suggestion.
    assert_eq!(checked, 1 + 2 + 7 + 1 + 1, "bench figures checked");
    has(
        "estimate",
        "This is an estimate from one set of readings, not a measurement.",
    );
    has("estimate", "measure the bias again");
    has("chart", "Frequency response on the bench");
    has("glance", "Performance on the bench");
    has("method", "On the bench.");
    has("method", "Bias estimates.");
    // A response table and its −3 dB line are on one page (in the demo
    // the table once ended one page and its line began the next).
    let pages: Vec<String> = pdftotext(&pdf).split('\u{c}').map(normalise).collect();
    let table = pages
        .iter()
        .position(|p| p.contains(&normalise("Response, bright")))
        .expect("the response table");
    assert!(
        pages[table].contains(&normalise("−3 dB points:")),
        "the −3 dB line is not on the response table's page {}",
        table + 1
    );

    // The fixed-bias demo: the grid voltage for the middle of the window.
    let job = demo("combo-6v6-fixed");
    let pdf = dir.path().join("6v6.pdf");
    assert_ok(&render(&job, &pdf, &[]), "render");
    let flat = normalise(&pdftotext(&pdf));
    let json = calc_json(&job);
    let mut grids = 0;
    for set in json["sets"].as_array().unwrap() {
        for v in set["valves"].as_array().unwrap() {
            if let Some(g) = v["target_window"]["grid_for_middle_volts"].as_f64() {
                let words = normalise(&format!("about {} V on the grid", signed(g)));
                assert!(flat.contains(&words), "grid estimate {words} missing");
                grids += 1;
            }
        }
    }
    assert_eq!(grids, 4, "a grid estimate for each valve in both sets");
}

/// The words on `page` of `pdf` with their boxes (points from the top
/// left), from `pdftotext -bbox`.
fn word_boxes(pdf: &Path, page: usize) -> Vec<(String, [f64; 4])> {
    let page = page.to_string();
    let html = pdftotext_args(pdf, &["-bbox", "-f", &page, "-l", &page]);
    html.lines()
        .filter_map(|line| {
            let line = line.trim();
            let rest = line.strip_prefix("<word ")?;
            let (attrs, text) = rest.split_once('>')?;
            let text = text.strip_suffix("</word>")?;
            let value = |name: &str| -> Option<f64> {
                let start = attrs.find(&format!("{name}=\""))? + name.len() + 2;
                let end = attrs[start..].find('"')? + start;
                attrs[start..end].parse().ok()
            };
            Some((
                text.to_string(),
                [
                    value("xMin")?,
                    value("yMin")?,
                    value("xMax")?,
                    value("yMax")?,
                ],
            ))
        })
        .collect()
}

#[test]
fn no_text_runs_past_the_page_margins() {
    if typst_version().is_none() {
        return;
    }
    // The side margins are 17 mm (48.19 pt) on A4 (595.28 pt wide) and US
    // Letter (612 pt) alike; the bottom margin is 21 mm, with the footer in it.
    let dir = tempfile::tempdir().unwrap();
    for name in DEMO_JOBS {
        let pdf = dir.path().join(format!("{name}.pdf"));
        assert_ok(&render(&demo(name), &pdf, &[]), name);
        let (width, height) = page_size(&pdf);
        let (left, right) = (48.19 - 1.0, width - 48.19 + 1.0);
        for page in 1..=page_count(&pdf) {
            let words = word_boxes(&pdf, page);
            assert!(
                words.len() > 20,
                "{name} page {page}: {} words",
                words.len()
            );
            for (word, [x0, y0, x1, y1]) in &words {
                assert!(
                    *x0 >= left && *x1 <= right && *y0 >= 0.0 && *y1 <= height,
                    "{name} page {page}: {word:?} at {x0:.1}–{x1:.1}, {y0:.1}–{y1:.1} is off the text area"
                );
            }
        }
    }
}

#[test]
fn the_at_a_glance_panel_names_each_family_with_its_status() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = demo("combo-6v6-fixed");
    let pdf = dir.path().join("glance.pdf");
    assert_ok(&render(&job, &pdf, &["--typst", "typst"]), "render");
    // Content-stream order (`-raw`): the panel's cells come out row by
    // row, whatever the reading-order heuristics make of short rows.
    let first_page = {
        let out = Command::new("pdftotext")
            .args(["-raw", "-f", "1", "-l", "1", "-enc", "UTF-8"])
            .arg(&pdf)
            .arg("-")
            .output()
            .unwrap();
        normalise(&String::from_utf8(out.stdout).unwrap())
    };
    let json = calc_json(&job);
    for family in json["at_a_glance"].as_array().unwrap() {
        let title = normalise(family["title"].as_str().unwrap());
        // A family whose only findings were accepted reads ACCEPTED; one
        // with nothing measured and nothing wrong (no bench tests in this
        // demo) reads "NOT MEASURED".
        let accepted = !family["accepted"].as_array().unwrap().is_empty();
        let word = if family["status"] == "ok" && accepted {
            "ACCEPTED".to_string()
        } else if family["measured"] == false && family["status"] == "ok" {
            "NOTMEASURED".to_string()
        } else {
            family["status"].as_str().unwrap().to_uppercase()
        };
        let line = format!("{title}{word}");
        assert!(first_page.contains(&line), "page 1 lacks {line:?}");
        // Its worst figure, or for an all-ok family calc's summary sentence,
        // follows in full (the page starts it with a capital).
        let worst = normalise(family["worst"].as_str().unwrap()).to_lowercase();
        assert!(
            first_page
                .to_lowercase()
                .contains(&format!("{}{worst}", line.to_lowercase())),
            "page 1 lacks the worst figure {worst:?} after {line:?}"
        );
    }
    // The summary of an all-ok family, e.g. "4 nodes within tolerance of the
    // chart; largest deviation +1.9 % at B+4", stays inside the panel: the
    // panel is the full text width, so no word of page 1 passes the margin.
    let supply = &json["at_a_glance"][1];
    assert_eq!(supply["family"], "supply_voltages");
    assert!(
        supply["worst"]
            .as_str()
            .unwrap()
            .contains("within tolerance")
    );
    // The text area is the page less 17 mm (48.19 pt) each side.
    let right = page_size(&pdf).0 - 48.19 + 1.0;
    for (word, [x0, _, x1, _]) in word_boxes(&pdf, 1) {
        assert!(
            x0 >= 47.0 && x1 <= right,
            "{word:?} at {x0}–{x1} leaves the page 1 text area"
        );
    }
}

#[test]
fn a_healthy_signed_off_unit_reads_healthy_at_a_glance() {
    if typst_version().is_none() {
        return;
    }
    // The 6V6 demo's final set is inside its limits apart from findings the
    // technician accepted; its as-found set had an over and cautions.
    let dir = tempfile::tempdir().unwrap();
    let job = demo("combo-6v6-fixed");
    let json = calc_json(&job);
    assert!(
        json["warnings"]
            .as_array()
            .unwrap()
            .iter()
            .any(|w| w["set"] == "as found" && w["status"] == "over"),
        "the history has an over"
    );
    for family in json["at_a_glance"].as_array().unwrap() {
        assert_eq!(family["status"], "ok", "{family}");
    }
    let pdf = dir.path().join("healthy.pdf");
    assert_ok(&render(&job, &pdf, &["--typst", "typst"]), "render");
    let out = Command::new("pdftotext")
        .args(["-f", "1", "-l", "1", "-layout", "-enc", "UTF-8"])
        .arg(&pdf)
        .arg("-")
        .output()
        .unwrap();
    let page = String::from_utf8(out.stdout).unwrap();
    // The panel: from its heading to the line under it.
    let rows = page.find("against their ratings").expect("the panel");
    let start = page[..rows].rfind('\n').map_or(0, |i| i + 1);
    let end = page[start..]
        .find("Before using")
        .expect("the line under the panel")
        + start;
    let panel = &page[start..end];
    for alarm in ["CAUTION ", "OVER ", "COLD ", "NOT MEASURED "] {
        // The key at the panel's foot names every mark once; a family row
        // would name it a second time.
        assert!(
            panel.matches(alarm).count() <= 1,
            "the panel of a healthy unit shows {alarm}:\n{panel}"
        );
    }
    assert!(panel.contains("ACCEPTED"), "{panel}");
    // The summary says so in words, and the accepted reasons are shown.
    let flat = normalise(&page);
    assert!(
        flat.contains(&normalise("every figure is inside its limits")),
        "{page}"
    );
    let text = normalise(&pdftotext(&pdf));
    let reason = json["sets"][1]["valves"][0]["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["accepted"] == true)
        .and_then(|c| c["accepted_reason"].as_str())
        .expect("an accepted check")
        .to_string();
    assert!(
        text.contains(&normalise(&reason)),
        "the reason {reason:?} is not in the document"
    );
}

#[test]
fn rendering_twice_and_from_emitted_source_gives_identical_bytes() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = demo("head-el34-quad");
    let (a, b) = (dir.path().join("a.pdf"), dir.path().join("b.pdf"));
    let src = dir.path().join("source");
    assert_ok(
        &render(&job, &a, &["--emit-source", src.to_str().unwrap()]),
        "first render",
    );
    assert_ok(&render(&job, &b, &[]), "second render");
    let bytes = std::fs::read(&a).unwrap();
    assert!(bytes.starts_with(b"%PDF-"));
    assert_eq!(bytes, std::fs::read(&b).unwrap(), "two renders differ");

    // The command docs/render.md gives for an emitted folder, which holds
    // its own fonts.
    assert!(
        src.join("main.typ").is_file() && src.join("plots").join("plate-dissipation.svg").is_file()
    );
    for font in ["NotoSans-Regular.ttf", "OFL-1.1.txt"] {
        assert!(src.join("fonts").join(font).is_file(), "{font} not emitted");
    }
    // The CJK font in a folder of its own beside them, which this job
    // (no CJK text, no arrow) does not need: its command leaves it out.
    assert!(src.join("fonts-cjk").join("wqy-microhei.ttc").is_file());
    assert!(!src.join("fonts").join("wqy-microhei.ttc").exists());
    let c = dir.path().join("c.pdf");
    assert!(compile_emitted(&src, &["fonts"], &c).success());
    assert_eq!(
        bytes,
        std::fs::read(&c).unwrap(),
        "typst on the emitted source gives another PDF"
    );
}

/// typst run by hand on an emitted source folder `src`, with the font
/// folders `fonts` (names inside `src`) and the flags a render of the demo
/// jobs passes, writing `out`.
fn compile_emitted(src: &Path, fonts: &[&str], out: &Path) -> std::process::ExitStatus {
    let root = src.to_str().unwrap();
    let mut typst = Command::new("typst");
    typst.args(["compile", "--root", root]);
    for folder in fonts {
        typst.args(["--font-path", &format!("{root}/{folder}")]);
    }
    typst
        .args(["--ignore-system-fonts", "--ignore-embedded-fonts"])
        // 2026-11-20, the job's completion date, at 00:00 UTC.
        .args([
            "--creation-timestamp",
            "1795132800",
            "--pdf-standard",
            "a-2b",
        ])
        .arg(src.join("main.typ"))
        .arg(out)
        .status()
        .unwrap()
}

/// Whether the PDF embeds the CJK face (its name is in the font's
/// dictionary as typed).
fn embeds_cjk_face(pdf: &[u8]) -> bool {
    pdf.windows(17).any(|w| w == b"WenQuanYiMicroHei")
}

#[test]
fn the_cjk_font_is_handed_over_only_when_a_document_needs_it_and_the_pdf_is_the_same() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    // A job without CJK text or an arrow: no CJK folder in its command,
    // no CJK families in its font rules, and the same bytes as when
    // typst is given the CJK font and the rules naming it.
    let job = demo("head-el34-quad");
    let pdf = dir.path().join("plain.pdf");
    let src = dir.path().join("plain-source");
    let out = render(&job, &pdf, &["--emit-source", src.to_str().unwrap()]);
    assert_ok(&out, "plain");
    let said = String::from_utf8_lossy(&out.stderr).into_owned();
    assert!(!said.contains("fonts-cjk"), "{said}");
    let main = std::fs::read_to_string(src.join("main.typ")).unwrap();
    let lean = ampreport::typeset::font_rules_without_cjk();
    assert!(main.contains(&lean) && !main.contains("WenQuanYi"));
    let bytes = std::fs::read(&pdf).unwrap();
    assert!(!embeds_cjk_face(&bytes));
    std::fs::write(
        src.join("main.typ"),
        main.replacen(&lean, &ampreport::typeset::font_rules(), 1),
    )
    .unwrap();
    let full = dir.path().join("full.pdf");
    assert!(compile_emitted(&src, &["fonts", "fonts-cjk"], &full).success());
    assert!(
        bytes == std::fs::read(&full).unwrap(),
        "the PDF without the CJK font differs from the one with it"
    );

    // CJK text in the complaint, or the parallel sign in a note: the CJK
    // font is handed over and its face is in the PDF.
    let text = std::fs::read_to_string(demo("combo-el84-cathode")).unwrap();
    for (name, from, to) in [
        ("cjk", "Loud hum after", "Loud hum (嗡嗡声) after"),
        ("parallel", "Run the unit on", "Run the unit (R1 ∥ R2) on"),
    ] {
        assert!(text.contains(from), "{from}");
        let job_dir = dir.path().join(name);
        std::fs::create_dir(&job_dir).unwrap();
        let job_copy = job_dir.join(format!("{name}.kdl"));
        std::fs::write(&job_copy, text.replacen(from, to, 1)).unwrap();
        let pdf = dir.path().join(format!("{name}.pdf"));
        let src = dir.path().join(format!("{name}-source"));
        let out = render(&job_copy, &pdf, &["--emit-source", src.to_str().unwrap()]);
        assert_ok(&out, name);
        let said = String::from_utf8_lossy(&out.stderr).into_owned();
        assert!(said.contains("fonts-cjk"), "{name}: {said}");
        assert!(
            std::fs::read_to_string(src.join("main.typ"))
                .unwrap()
                .contains(&ampreport::typeset::font_rules())
        );
        assert!(embeds_cjk_face(&std::fs::read(&pdf).unwrap()), "{name}");
    }
}

/// typst's own threads (`--jobs`, which a batch sets for each of its
/// typst processes; a job alone leaves typst its default) must not change
/// a byte of the PDF: the content key leaves them out. Each demo job and
/// a generated job of many measurement sets is rendered alone, then its
/// emitted source compiled with typst held to one and to two threads.
#[test]
fn typst_threads_do_not_change_the_pdf() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let many_sets = dir.path().join("many-sets.kdl");
    let generated = Command::new("bash")
        .arg(repo().join("scripts/gen-job.sh"))
        // Ten sets: the charts come in two parts (at most 8 sets each).
        .arg("10")
        .output()
        .unwrap();
    assert!(generated.status.success());
    std::fs::write(&many_sets, &generated.stdout).unwrap();
    let jobs: Vec<PathBuf> = [
        "combo-el84-cathode",
        "combo-6v6-fixed",
        "head-el34-quad",
        "stereo-el84-hifi",
    ]
    .iter()
    .map(|name| demo(name))
    .chain([many_sets])
    .collect();
    for job in &jobs {
        let name = job.file_stem().unwrap().to_string_lossy().into_owned();
        let src = dir.path().join(format!("{name}-source"));
        let alone = dir.path().join(format!("{name}.pdf"));
        let out = render(job, &alone, &["--emit-source", src.to_str().unwrap()]);
        assert_ok(&out, &name);
        let said = String::from_utf8_lossy(&out.stderr);
        let command = said
            .lines()
            .find_map(|l| l.split_once("the same PDF comes from: "))
            .map(|(_, c)| c.to_owned())
            .unwrap_or_else(|| panic!("{name}: no command in {said}"));
        assert!(
            !command.contains("--jobs"),
            "{name}: a job alone: {command}"
        );
        let stamp = command
            .split_whitespace()
            .skip_while(|w| *w != "--creation-timestamp")
            .nth(1)
            .unwrap_or_else(|| panic!("{name}: {command}"))
            .to_owned();
        let bytes = std::fs::read(&alone).unwrap();
        assert!(bytes.starts_with(b"%PDF-"), "{name}");
        for threads in ["1", "2"] {
            let held = dir.path().join(format!("{name}-{threads}.pdf"));
            let root = src.to_str().unwrap();
            let status = Command::new("typst")
                .args(["compile", "--jobs", threads, "--root", root])
                .args(["--font-path", &format!("{root}/fonts")])
                // The CJK folder where the command names it (a document
                // with CJK text or an arrow).
                .args(if command.contains("/fonts-cjk ") {
                    vec!["--font-path".to_owned(), format!("{root}/fonts-cjk")]
                } else {
                    vec![]
                })
                .args(["--ignore-system-fonts", "--ignore-embedded-fonts"])
                .args(["--creation-timestamp", &stamp, "--pdf-standard", "a-2b"])
                .arg(src.join("main.typ"))
                .arg(&held)
                .status()
                .unwrap();
            assert!(status.success(), "{name}: typst --jobs {threads}");
            assert!(
                bytes == std::fs::read(&held).unwrap(),
                "{name}: typst --jobs {threads} gives another PDF than typst's default"
            );
        }
    }
}

/// typst's answer to `--version` is remembered only for the very program
/// file that gave it: an entry in the cache folder is used while the file
/// is as it was (shown by an entry edited to another version), and a
/// program replaced by a rename or rewritten in place is asked again.
/// `ampreport --version` always asks.
#[test]
fn a_replaced_typst_program_is_asked_its_version_again() {
    let Some(version) = typst_version() else {
        return;
    };
    let real = std::env::split_paths(&std::env::var_os("PATH").unwrap())
        .map(|d| d.join("typst"))
        .find(|p| p.is_file())
        .unwrap();
    let dir = tempfile::tempdir().unwrap();
    let typst = dir.path().join("typst");
    std::fs::copy(&real, &typst).unwrap();
    let home = dir.path().join("cache-home");
    let job = dir.path().join("broken.kdl");
    std::fs::write(&job, "job-format 1\n").unwrap();
    let run = |args: &[&str]| -> String {
        let out = Command::new(BIN)
            .args(args)
            .env("AMPREPORT_TYPST", &typst)
            .env("XDG_CACHE_HOME", &home)
            .env("XDG_CONFIG_HOME", home.join("no-config-home"))
            .output()
            .unwrap();
        format!(
            "{}{}",
            String::from_utf8_lossy(&out.stdout),
            String::from_utf8_lossy(&out.stderr)
        )
    };
    // The version a render takes, from its `--verbose` lines (the job is
    // refused after typst is found, before anything is typeset).
    let used = || -> String {
        let said = run(&["render", "-v", job.to_str().unwrap()]);
        said.lines()
            .find_map(|l| l.strip_prefix("read: typst: "))
            .and_then(|l| l.split_once("(version "))
            .map(|(_, v)| v.trim_end_matches(')').to_owned())
            .unwrap_or_else(|| panic!("{said}"))
    };
    let said = run(&["--version"]);
    assert!(
        said.contains(&format!("typst {version} at {}", typst.display())),
        "{said}"
    );
    let entries = home.join("ampreport").join("typst");
    let entry = || {
        let found: Vec<PathBuf> = std::fs::read_dir(&entries)
            .unwrap()
            .map(|e| e.unwrap().path())
            .collect();
        assert_eq!(found.len(), 1, "one entry per program: {found:?}");
        found[0].clone()
    };
    let forge = || {
        let text = std::fs::read_to_string(entry()).unwrap();
        let forged = text.replace(&format!("version {version}\n"), "version 0.15.99\n");
        assert_ne!(text, forged, "{text}");
        std::fs::write(entry(), forged).unwrap();
    };
    assert_eq!(used(), version);
    forge();
    assert_eq!(used(), "0.15.99", "the unchanged program's entry is used");
    // Replaced by another file renamed over it.
    let new = dir.path().join("typst.new");
    std::fs::copy(&real, &new).unwrap();
    std::fs::rename(&new, &typst).unwrap();
    assert_eq!(used(), version, "replaced by a rename");
    assert_eq!(used(), version);
    // Rewritten in place, in a later tick of the file system's clock.
    forge();
    std::thread::sleep(std::time::Duration::from_millis(30));
    std::fs::copy(&real, &typst).unwrap();
    assert_eq!(used(), version, "rewritten in place");
    // `ampreport --version` asks typst itself, and its answer is kept.
    forge();
    let said = run(&["--version"]);
    assert!(said.contains(&format!("typst {version} at")), "{said}");
    assert_eq!(used(), version);
}

#[test]
fn fonts_from_the_user_cache_or_the_sandbox_give_identical_bytes() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = demo("combo-6v6-fixed");
    let home = dir.path().join("cache-home");
    let args = |pdf: &Path| -> Vec<std::ffi::OsString> {
        vec![
            "render".into(),
            job.clone().into(),
            "-o".into(),
            pdf.as_os_str().into(),
        ]
    };
    let run = |pdf: &Path, home: &Path| {
        let args = args(pdf);
        let args: Vec<&std::ffi::OsStr> = args.iter().map(|a| a.as_os_str()).collect();
        let out = ampreport_with_cache(&args, home);
        assert_ok(&out, "render");
        std::fs::read(pdf).unwrap()
    };
    // First run writes the cache (the fonts, the job's two photos as
    // prepared, typst's version and the job's place in git), the second
    // uses it.
    let first = run(&dir.path().join("a.pdf"), &home);
    let photos = home.join("ampreport").join("photos");
    assert_eq!(std::fs::read_dir(&photos).unwrap().count(), 2);
    let versions = home.join("ampreport").join("typst");
    assert_eq!(std::fs::read_dir(&versions).unwrap().count(), 1);
    // The demo job is in this repository: where it stands in git is kept
    // too (where the source is not a git checkout, there is no entry).
    let git = home.join("ampreport").join("git");
    if git.exists() {
        assert_eq!(std::fs::read_dir(&git).unwrap().count(), 1);
    }
    let cached: Vec<PathBuf> = std::fs::read_dir(home.join("ampreport"))
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| *p != photos && *p != versions && *p != git)
        .collect();
    // The fonts' folder and the CJK font's beside it.
    assert_eq!(cached.len(), 2, "{cached:?}");
    let folder = &ampreport::typeset::font_cache_folder_name();
    let folder = &cached
        .iter()
        .find(|p| p.file_name().unwrap() == folder.as_str())
        .unwrap_or_else(|| panic!("{cached:?}"))
        .clone();
    assert!(
        ampreport::typeset::cjk_folder(folder)
            .join("wqy-microhei.ttc")
            .is_file()
    );
    assert!(
        folder
            .file_name()
            .unwrap()
            .to_string_lossy()
            .starts_with("fonts-")
    );
    assert!(folder.join("NotoSans-Regular.ttf").is_file());
    let second = run(&dir.path().join("b.pdf"), &home);
    // A cache folder that cannot be made: the fonts go into the sandbox
    // and the photos are prepared afresh.
    let blocked = dir.path().join("not-a-folder");
    std::fs::write(&blocked, b"x").unwrap();
    let fallback = run(&dir.path().join("c.pdf"), &blocked);
    assert!(first.starts_with(b"%PDF-"));
    assert_eq!(first, second, "a render from the caches differs");
    assert_eq!(
        first, fallback,
        "a render with fonts in the sandbox differs"
    );
}

#[test]
fn default_output_sits_beside_the_job() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = dir.path().join("bench job.kdl");
    std::fs::copy(demo("combo-el84-cathode"), &job).unwrap();
    let out = ampreport(&["render".as_ref(), job.as_os_str()]);
    assert_ok(&out, "render");
    // Beside the PDF, the small manifest saying what it was made from.
    assert_eq!(
        listing(dir.path()),
        BTreeSet::from([
            "bench job.kdl".to_string(),
            "bench job.pdf".to_string(),
            ".bench job.pdf.ampreport-key".to_string()
        ])
    );
}

/// A KDL 2 quoted string holding exactly `s`.
fn kdl(s: &str) -> String {
    let mut out = String::from("\"");
    for c in s.chars() {
        match c {
            '\\' => out.push_str("\\\\"),
            '"' => out.push_str("\\\""),
            '\n' => out.push_str("\\n"),
            '\r' => out.push_str("\\r"),
            '\t' => out.push_str("\\t"),
            c if c.is_control() => out.push_str(&format!("\\u{{{:x}}}", c as u32)),
            c => out.push(c),
        }
    }
    out.push('"');
    out
}

/// The free-text fields of a job file, by name.
const FIELDS: &[&str] = &[
    "job id",
    "technician",
    "customer name",
    "contact 1",
    "contact 2",
    "make",
    "model",
    "serial",
    "description",
    "condition",
    "complaint",
    "findings",
    "work",
    "node label",
    "first set label",
    "second set label",
    "heater label",
    "part was",
    "part now",
    "part reason",
    "mod what",
    "mod why",
    "note 1",
    "note 2",
];

/// A complete job file whose free-text fields hold `value(field)` and
/// whose names (positions, nodes, references) are `name(usual name)`.
fn job_with(value: impl Fn(&str) -> String, name: impl Fn(&str) -> String) -> String {
    let v = |f: &str| kdl(&value(f));
    let n = |f: &str| kdl(&name(f));
    format!(
        r##"job-format 1
job id={id} received="2026-03-01" completed="2026-03-04" technician={tech}
customer name={cust} {{
    contact {c1}
    contact {c2}
}}
unit make={make} model={model} serial={serial} year=1968 {{
    description {desc}
    condition {cond}
}}
mains nominal="230V" tolerance="10%"
complaint {complaint}
findings {findings}
work {work}
valves {{
    valve {v1} type="12AX7" role=preamp
    valve {v3} type=EL84 role=output
    valve {v4} type=EL84 role=output
}}
circuit {{
    bias cathode
    cathode-resistor {r9} value="130" rating="3W" valves={pair}
    node {b1} chart="330V" label={label}
    node {b2} chart="300V"
    dropper {r10} value="1k" rating="2W" from={b1} to={b2}
    filter-capacitor {cap1} value="32u" rating="450V" node={b1}
}}
measurements {set1} mains="232V" date="2026-03-01" {{
    node {b1} "331V"
    node {b2} "302V"
    valve {v3} plate="320V" screen="300V" cathode="10.1V"
    valve {v4} plate="320V" screen="300V" cathode="10.1V"
    heater "6.4V" label={heater}
}}
measurements {set2} mains="229V" date="2026-03-04" {{
    node {b1} "328V"
    node {b2} "299V"
    valve {v3} plate="318V" screen="299V" cathode="10.0V"
    valve {v4} plate="318V" screen="299V" cathode="10.0V"
}}
parts {{
    part {r9} was={was} now={now} reason={reason} original-kept=#true
}}
mods {{
    mod {what} why={why} reversible=#true original-kept=#false
}}
safety class=I {{
    earth-continuity "0.05R" limit="0.1R"
    insulation "200M" test-voltage="500V" minimum="1M"
}}
notes {{
    note {n1}
    note {n2}
}}
"##,
        id = v("job id"),
        tech = v("technician"),
        cust = v("customer name"),
        c1 = v("contact 1"),
        c2 = v("contact 2"),
        make = v("make"),
        model = v("model"),
        serial = v("serial"),
        desc = v("description"),
        cond = v("condition"),
        complaint = v("complaint"),
        findings = v("findings"),
        work = v("work"),
        label = v("node label"),
        set1 = v("first set label"),
        set2 = v("second set label"),
        heater = v("heater label"),
        was = v("part was"),
        now = v("part now"),
        reason = v("part reason"),
        what = v("mod what"),
        why = v("mod why"),
        n1 = v("note 1"),
        n2 = v("note 2"),
        v1 = n("V1"),
        v3 = n("V3"),
        v4 = n("V4"),
        pair = kdl(&format!("{} {}", name("V3"), name("V4"))),
        b1 = n("B+1"),
        b2 = n("B+2"),
        r9 = n("R9"),
        r10 = n("R10"),
        cap1 = n("C1"),
    )
}

/// Hostile and multilingual strings.
fn corpus() -> Vec<(&'static str, String)> {
    let cases: &[(&str, &str)] = &[
        ("markup characters", "# $ * _ ` < > @ = - + / \\ [ ] ~ \""),
        ("read", "#read(\"/etc/passwd\")"),
        ("include", "#include \"x\""),
        ("code block", "#{ panic(\"no\") } #let x = 1"),
        ("math", "$x$ and $5 off$"),
        ("label", "<label>"),
        ("reference", "@ref"),
        ("line comment", "// not a comment"),
        ("block comment", "/* not a comment */"),
        ("strong and emphasis", "*$5 off* <x> @y _em_"),
        ("heading after newline", "first line\n= Heading"),
        (
            "lists after newline",
            "notes:\n- item\n+ item\n1. item\n/ Term: d",
        ),
        ("backslash at end", "C:\\temp\\"),
        ("unicode escape", "\\u{41}"),
        ("raw", "`raw` ```rust code```"),
        ("shorthands", "a -- b --- c ... d -? e -1 ~"),
        ("brackets", "] [ ) ( } {"),
        ("quotes", "\"quoted\" and 'single'"),
        ("blank lines", "one\n\ntwo\r\n\r\nthree"),
        ("Greek", "Καλημέρα κόσμε"),
        ("Cyrillic", "Съешь же ещё этих булок"),
        ("Arabic", "مرحبا بالعالم"),
        ("Hebrew", "שלום עולם"),
        ("Devanagari", "नमस्ते दुनिया"),
        ("Chinese", "你好世界，电子管放大器"),
        ("empty", ""),
    ];
    cases.iter().map(|(n, t)| (*n, t.to_string())).collect()
}

/// Letters only, so the markers are strong left-to-right text and bidi
/// reordering around Arabic or Hebrew cannot move them: `n` as `a`…`z`, `aa`….
fn letters(mut n: usize) -> String {
    let mut out = String::new();
    loop {
        out.insert(0, (b'a' + (n % 26) as u8) as char);
        if n < 26 {
            return out;
        }
        n = n / 26 - 1;
    }
}

/// Renders a job whose every free-text field holds every case, each case
/// between markers naming the field and the case, and checks that the text
/// of the PDF holds each one, literally, for every field. A case counts as
/// found in the reading-order extraction or, for left-to-right text only,
/// the content-stream one (which keeps hyphens at line ends).
fn check_corpus_job(cases: &[(&str, String)], tag: &str) {
    let dir = tempfile::tempdir().unwrap();
    let wrap = |f: usize, c: usize, s: &str| {
        let (f, c) = (letters(f).to_uppercase(), letters(c).to_uppercase());
        format!("Zf{f}c{c}Z{s}Zc{c}f{f}Z")
    };
    let text = job_with(
        |field| {
            let f = FIELDS.iter().position(|x| *x == field).unwrap();
            cases
                .iter()
                .enumerate()
                .map(|(c, (_, s))| wrap(f, c, s))
                .collect::<Vec<_>>()
                .join(" ")
        },
        str::to_string,
    );
    let job = dir.path().join(format!("{tag}.kdl"));
    std::fs::write(&job, &text).unwrap();
    let pdf = dir.path().join(format!("{tag}.pdf"));
    let out = render(&job, &pdf, &[]);
    assert_ok(&out, tag);
    let reading = normalise(&body_text(&pdf, None));
    let raw = normalise(&body_text(&pdf, Some("-raw")));
    let mut missing = Vec::new();
    for (f, field) in FIELDS.iter().enumerate() {
        for (c, (case, s)) in cases.iter().enumerate() {
            let want = normalise(&wrap(f, c, s));
            let rtl = s.chars().any(|ch| matches!(ch, '\u{0590}'..='\u{08FF}'));
            if !(reading.contains(&want) || (!rtl && raw.contains(&want))) {
                missing.push(format!("{field} / {case}"));
            }
        }
    }
    if !missing.is_empty() && std::env::var_os("SHOW_EXTRACTED").is_some() {
        eprintln!("{reading}");
    }
    assert!(
        missing.is_empty(),
        "{tag}: not printed literally:\n  {}",
        missing.join("\n  ")
    );
}

#[test]
fn hostile_text_in_every_field_prints_literally() {
    if typst_version().is_none() {
        return;
    }
    check_corpus_job(&corpus(), "corpus");
}

/// Whether `pieces` occur in `hay` in this order (other text may come
/// between them).
fn in_order(hay: &str, pieces: &[String]) -> bool {
    let mut at = 0;
    for piece in pieces {
        match hay[at..].find(piece.as_str()) {
            Some(i) => at += i + piece.len(),
            None => return false,
        }
    }
    true
}

#[test]
fn very_long_text_in_every_field_prints_in_full() {
    if typst_version().is_none() {
        return;
    }
    // A long paragraph and a long unbroken word in every field. They run
    // over page breaks and through table rows, so other cells and repeated
    // table headers can come between their pieces in the extracted text:
    // the check is that every word is there, in order, between the
    // field's own markers.
    let mut long = String::new();
    let mut i = 0;
    while long.len() < 3000 {
        long.push_str(&format!("w{i}; "));
        i += 1;
    }
    let unbroken: String = (0..400)
        .map(|i| char::from(b'a' + (i % 26) as u8))
        .collect();
    let dir = tempfile::tempdir().unwrap();
    let open = |f: usize| format!("ZzOPEN{}Z", letters(f).to_uppercase());
    let close = |f: usize| format!("ZzCLOSE{}Z", letters(f).to_uppercase());
    let text = job_with(
        |field| {
            let f = FIELDS.iter().position(|x| *x == field).unwrap();
            format!("{} {long} {unbroken} {}", open(f), close(f))
        },
        str::to_string,
    );
    let job = dir.path().join("long.kdl");
    std::fs::write(&job, &text).unwrap();
    let pdf = dir.path().join("long.pdf");
    assert_ok(&render(&job, &pdf, &[]), "long text");
    let got = normalise(&body_text(&pdf, None));
    let mut missing = Vec::new();
    for (f, field) in FIELDS.iter().enumerate() {
        let mut pieces = vec![open(f)];
        pieces.extend(long.split_whitespace().map(normalise));
        pieces.push(unbroken.clone());
        pieces.push(close(f));
        if !in_order(&got, &pieces) {
            missing.push(*field);
        }
    }
    assert!(
        missing.is_empty(),
        "long text not printed in full in: {missing:?}"
    );
}

#[test]
fn empty_text_fields_render() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = dir.path().join("empty.kdl");
    // Two sets need distinct labels; every other field is empty.
    let text = job_with(
        |f| match f {
            "first set label" => "a".into(),
            "second set label" => "b".into(),
            _ => String::new(),
        },
        str::to_string,
    );
    std::fs::write(&job, text).unwrap();
    let pdf = dir.path().join("empty.pdf");
    assert_ok(&render(&job, &pdf, &[]), "empty fields");
    assert!(normalise(&pdftotext(&pdf)).contains(&normalise(CAUTION_PHRASES[0])));
}

#[test]
fn hostile_names_reach_tables_and_charts_literally() {
    if typst_version().is_none() {
        return;
    }
    // Valve names go into a space-separated list, so they hold no spaces.
    let names = [
        ("V1", "V1_*x*"),
        ("V3", "V<3>&\"#x\""),
        ("V4", "V4#read(\"/etc/passwd\")"),
        ("B+1", "B+1 $x$ </svg>"),
        ("B+2", "@B2 // *"),
        ("R9", "R9 #include \"x\""),
        ("R10", "R10 ]["),
        ("C1", "C1 'ü' Ω"),
    ];
    let text = job_with(
        |f| match f {
            "first set label" => "as found".into(),
            "second set label" => "as left".into(),
            _ => "plain".into(),
        },
        |usual| {
            names
                .iter()
                .find(|(u, _)| *u == usual)
                .map(|(_, h)| h.to_string())
                .unwrap()
        },
    );
    let dir = tempfile::tempdir().unwrap();
    let job = dir.path().join("names.kdl");
    std::fs::write(&job, &text).unwrap();
    let check = ampreport(&["check".as_ref(), job.as_os_str()]);
    assert_ok(&check, &format!("check of\n{text}"));
    let pdf = dir.path().join("names.pdf");
    assert_ok(&render(&job, &pdf, &[]), "render");
    let got = normalise(&pdftotext(&pdf));
    for (_, hostile) in names {
        assert!(got.contains(&normalise(hostile)), "{hostile:?} missing");
    }
}

#[test]
fn a_failing_typst_leaves_the_folder_as_it_was() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = dir.path().join("job.kdl");
    std::fs::copy(demo("combo-6v6-fixed"), &job).unwrap();
    copy_photos(dir.path());
    let pdf = dir.path().join("job.pdf");
    std::fs::write(&pdf, b"%PDF-1.7 the good old document").unwrap();
    let before = listing(dir.path());

    // Not typst at all: refused at the version check.
    let out = render(&job, &pdf, &["--typst", "/bin/false"]);
    assert_eq!(
        out.status.code(),
        Some(3),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    assert_eq!(
        std::fs::read(&pdf).unwrap(),
        b"%PDF-1.7 the good old document"
    );
    assert_eq!(listing(dir.path()), before);

    // A typst that answers like one and then fails to compile.
    let fake_dir = tempfile::tempdir().unwrap();
    let fake = fake_dir.path().join("typst");
    std::fs::write(
        &fake,
        "#!/bin/sh\nif [ \"$1\" = --version ]; then echo 'typst 0.15.1 (fake)'; exit 0; fi\n\
         echo 'error: the press is out of ink' >&2\nexit 1\n",
    )
    .unwrap();
    make_executable(&fake);
    let out = render(&job, &pdf, &["--typst", fake.to_str().unwrap()]);
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(3), "{stderr}");
    assert!(
        stderr.contains("the press is out of ink"),
        "typst's message missing: {stderr}"
    );
    assert_eq!(
        std::fs::read(&pdf).unwrap(),
        b"%PDF-1.7 the good old document"
    );
    assert_eq!(listing(dir.path()), before, "stray files beside the PDF");
    // The generated source is kept for inspection, and its folder named.
    let kept = kept_folder(&stderr).expect("the kept folder is named");
    assert!(kept.join("main.typ").is_file(), "{}", kept.display());
    std::fs::remove_dir_all(kept).unwrap();
}

/// The folder a failed compile left for inspection, as named on stderr.
/// Copies the demo jobs' photos into `dir`, for a demo job copied there.
fn copy_photos(dir: &Path) {
    let to = dir.join("photos");
    std::fs::create_dir_all(&to).unwrap();
    for entry in std::fs::read_dir(repo().join("jobs").join("photos")).unwrap() {
        let entry = entry.unwrap();
        std::fs::copy(entry.path(), to.join(entry.file_name())).unwrap();
    }
}

fn kept_folder(stderr: &str) -> Option<PathBuf> {
    let rest = stderr.split("kept for inspection in ").nth(1)?;
    let path: String = rest
        .split(';')
        .next()?
        .split_whitespace()
        .collect::<Vec<_>>()
        .join("");
    Some(PathBuf::from(path))
}

#[cfg(unix)]
fn make_executable(path: &Path) {
    use std::os::unix::fs::PermissionsExt;
    std::fs::set_permissions(path, std::fs::Permissions::from_mode(0o755)).unwrap();
    // Another test thread forking while the script was open for writing can
    // make it briefly "text file busy"; wait until it runs.
    for _ in 0..200 {
        match Command::new(path).arg("--version").output() {
            Err(e) if e.raw_os_error() == Some(26) => {
                std::thread::sleep(std::time::Duration::from_millis(10))
            }
            _ => break,
        }
    }
}

#[test]
fn without_typst_the_install_command_is_named() {
    let dir = tempfile::tempdir().unwrap();
    let empty = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("x.pdf");
    let out = Command::new(BIN)
        .args([
            "render".as_ref(),
            demo("combo-el84-cathode").as_os_str(),
            "-o".as_ref(),
            pdf.as_os_str(),
        ])
        .env("PATH", empty.path())
        .env_remove("AMPREPORT_TYPST")
        .env("XDG_CACHE_HOME", test_cache_home())
        .output()
        .unwrap();
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(3), "{stderr}");
    assert!(
        stderr.contains("cargo install --locked typst-cli"),
        "{stderr}"
    );
    assert!(listing(dir.path()).is_empty());
}

#[test]
fn a_shop_template_folder_overrides_the_built_in_one() {
    if typst_version().is_none() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let templates = dir.path().join("templates");
    std::fs::create_dir_all(templates.join("images")).unwrap();
    std::fs::write(
        templates.join("handover.typ"),
        "{{ font_rules }}\nShop copy for {{ unit.serial }}: {{ sets|length }} sets, {{ glance.overall }}.\n\
         #image(\"images/mark.svg\", width: 2cm)\n#include \"mains-safety.typ\"\n",
    )
    .unwrap();
    // A shop cannot replace the notice's words: its own copy is ignored.
    std::fs::write(
        templates.join("mains-safety.typ"),
        "A softer notice of the shop's own.\n",
    )
    .unwrap();
    std::fs::write(
        templates.join("images").join("mark.svg"),
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="20" height="20"><rect width="20" height="20"/></svg>"#,
    )
    .unwrap();
    let pdf = dir.path().join("shop.pdf");
    let job = demo("combo-el84-cathode");
    assert_ok(
        &render(&job, &pdf, &["--templates", templates.to_str().unwrap()]),
        "shop template",
    );
    let text = pdftotext(&pdf);
    assert!(
        text.contains("Shop copy for DU15-04417: 2 sets, caution."),
        "{text}"
    );
    assert!(
        text.contains("Local electrical codes come first."),
        "{text}"
    );
    assert!(!text.contains("softer notice"), "{text}");

    // A template that leaves out the notice is refused: status 1, PDF untouched.
    std::fs::write(
        templates.join("handover.typ"),
        "{{ font_rules }}\nShop copy without the notice.\n",
    )
    .unwrap();
    let kept = std::fs::read(&pdf).unwrap();
    let out = render(&job, &pdf, &["--templates", templates.to_str().unwrap()]);
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(1), "{stderr}");
    assert!(stderr.contains("mains-safety notice"), "{stderr}");
    assert_eq!(std::fs::read(&pdf).unwrap(), kept);

    // A broken shop template is the shop's input: status 1, PDF untouched.
    std::fs::write(
        templates.join("handover.typ"),
        "{{ font_rules }}\n{{ no_such_variable }}\n",
    )
    .unwrap();
    let before = std::fs::read(&pdf).unwrap();
    let out = render(&job, &pdf, &["--templates", templates.to_str().unwrap()]);
    assert_eq!(
        out.status.code(),
        Some(1),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    assert_eq!(std::fs::read(&pdf).unwrap(), before);
    std::fs::write(
        templates.join("handover.typ"),
        "{{ font_rules }}\n#nonexistent()\n#include \"mains-safety.typ\"\n",
    )
    .unwrap();
    let out = render(&job, &pdf, &["--templates", templates.to_str().unwrap()]);
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(1), "{stderr}");
    assert!(
        stderr.contains("nonexistent"),
        "typst's diagnostics missing: {stderr}"
    );
    assert_eq!(std::fs::read(&pdf).unwrap(), before);
    if let Some(kept) = kept_folder(&stderr) {
        std::fs::remove_dir_all(kept).unwrap();
    }
}

/// Runs git in `dir` with a fixed author and no signing, and returns its
/// standard output; panics when git fails.
fn git(dir: &Path, args: &[&str]) -> String {
    let out = Command::new("git")
        .current_dir(dir)
        .args([
            "-c",
            "user.name=Bench",
            "-c",
            "user.email=bench@example.invalid",
            "-c",
            "commit.gpgsign=false",
            "-c",
            "init.defaultBranch=main",
        ])
        .args(args)
        .env_remove("GIT_DIR")
        .env_remove("GIT_WORK_TREE")
        .env_remove("GIT_INDEX_FILE")
        .output()
        .expect("git runs");
    assert!(
        out.status.success(),
        "git {args:?} failed: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8_lossy(&out.stdout).into_owned()
}

#[test]
fn a_job_in_git_shows_its_commit_and_a_mark_once_edited() {
    let Some(_) = typst_version() else { return };
    let dir = tempfile::tempdir().unwrap();
    let job = dir.path().join("job.kdl");
    std::fs::copy(demo("combo-el84-cathode"), &job).unwrap();
    let pdf = dir.path().join("job.pdf");

    // Outside a repository: the job file's SHA-256, as before.
    assert_ok(&render(&job, &pdf, &["--no-shop"]), "render outside git");
    let text = std::fs::read_to_string(&job).unwrap();
    let digest: String = Sha256::digest(text.as_bytes())
        .iter()
        .take(6)
        .map(|b| format!("{b:02x}"))
        .collect();
    let flat = normalise(&pdftotext(&pdf));
    assert!(flat.contains(&format!("SHA-256{digest}")), "{flat}");
    assert!(calc_json(&job)["job"]["git"].is_null());
    std::fs::remove_file(&pdf).unwrap();

    // Committed: the commit's short id, no mark.
    git(dir.path(), &["init", "-q"]);
    git(dir.path(), &["add", "job.kdl"]);
    git(dir.path(), &["commit", "-q", "-m", "Take in the job"]);
    let head = git(dir.path(), &["rev-parse", "HEAD"]);
    let short = &head.trim()[..12];
    assert_ok(&render(&job, &pdf, &["--no-shop"]), "render committed");
    let flat = normalise(&pdftotext(&pdf));
    let pages = page_count(&pdf);
    assert_eq!(
        flat.matches(&format!("commit{short}")).count(),
        pages,
        "{flat}"
    );
    assert!(
        !flat.contains("+edits") && !flat.contains(&digest),
        "{flat}"
    );
    let json = calc_json(&job);
    assert_eq!(json["job"]["git"]["commit"], short);
    assert_eq!(json["job"]["git"]["uncommitted_changes"], false);
    std::fs::remove_file(&pdf).unwrap();

    // Edited and not committed: the same commit with the mark.
    let reading = "valve V3 plate=\"344V\" screen=\"343V\" cathode=\"14.1V\"";
    assert!(text.contains(reading), "the demo's V3 reading as left");
    let edited = text.replace(reading, &reading.replace("14.1V", "14.6V"));
    std::fs::write(&job, &edited).unwrap();
    assert_ok(&render(&job, &pdf, &["--no-shop"]), "render edited");
    let flat = normalise(&pdftotext(&pdf));
    assert_eq!(
        flat.matches(&format!("commit{short}+edits")).count(),
        pages,
        "{flat}"
    );
    let json = calc_json(&job);
    assert_eq!(json["job"]["git"]["commit"], short);
    assert_eq!(json["job"]["git"]["uncommitted_changes"], true);

    // `compare HEAD:job.kdl job.kdl` lists the change, with the figures
    // `calc --json` gives for the committed text and for the file.
    let committed = tempfile::tempdir().unwrap();
    let old_copy = committed.path().join("job.kdl");
    std::fs::write(&old_copy, git(dir.path(), &["show", "HEAD:job.kdl"])).unwrap();
    let old_json = calc_json(&old_copy);
    let out = Command::new(BIN)
        .current_dir(dir.path())
        .args(["compare", "HEAD:job.kdl", "job.kdl", "--json"])
        .env("XDG_CONFIG_HOME", test_cache_home().join("no-config-home"))
        .output()
        .unwrap();
    assert_ok(&out, "compare HEAD:job.kdl job.kdl");
    let changes: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let changes = changes["changes"].as_array().unwrap();
    let find = |json: &serde_json::Value, figure: &str| {
        json["sets"]
            .as_array()
            .unwrap()
            .iter()
            .find(|s| s["label"] == "as left")
            .unwrap()["valves"]
            .as_array()
            .unwrap()
            .iter()
            .find(|v| v["position"] == "V3")
            .unwrap()[figure]
            .clone()
    };
    for figure in ["cathode_volts", "cathode_current_ma", "plate_dissipation_w"] {
        let change = changes
            .iter()
            .find(|c| c["subject"] == "V3" && c["figure"] == figure && c["set"] == "as left")
            .unwrap_or_else(|| panic!("V3 {figure} not listed: {changes:?}"));
        assert_eq!(change["old"], find(&old_json, figure), "{figure}");
        assert_eq!(change["new"], find(&json, figure), "{figure}");
        assert_ne!(change["old"], change["new"]);
    }
    // Nothing of "as found" changed.
    assert!(
        changes.iter().all(|c| c["set"] != "as found"),
        "{changes:?}"
    );
}

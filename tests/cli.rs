//! Runs the real `ampreport` binary the way a technician or a script would:
//! every demo job through `check` and `calc --json`, the `tubes` and `init`
//! commands, and broken job files whose problems must be reported at their
//! own `file:line:column`. The expected positions are worked out here from
//! the text each test writes, never copied from the program's output.

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

use serde_json::Value;

// ----- helpers ------------------------------------------------------------

/// The binary, with colour left to its own decision (no NO_COLOR), so the
/// "not a terminal, no colour" rule is tested too.
fn ampreport() -> Command {
    let mut c = Command::new(env!("CARGO_BIN_EXE_ampreport"));
    // No shop profile from the user's own configuration folder.
    c.env(
        "XDG_CONFIG_HOME",
        Path::new(env!("CARGO_TARGET_TMPDIR")).join("no-config-home"),
    );
    c.env_remove("NO_COLOR");
    c.env_remove("CLICOLOR_FORCE");
    c.env_remove("FORCE_COLOR");
    c
}

fn run_in(dir: &Path, args: &[&str]) -> Output {
    ampreport()
        .current_dir(dir)
        .args(args)
        .output()
        .expect("the ampreport binary runs")
}

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

fn code(o: &Output) -> i32 {
    o.status
        .code()
        .expect("ampreport exits with a status, not a signal")
}

fn demo_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("jobs")
}

/// Every demo job in `jobs/`.
fn demo_jobs() -> Vec<PathBuf> {
    let mut jobs: Vec<PathBuf> = std::fs::read_dir(demo_dir())
        .expect("jobs/ exists")
        .map(|e| e.expect("readable entry").path())
        .filter(|p| p.extension().is_some_and(|e| e == "kdl"))
        .filter(|p| p.file_name().is_some_and(|n| n != "shop.kdl"))
        .collect();
    jobs.sort();
    assert!(
        jobs.len() >= 3,
        "the issue asks for three demo jobs, found {}",
        jobs.len()
    );
    jobs
}

/// A temporary folder with one job file in it.
fn job_file(name: &str, text: &str) -> tempfile::TempDir {
    let dir = tempfile::tempdir().expect("temp dir");
    std::fs::write(dir.path().join(name), text).expect("write job file");
    dir
}

/// 1-based line and column (in characters) of a byte offset, worked out
/// independently of the program's own helper.
fn line_col(text: &str, offset: usize) -> (usize, usize) {
    let before = &text[..offset];
    let line = before.matches('\n').count() + 1;
    let line_start = before.rfind('\n').map(|i| i + 1).unwrap_or(0);
    (line, before[line_start..].chars().count() + 1)
}

/// `file:LINE:COL` of the first occurrence of `needle` in `text`, moved
/// `skip` bytes into it (to point inside a value).
fn pos_of(file: &str, text: &str, needle: &str, skip: usize) -> String {
    let at = text
        .find(needle)
        .unwrap_or_else(|| panic!("{needle:?} is not in the test text"))
        + skip;
    let (l, c) = line_col(text, at);
    format!("{file}:{l}:{c}")
}

/// The `file:LINE:COL` strings miette prints, one per problem, in order.
fn reported_positions(stderr: &str, file: &str) -> Vec<String> {
    let marker = format!("[{file}:");
    stderr
        .match_indices(&marker)
        .map(|(i, _)| {
            let rest = &stderr[i + 1..];
            rest[..rest.find(']').expect("closing bracket")].to_string()
        })
        .collect()
}

fn no_ansi(what: &str, s: &str) {
    assert!(
        !s.contains('\u{1b}'),
        "{what} holds ANSI escape sequences:\n{s}"
    );
}

/// A small valid job, with a hole for extra circuit facts and one for the
/// readings of the single measurement set.
fn small_job(circuit: &str, readings: &str) -> String {
    format!(
        r#"job-format 1
job id="T-0001" received="2026-03-02" technician="Bench"
unit make="Testmake" model="Testmodel"
mains nominal="120V" frequency="60Hz"
valves {{
    valve V1 type="12AX7" role=preamp
    valve V3 type=EL84 role=output
    valve V4 type=EL84 role=output
}}
circuit {{
    bias cathode
{circuit}
}}
measurements "as found" mains="120V" {{
{readings}
}}
"#
    )
}

const GOOD_CIRCUIT: &str = r#"    cathode-resistor R24 value="130" rating="5W" valves="V3 V4""#;
const GOOD_READINGS: &str = r#"    valve V3 plate="300V" cathode="10V"
    valve V4 plate="300V" cathode="10V""#;

// ----- demo jobs ------------------------------------------------------------

#[test]
fn every_demo_job_passes_check() {
    for job in demo_jobs() {
        let o = ampreport().arg("check").arg(&job).output().expect("runs");
        assert_eq!(
            code(&o),
            0,
            "check {} failed:\n{}",
            job.display(),
            stderr(&o)
        );
        let out = stdout(&o);
        assert!(
            out.contains("Valves"),
            "check {} printed no valve table:\n{out}",
            job.display()
        );
        assert!(
            out.contains("as found") && out.contains("as left"),
            "check {} lacks a set:\n{out}",
            job.display()
        );
        // A demo job decodes cleanly: no error diagnostics on stderr.
        assert!(
            !stderr(&o).contains("Error:"),
            "check {} printed errors:\n{}",
            job.display(),
            stderr(&o)
        );
    }
}

#[test]
fn calc_json_holds_schema_3_and_plate_dissipation_for_every_output_valve() {
    for job in demo_jobs() {
        let o = ampreport()
            .args(["calc", "--json"])
            .arg(&job)
            .output()
            .expect("runs");
        assert_eq!(
            code(&o),
            0,
            "calc {} failed:\n{}",
            job.display(),
            stderr(&o)
        );
        let text = stdout(&o);
        assert!(
            text.trim_start().starts_with("{\n  \"schema\": 3"),
            "{} does not start with \"schema\": 3",
            job.display()
        );
        let v: Value = serde_json::from_str(&text)
            .unwrap_or_else(|e| panic!("{}: not JSON: {e}", job.display()));
        assert_eq!(v["schema"], 3);

        // The output valves the job file lists, read from the file itself.
        let source = std::fs::read_to_string(&job).expect("read demo");
        let outputs: Vec<&str> = source
            .lines()
            .map(str::trim)
            .filter(|l| l.starts_with("valve ") && l.contains("role=output"))
            .filter_map(|l| l.split_whitespace().nth(1))
            .collect();
        assert!(
            !outputs.is_empty(),
            "{} lists no output valves",
            job.display()
        );

        let sets = v["sets"].as_array().expect("sets");
        assert!(sets.len() >= 2, "{}: as found and as left", job.display());
        for set in sets {
            let valves = set["valves"].as_array().expect("valves");
            for pos in &outputs {
                let valve = valves
                    .iter()
                    .find(|x| x["position"] == *pos)
                    .unwrap_or_else(|| {
                        panic!(
                            "{}: set {} has no figures for {pos}",
                            job.display(),
                            set["label"]
                        )
                    });
                assert_eq!(valve["is_output"], true);
                let w = valve["plate_dissipation_w"]
                    .as_f64()
                    .unwrap_or_else(|| panic!("{pos}: no plate_dissipation_w"));
                let pct = valve["plate_dissipation_pct"]
                    .as_f64()
                    .unwrap_or_else(|| panic!("{pos}: no plate_dissipation_pct"));
                let max = valve["plate_dissipation_max_w"]
                    .as_f64()
                    .expect("plate_dissipation_max_w");
                assert!(w > 0.0 && w < max * 2.0, "{pos}: implausible {w} W");
                // Percent of rating = P / Pmax × 100 (definition).
                assert!(
                    (pct - w / max * 100.0).abs() < 1e-3,
                    "{pos}: {pct} % is not {w} W of {max} W"
                );
            }
        }
    }
}

#[test]
fn strict_judges_the_final_set_and_strict_all_every_set() {
    let job = demo_dir().join("combo-el84-cathode.kdl");
    // The demo's "as found" set has the pair over its rating; "as left",
    // the final set, has nothing over.
    let calc = ampreport()
        .args(["calc", "--json"])
        .arg(&job)
        .output()
        .expect("runs");
    let v: Value = serde_json::from_str(&stdout(&calc)).expect("json");
    assert_eq!(v["final_set"], "as left");
    let overs: Vec<&Value> = v["warnings"]
        .as_array()
        .expect("warnings")
        .iter()
        .filter(|w| w["status"] == "over")
        .collect();
    assert!(
        !overs.is_empty(),
        "the cathode-bias demo should have an over"
    );
    assert!(
        overs
            .iter()
            .all(|w| w["set"] == "as found" && w["in_final_set"] == false),
        "{overs:?}"
    );

    let o = ampreport()
        .args(["check", "--strict"])
        .arg(&job)
        .output()
        .expect("runs");
    assert_eq!(
        code(&o),
        0,
        "an as-found-only over does not fail --strict: {}",
        stderr(&o)
    );
    let o = ampreport()
        .args(["check", "--strict=final"])
        .arg(&job)
        .output()
        .expect("runs");
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let o = ampreport()
        .args(["check", "--strict=all"])
        .arg(&job)
        .output()
        .expect("runs");
    assert_eq!(
        code(&o),
        4,
        "--strict=all keeps judging every set: {}",
        stderr(&o)
    );
    let o = ampreport().arg("check").arg(&job).output().expect("runs");
    assert_eq!(code(&o), 0);
    let o = ampreport()
        .args(["check", "--strict=some"])
        .arg(&job)
        .output()
        .expect("runs");
    assert_eq!(
        code(&o),
        2,
        "an unknown --strict value is a command-line error"
    );
}

#[test]
fn strict_exits_0_when_nothing_is_over() {
    let dir = job_file("fine.kdl", &small_job(GOOD_CIRCUIT, GOOD_READINGS));
    // 10 V / (2 × 130 Ω) = 38.5 mA; (300 − 10) V × 38.5 mA = 11.15 W: 93 % of 12 W, a caution, not an over.
    let o = run_in(dir.path(), &["check", "--strict", "fine.kdl"]);
    assert_eq!(code(&o), 0, "{}\n{}", stdout(&o), stderr(&o));
}

/// A job whose final set has the EL84 pair over its plate rating:
/// 12 V / (2 × 100 Ω) = 60 mA; (280 − 12) V × 60 mA = 16.1 W, 134 % of the
/// 12 W rating (EL84 Pa max 12 W, from memory of manufacturer data). The
/// plate voltage, 280 V × 1.05 = 294 V at high line, stays under the 300 V
/// maximum.
fn over_in_the_final_set(accepted: &str) -> String {
    format!(
        r#"{}
measurements "as left" mains="120V" {{
    valve V3 plate="280V" cathode="12V"
    valve V4 plate="280V" cathode="12V"
    circuit {{
        cathode-resistor R24 value="100" rating="5W" valves="V3 V4"
    }}
}}
{accepted}
"#,
        small_job(GOOD_CIRCUIT, GOOD_READINGS)
    )
}

#[test]
fn an_un_accepted_over_in_the_final_set_fails_strict() {
    let dir = job_file("hot.kdl", &over_in_the_final_set(""));
    let o = run_in(dir.path(), &["check", "--strict", "hot.kdl"]);
    assert_eq!(code(&o), 4, "{}\n{}", stdout(&o), stderr(&o));
}

#[test]
fn accepted_findings_do_not_fail_strict_and_keep_their_status() {
    let accepted = r#"accepted by="Bench" date="2026-03-04" {
    valve V3 check=plate-dissipation reason="Customer wants it hot; told of the shorter valve life"
    valve V4 set="as left" reason="Same as V3"
}"#;
    let dir = job_file("hot.kdl", &over_in_the_final_set(accepted));
    let o = run_in(dir.path(), &["check", "--strict", "hot.kdl"]);
    assert_eq!(code(&o), 0, "{}\n{}", stdout(&o), stderr(&o));
    assert!(
        stdout(&o).contains("Customer wants it hot"),
        "{}",
        stdout(&o)
    );
    // --strict=all still counts the as-found figures, which were not over.
    let o = run_in(dir.path(), &["check", "--strict=all", "hot.kdl"]);
    assert_eq!(code(&o), 0, "{}\n{}", stdout(&o), stderr(&o));

    let o = run_in(dir.path(), &["calc", "--json", "hot.kdl"]);
    let v: Value = serde_json::from_str(&stdout(&o)).expect("json");
    let left = &v["sets"][1];
    assert_eq!(left["is_final"], true);
    let v3 = &left["valves"][0];
    assert_eq!(v3["position"], "V3");
    // The figure keeps its status; only the open status changes.
    assert_eq!(v3["status"], "over");
    assert_eq!(v3["open_status"], "ok");
    let check = v3["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["check"] == "plate_dissipation")
        .expect("plate check");
    assert_eq!(check["status"], "over");
    assert_eq!(check["accepted"], true);
    assert_eq!(
        check["accepted_reason"],
        "Customer wants it hot; told of the shorter valve life"
    );
    assert_eq!(check["accepted_by"], "Bench");
    assert_eq!(check["accepted_date"], "2026-03-04");
    // V3's acceptance names no set, so it covers the as-found caution
    // (93 %) too; V4's names "as left", so V4's as-found caution stays open.
    let found = &v["sets"][0]["valves"];
    let plate_check = |valve: &Value| {
        valve["checks"]
            .as_array()
            .unwrap()
            .iter()
            .find(|c| c["check"] == "plate_dissipation")
            .cloned()
            .expect("plate check")
    };
    assert_eq!(found[0]["position"], "V3");
    assert_eq!(plate_check(&found[0])["status"], "caution");
    assert_eq!(plate_check(&found[0])["accepted"], true);
    assert_eq!(found[1]["position"], "V4");
    assert_eq!(plate_check(&found[1])["status"], "caution");
    assert_eq!(plate_check(&found[1])["accepted"], false);
    // The panel judges the final set: the output valves read accepted, not over.
    let glance = &v["at_a_glance"][0];
    assert_eq!(glance["family"], "output_valves");
    assert_eq!(glance["status"], "ok");
    assert_eq!(glance["accepted"].as_array().unwrap().len(), 2);
}

#[test]
fn an_acceptance_that_names_nothing_is_an_error_with_a_suggestion() {
    let accepted = r#"accepted by="Bench" date="2026-03-04" {
    valve V33 reason="typo"
    part R2 reason="typo"
    valve V3 set="as lfet" reason="typo"
    valve V4 check=plate-disipation reason="typo"
}"#;
    let text = over_in_the_final_set(accepted);
    let dir = job_file("bad.kdl", &text);
    let o = run_in(dir.path(), &["check", "bad.kdl"]);
    assert_eq!(code(&o), 1, "{}", stderr(&o));
    let err = stderr(&o);
    assert_eq!(
        reported_positions(&err, "bad.kdl"),
        [
            pos_of("bad.kdl", &text, "V33", 0),
            pos_of("bad.kdl", &text, "R2 ", 0),
            pos_of("bad.kdl", &text, "\"as lfet\"", 0),
            pos_of("bad.kdl", &text, "plate-disipation", 0),
        ],
        "{err}"
    );
    assert!(err.contains("did you mean `V3`"), "{err}");
    assert!(err.contains("did you mean `R24`"), "{err}");
    assert!(err.contains("the acceptance names part R2,"), "{err}");
    assert!(err.contains("did you mean `as left`"), "{err}");
    assert!(err.contains("did you mean `plate-dissipation`"), "{err}");
}

#[test]
fn two_final_sets_are_an_error_and_a_marked_final_set_is_judged() {
    let mut text = over_in_the_final_set("");
    // Mark "as found" final: the over in "as left" no longer fails --strict.
    text = text.replace(
        r#"measurements "as found" mains="120V""#,
        r#"measurements "as found" mains="120V" final=#true"#,
    );
    let dir = job_file("f.kdl", &text);
    let o = run_in(dir.path(), &["check", "--strict", "f.kdl"]);
    assert_eq!(code(&o), 0, "{}\n{}", stdout(&o), stderr(&o));
    let two = text.replace(
        r#"measurements "as left" mains="120V""#,
        r#"measurements "as left" mains="120V" final=#true"#,
    );
    let dir = job_file("two.kdl", &two);
    let o = run_in(dir.path(), &["check", "two.kdl"]);
    assert_eq!(code(&o), 1);
    let at = two.rfind("final=#true").unwrap();
    assert!(
        stderr(&o).contains(&format!("two.kdl:{}", line_col(&two, at).0)),
        "{}",
        stderr(&o)
    );
}

#[test]
fn each_completeness_warning_is_at_its_line() {
    let text = r#"job-format 1
job id="T-0002" technician="Bench" completed="2026-03-05"
unit make="Testmake" model="Testmodel"
mains nominal="120V"
valves {
    valve V3 type=EL84 role=output
    valve V4 type=EL84 role=output
}
circuit {
    bias cathode
    cathode-resistor R24 value="130" rating="5W" valves="V3 V4"
    node B+1 chart="300V"
    node B+2 chart="280V"
    dropper R1 value="1k" rating="2W" from=B+1 to=B+2
}
measurements "as found" mains="120V" {
    node B+1 "300V"
    node B+2 "280V"
    valve V3 plate="290V" cathode="10V"
    valve V4 plate="290V" cathode="10V"
    heater "6.3V"
}
measurements "as left" mains="120V" {
    node B+1 "300V"
    node B2 "280V"
    valve V3 plate="290V" cathode="10V"
}
"#;
    let dir = job_file("gaps.kdl", text);
    let o = run_in(dir.path(), &["check", "gaps.kdl"]);
    assert_eq!(code(&o), 0, "warnings only: {}", stderr(&o));
    let err = stderr(&o);
    let as_found = text.find(r#"measurements "as found""#).unwrap();
    let at = |needle: &str, from: usize| {
        let i = text[from..].find(needle).unwrap() + from;
        let (l, c) = line_col(text, i);
        format!("gaps.kdl:{l}:{c}")
    };
    let as_left = text.find(r#"measurements "as left""#).unwrap();
    assert_eq!(
        reported_positions(&err, "gaps.kdl"),
        [
            // Read as found, not as left: B+2, V4 and the heater.
            at("B+2 \"280V\"", as_found),
            at("V4 plate", as_found),
            at("\"6.3V\"", as_found),
            // A name the circuit does not declare, close to one it does.
            at("B2", as_left),
        ],
        "{err}"
    );
    assert!(
        err.contains("V4 is not measured in “as left”, the final set (it was in “as found”)"),
        "{err}"
    );
    assert!(
        err.contains("node B2 in “as left” is not declared"),
        "{err}"
    );
    assert!(err.contains("did you mean `B+2`?"), "{err}");
    // The dropper between B+1 and B+2 says why it is not checked as left,
    // instead of vanishing; the missing valve is an open finding as left.
    let out = stdout(&o);
    assert!(out.contains("not checked (B+2 not measured)"), "{out}");
    assert!(
        out.contains("V4 (EL84): V4 is not measured in “as left”, the final set"),
        "{out}"
    );
}

#[test]
fn an_over_range_insulation_reading_and_the_other_new_set_lines() {
    let extra = r#"parts {
    part what="Mains cord" was="two-wire" now="three-wire, grounded" reason="No earth"
    part R24 what="cathode resistor" was="130 Ω 2 W" now="130 Ω 5 W"
}
safety class=I {
    insulation ">500M" test-voltage="500V" minimum="1M"
    earth-continuity "0.05R" limit="0.1R"
}
"#;
    let readings = format!(
        "{GOOD_READINGS}\n    bias-control \"fully counter-clockwise\" label=\"V3, V4\"\n    warm-up {{\n        valve V3 after=\"30s\" cathode=\"6V\"\n        valve V3 after=\"5min\" cathode=\"9V\"\n    }}"
    );
    let text = format!("{}{extra}", small_job(GOOD_CIRCUIT, &readings));
    let dir = job_file("more.kdl", &text);
    let o = run_in(dir.path(), &["check", "more.kdl"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let out = stdout(&o);
    assert!(
        out.contains("Bias control V3, V4: fully counter-clockwise"),
        "{out}"
    );
    assert!(out.contains("Mains cord"), "{out}");
    let o = run_in(dir.path(), &["calc", "--json", "more.kdl"]);
    let v: Value = serde_json::from_str(&stdout(&o)).expect("json");
    let ins = &v["safety"][0];
    assert_eq!(ins["test"], "insulation");
    assert_eq!(ins["measured"], "> 500 MΩ");
    assert_eq!(ins["measured_value"], 500e6);
    assert_eq!(ins["passed"], true);
    // Warm-up: 6 V / (2 × 130 Ω) = 23.1 mA per valve after 30 s (Ohm's law, textbook; matched pair).
    let w = &v["sets"][0]["warm_up"][0];
    assert!((w["minutes"].as_f64().unwrap() - 0.5).abs() < 1e-9);
    assert!((w["current_ma"].as_f64().unwrap() - 6.0 / 260.0 * 1e3).abs() < 1e-3);

    // A "more than" reading on another test is an error at the `>`, and a
    // warm-up line without its time is an error at that line.
    let bad = text
        .replace(
            r#"earth-continuity "0.05R""#,
            r#"earth-continuity ">0.05R""#,
        )
        .replace(
            r#"valve V3 after="5min" cathode="9V""#,
            r#"valve V3 cathode="9V""#,
        );
    let dir = job_file("bad.kdl", &bad);
    let o = run_in(dir.path(), &["check", "bad.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    let warm = bad.find("valve V3 cathode=\"9V\"").unwrap();
    let (wl, wc) = line_col(&bad, warm);
    let arrow = bad.find("\">0.05R").unwrap() + 1;
    let (al, ac) = line_col(&bad, arrow);
    assert_eq!(
        reported_positions(&err, "bad.kdl"),
        [format!("bad.kdl:{wl}:{wc}"), format!("bad.kdl:{al}:{ac}")],
        "{err}"
    );
    assert!(
        err.contains("a warm-up reading needs the time since power-on"),
        "{err}"
    );
    assert!(err.contains("takes no over-range reading"), "{err}");
}

#[test]
fn a_bench_finding_can_be_accepted_for_one_channel() {
    // 8 V rms into 8 Ω: P = V²/R = 8 W (Joule's law, textbook), 53 % of the
    // rated 15 W: under the 80 % guide (common practice), a caution.
    let text = small_job(
        GOOD_CIRCUIT,
        &format!(
            "{GOOD_READINGS}\n    output-power rms=\"8V\" load=\"8R\" at=clipping channel=\"clean\""
        ),
    )
    .replace(
        r#"model="Testmodel""#,
        r#"model="Testmodel" rated-power="15W""#,
    );
    let accepted = r#"accepted by="Bench" date="2026-03-04" {
    bench output-power channel="clean" reason="Original output transformer, tired but the customer keeps it"
}
"#;
    let dir = job_file("bench.kdl", &format!("{text}{accepted}"));
    let o = run_in(dir.path(), &["calc", "--json", "bench.kdl"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let v: Value = serde_json::from_str(&stdout(&o)).expect("json");
    let p = &v["sets"][0]["bench"]["output_power"][0];
    assert!((p["output_power_w"].as_f64().unwrap() - 8.0).abs() < 1e-9);
    assert_eq!(p["status"], "caution");
    assert_eq!(p["accepted"], true);
    // A channel the bench tests do not name is an error with a suggestion.
    let typo = accepted.replace(r#"channel="clean""#, r#"channel="claen""#);
    let dir = job_file("typo.kdl", &format!("{text}{typo}"));
    let o = run_in(dir.path(), &["check", "typo.kdl"]);
    assert_eq!(code(&o), 1);
    assert!(
        stderr(&o).contains("did you mean `clean`"),
        "{}",
        stderr(&o)
    );
}

// ----- tubes ------------------------------------------------------------------

#[test]
fn tubes_lists_at_least_40_types() {
    let o = ampreport().arg("tubes").output().expect("runs");
    assert_eq!(code(&o), 0);
    let out = stdout(&o);
    let summary = out
        .lines()
        .find(|l| l.contains(" types."))
        .expect("a closing count line");
    let n: usize = summary
        .split_whitespace()
        .next()
        .and_then(|n| n.parse().ok())
        .expect("a number of types");
    assert!(n >= 40, "only {n} types");
    // The table really has that many rows: one per type after the header.
    let rows = out
        .lines()
        .skip(1)
        .take_while(|l| !l.trim().is_empty())
        .count();
    assert_eq!(rows, n, "{out}");
    for t in ["EL84", "6V6GT", "EL34", "12AX7", "5Y3GT", "EZ81", "KT88"] {
        assert!(
            out.lines().any(|l| l.split_whitespace().next() == Some(t)),
            "{t} missing from the list"
        );
    }
}

#[test]
fn tubes_el84_shows_its_source_note() {
    let table = ampreport::ratings::RatingsTable::builtin();
    let el84 = table.lookup("EL84").expect("EL84 is built in");
    assert!(!el84.source.is_empty());
    let o = ampreport().args(["tubes", "EL84"]).output().expect("runs");
    assert_eq!(code(&o), 0);
    let out = stdout(&o);
    assert!(out.starts_with("EL84"), "{out}");
    let source_line = out
        .lines()
        .find(|l| l.trim_start().starts_with("source"))
        .expect("a source line");
    assert!(
        source_line.contains(&el84.source),
        "{source_line:?} does not carry {:?}",
        el84.source
    );
    // Datasheet maxima, from memory of manufacturer data: EL84 Pa(max) 12 W, Va(max) 300 V.
    assert!(out.contains("12 W") && out.contains("300 V"), "{out}");
}

#[test]
fn tubes_finds_el84_by_its_equivalent_6bq5() {
    let o = ampreport().args(["tubes", "6BQ5"]).output().expect("runs");
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let out = stdout(&o);
    assert!(
        out.lines().next().is_some_and(|l| l.starts_with("EL84 ")),
        "{out}"
    );
}

#[test]
fn tubes_with_an_unknown_type_fails_and_suggests() {
    let o = ampreport().args(["tubes", "EL8"]).output().expect("runs");
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(
        err.contains("EL8") && err.contains("did you mean") && err.contains("EL84"),
        "{err}"
    );
    assert!(stdout(&o).is_empty());
}

// ----- init -------------------------------------------------------------------

#[test]
fn init_writes_a_skeleton_that_passes_check() {
    let dir = tempfile::tempdir().expect("temp dir");
    let o = run_in(dir.path(), &["init", "new-job.kdl"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let written =
        std::fs::read_to_string(dir.path().join("new-job.kdl")).expect("the skeleton is written");
    assert!(written.contains("job-format 1"));
    let o = run_in(dir.path(), &["check", "new-job.kdl"]);
    assert_eq!(
        code(&o),
        0,
        "the skeleton does not pass check:\n{}",
        stderr(&o)
    );
    assert!(!stderr(&o).contains("Error:"), "{}", stderr(&o));
    let o = run_in(dir.path(), &["calc", "--json", "new-job.kdl"]);
    assert_eq!(code(&o), 0);
    let v: Value = serde_json::from_str(&stdout(&o)).expect("json");
    assert_eq!(v["schema"], 3);
    // No temporary files are left beside it.
    let names: Vec<_> = std::fs::read_dir(dir.path())
        .expect("dir")
        .map(|e| e.expect("entry").file_name())
        .collect();
    assert_eq!(names, ["new-job.kdl"]);
}

#[test]
fn init_refuses_to_replace_an_existing_file() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("job.kdl");
    std::fs::write(&path, "my own work\n").expect("write");
    let o = run_in(dir.path(), &["init", "job.kdl"]);
    assert_ne!(code(&o), 0);
    assert!(stderr(&o).contains("already exists"), "{}", stderr(&o));
    assert_eq!(
        std::fs::read_to_string(&path).expect("read"),
        "my own work\n"
    );
}

// ----- broken job files -----------------------------------------------------------

#[test]
fn four_different_problems_are_reported_in_one_run_each_at_its_own_place() {
    let text = r#"job-format 1
job id="T-0003" received="02.11.2026" technician="Bench"
unit make="Testmake" model="Testmodel"
mains nominal="120V" frequncy="60Hz"
valves {
    valve V3 type=EL84 role=output
}
circuit {
    cathode-resistor R24 value="130" rating="5W" valves="V3"
}
gadget "left over from an old format"
measurements "as found" mains="120V" {
    valve V3 plate="38.5mA" cathode="10V"
}
"#;
    let dir = job_file("broken.kdl", text);
    let o = run_in(dir.path(), &["check", "broken.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(
        stdout(&o).is_empty(),
        "nothing is printed on stdout for an invalid job"
    );

    let expected = [
        // The malformed date: the whole value, from its opening quote.
        (
            pos_of("broken.kdl", text, "\"02.11.2026\"", 0),
            "job::bad-date",
        ),
        // The misspelt property: its name.
        (
            pos_of("broken.kdl", text, "frequncy", 0),
            "job::unknown-property",
        ),
        // The unknown node: its name.
        (pos_of("broken.kdl", text, "gadget", 0), "job::unknown-node"),
        // The wrong unit: the "A" after "38.5m" inside the quotes.
        (
            pos_of(
                "broken.kdl",
                text,
                "plate=\"38.5mA\"",
                "plate=\"38.5m".len(),
            ),
            "job::bad-value",
        ),
    ];
    let reported = reported_positions(&err, "broken.kdl");
    let want: Vec<&str> = expected.iter().map(|(p, _)| p.as_str()).collect();
    assert_eq!(reported, want, "stderr:\n{err}");
    // Each on its own line.
    let mut lines: Vec<&str> = want
        .iter()
        .map(|p| p.split(':').nth(1).expect("line"))
        .collect();
    lines.dedup();
    assert_eq!(lines.len(), 4);
    for (_, code) in &expected {
        assert!(
            err.contains(&format!("ampreport::{code}")),
            "{code} missing:\n{err}"
        );
    }
    assert!(
        err.contains("4 problems stop this job file from being read"),
        "{err}"
    );
    assert!(err.contains("did you mean `frequency`?"), "{err}");
    assert!(
        err.contains("\"A\" is the unit of a current, but a voltage belongs here"),
        "{err}"
    );
}

#[test]
fn kdl_syntax_errors_point_at_the_broken_text() {
    // An unterminated string.
    let text = "job-format 1\njob id=\"T-0004\"\nunit make=\"Testmake\" model=\"Testmodel\nmains nominal=\"120V\"\n";
    let dir = job_file("syntax.kdl", text);
    let o = run_in(dir.path(), &["check", "syntax.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(
        err.contains("ampreport::job::syntax") && err.contains("KDL syntax"),
        "{err}"
    );
    assert_eq!(
        reported_positions(&err, "syntax.kdl"),
        [pos_of("syntax.kdl", text, "\"Testmodel", 0)],
        "{err}"
    );

    // A stray closing brace.
    let text = "job-format 1\njob id=\"T-0004\"\nunit make=\"Testmake\" model=\"Testmodel\" }\nmains nominal=\"120V\"\n";
    let dir = job_file("brace.kdl", text);
    let o = run_in(dir.path(), &["check", "brace.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert_eq!(
        reported_positions(&err, "brace.kdl"),
        [pos_of("brace.kdl", text, "}", 0)],
        "{err}"
    );

    // A block left open at the end: told once, at its `{`.
    let text = "job-format 1\njob id=\"T-0004\"\nunit make=\"Testmake\" model=\"Testmodel\" {\n    serial \"1\"\n";
    let dir = job_file("open.kdl", text);
    let o = run_in(dir.path(), &["check", "open.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert_eq!(
        reported_positions(&err, "open.kdl"),
        [pos_of("open.kdl", text, "{", 0)],
        "{err}"
    );

    // A unit written without quotes, the likeliest slip in this format.
    let text = "job-format 1\njob id=\"T-0004\"\nunit make=\"Testmake\" model=\"Testmodel\"\nmains nominal=120V\n";
    let dir = job_file("bare.kdl", text);
    let o = run_in(dir.path(), &["check", "bare.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert_eq!(
        reported_positions(&err, "bare.kdl"),
        [pos_of("bare.kdl", text, "120V", 0)],
        "{err}"
    );
    assert!(
        err.contains("\"120V\""),
        "the hint shows the quoted form:\n{err}"
    );
}

#[test]
fn an_unknown_valve_type_is_an_error_with_a_suggestion() {
    let text = small_job(GOOD_CIRCUIT, GOOD_READINGS)
        .replace("valve V4 type=EL84", "valve V4 type=\"EL48\"");
    let dir = job_file("type.kdl", &text);
    let o = run_in(dir.path(), &["check", "type.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(err.contains("ampreport::job::unknown-valve-type"), "{err}");
    assert!(err.contains("unknown valve type \"EL48\" at V4"), "{err}");
    assert!(
        err.contains("did you mean") && err.contains("EL84"),
        "{err}"
    );
    assert_eq!(
        reported_positions(&err, "type.kdl"),
        [pos_of("type.kdl", &text, "\"EL48\"", 0)],
        "{err}"
    );
}

#[test]
fn a_negative_resistance_is_an_error() {
    let circuit = r#"    cathode-resistor R24 value="-130" rating="5W" valves="V3 V4""#;
    let text = small_job(circuit, GOOD_READINGS);
    let dir = job_file("neg.kdl", &text);
    let o = run_in(dir.path(), &["check", "neg.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(err.contains("a resistance cannot be negative"), "{err}");
    assert_eq!(
        reported_positions(&err, "neg.kdl"),
        [pos_of("neg.kdl", &text, "\"-130\"", 0)],
        "{err}"
    );
}

#[test]
fn a_negative_plate_or_screen_voltage_is_an_error() {
    // Found by feeding `plate="-338V"`: it was taken, and the document
    // printed −130 % of the plate rating.
    let readings = r#"    valve V3 plate="-300V" cathode="10V"
    valve V4 plate="300V" screen="-290V" cathode="10V""#;
    let text = small_job(GOOD_CIRCUIT, readings);
    let dir = job_file("neg.kdl", &text);
    let o = run_in(dir.path(), &["check", "neg.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(
        err.contains("the plate voltage cannot be negative"),
        "{err}"
    );
    assert!(
        err.contains("the screen voltage cannot be negative"),
        "{err}"
    );
    assert_eq!(
        reported_positions(&err, "neg.kdl"),
        [
            pos_of("neg.kdl", &text, "\"-300V\"", 0),
            pos_of("neg.kdl", &text, "\"-290V\"", 0)
        ],
        "{err}"
    );
    // Zero is a state a valve can be found in (no supply reaches it).
    let text = small_job(
        GOOD_CIRCUIT,
        &GOOD_READINGS.replacen("plate=\"300V\"", "plate=\"0V\"", 1),
    );
    let dir = job_file("zero.kdl", &text);
    let o = run_in(dir.path(), &["check", "zero.kdl"]);
    assert!(!stderr(&o).contains("cannot be negative"), "{}", stderr(&o));
}

#[test]
fn a_negative_cathode_sense_or_primary_drop_reading_is_an_error() {
    // Found by negating each figure of the demo jobs in turn: these were
    // taken, and a negative sense voltage printed "idling cold (-77 % of
    // the plate rating)". A cathode, a sense resistor and a half primary
    // all carry the valve's current one way only, so a reading below zero
    // is the meter's leads the wrong way round.
    let circuit = r#"    cathode-resistor R24 value="130" rating="5W" valves="V3 V4"
    sense-resistor R40 value="1R" valve=V4
    half-primary resistance="100R" valves="V4""#;
    let readings = r#"    valve V3 plate="300V" cathode="-10V"
    valve V4 plate="300V" cathode="10V" sense="-30mV" primary-drop="-3V""#;
    let text = small_job(circuit, readings);
    let dir = job_file("neg.kdl", &text);
    let o = run_in(dir.path(), &["check", "neg.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(
        err.contains("unless the meter’s leads were the wrong way round"),
        "{err}"
    );
    for (words, value) in [
        ("the cathode voltage cannot be negative", "\"-10V\""),
        (
            "the voltage across the sense resistor cannot be negative",
            "\"-30mV\"",
        ),
        (
            "the drop across the half primary cannot be negative",
            "\"-3V\"",
        ),
    ] {
        assert!(err.contains(words), "{words}: {err}");
        assert!(
            reported_positions(&err, "neg.kdl").contains(&pos_of("neg.kdl", &text, value, 0)),
            "{value}: {err}"
        );
    }
    // Zero is still taken: a valve that draws nothing reads nothing.
    let zero = readings
        .replace("\"-10V\"", "\"0V\"")
        .replace("\"-30mV\"", "\"0mV\"")
        .replace("\"-3V\"", "\"0V\"");
    let text = small_job(circuit, &zero);
    let dir = job_file("zero.kdl", &text);
    let o = run_in(dir.path(), &["check", "zero.kdl"]);
    assert!(!stderr(&o).contains("cannot be negative"), "{}", stderr(&o));
}

#[test]
fn zero_mains_is_an_error() {
    let text = small_job(GOOD_CIRCUIT, GOOD_READINGS).replace("mains=\"120V\"", "mains=\"0V\"");
    let dir = job_file("zero.kdl", &text);
    let o = run_in(dir.path(), &["check", "zero.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(err.contains("the mains voltage cannot be zero"), "{err}");
    assert_eq!(
        reported_positions(&err, "zero.kdl"),
        [pos_of("zero.kdl", &text, "\"0V\"", 0)],
        "{err}"
    );

    // Zero nominal mains too.
    let text = small_job(GOOD_CIRCUIT, GOOD_READINGS).replace("nominal=\"120V\"", "nominal=0");
    let dir = job_file("zero-nominal.kdl", &text);
    let o = run_in(dir.path(), &["check", "zero-nominal.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(
        err.contains("the nominal mains voltage cannot be zero"),
        "{err}"
    );
    assert_eq!(
        reported_positions(&err, "zero-nominal.kdl"),
        [pos_of(
            "zero-nominal.kdl",
            &text,
            "nominal=0",
            "nominal=".len()
        )],
        "{err}"
    );
}

#[test]
fn implausible_values_are_warnings_and_the_job_still_passes() {
    let readings = r#"    valve V3 plate="1800V" cathode="10V"
    valve V4 plate="300V" cathode="10V""#;
    let text = small_job(GOOD_CIRCUIT, readings);
    let dir = job_file("odd.kdl", &text);
    let o = run_in(dir.path(), &["check", "odd.kdl"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let err = stderr(&o);
    assert!(
        err.contains("Warning: ampreport::job::implausible"),
        "{err}"
    );
    assert!(
        err.contains("unusually high for a valve amplifier"),
        "{err}"
    );
    assert!(!err.contains("Error:"), "{err}");
    assert_eq!(
        reported_positions(&err, "odd.kdl"),
        [pos_of("odd.kdl", &text, "\"1800V\"", 0)],
        "{err}"
    );
    // The figures are still derived.
    assert!(stdout(&o).contains("Valves"));
}

#[test]
fn an_unreadable_job_file_is_exit_1_and_a_bad_command_line_exit_2() {
    let dir = tempfile::tempdir().expect("temp dir");
    let o = run_in(dir.path(), &["check", "no-such-job.kdl"]);
    assert_eq!(code(&o), 1);
    assert!(stderr(&o).contains("no-such-job.kdl"));
    let o = run_in(dir.path(), &["check"]);
    assert_eq!(code(&o), 2);
    let o = run_in(dir.path(), &["no-such-command"]);
    assert_eq!(code(&o), 2);
}

// ----- colour -------------------------------------------------------------------

#[test]
fn no_ansi_escapes_when_not_a_terminal_or_with_no_color() {
    let demo = demo_dir().join("combo-6v6-fixed.kdl");
    let broken = job_file(
        "broken.kdl",
        &small_job(GOOD_CIRCUIT, GOOD_READINGS).replace("cathode=\"10V\"", "cathode=\"10mA\""),
    );
    for no_color in [false, true] {
        let mut c = ampreport();
        if no_color {
            c.env("NO_COLOR", "1");
        }
        let o = c.arg("check").arg(&demo).output().expect("runs");
        assert_eq!(code(&o), 0);
        no_ansi("check stdout", &stdout(&o));
        no_ansi("check stderr", &stderr(&o));

        let mut c = ampreport();
        if no_color {
            c.env("NO_COLOR", "1");
        }
        let o = c
            .current_dir(broken.path())
            .args(["check", "broken.kdl"])
            .output()
            .expect("runs");
        assert_eq!(code(&o), 1);
        assert!(stderr(&o).contains("broken.kdl:"), "{}", stderr(&o));
        no_ansi("diagnostics", &stderr(&o));
    }
}

#[test]
fn a_repeated_measurement_set_label_is_an_error_at_the_second_set() {
    let text = format!(
        "{}measurements \"as left\" mains=\"121V\" {{\n{GOOD_READINGS}\n}}\nmeasurements \"as found\" mains=\"119V\" {{\n{GOOD_READINGS}\n}}\n",
        small_job(GOOD_CIRCUIT, GOOD_READINGS)
    );
    let dir = job_file("sets.kdl", &text);
    let o = run_in(dir.path(), &["check", "sets.kdl"]);
    assert_eq!(code(&o), 1);
    let err = stderr(&o);
    assert!(
        err.contains("there are two measurement sets labelled \"as found\""),
        "{err}"
    );
    let second = text.rfind("measurements \"as found\"").expect("second set");
    let (l, c) = line_col(&text, second);
    assert_eq!(
        reported_positions(&err, "sets.kdl"),
        [format!("sets.kdl:{l}:{c}")],
        "{err}"
    );
}

/// Runs ampreport on a pseudo-terminal through `script` (util-linux or
/// bsdutils, on every Debian system); `None` where it cannot be run.
fn on_a_terminal(dir: &Path, args: &str, no_color: Option<&str>) -> Option<String> {
    let command = format!("{} {args}", env!("CARGO_BIN_EXE_ampreport"));
    let mut c = Command::new("script");
    c.current_dir(dir)
        .args(["-qec", &command, "/dev/null"])
        .env_remove("NO_COLOR");
    if let Some(v) = no_color {
        c.env("NO_COLOR", v);
    }
    let o = c.output().ok()?;
    o.status
        .success()
        .then(|| String::from_utf8_lossy(&o.stdout).into_owned())
}

#[test]
fn colour_on_a_terminal_unless_no_color_is_set() {
    let demo = demo_dir();
    let Some(plain) = on_a_terminal(&demo, "check combo-el84-cathode.kdl", None) else {
        eprintln!("skipped: `script` cannot give ampreport a terminal here");
        return;
    };
    assert!(
        plain.contains('\u{1b}'),
        "no colour on a terminal:\n{plain}"
    );
    let none = on_a_terminal(&demo, "check combo-el84-cathode.kdl", Some("1")).expect("runs");
    assert!(none.contains("as found"), "{none}");
    no_ansi("check on a terminal with NO_COLOR", &none);
    // NO_COLOR set but empty does not count (no-color.org).
    let empty = on_a_terminal(&demo, "check combo-el84-cathode.kdl", Some("")).expect("runs");
    assert!(empty.contains('\u{1b}'));
    // Diagnostics too.
    let broken = job_file(
        "broken.kdl",
        &small_job(GOOD_CIRCUIT, GOOD_READINGS).replace("cathode=\"10V\"", "cathode=\"10mA\""),
    );
    let command = format!(
        "{} check broken.kdl; exit 0",
        env!("CARGO_BIN_EXE_ampreport")
    );
    let o = Command::new("script")
        .current_dir(broken.path())
        .args(["-qec", &command, "/dev/null"])
        .env("NO_COLOR", "1")
        .output()
        .expect("script runs");
    let text = String::from_utf8_lossy(&o.stdout);
    assert!(text.contains("broken.kdl:"), "{text}");
    no_ansi("diagnostics on a terminal with NO_COLOR", &text);
}

// ----- archive-friendly JSON and photos --------------------------------------

#[test]
fn calc_json_is_the_same_bytes_from_the_job_folder_its_parent_and_root() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    for job in demo_jobs() {
        let name = job.file_name().unwrap().to_str().unwrap().to_string();
        let from_folder = run_in(&demo_dir(), &["calc", "--json", &name]);
        let from_parent = run_in(root, &["calc", "--json", &format!("jobs/{name}")]);
        let from_root = run_in(Path::new("/"), &["calc", "--json", job.to_str().unwrap()]);
        for o in [&from_folder, &from_parent, &from_root] {
            assert_eq!(code(o), 0, "{name}: {}", stderr(o));
        }
        assert_eq!(
            from_folder.stdout, from_parent.stdout,
            "{name}: folder vs parent"
        );
        assert_eq!(from_folder.stdout, from_root.stdout, "{name}: folder vs /");
        let v: Value = serde_json::from_slice(&from_root.stdout).unwrap();
        assert_eq!(v["job"]["source"], name.as_str());
        // The unit, the parts and the mods are carried, as the file has them.
        let text = std::fs::read_to_string(&job).unwrap();
        let make = text
            .split("make=\"")
            .nth(1)
            .unwrap()
            .split('"')
            .next()
            .unwrap();
        assert_eq!(v["unit"]["make"], make);
        // The children of a top-level block, read from the file's text.
        let children = |block: &str, child: &str| {
            text.lines()
                .skip_while(|l| *l != format!("{block} {{"))
                .take_while(|l| *l != "}")
                .filter(|l| l.starts_with(&format!("    {child} ")))
                .count()
        };
        let parts = children("parts", "part");
        assert_eq!(v["parts"].as_array().unwrap().len(), parts, "{name}");
        let mods = children("mods", "mod");
        assert_eq!(v["mods"].as_array().unwrap().len(), mods, "{name}");
        // The file's SHA-256 is the one of its bytes.
        use sha2::{Digest, Sha256};
        let digest: String = Sha256::digest(text.as_bytes())
            .iter()
            .map(|b| format!("{b:02x}"))
            .collect();
        assert_eq!(v["job"]["file_sha256"], digest.as_str());
    }
}

#[test]
fn a_bad_photo_is_reported_at_its_line_before_typst_is_needed() {
    let text = small_job(GOOD_CIRCUIT, GOOD_READINGS)
        + "photos {\n    photo \"photos/ok.png\"\n    photo \"../outside.png\" caption=\"x\"\n    photo \"/etc/hostname\"\n}\n";
    let dir = job_file("job.kdl", &text);
    std::fs::create_dir(dir.path().join("photos")).unwrap();
    std::fs::write(
        dir.path().join("photos/ok.png"),
        "plain text, not a picture",
    )
    .unwrap();
    // The typst named does not exist: the photos are checked first.
    let o = run_in(
        dir.path(),
        &[
            "render",
            "job.kdl",
            "--no-shop",
            "--typst",
            "/nonexistent/typst",
        ],
    );
    assert_eq!(code(&o), 1, "{}", stderr(&o));
    let err = stderr(&o);
    assert_eq!(
        reported_positions(&err, "job.kdl"),
        [
            pos_of("job.kdl", &text, "\"photos/ok.png\"", 0),
            pos_of("job.kdl", &text, "\"../outside.png\"", 0),
            pos_of("job.kdl", &text, "\"/etc/hostname\"", 0),
        ],
        "{err}"
    );
    assert!(err.contains("not a PNG or JPEG picture"), "{err}");
    assert!(err.contains("not a path inside the job's folder"), "{err}");
    assert!(err.contains("is an absolute path"), "{err}");
    assert!(!dir.path().join("job.pdf").exists());
}

// ----- new and init --repo -----------------------------------------------------

/// A job folder whose shop profile numbers jobs `T-{yymm}-{nn}`, holding
/// jobs numbered 03 and 07 this month and 99 last year.
fn numbered_folder() -> (tempfile::TempDir, String) {
    let dir = tempfile::tempdir().expect("temp dir");
    let shop = std::fs::read_to_string(demo_dir().join("shop.kdl"))
        .unwrap()
        .replace("logo \"larkmoor-logo.svg\"", "");
    assert!(shop.contains("job-numbers \"D-{yymm}-{nnn}\""));
    let shop = shop.replace("D-{yymm}-{nnn}", "T-{yymm}-{nn}");
    std::fs::write(dir.path().join("shop.kdl"), shop).unwrap();
    let period = chrono::Local::now().format("%y%m").to_string();
    let demo = std::fs::read_to_string(demo_dir().join("combo-6v6-fixed.kdl")).unwrap();
    let demo_id = "D-2611-022";
    assert!(demo.contains(demo_id));
    for (file, id) in [
        ("a.kdl", format!("T-{period}-03")),
        ("b.kdl", format!("T-{period}-07")),
        ("old.kdl", "T-0001-99".to_string()),
    ] {
        std::fs::write(dir.path().join(file), demo.replace(demo_id, &id)).unwrap();
    }
    (dir, period)
}

#[test]
fn new_continues_the_numbering_and_carries_the_unit_without_the_readings() {
    let (dir, period) = numbered_folder();
    let o = run_in(dir.path(), &["new", "--from", "a.kdl"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let id = format!("T-{period}-08");
    let path = dir.path().join(format!("{id}.kdl"));
    let text = std::fs::read_to_string(&path).expect("the new job file");
    let today = chrono::Local::now().format("%Y-%m-%d").to_string();
    assert!(
        text.contains(&format!("job id=\"{id}\" received=\"{today}\"")),
        "{text}"
    );
    // The unit, mains, line-up and circuit as the old job writes them.
    let old = std::fs::read_to_string(dir.path().join("a.kdl")).unwrap();
    let block = |name: &str| -> Vec<&str> {
        let mut lines = old
            .lines()
            .skip_while(|l| !l.starts_with(&format!("{name} ")));
        let first = lines.next().unwrap();
        let mut out = vec![first];
        if first.ends_with('{') {
            out.extend(lines.take_while(|l| *l != "}"));
        }
        out
    };
    let carried: Vec<&str> = ["unit", "mains", "valves", "circuit"]
        .iter()
        .flat_map(|b| block(b))
        .collect();
    assert!(carried.len() > 20, "{carried:?}");
    for line in carried {
        assert!(text.contains(line), "{line} not carried over");
    }
    // Nothing of the old service: readings, parts, mods, customer,
    // charges, notes, photos, acceptances, safety tests.
    for node in [
        "measurements",
        "parts",
        "mods",
        "customer",
        "charges",
        "notes",
        "photos",
        "accepted",
        "safety",
        "complaint",
        "findings",
        "work",
    ] {
        assert!(
            !text.lines().any(|l| l.starts_with(&format!("{node} "))),
            "{node} carried over:\n{text}"
        );
    }
    assert!(!text.contains("Emeka Lindqvist") && !text.contains("sense=\""));
    let o = run_in(dir.path(), &["check", &format!("{id}.kdl")]);
    assert_eq!(
        code(&o),
        0,
        "the new job does not pass check: {}",
        stderr(&o)
    );

    // Without --from: the skeleton, numbered next.
    let o = run_in(dir.path(), &["new"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let next = std::fs::read_to_string(dir.path().join(format!("T-{period}-09.kdl"))).unwrap();
    assert!(next.contains(&format!("job id=\"T-{period}-09\"")));
    assert_eq!(
        code(&run_in(
            dir.path(),
            &["check", &format!("T-{period}-09.kdl")]
        )),
        0
    );
}

#[test]
fn new_never_writes_over_a_file() {
    let (dir, period) = numbered_folder();
    // A file already has the next number's name (its own id unreadable).
    let taken = dir.path().join(format!("T-{period}-08.kdl"));
    std::fs::write(&taken, "not a job at all {").unwrap();
    let o = run_in(dir.path(), &["new", "--dir", "."]);
    assert_eq!(code(&o), 1, "{}", stderr(&o));
    assert!(
        stderr(&o).contains("never replaces a file"),
        "{}",
        stderr(&o)
    );
    assert_eq!(
        std::fs::read_to_string(&taken).unwrap(),
        "not a job at all {"
    );
    // A bad pattern in the shop profile is an error at its line.
    let shop = dir.path().join("shop.kdl");
    let text = std::fs::read_to_string(&shop)
        .unwrap()
        .replace("T-{yymm}-{nn}", "T-{week}-{nn}");
    std::fs::write(&shop, &text).unwrap();
    let o = run_in(dir.path(), &["new"]);
    assert_eq!(code(&o), 1);
    let full = shop.display().to_string();
    assert_eq!(
        reported_positions(&stderr(&o), &full).first(),
        Some(&pos_of(&full, &text, "\"T-{week}", 0)),
        "{}",
        stderr(&o)
    );
}

#[test]
fn init_repo_writes_the_git_files_once() {
    let dir = tempfile::tempdir().expect("temp dir");
    let o = run_in(dir.path(), &["init", "--repo", "jobs"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let attributes = std::fs::read_to_string(dir.path().join("jobs/.gitattributes")).unwrap();
    let ignore = std::fs::read_to_string(dir.path().join("jobs/.gitignore")).unwrap();
    assert!(
        attributes.lines().any(|l| l == "*.pdf binary"),
        "{attributes}"
    );
    assert!(
        attributes.lines().any(|l| l == "*.kdl text eol=lf"),
        "{attributes}"
    );
    assert!(ignore.lines().any(|l| l == "*.pdf"), "{ignore}");
    assert!(ignore.lines().any(|l| l == "*.listing.md"), "{ignore}");
    // git reads them as meant, where git is installed.
    if let Ok(out) = Command::new("git")
        .current_dir(dir.path().join("jobs"))
        .args(["-c", "init.defaultBranch=main", "init", "-q"])
        .output()
        && out.status.success()
    {
        let check = |args: &[&str]| {
            let o = Command::new("git")
                .current_dir(dir.path().join("jobs"))
                .args(args)
                .output()
                .unwrap();
            String::from_utf8_lossy(&o.stdout).into_owned()
        };
        assert_eq!(
            check(&["check-attr", "diff", "a.pdf"]),
            "a.pdf: diff: unset\n"
        );
        assert_eq!(
            check(&["check-ignore", "a.pdf", "a.listing.md", "a.kdl"]),
            "a.pdf\na.listing.md\n"
        );
    }
    // Never again over the same files.
    std::fs::write(dir.path().join("jobs/.gitignore"), "mine\n").unwrap();
    let o = run_in(dir.path(), &["init", "--repo", "jobs"]);
    assert_eq!(code(&o), 1);
    assert_eq!(
        std::fs::read_to_string(dir.path().join("jobs/.gitignore")).unwrap(),
        "mine\n"
    );
}

#[test]
fn a_shop_profile_or_ratings_file_given_as_a_job_gets_one_error_saying_what_it_is() {
    let shop = "// a shop profile\nshop-format 1\nshop \"Test Bench\"\ntechnician \"A. Tester\"\n";
    let ratings = "ratings-format 1\nvalve XT1 {\n    plate-dissipation \"10W\"\n}\n";
    for (name, text, says) in [
        ("bench.kdl", shop, "this is a shop profile, not a job file"),
        (
            "tubes.kdl",
            ratings,
            "this is a ratings file, not a job file",
        ),
    ] {
        let dir = job_file(name, text);
        for command in ["check", "render"] {
            let o = run_in(dir.path(), &[command, name]);
            assert_eq!(code(&o), 1, "{command} {name}");
            let err = stderr(&o);
            assert_eq!(
                err.matches("ampreport::job::not-a-job-file").count(),
                1,
                "{command} {name}: {err}"
            );
            assert!(err.contains(says), "{command} {name}: {err}");
            assert!(!err.contains("unknown-node"), "{command} {name}: {err}");
            assert_eq!(
                reported_positions(&err, name),
                [pos_of(
                    name,
                    text,
                    text.lines().find(|l| !l.starts_with("//")).unwrap(),
                    0
                )],
                "{command} {name}: {err}"
            );
            assert!(!dir.path().join(name.replace(".kdl", ".pdf")).exists());
        }
    }
}

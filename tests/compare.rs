//! `ampreport compare`, through the real binary: between the first and the
//! final set of each demo job, and between two versions of a job file,
//! every changed figure is listed with the values `calc --json` gives for
//! each side, and nothing that did not change is. The expected changes are
//! worked out here from `calc --json`, never written down.

mod support;

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

use ampreport::report::compare::SET_TABLES;
use serde_json::Value;

fn ampreport(dir: &Path, args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_ampreport"))
        .current_dir(dir)
        .args(args)
        .env(
            "XDG_CONFIG_HOME",
            Path::new(env!("CARGO_TARGET_TMPDIR")).join("no-config-home"),
        )
        .output()
        .expect("ampreport runs")
}

fn ok_json(out: &Output, what: &str) -> Value {
    assert!(
        out.status.success(),
        "{what}: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).unwrap_or_else(|e| panic!("{what}: {e}"))
}

fn jobs_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("jobs")
}

const DEMO_JOBS: [&str; 4] = [
    "combo-el84-cathode.kdl",
    "combo-6v6-fixed.kdl",
    "head-el34-quad.kdl",
    "stereo-el84-hifi.kdl",
];

/// A row's name as compare gives it: its channel in front, when it has one.
fn subject(row: &Value, id: &str) -> String {
    let name = row[id].as_str().map(str::to_string).unwrap_or_default();
    match row["channel"].as_str() {
        Some(c) => format!("{c} {name}"),
        None => name,
    }
}

/// Every (table, subject, figure, old, new) that differs between two sets
/// of `calc --json`, found from the JSON alone.
fn expected(old: &Value, new: &Value) -> Vec<(String, String, String, Value, Value)> {
    let mut out = Vec::new();
    if old["mains_volts"] != new["mains_volts"] {
        out.push((
            "set".into(),
            "mains".into(),
            "mains_volts".into(),
            old["mains_volts"].clone(),
            new["mains_volts"].clone(),
        ));
    }
    for (table, id, fields) in SET_TABLES {
        let rows = |set: &Value| -> Vec<(String, Value)> {
            set[*table]
                .as_array()
                .map(|a| a.iter().map(|r| (subject(r, id), r.clone())).collect())
                .unwrap_or_default()
        };
        let (o, n) = (rows(old), rows(new));
        let mut subjects: Vec<String> = o.iter().map(|(s, _)| s.clone()).collect();
        subjects.extend(
            n.iter()
                .map(|(s, _)| s.clone())
                .filter(|s| !o.iter().any(|(k, _)| k == s)),
        );
        for s in subjects {
            let get = |rows: &[(String, Value)], f: &str| {
                rows.iter()
                    .find(|(k, _)| *k == s)
                    .map(|(_, r)| r[f].clone())
                    .unwrap_or(Value::Null)
            };
            for f in *fields {
                let (a, b) = (get(&o, f), get(&n, f));
                if a != b {
                    out.push((table.to_string(), s.clone(), f.to_string(), a, b));
                }
            }
        }
    }
    out
}

fn listed(changes: &Value) -> Vec<(String, String, String, Value, Value)> {
    changes
        .as_array()
        .unwrap()
        .iter()
        .map(|c| {
            (
                c["table"].as_str().unwrap().to_string(),
                c["subject"].as_str().unwrap().to_string(),
                c["figure"].as_str().unwrap().to_string(),
                c["old"].clone(),
                c["new"].clone(),
            )
        })
        .collect()
}

#[test]
fn the_first_and_final_sets_of_each_demo_job_differ_exactly_as_calc_says() {
    for name in DEMO_JOBS {
        let calc = ok_json(&ampreport(&jobs_dir(), &["calc", "--json", name]), name);
        let sets = calc["sets"].as_array().unwrap();
        let first = &sets[0];
        let last = sets.iter().find(|s| s["is_final"] == true).unwrap();
        let (a, b) = (
            first["label"].as_str().unwrap(),
            last["label"].as_str().unwrap(),
        );
        let out = ampreport(&jobs_dir(), &["compare", name, "--sets", a, b, "--json"]);
        let got = ok_json(&out, name);
        let want = expected(first, last);
        assert!(
            want.len() >= 5,
            "{name}: only {} changes between {a} and {b}",
            want.len()
        );
        assert_eq!(listed(&got["changes"]), want, "{name}");
        // Every difference is new − old of the two figures.
        for c in got["changes"].as_array().unwrap() {
            if let (Some(o), Some(n)) = (c["old"].as_f64(), c["new"].as_f64()) {
                let d = c["difference"].as_f64().unwrap();
                assert!((d - (n - o)).abs() <= 1e-5 * (n - o).abs().max(1.0), "{c}");
            }
        }
        // The table names every change's subject, and its count.
        let text = ampreport(&jobs_dir(), &["compare", name, "--sets", a, b]);
        assert!(text.status.success());
        let text = String::from_utf8_lossy(&text.stdout);
        for (_, subject, ..) in &want {
            assert!(
                text.contains(subject.as_str()),
                "{name}: {subject} not in\n{text}"
            );
        }
        assert!(
            text.contains(&format!("{} figures changed", want.len())),
            "{text}"
        );
    }
}

#[test]
fn two_versions_of_a_job_differ_in_the_edited_reading_only() {
    let dir = tempfile::tempdir().unwrap();
    let text = std::fs::read_to_string(jobs_dir().join("head-el34-quad.kdl")).unwrap();
    std::fs::write(dir.path().join("old.kdl"), &text).unwrap();
    // The first B+1 reading of the last set, raised by 10 V.
    let last_set = text.rfind("measurements \"").unwrap();
    let at = last_set + text[last_set..].find("node B+1 \"").unwrap() + "node B+1 \"".len();
    let end = at + text[at..].find('V').unwrap();
    let volts: f64 = text[at..end].parse().unwrap();
    let mut edited = text.clone();
    edited.replace_range(at..end, &format!("{}", volts + 10.0));
    std::fs::write(dir.path().join("new.kdl"), &edited).unwrap();

    let old = ok_json(
        &ampreport(dir.path(), &["calc", "--json", "old.kdl"]),
        "old",
    );
    let new = ok_json(
        &ampreport(dir.path(), &["calc", "--json", "new.kdl"]),
        "new",
    );
    let got = ok_json(
        &ampreport(dir.path(), &["compare", "old.kdl", "new.kdl", "--json"]),
        "compare",
    );
    let mut want = Vec::new();
    for (o, n) in old["sets"]
        .as_array()
        .unwrap()
        .iter()
        .zip(new["sets"].as_array().unwrap())
    {
        want.extend(expected(o, n));
    }
    assert!(
        want.iter()
            .any(|(t, s, f, ..)| t == "nodes" && s == "B+1" && f == "measured_volts"),
        "{want:?}"
    );
    assert_eq!(listed(&got["changes"]), want);
    // The same file on both sides: nothing changed.
    let same = ampreport(dir.path(), &["compare", "old.kdl", "old.kdl"]);
    assert!(String::from_utf8_lossy(&same.stdout).contains("no figure changed"));
}

#[test]
fn a_set_that_is_not_in_the_job_is_named_with_the_ones_that_are() {
    let out = ampreport(
        &jobs_dir(),
        &[
            "compare",
            "combo-el84-cathode.kdl",
            "--sets",
            "as found",
            "as sold",
        ],
    );
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains("no measurement set \u{201c}as sold\u{201d}"),
        "{err}"
    );
    assert!(err.contains("\u{201c}as left\u{201d}"), "{err}");
    // A revision outside any repository is an error, not a panic.
    let dir = tempfile::tempdir().unwrap();
    std::fs::copy(
        jobs_dir().join("combo-el84-cathode.kdl"),
        dir.path().join("j.kdl"),
    )
    .unwrap();
    let out = ampreport(dir.path(), &["compare", "HEAD:j.kdl", "j.kdl"]);
    assert_eq!(
        out.status.code(),
        Some(1),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
}

#[test]
fn a_revision_path_from_the_top_finds_the_shop_beside_that_file() {
    // git reads `REV:jobs/j.kdl` from the top of the repository, whatever
    // the current folder; the shop profile beside that file (German here)
    // is the one both sides use, so the table is German. Run from another
    // subfolder, which has no shop profile of its own.
    let dir = tempfile::tempdir().unwrap();
    let top = dir.path();
    std::fs::create_dir_all(top.join("jobs")).unwrap();
    std::fs::create_dir_all(top.join("elsewhere")).unwrap();
    std::fs::copy(
        jobs_dir().join("combo-el84-cathode.kdl"),
        top.join("jobs/j.kdl"),
    )
    .unwrap();
    let profile = std::fs::read_to_string(jobs_dir().join("shop.kdl")).unwrap();
    std::fs::write(
        top.join("jobs/shop.kdl"),
        format!("{profile}\nlanguage \"de\"\n"),
    )
    .unwrap();
    std::fs::copy(
        jobs_dir().join("larkmoor-logo.svg"),
        top.join("jobs/larkmoor-logo.svg"),
    )
    .unwrap();
    if !support::git(top, &["init", "-q"]) {
        assert!(std::env::var_os("CI").is_none(), "git is needed under CI");
        eprintln!("note: skipping: git cannot be run");
        return;
    }
    assert!(support::git(top, &["add", "."]) && support::git(top, &["commit", "-qm", "first"]));
    let here = top.join("elsewhere");
    for spec in ["HEAD:jobs/j.kdl", "HEAD:../jobs/j.kdl"] {
        let out = ampreport(&here, &["compare", spec, "../jobs/j.kdl"]);
        let text = String::from_utf8_lossy(&out.stdout);
        assert!(
            out.status.success(),
            "{spec}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        assert!(
            text.contains("kein Wert hat sich ge\u{e4}ndert"),
            "{spec}: {text}"
        );
    }
}

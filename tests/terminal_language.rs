//! The terminal speaks the shop profile's language: a job's problems are
//! said in German under a German shop, at the very `file:line:column` the
//! English run names; the profile's own problems follow the language it
//! names; without a shop (or with `--no-shop`) everything stays English.

use std::path::PathBuf;

mod support;

use support::{repo, run_in as run, stderr};

/// "file:line:column" of `needle` in `text`, worked out here.
fn at(file: &str, text: &str, needle: &str) -> String {
    let offset = text.find(needle).expect("needle present");
    let before = &text[..offset];
    let line = before.matches('\n').count() + 1;
    let column = before.rsplit('\n').next().unwrap().chars().count() + 1;
    format!("{file}:{line}:{column}")
}

/// A folder with `job` as `job.kdl` and the demo shop profile with
/// `extra` appended (its logo beside it).
fn folder(job: &str, extra: &str) -> tempfile::TempDir {
    let dir = tempfile::tempdir().unwrap();
    std::fs::copy(
        repo().join("jobs/larkmoor-logo.svg"),
        dir.path().join("larkmoor-logo.svg"),
    )
    .unwrap();
    let profile = std::fs::read_to_string(repo().join("jobs/shop.kdl")).unwrap();
    std::fs::write(dir.path().join("shop.kdl"), format!("{profile}\n{extra}\n")).unwrap();
    std::fs::write(dir.path().join("job.kdl"), job).unwrap();
    dir
}

/// The demo job with three mistakes a reader catches: a misspelt node, a
/// date that does not exist and a current where a voltage belongs.
fn broken_job() -> String {
    let job = std::fs::read_to_string(repo().join("jobs/combo-6v6-fixed.kdl")).unwrap();
    let job = job.replacen("complaint \"", "complain \"", 1);
    let job = job.replacen("received=\"2026-11-05\"", "received=\"2026-13-05\"", 1);
    let job = job.replacen("nominal=\"120V\"", "nominal=\"120A\"", 1);
    assert_eq!(job.matches("complain \"").count(), 1);
    job
}

#[test]
fn a_german_shop_gives_german_diagnostics_at_the_same_places() {
    let job = broken_job();
    let english = folder(&job, "");
    let german = folder(&job, "language \"de\"");
    let en = run(english.path(), &["check", "job.kdl"]);
    let de = run(german.path(), &["check", "job.kdl"]);
    assert_eq!(en.status.code(), Some(1), "{}", stderr(&en));
    assert_eq!(de.status.code(), Some(1), "{}", stderr(&de));
    let (en, de) = (stderr(&en), stderr(&de));
    for (needle, english_words, german_words) in [
        (
            "complain \"",
            "unknown node `complain` in the job file",
            "unbekannter Knoten `complain` in der Auftragsdatei",
        ),
        (
            "complain \"",
            "did you mean `complaint`?",
            "meinten Sie `complaint`?",
        ),
        (
            "\"2026-13-05\"",
            "`received` \"2026-13-05\" is not a valid date",
            "`received` \"2026-13-05\" ist kein gültiges Datum",
        ),
        (
            "A\" frequency",
            "is the unit of a current, but a voltage belongs here",
            "ist eine Einheit für etwas anderes (ein Strom); hier gehört eine Spannung hin",
        ),
    ] {
        let place = at("job.kdl", &job, needle);
        assert!(en.contains(&place), "{place} missing from:\n{en}");
        assert!(de.contains(&place), "{place} missing from:\n{de}");
        assert!(en.contains(english_words), "{english_words} missing:\n{en}");
        assert!(de.contains(german_words), "{german_words} missing:\n{de}");
        assert!(
            !de.contains(english_words),
            "{english_words} left in:\n{de}"
        );
    }
    assert!(
        en.contains("job.kdl: 3 problems stop this job file from being read"),
        "{en}"
    );
    assert!(
        de.contains("job.kdl: 3 Probleme verhindern, dass diese Auftragsdatei gelesen wird"),
        "{de}"
    );
    // The date reader's finding in the catalogue's words.
    assert!(
        support::says(&de, "(diesen Monat oder Tag gibt es nicht)"),
        "{de}"
    );
    assert!(
        support::says(&en, "(there is no such month or day)"),
        "{en}"
    );
    assert!(!en.contains("out of range"), "{en}");
    // The codes stay the same in every language: scripts may match them.
    assert!(de.contains("ampreport::job::unknown-node"), "{de}");
}

#[test]
fn the_profile_says_its_own_problems_in_the_language_it_names() {
    let job = std::fs::read_to_string(repo().join("jobs/combo-6v6-fixed.kdl")).unwrap();
    let dir = folder(&job, "language \"de\"\npaper \"legal\" frobnicate=1");
    let o = run(dir.path(), &["check", "job.kdl"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let err = stderr(&o);
    let profile = std::fs::read_to_string(dir.path().join("shop.kdl")).unwrap();
    let place = at("shop.kdl", &profile, "frobnicate");
    assert!(err.contains(&place), "{place} missing from:\n{err}");
    assert!(
        err.contains("unbekannte Eigenschaft `frobnicate` an `paper`"),
        "{err}"
    );
    assert!(err.contains("dieses Werkstattprofil"), "{err}");

    // With `--no-shop` nothing names a language: English.
    let broken = folder(&broken_job(), "language \"de\"");
    let o = run(broken.path(), &["check", "--no-shop", "job.kdl"]);
    let err = stderr(&o);
    assert!(err.contains("did you mean `complaint`?"), "{err}");
    assert!(!err.contains("meinten Sie"), "{err}");
}

#[test]
fn a_batch_says_how_each_job_ended_in_its_language() {
    let job = broken_job();
    let dir = folder(&job, "language \"de\"");
    std::fs::write(dir.path().join("second.kdl"), &job).unwrap();
    let o = run(dir.path(), &["render", "job.kdl", "second.kdl"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let out = String::from_utf8_lossy(&o.stdout);
    // Each job's line, then the summary, all in German; the first error of
    // each job quoted at its place.
    let place = at("job.kdl", &job, "\"2026-13-05\"");
    for words in [
        format!(
            "fehlgeschlagen job.kdl: {place}: `received` \"2026-13-05\" ist kein gültiges Datum"
        ),
        "2 Aufträge in".to_string(),
        ": 0 erstellt, 0 unverändert, 2 fehlgeschlagen".to_string(),
    ] {
        assert!(out.contains(&words), "{words} missing from:\n{out}");
    }
    assert!(!out.contains("failed"), "{out}");
    // The same jobs without the shop: English, word for word as before.
    let o = run(
        dir.path(),
        &["render", "--no-shop", "job.kdl", "second.kdl"],
    );
    let out = String::from_utf8_lossy(&o.stdout);
    assert!(out.contains("2 jobs in"), "{out}");
    assert!(out.contains(": 0 rendered, 0 unchanged, 2 failed"), "{out}");
}

/// Every `"diag-…"` and `"cli-…"` key the program's source names.
fn terminal_keys_used() -> Vec<(String, PathBuf)> {
    let mut used = Vec::new();
    let mut dirs = vec![repo().join("src")];
    while let Some(dir) = dirs.pop() {
        for entry in std::fs::read_dir(dir).unwrap() {
            let path = entry.unwrap().path();
            if path.is_dir() {
                dirs.push(path);
                continue;
            }
            if path.extension().is_none_or(|e| e != "rs") {
                continue;
            }
            let text = std::fs::read_to_string(&path).unwrap();
            for prefix in ["\"diag-", "\"cli-"] {
                for (i, _) in text.match_indices(prefix) {
                    let rest = &text[i + 1..];
                    let end = rest.find('"').unwrap();
                    let key = &rest[..end];
                    if key
                        .chars()
                        .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '-')
                    {
                        used.push((key.to_owned(), path.clone()));
                    }
                }
            }
        }
    }
    used
}

#[test]
fn every_terminal_key_the_program_uses_is_in_every_built_in_catalogue() {
    use ampreport::catalogue::{BUILT_IN, Catalogue};
    let used = terminal_keys_used();
    assert!(used.len() > 150, "only {} keys found", used.len());
    for (tag, _) in BUILT_IN {
        let catalogue = Catalogue::built_in(tag).unwrap();
        for (key, file) in &used {
            assert!(
                catalogue.has(key),
                "{key} (used in {}) is missing from messages/{tag}.ftl",
                file.display()
            );
        }
    }
    // Braces written literally in a message come out as braces.
    assert_eq!(
        Catalogue::english().text("diag-expected-pattern"),
        "expected a pattern such as D-{yymm}-{nnn}"
    );
    let de = Catalogue::built_in("de").unwrap();
    assert!(
        de.text("diag-pattern-help")
            .starts_with("Bausteine: {yyyy} {yy}")
    );
}

/// The first `[file:line:column]` miette draws after `words` in `output`.
fn place_after(output: &str, words: &str) -> String {
    let start = output
        .find(words)
        .unwrap_or_else(|| panic!("{words} missing from:\n{output}"));
    let rest = &output[start..];
    let open = rest.find("[job.kdl:").expect("a place follows the message") + 1;
    let close = open + rest[open..].find(']').unwrap();
    rest[open..close].to_string()
}

/// The words miette draws are wrapped at 80 columns: each needle below is
/// short enough to stay on one line.
/// Says each problem of `job` in English and under a German shop, and
/// checks each pair of words at one and the same place; the English words
/// must not be left in the German output.
fn same_places(job: &str, pairs: &[(&str, &str)]) {
    let english = folder(job, "");
    let german = folder(job, "language \"de\"");
    let en = run(english.path(), &["check", "job.kdl"]);
    let de = run(german.path(), &["check", "job.kdl"]);
    assert_eq!(en.status.code(), Some(1), "{}", stderr(&en));
    assert_eq!(de.status.code(), Some(1), "{}", stderr(&de));
    let (en, de) = (stderr(&en), stderr(&de));
    for (english_words, german_words) in pairs {
        assert_eq!(
            place_after(&en, english_words),
            place_after(&de, german_words),
            "{english_words} / {german_words}"
        );
        assert!(
            !de.contains(english_words),
            "{english_words} left in:\n{de}"
        );
    }
}

#[test]
fn network_bench_and_value_problems_are_said_in_german_at_their_places() {
    let job = std::fs::read_to_string(repo().join("jobs/combo-6v6-fixed.kdl")).unwrap();
    let job = job.replacen("frequency=\"60Hz\"", "frequency=\"-60Hz\"", 1);
    let job = job.replacen("setting=\"4 7\"", "setting=\"4 x7\"", 1);
    let job = job.replacen(
        "    heater \"6.4V\"\n}",
        "    heater \"6.4V\"\n    hum-noise \"4.2mV\" load=\"8R\" input=shortd\n}",
        1,
    );
    assert!(job.contains("input=shortd") && job.contains("\"-60Hz\""));
    same_places(
        &job,
        &[
            (
                "the mains frequency cannot be negative",
                "die Netzfrequenz kann nicht negativ sein",
            ),
            (
                "a pot setting runs from 0 to 10, found `x7`",
                "die Stellung eines Potentiometers reicht von 0 bis 10, gefunden: `x7`",
            ),
            (
                "`input` must be shorted or open, found shortd",
                "`input` muss shorted (kurzgeschlossen) oder open (offen) sein, gefunden: shortd",
            ),
            // The help line's did-you-mean, in German too.
            ("did you mean `shorted`?", "meinten Sie `shorted`?"),
        ],
    );
}

#[test]
fn names_that_point_nowhere_and_a_broken_network_are_said_in_german() {
    let job = std::fs::read_to_string(repo().join("jobs/combo-6v6-fixed.kdl")).unwrap();
    let job = job.replacen(
        "sense-resistor R40 value=\"1R\" valve=V3",
        "sense-resistor R40 value=\"1R\" valve=V9",
        1,
    );
    let job = job.replacen(
        "capacitor C7 value=\"22n\" from=a to=mid",
        "capacitor C7 value=\"22n\" from=a to=mid\n            resistor R99 value=\"1k\" from=x to=y",
        1,
    );
    assert!(job.contains("valve=V9") && job.contains("R99"));
    same_places(
        &job,
        &[
            (
                "a sense resistor names valve position V9, which the",
                "ein Messwiderstand nennt die Röhrenposition V9, die der",
            ),
            (
                "nodes `x` and `y` connect to nothing that reaches ground (only R99)",
                "Knoten `x` und `y` sind mit nichts verbunden, das Masse erreicht",
            ),
        ],
    );
}

#[test]
fn the_logo_and_the_translation_file_are_refused_in_the_profiles_language() {
    let job = std::fs::read_to_string(repo().join("jobs/combo-6v6-fixed.kdl")).unwrap();
    let dir = folder(&job, "language \"de\"");
    let profile = std::fs::read_to_string(dir.path().join("shop.kdl")).unwrap();
    let profile = profile.replacen("logo \"larkmoor-logo.svg\"", "logo \"notes.txt\"", 1);
    std::fs::write(dir.path().join("shop.kdl"), &profile).unwrap();
    std::fs::write(dir.path().join("notes.txt"), "not a picture\n").unwrap();
    let o = run(dir.path(), &["check", "job.kdl"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let err = stderr(&o);
    let place = at("shop.kdl", &profile, "\"notes.txt\"");
    assert!(err.contains(&place), "{place} missing from:\n{err}");
    assert!(
        err.contains("notes.txt ist weder ein PNG-Bild noch eine SVG-Zeichnung"),
        "{err}"
    );
    assert!(!err.contains("is neither"), "{err}");

    // A translation file with a message the program does not have: the
    // problem at its own line, in German, with the did-you-mean.
    let dir = folder(&job, "language \"de\" file=\"werkstatt.ftl\"");
    let german = std::fs::read_to_string(repo().join("messages/de.ftl")).unwrap();
    let text = format!("{german}diag-net-floting = schwebend\n");
    std::fs::write(dir.path().join("werkstatt.ftl"), &text).unwrap();
    let o = run(dir.path(), &["check", "job.kdl"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let err = stderr(&o);
    let place = at("werkstatt.ftl", &text, "diag-net-floting =");
    assert!(err.contains(&place), "{place} missing from:\n{err}");
    assert!(
        err.contains("der englische Katalog hat keine Meldung `diag-net-floting`"),
        "{err}"
    );
    assert!(err.contains("meinten Sie `diag-net-floating`"), "{err}");
    assert!(
        err.contains("1 Problem verhindert, dass diese Übersetzungsdatei gelesen wird"),
        "{err}"
    );
}

/// A demo job in a folder of its own with the demo shop profile, in German
/// or (with `extra` empty) in English.
fn demo_folder(demo: &str, extra: &str) -> tempfile::TempDir {
    let job = std::fs::read_to_string(repo().join("jobs").join(demo)).unwrap();
    folder(&job, extra)
}

fn stdout(o: &std::process::Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

#[test]
fn compare_speaks_the_shop_language() {
    let german = demo_folder("head-el34-quad.kdl", "language \"de\"");
    let english = demo_folder("head-el34-quad.kdl", "");
    let args = ["compare", "job.kdl", "--sets", "as found", "as left"];
    let json = run(german.path(), &[&args[..], &["--json"]].concat());
    assert!(json.status.success(), "{}", stderr(&json));
    let json: serde_json::Value = serde_json::from_slice(&json.stdout).unwrap();
    let changes = json["changes"].as_array().unwrap();
    assert!(changes.len() > 5, "{json}");
    // The JSON is the same whatever the language: field names and status
    // identifiers, never words.
    let english_json = run(english.path(), &[&args[..], &["--json"]].concat());
    assert_eq!(
        serde_json::from_slice::<serde_json::Value>(&english_json.stdout).unwrap(),
        json
    );

    let de = run(german.path(), &args);
    assert!(de.status.success(), "{}", stderr(&de));
    let de = stdout(&de);
    let en = stdout(&run(english.path(), &args));
    // The count, worked out from the JSON, in each language's words.
    assert!(
        de.contains(&format!("{} Werte geändert", changes.len())),
        "{de}"
    );
    assert!(
        en.contains(&format!("{} figures changed", changes.len())),
        "{en}"
    );
    // The sets compared, quoted as the language quotes.
    assert_eq!(
        de.lines().next().unwrap(),
        "job.kdl: „as found“ → „as left“"
    );
    assert_eq!(
        en.lines().next().unwrap(),
        "job.kdl: “as found” → “as left”"
    );
    let header = de.lines().nth(1).unwrap();
    for word in ["Größe", "alt", "neu", "Änderung"] {
        assert!(header.contains(word), "{word} missing from {header}");
    }
    // One job's two sets: the set is named once above, not on every row.
    assert!(!header.contains("Messreihe"), "{header}");
    let en_header = en.lines().nth(1).unwrap();
    for word in ["what", "figure", "old", "new", "change"] {
        assert!(en_header.contains(word), "{word} missing from {en_header}");
    }
    assert!(!en_header.starts_with("set"), "{en_header}");
    // Each changed figure by its German name; a status by its German word.
    let german_figure = |f: &str| match f {
        "plate_volts" => "Anodenspannung",
        "plate_dissipation_w" => "Anodenverlustleistung",
        "mains_volts" => "Netzspannung",
        "status" => "Status",
        _ => "",
    };
    let mut seen = 0;
    for c in changes {
        let word = german_figure(c["figure"].as_str().unwrap());
        if word.is_empty() {
            continue;
        }
        seen += 1;
        // The set's own mains reading is the subject "mains", in German "Netz".
        let subject = match c["subject"].as_str().unwrap() {
            "mains" => "Netz",
            s => s,
        };
        let row = de
            .lines()
            .find(|l| l.contains(subject) && l.contains(word))
            .unwrap_or_else(|| panic!("no row for {c} in\n{de}"));
        if c["figure"] == "status" {
            let status_word = |v: &serde_json::Value| match v.as_str().unwrap() {
                "ok" => "ok",
                "caution" => "Vorsicht",
                "over" => "zu hoch",
                "cold" => "zu kalt",
                other => panic!("unexpected status {other}"),
            };
            assert!(row.contains(status_word(&c["old"])), "{row}");
            assert!(row.contains(status_word(&c["new"])), "{row}");
        }
    }
    assert!(seen >= 3, "{de}");
    for english_words in ["figures changed", "plate dissipation", "screen"] {
        assert!(
            !de.contains(english_words),
            "{english_words} left in:\n{de}"
        );
    }

    // A set that is not there, named with the ones that are, in German.
    let o = run(
        german.path(),
        &["compare", "job.kdl", "--sets", "as found", "as sold"],
    );
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains(
            "Fehler: job.kdl hat keine Messreihe „as sold“; vorhanden sind „as found“ und „as left“"
        ),
        "{}",
        stderr(&o)
    );
}

/// The files `new` made in `dir`: every `.kdl` but the job and the profile.
fn made_by_new(dir: &std::path::Path) -> Vec<PathBuf> {
    let mut made: Vec<PathBuf> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| {
            p.extension().is_some_and(|e| e == "kdl")
                && !p.ends_with("job.kdl")
                && !p.ends_with("shop.kdl")
        })
        .collect();
    made.sort();
    made
}

#[test]
fn new_speaks_the_shop_language() {
    let german = demo_folder("combo-6v6-fixed.kdl", "language \"de\"");
    let o = run(german.path(), &["new", "--from", "job.kdl"]);
    assert!(o.status.success(), "{}", stderr(&o));
    let made = made_by_new(german.path());
    assert_eq!(made.len(), 1, "{made:?}");
    let name = made[0].file_name().unwrap().to_string_lossy().into_owned();
    let out = stdout(&o);
    assert!(
        out.contains(&format!(
            "geschrieben: ./{name}; die Messwerte eintragen, dann `ampreport check ./{name}` ausführen"
        )),
        "{out}"
    );
    let text = std::fs::read_to_string(&made[0]).unwrap();
    assert!(
        text.starts_with(
            "// Begonnen mit job.kdl (Auftrag D-2611-022) über `ampreport new --from`"
        ),
        "{text}"
    );
    assert!(text.contains("// Messwerte dieses Auftrags:\n"), "{text}");
    assert!(!text.contains("Started from"), "{text}");

    // Without a language the same words are English, word for word.
    let english = demo_folder("combo-6v6-fixed.kdl", "");
    let o = run(english.path(), &["new", "--from", "job.kdl"]);
    let name = made_by_new(english.path())[0]
        .file_name()
        .unwrap()
        .to_string_lossy()
        .into_owned();
    assert!(
        stdout(&o).contains(&format!(
            "wrote ./{name}; fill in the readings, then run `ampreport check ./{name}`"
        )),
        "{}",
        stdout(&o)
    );
}

/// `render job.kdl` in `dir` with the stand-in typst `body` (after it
/// answers `--version` like typst 0.15.1) and a temporary folder of its
/// own, so the source typst leaves behind is cleaned up with `dir`.
fn render_with_typst(dir: &std::path::Path, body: &str) -> std::process::Output {
    render_with_typst_to(dir, body, "job.pdf")
}

/// [`render_with_typst`] with the output named `output`.
fn render_with_typst_to(dir: &std::path::Path, body: &str, output: &str) -> std::process::Output {
    let typst = dir.join("stand-in-typst");
    std::fs::write(
        &typst,
        format!(
            "#!/bin/sh\nif [ \"$1\" = --version ]; then echo 'typst 0.15.1 (stand-in)'; exit 0; fi\n{body}\n"
        ),
    )
    .unwrap();
    support::make_executable(&typst);
    let tmp = dir.join("tmp");
    std::fs::create_dir_all(&tmp).unwrap();
    std::process::Command::new(support::bin())
        .current_dir(dir)
        .args(["render", "job.kdl", "-o", output, "--typst"])
        .arg(&typst)
        .env("XDG_CONFIG_HOME", dir.join("no-config"))
        .env("XDG_CACHE_HOME", support::cache_home())
        .env("TMPDIR", &tmp)
        .env_remove("AMPREPORT_TYPST")
        .env("NO_COLOR", "1")
        .output()
        .unwrap()
}

#[test]
fn a_typst_failure_is_said_in_the_shop_language() {
    use support::says;
    let rejects = "echo 'error: unknown variable: frobnicate' >&2; exit 1";
    let german = demo_folder("combo-el84-cathode.kdl", "language \"de\"");
    let o = render_with_typst(german.path(), rejects);
    // The built-in template failed: a fault of the program (3).
    assert_eq!(o.status.code(), Some(3), "{}", stderr(&o));
    let err = stderr(&o);
    for words in [
        "typst konnte das Dokument nicht setzen (es endete mit Status 1):",
        "der erzeugte Quelltext wurde zur Prüfung in",
        "Hinweis: die eingebaute Vorlage ist fehlgeschlagen",
    ] {
        assert!(says(&err, words), "{words} missing from:\n{err}");
    }
    // typst's own words stay as typst said them; the code is the same.
    assert!(says(&err, "error: unknown variable: frobnicate"), "{err}");
    assert!(err.contains("ampreport::typeset::compile_failed"), "{err}");
    assert!(!says(&err, "could not compile"), "{err}");
    assert!(!german.path().join("job.pdf").exists());

    // A typst that crashes is named as the one at fault, in German.
    let o = render_with_typst(german.path(), "kill -SEGV $$");
    assert_eq!(o.status.code(), Some(3), "{}", stderr(&o));
    let err = stderr(&o);
    assert!(
        says(&err, "wurde durch Signal 11 (SIGSEGV) beendet"),
        "{err}"
    );
    assert!(
        says(
            &err,
            "das deutet auf das Programm typst oder den Rechner hin"
        ),
        "{err}"
    );
    assert!(
        err.contains("ampreport::typeset::typst_misbehaved"),
        "{err}"
    );

    // The same failure without a language: English, as before.
    let english = demo_folder("combo-el84-cathode.kdl", "");
    let err = stderr(&render_with_typst(english.path(), rejects));
    assert!(
        says(
            &err,
            "typst could not compile the document (it exited with status 1):"
        ),
        "{err}"
    );
    assert!(!says(&err, "konnte"), "{err}");
}

#[test]
fn the_terminal_tables_name_bias_and_safety_tests_in_the_shop_language() {
    // (demo, valve, bias in English, in German)
    for (demo, valve, english_bias, german_bias) in [
        ("combo-el84-cathode.kdl", "EL84", "cathode", "automatisch"),
        ("combo-6v6-fixed.kdl", "6V6GT", "fixed", "fest"),
    ] {
        let de = stdout(&run(
            demo_folder(demo, "language \"de\"").path(),
            &["check", "job.kdl"],
        ));
        let en = stdout(&run(demo_folder(demo, "").path(), &["check", "job.kdl"]));
        // The bias column (the third) of each output valve's row, under
        // the header naming it.
        let column = |text: &str, header: &str| -> Vec<String> {
            assert!(
                text.lines()
                    .any(|l| l.split_whitespace().nth(2) == Some(header)),
                "no {header} column in\n{text}"
            );
            text.lines()
                .filter(|l| l.trim_start().starts_with('V') && l.contains(valve))
                .map(|l| l.split_whitespace().nth(2).unwrap().to_string())
                .collect()
        };
        let de_bias = column(&de, "Vorspannung");
        let en_bias = column(&en, "bias");
        assert!(!de_bias.is_empty(), "{de}");
        assert!(
            de_bias.iter().all(|b| b == german_bias),
            "{de_bias:?}\n{de}"
        );
        assert!(
            en_bias.iter().all(|b| b == english_bias),
            "{en_bias:?}\n{en}"
        );
        assert_eq!(de_bias.len(), en_bias.len());
        // The safety tests by their names in the language.
        assert!(de.contains("Schutzleiter"), "{de}");
        assert!(en.contains("earth continuity"), "{en}");
        assert!(!de.contains("earth continuity"), "{de}");
    }
}

#[test]
fn an_output_that_would_destroy_an_input_is_refused_in_the_shop_language() {
    use support::says;
    let german = demo_folder("combo-el84-cathode.kdl", "language \"de\"");
    // A stand-in typst that is never asked to compile: the refusal comes
    // first.
    let o = render_with_typst_to(german.path(), "exit 9", "job.kdl");
    assert_eq!(o.status.code(), Some(2), "{}", stderr(&o));
    let err = stderr(&o);
    assert!(
        says(
            &err,
            "die Ausgabe job.kdl ist die Auftragsdatei (job.kdl); dorthin zu schreiben würde sie zerstören"
        ),
        "{err}"
    );
    assert!(says(&err, "mit `-o` einen anderen Pfad angeben"), "{err}");
    assert!(err.contains("ampreport::output::is_input"), "{err}");
    // The job file is untouched.
    assert_eq!(
        std::fs::read_to_string(german.path().join("job.kdl")).unwrap(),
        std::fs::read_to_string(repo().join("jobs/combo-el84-cathode.kdl")).unwrap()
    );
    let english = demo_folder("combo-el84-cathode.kdl", "");
    let err = stderr(&render_with_typst_to(english.path(), "exit 9", "job.kdl"));
    assert!(
        says(
            &err,
            "the output job.kdl is the job file (job.kdl); writing there would destroy it"
        ),
        "{err}"
    );
}

#[test]
fn why_no_cathode_resistor_is_suggested_is_said_in_the_shop_language() {
    // The demo's "as found" pair as 6973s: the built-in ratings table gives
    // no μg1g2 for the 6973, so the three-halves law cannot be fitted and
    // the note says why, in the job's language, in the terminal and JSON.
    let demo = std::fs::read_to_string(repo().join("jobs/combo-el84-cathode.kdl")).unwrap();
    let job = demo.replace("type=EL84", "type=\"6973\"");
    assert_eq!(job.matches("type=\"6973\"").count(), 2);
    let english_words = "R24: no cathode-resistor suggestion, since for V3 the ratings table gives no μg1g2 for 6973";
    let german_words = "R24: kein Vorschlag für den Kathodenwiderstand, da für V3 gilt: die Datentabelle nennt kein μg1g2 für 6973";
    for args in [
        &["check", "job.kdl"][..],
        &["calc", "--json", "job.kdl"][..],
    ] {
        let de = run(folder(&job, "language \"de\"").path(), args);
        let en = run(folder(&job, "").path(), args);
        let (de, en) = (
            format!("{}{}", stdout(&de), stderr(&de)),
            format!("{}{}", stdout(&en), stderr(&en)),
        );
        assert!(de.contains(german_words), "{args:?}\n{de}");
        assert!(!de.contains(english_words), "{args:?}\n{de}");
        assert!(en.contains(english_words), "{args:?}\n{en}");
    }
}

#[test]
fn a_job_file_that_cannot_be_read_is_refused_in_the_shop_language() {
    // Not UTF-8: a stray byte 0xff on line 2, column 5, same place in
    // both languages.
    let job = b"job-format 1\njob \xff\n".to_vec();
    let cases: [(&str, Vec<u8>, &str, &str); 2] = [
        (
            "job.kdl",
            job,
            "error: job.kdl:2:5: the job file is not UTF-8 text (byte 0xff here); save it as UTF-8",
            "Fehler: job.kdl:2:5: die Auftragsdatei ist kein UTF-8-Text (Byte 0xff an dieser Stelle); bitte im Format UTF-8 speichern",
        ),
        (
            "missing.kdl",
            Vec::new(),
            "error: cannot read the job file missing.kdl: ",
            "Fehler: die Auftragsdatei missing.kdl kann nicht gelesen werden: ",
        ),
    ];
    for (name, bytes, english_words, german_words) in cases {
        let german = folder("", "language \"de\"");
        let english = folder("", "");
        for dir in [&german, &english] {
            std::fs::remove_file(dir.path().join("job.kdl")).unwrap();
            if !bytes.is_empty() {
                std::fs::write(dir.path().join(name), &bytes).unwrap();
            }
        }
        let de = run(german.path(), &["check", name]);
        let en = run(english.path(), &["check", name]);
        assert_eq!(de.status.code(), en.status.code());
        assert_ne!(de.status.code(), Some(0));
        let (de, en) = (stderr(&de), stderr(&en));
        assert!(de.contains(german_words), "{de}");
        assert!(!de.contains(english_words), "{de}");
        assert!(en.contains(english_words), "{en}");
    }
    // Too large: one byte over 16 MiB, in German.
    let german = folder("", "language \"de\"");
    std::fs::write(
        german.path().join("job.kdl"),
        vec![b' '; 16 * 1024 * 1024 + 1],
    )
    .unwrap();
    let de = stderr(&run(german.path(), &["check", "job.kdl"]));
    assert!(
        de.contains("Fehler: die Auftragsdatei job.kdl ist größer als 16 MiB;"),
        "{de}"
    );
}

#[test]
fn why_a_pdf_is_incomplete_is_said_in_the_shop_language() {
    use support::says;
    // A stand-in typst that reports success after writing only a PDF's
    // first line (9 bytes) to its output, the last argument.
    let half = "for a in \"$@\"; do out=$a; done; printf '%%PDF-1.7\\n' > \"$out\"";
    let german = demo_folder("combo-el84-cathode.kdl", "language \"de\"");
    let o = render_with_typst(german.path(), half);
    assert_eq!(o.status.code(), Some(3), "{}", stderr(&o));
    let err = stderr(&o);
    assert!(
        says(
            &err,
            "schrieb aber eine unvollständige Datei: sie endet nach 9 Bytes ohne die Dateiende-Marke `%%EOF`"
        ),
        "{err}"
    );
    assert!(!says(&err, "without the end-of-file mark"), "{err}");
    assert!(
        err.contains("ampreport::typeset::typst_misbehaved"),
        "{err}"
    );
    let english = demo_folder("combo-el84-cathode.kdl", "");
    let err = stderr(&render_with_typst(english.path(), half));
    assert!(
        says(
            &err,
            "wrote an incomplete file: it stops after 9 bytes without the end-of-file mark `%%EOF`"
        ),
        "{err}"
    );
}

#[test]
fn verbose_lines_about_a_job_are_said_in_the_shop_language() {
    let job = std::fs::read_to_string(repo().join("jobs/combo-6v6-fixed.kdl")).unwrap();
    let german = folder(&job, "language \"de\"");
    let english = folder(&job, "");
    let de = run(german.path(), &["check", "-v", "job.kdl"]);
    let en = run(english.path(), &["check", "-v", "job.kdl"]);
    assert!(de.status.success(), "{}", stderr(&de));
    let (de, en) = (stderr(&de), stderr(&en));
    let bytes = job.len();
    let shop = |dir: &tempfile::TempDir| dir.path().join("shop.kdl").display().to_string();
    for (german_words, english_words) in [
        (
            format!(
                "gelesen: Werkstattprofil: {} (neben dem Auftrag oder darüber)",
                shop(&german)
            ),
            format!(
                "read: shop profile: {} (beside the job or above it)",
                shop(&german)
            ),
        ),
        (
            "gelesen: Logo der Werkstatt: ".to_string(),
            "read: shop logo: ".to_string(),
        ),
        (
            format!("gelesen: Auftrag: job.kdl ({bytes} Bytes)"),
            format!("read: job: job.kdl ({bytes} bytes)"),
        ),
    ] {
        assert!(de.contains(&german_words), "{german_words} missing:\n{de}");
        assert!(
            !de.contains(&english_words),
            "{english_words} left in:\n{de}"
        );
        let english_words = english_words.replace(&shop(&german), &shop(&english));
        assert!(
            en.contains(&english_words),
            "{english_words} missing:\n{en}"
        );
    }
    // Read before any profile: English in both.
    assert!(de.contains("read: ratings: built in ("), "{de}");
    // No profile at all: the catalogue's English.
    let o = run(german.path(), &["check", "-v", "--no-shop", "job.kdl"]);
    assert!(
        stderr(&o).contains("read: shop profile: none (--no-shop)"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn the_valve_class_of_a_role_mismatch_is_said_in_the_shop_language() {
    let job = std::fs::read_to_string(repo().join("jobs/combo-6v6-fixed.kdl")).unwrap();
    let job = job.replacen(
        "valve V5 type=\"5Y3GT\" role=rectifier",
        "valve V5 type=\"12AX7\" role=rectifier",
        1,
    );
    assert!(job.contains("type=\"12AX7\" role=rectifier"));
    same_places(
        &job,
        &[(
            "V5 is listed as the rectifier, but 12AX7 is a preamp triode",
            "V5 ist als Gleichrichter angegeben, aber die Datentabelle führt 12AX7 als Vorstufentriode",
        )],
    );
}

#[test]
fn the_operating_systems_words_are_said_in_the_shop_language() {
    let german = folder("", "language \"de\"");
    let english = folder("", "");
    let de = stderr(&run(german.path(), &["check", "missing.kdl"]));
    let en = stderr(&run(english.path(), &["check", "missing.kdl"]));
    assert!(
        de.contains(
            "die Auftragsdatei missing.kdl kann nicht gelesen werden: diese Datei oder dieser Ordner existiert nicht"
        ),
        "{de}"
    );
    assert!(
        en.contains("cannot read the job file missing.kdl: there is no such file or folder"),
        "{en}"
    );
}

#[test]
fn why_there_is_no_grid_estimate_is_said_in_the_shop_language() {
    // The demo's fixed-bias valves without their grid readings: the window
    // is given, the grid estimate for its middle cannot be, and the
    // terminal and the JSON say why.
    let demo = std::fs::read_to_string(repo().join("jobs/combo-6v6-fixed.kdl")).unwrap();
    let job = demo
        .replace(" grid=\"-19.5V\"", "")
        .replace(" grid=\"-23V\"", "");
    assert!(!job.contains("grid=\"-"), "{job}");
    let english_words = "no grid estimate for the middle: there is no grid reading";
    let german_words = "keine Schätzung der Gitterspannung für die Mitte: es gibt keinen Messwert der Gitterspannung";
    for args in [
        &["check", "job.kdl"][..],
        &["calc", "--json", "job.kdl"][..],
    ] {
        let de = run(folder(&job, "language \"de\"").path(), args);
        let en = run(folder(&job, "").path(), args);
        let (de, en) = (stdout(&de), stdout(&en));
        if args[0] == "calc" {
            let json: serde_json::Value = serde_json::from_str(&de).unwrap();
            let reasons: Vec<&str> = json["sets"]
                .as_array()
                .unwrap()
                .iter()
                .flat_map(|s| s["valves"].as_array().unwrap())
                .filter_map(|v| v["target_window"]["grid_for_middle_unknown_reason"].as_str())
                .collect();
            assert!(!reasons.is_empty(), "{de}");
            assert!(
                reasons
                    .iter()
                    .all(|r| *r == "es gibt keinen Messwert der Gitterspannung"),
                "{reasons:?}"
            );
            assert!(
                en.contains("\"grid_for_middle_unknown_reason\": \"there is no grid reading\""),
                "{en}"
            );
        } else {
            assert!(de.contains(german_words), "{de}");
            assert!(!de.contains(english_words), "{de}");
            assert!(en.contains(english_words), "{en}");
        }
    }
    // With the readings, an estimate and no reason.
    let en = stdout(&run(
        folder(&demo, "").path(),
        &["calc", "--json", "job.kdl"],
    ));
    assert!(
        !en.contains("\"grid_for_middle_unknown_reason\": \""),
        "{en}"
    );
}

#[test]
fn what_the_template_engine_found_is_said_in_the_shop_language() {
    use support::says;
    // (template, German words, English words): the kind of problem in the
    // catalogue's words, the engine's own detail only where it names a
    // template line, and the template and line.
    let cases = [
        (
            "{{ font_rules }}\n{{ no_such_variable }}\n",
            "ließ sich nicht ausfüllen: ein Wert, den die Vorlage verwendet, ist nicht definiert (handover.typ, Zeile 2)",
            "could not be filled: a value the template uses is undefined (handover.typ, line 2)",
        ),
        (
            "{{ font_rules }}\n\n{{ foo }\n",
            "ließ sich nicht ausfüllen: ein Syntaxfehler: unexpected `}`, expected end of variable block (handover.typ, Zeile 3)",
            "could not be filled: a syntax error: unexpected `}`, expected end of variable block (handover.typ, line 3)",
        ),
        (
            "{{ font_rules }}\n{{ t(\"doc-no-such-label\") }}\n",
            "der Meldungskatalog (de, built-in) hat keine Meldung `doc-no-such-label` (handover.typ, Zeile 2)",
            "the message catalogue (en, built-in) has no message `doc-no-such-label` (handover.typ, line 2)",
        ),
        (
            "{{ font_rules }}\nShop copy.\n",
            "das Dokument muss den Sicherheitshinweis zur Netzspannung enthalten: die Zeile `#include \"mains-safety.typ\"` in die Vorlage setzen",
            "the document must carry the mains-safety notice: put the line `#include \"mains-safety.typ\"` in the template",
        ),
    ];
    for (template, german_words, english_words) in cases {
        for (extra, words, other) in [
            ("language \"de\"", german_words, english_words),
            ("", english_words, german_words),
        ] {
            let dir = demo_folder("combo-el84-cathode.kdl", extra);
            let templates = dir.path().join("templates");
            std::fs::create_dir(&templates).unwrap();
            std::fs::write(templates.join("handover.typ"), template).unwrap();
            let typst = dir.path().join("stand-in-typst");
            std::fs::write(
                &typst,
                "#!/bin/sh\nif [ \"$1\" = --version ]; then echo 'typst 0.15.1 (stand-in)'; exit 0; fi\nexit 9\n",
            )
            .unwrap();
            support::make_executable(&typst);
            let o = std::process::Command::new(support::bin())
                .current_dir(dir.path())
                .args(["render", "job.kdl", "--templates", "templates", "--typst"])
                .arg(&typst)
                .env("XDG_CONFIG_HOME", dir.path().join("no-config"))
                .env("XDG_CACHE_HOME", support::cache_home())
                .env_remove("AMPREPORT_TYPST")
                .env("NO_COLOR", "1")
                .output()
                .unwrap();
            // A shop's template is the shop's input: status 1.
            assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
            let err = stderr(&o);
            assert!(says(&err, words), "{words} missing from:\n{err}");
            assert!(!says(&err, other), "{other} in:\n{err}");
        }
    }
}

#[test]
fn gits_problems_reading_a_revision_are_said_in_the_shop_language() {
    use support::says;
    let job = std::fs::read_to_string(repo().join("jobs/combo-el84-cathode.kdl")).unwrap();
    let dir = folder(&job, "language \"de\"");
    // Not a repository yet (the folder lies under the system's temporary
    // folder, outside any repository).
    let o = run(dir.path(), &["compare", "HEAD:job.kdl", "job.kdl"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let err = stderr(&o);
    assert!(
        says(
            &err,
            "Fehler: HEAD:job.kdl kann nicht gelesen werden: dieser Ordner liegt in keinem git-Repository (git sagte: „fatal: not a git repository"
        ),
        "{err}"
    );
    let git = |args: &[&str]| {
        let o = std::process::Command::new("git")
            .current_dir(dir.path())
            .args([
                "-c",
                "user.name=Bench",
                "-c",
                "user.email=bench@example.invalid",
            ])
            .args(["-c", "commit.gpgsign=false"])
            .args(args)
            .output()
            .unwrap();
        assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    };
    git(&["init", "-q"]);
    git(&["add", "job.kdl"]);
    git(&["commit", "-q", "-m", "job"]);
    for (spec, german_words, english_words) in [
        (
            "nope:job.kdl",
            "das Repository hat keine Revision `nope` (git sagte: „fatal:",
            "the repository has no revision `nope` (git said: “fatal:",
        ),
        (
            "HEAD:other.kdl",
            "`other.kdl` ist in der Revision `HEAD` nicht vorhanden (git sagte: „fatal:",
            "`other.kdl` is not in revision `HEAD` (git said: “fatal:",
        ),
    ] {
        let o = run(dir.path(), &["compare", spec, "job.kdl"]);
        assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
        let err = stderr(&o);
        assert!(says(&err, german_words), "{german_words} missing:\n{err}");
        assert!(!says(&err, english_words), "{err}");
        let o = run(dir.path(), &["compare", "--no-shop", spec, "job.kdl"]);
        let err = stderr(&o);
        assert!(says(&err, english_words), "{english_words} missing:\n{err}");
    }
}

#[test]
fn the_job_skeleton_new_writes_is_commented_in_the_shop_language() {
    let german = folder("", "language \"de\"");
    std::fs::remove_file(german.path().join("job.kdl")).unwrap();
    let o = run(german.path(), &["new"]);
    assert!(o.status.success(), "{}", stderr(&o));
    let made = made_by_new(german.path());
    assert_eq!(made.len(), 1, "{made:?}");
    let text = std::fs::read_to_string(&made[0]).unwrap();
    assert!(
        text.starts_with("// Eine Auftragsdatei für ampreport (KDL 2.0)."),
        "{text}"
    );
    assert!(
        text.contains("\n// Angaben zur Schaltung, die die Berechnungen brauchen.\ncircuit {"),
        "{text}"
    );
    assert!(
        !text.contains("// The job:") && !text.contains("// @"),
        "{text}"
    );
    // It reads back as a job, under the German shop.
    let name = made[0].file_name().unwrap().to_string_lossy().into_owned();
    let o = run(german.path(), &["check", &name]);
    assert!(o.status.success(), "{}", stderr(&o));
    // `init` reads no profile: English, word for word the skeleton's.
    let o = run(german.path(), &["init", "plain.kdl"]);
    assert!(o.status.success(), "{}", stderr(&o));
    let plain = std::fs::read_to_string(german.path().join("plain.kdl")).unwrap();
    assert!(
        plain.starts_with("// An ampreport job file (KDL 2.0)."),
        "{plain}"
    );
}

#[test]
fn the_kdl_parsers_words_are_said_in_the_shop_language() {
    use support::says;
    // A child block left open at the end of the file: the parser's
    // sentence, said from the catalogue at the same place in both.
    let job = std::fs::read_to_string(repo().join("jobs/combo-el84-cathode.kdl")).unwrap();
    let job = format!("{job}\nnotes {{\n    note \"open\"\n");
    let german = folder(&job, "language \"de\"");
    let english = folder(&job, "");
    let de = stderr(&run(german.path(), &["check", "job.kdl"]));
    let en = stderr(&run(english.path(), &["check", "job.kdl"]));
    assert!(
        says(
            &en,
            "KDL syntax: a block of child nodes is not closed with `}`"
        ),
        "{en}"
    );
    assert!(
        says(
            &de,
            "KDL-Syntax: der Block der Unterknoten wird nicht mit `}` geschlossen"
        ),
        "{de}"
    );
    assert!(!says(&de, "closing '}'"), "{de}");
    let place = |text: &str| {
        let start = text.find("[job.kdl:").expect("a place") + 1;
        let end = start + text[start..].find(']').unwrap();
        text[start..end].to_string()
    };
    assert_eq!(place(&de), place(&en));
}

#[test]
fn the_xml_and_image_readers_findings_are_said_in_the_shop_language() {
    use support::says;
    let job = std::fs::read_to_string(repo().join("jobs/combo-6v6-fixed.kdl")).unwrap();
    // (logo file, its bytes, German words, English words)
    let cases: [(&str, &[u8], &str, &str); 2] = [
        (
            "broken.svg",
            b"<svg xmlns=\"http://www.w3.org/2000/svg\"><g></svg>\n",
            "ist keine wohlgeformte SVG-Zeichnung (`</svg>` schließt ein Element, das `<g>` ist (Zeile 1,",
            "is not a well-formed SVG drawing (`</svg>` closes an element that is `<g>` (line 1,",
        ),
        (
            "cut.png",
            // A PNG signature and the start of a header chunk, then nothing.
            b"\x89PNG\r\n\x1a\n\0\0\0\x0dIHDR\0\0",
            "beginnt wie ein PNG-Bild, lässt sich aber nicht dekodieren (",
            "starts like a PNG picture but does not decode (",
        ),
    ];
    for (name, bytes, german_words, english_words) in cases {
        for (extra, words, other) in [
            ("language \"de\"", german_words, english_words),
            ("", english_words, german_words),
        ] {
            let dir = folder(&job, extra);
            let profile = std::fs::read_to_string(dir.path().join("shop.kdl")).unwrap();
            let profile =
                profile.replacen("logo \"larkmoor-logo.svg\"", &format!("logo \"{name}\""), 1);
            std::fs::write(dir.path().join("shop.kdl"), &profile).unwrap();
            std::fs::write(dir.path().join(name), bytes).unwrap();
            let o = run(dir.path(), &["check", "job.kdl"]);
            assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
            let err = stderr(&o);
            assert!(says(&err, words), "{words} missing from:\n{err}");
            assert!(!says(&err, other), "{err}");
            let place = at("shop.kdl", &profile, &format!("\"{name}\""));
            assert!(err.contains(&place), "{place} missing from:\n{err}");
        }
    }
}

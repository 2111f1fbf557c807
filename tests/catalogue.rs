//! The message catalogue through the real binary: a shop profile that
//! names German gets a complete German document (its labels, dates, the
//! mains-safety notice checked in the PDF); a shop's own translation file
//! with a key missing, a notice part missing or an unknown language is
//! refused before anything is rendered, naming the key at `file:line`.

use std::path::Path;
use std::process::Command;

mod support;

use support::{repo, run_in as run, stderr};

/// A folder with the demo job and its photos, the demo shop profile (with
/// `language` appended) and its logo.
fn shop_folder(language: &str) -> tempfile::TempDir {
    let dir = tempfile::tempdir().unwrap();
    for f in ["combo-6v6-fixed.kdl", "larkmoor-logo.svg"] {
        std::fs::copy(repo().join("jobs").join(f), dir.path().join(f)).unwrap();
    }
    // The demo job's photos.
    let photos = dir.path().join("photos");
    std::fs::create_dir(&photos).unwrap();
    for entry in std::fs::read_dir(repo().join("jobs/photos")).unwrap() {
        let from = entry.unwrap().path();
        std::fs::copy(&from, photos.join(from.file_name().unwrap())).unwrap();
    }
    let profile = std::fs::read_to_string(repo().join("jobs/shop.kdl")).unwrap();
    std::fs::write(
        dir.path().join("shop.kdl"),
        format!("{profile}\n{language}\n"),
    )
    .unwrap();
    dir
}

fn german() -> String {
    std::fs::read_to_string(repo().join("messages/de.ftl")).unwrap()
}

/// The German catalogue without the message `key` (and its continuation
/// lines).
fn german_without(key: &str) -> String {
    let mut out = String::new();
    let mut skipping = false;
    for line in german().split_inclusive('\n') {
        if line.starts_with(&format!("{key} =")) {
            skipping = true;
            continue;
        }
        if skipping && line.starts_with(' ') {
            continue;
        }
        skipping = false;
        out.push_str(line);
    }
    out
}

fn pdf_text(pdf: &Path) -> String {
    let out = Command::new("pdftotext")
        .args(["-enc", "UTF-8"])
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

#[test]
fn a_german_shop_gets_a_complete_german_document() {
    if !have_typst() {
        return;
    }
    let dir = shop_folder("language \"de\"");
    let o = run(
        dir.path(),
        &["render", "combo-6v6-fixed.kdl", "-o", "de.pdf"],
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let text = pdf_text(&dir.path().join("de.pdf"));
    // Every section of the document, in German.
    for words in [
        "ÜBERGABEPROTOKOLL",
        "Auftrag D-2611-022",
        // Received 5 and completed 12 November 2026 (the demo job).
        "Eingang 5. November 2026 · Fertig 12. November 2026",
        "AUF EINEN BLICK",
        "Was Aufmerksamkeit braucht",
        "Ersetzte Teile",
        "Änderungen",
        "Röhrenbestückung",
        "Versorgungsspannungen",
        "Röhren im Ruhezustand",
        "Belastete Bauteile",
        "Heizversorgung",
        "Diagramme",
        "Elektrische Sicherheitsprüfungen",
        "Kosten",
        "Zwischensumme",
        "Gewährleistung",
        "Unterschrift",
        "Methode und Annahmen",
        "Wie die Werte berechnet werden",
        // The notice and the deferral to local codes (the program itself
        // checked the whole notice, heading included, in the PDF).
        "Dieser Verstärker arbeitet mit Spannungen, die tödlich sein können.",
        "Örtliche elektrotechnische Vorschriften gehen vor.",
        "Seite 1 von",
        // The sentences built from the findings: the summary, the at-a-glance
        // lines, the attention list, the tables' words and the charts' axes.
        "Die Messreihe „as found“ zeigte: Endröhren V3 und V4 laufen heiß",
        "8 Bauteile wurden ersetzt",
        "In V5 steckt jetzt eine 5V4G (vorher eine 5Y3GT).",
        "Endröhren gegen ihre Grenzwerte",
        "Alle 3 Prüfungen halten ihre Grenzwerte ein.",
        "Was die Messwerte „as found“ zeigten",
        "R31: 213 % v. Nennwert",
        "Siebwiderstand",
        "Kathodenströme von V3, V4",
        "Schutzleiterwiderstand",
        "BESTANDEN",
        "Anodenverlustleistung, % des Grenzwerts",
        "Minuten nach dem Einschalten",
        "pro Stunde",
    ] {
        assert!(
            text.contains(words),
            "{words} missing from the German document"
        );
    }
    // The template's own English labels are gone.
    for english in [
        "HAND-OVER REPORT",
        "What needs attention",
        "Valve line-up",
        "Method and assumptions",
        "MAINS SAFETY",
        "Page 1 of",
        "The readings",
        "running hot",
        "parts were replaced",
        "Output valves against their ratings",
        "of rating",
        // A dropper's place ("B+1 to B+2"); the job's own text says
        // "dropper", so that word is not a sign.
        "B+1 to B+2",
        "cathode currents of",
        "Plate dissipation, % of rating",
        "Minutes since power-on",
        "per hour",
        "PASS",
    ] {
        assert!(!text.contains(english), "{english} left in English");
    }
}

/// The reasons of `calc --json` follow the shop's language; without a
/// profile they are English, as before.
#[test]
fn the_json_reasons_follow_the_shop_language() {
    let dir = shop_folder("language \"de\"");
    let reason_of_r31 = |args: &[&str]| {
        let o = run(dir.path(), args);
        assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
        let json: serde_json::Value = serde_json::from_slice(&o.stdout).unwrap();
        let r31 = json["sets"][0]["droppers"]
            .as_array()
            .unwrap()
            .iter()
            .find(|r| r["reference"] == "R31")
            .unwrap()
            .clone();
        (
            r31["reason"].as_str().unwrap().to_owned(),
            json["at_a_glance"][0]["title"].as_str().unwrap().to_owned(),
        )
    };
    // 100 V across 4.7 kΩ is 100² / 4700 = 2.13 W (Joule's law, textbook):
    // 213 % of the 1 W rating.
    let (german, title) = reason_of_r31(&["calc", "combo-6v6-fixed.kdl", "--json"]);
    assert_eq!(
        german,
        "Verlustleistung 2.13 W ist 213 % des Nennwerts von 1 W"
    );
    assert_eq!(title, "Endröhren gegen ihre Grenzwerte");
    let (english, title) = reason_of_r31(&["calc", "combo-6v6-fixed.kdl", "--json", "--no-shop"]);
    assert_eq!(english, "dissipation 2.13 W is 213 % of its 1 W rating");
    assert_eq!(title, "Output valves against their ratings");
}

#[test]
fn a_translation_missing_a_key_is_refused_naming_the_key() {
    let dir = shop_folder("language \"de\" file=\"werkstatt.ftl\"");
    std::fs::write(
        dir.path().join("werkstatt.ftl"),
        german_without("doc-subtotal"),
    )
    .unwrap();
    let o = run(dir.path(), &["check", "combo-6v6-fixed.kdl"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let err = stderr(&o);
    assert!(err.contains("catalogue::missing-key"), "{err}");
    // Said in the language the profile names, German being built in.
    assert!(
        err.contains("der Übersetzung fehlt die Meldung `doc-subtotal`"),
        "{err}"
    );
    assert!(err.contains("werkstatt.ftl:1:1"), "{err}");
    // The help points at the English message's line.
    let line = std::fs::read_to_string(repo().join("messages/en.ftl"))
        .unwrap()
        .lines()
        .position(|l| l.starts_with("doc-subtotal ="))
        .unwrap()
        + 1;
    assert!(err.contains(&format!("messages/en.ftl:{line}")), "{err}");

    // A language the program does not have built in hears it in English.
    let dir = shop_folder("language \"xx\" file=\"werkstatt.ftl\"");
    std::fs::write(
        dir.path().join("werkstatt.ftl"),
        german_without("diag-net-floating"),
    )
    .unwrap();
    let o = run(dir.path(), &["check", "combo-6v6-fixed.kdl"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let err = stderr(&o);
    assert!(
        err.contains("the translation has no message `diag-net-floating`"),
        "{err}"
    );
    let dir = shop_folder("language \"de\" file=\"werkstatt.ftl\"");

    // The complete file is accepted.
    std::fs::write(dir.path().join("werkstatt.ftl"), german()).unwrap();
    let o = run(dir.path(), &["check", "combo-6v6-fixed.kdl"]);
    assert_ne!(o.status.code(), Some(1), "{}", stderr(&o));
}

#[test]
fn a_notice_translated_in_part_is_refused() {
    let dir = shop_folder("language \"de\" file=\"werkstatt.ftl\"");
    std::fs::write(
        dir.path().join("werkstatt.ftl"),
        german_without("notice-earth"),
    )
    .unwrap();
    let o = run(dir.path(), &["check", "combo-6v6-fixed.kdl"]);
    assert_eq!(o.status.code(), Some(1));
    let err = stderr(&o);
    assert!(
        err.contains(
            "der Sicherheitshinweis zur Netzspannung wird nur als Ganzes übersetzt; es fehlen: notice-earth"
        ),
        "{err}"
    );
}

#[test]
fn a_language_without_a_catalogue_or_outside_the_folder_is_an_error_at_its_line() {
    let dir = shop_folder("language \"fr\"");
    let o = run(dir.path(), &["check", "combo-6v6-fixed.kdl"]);
    assert_eq!(o.status.code(), Some(1));
    let err = stderr(&o);
    let line = std::fs::read_to_string(dir.path().join("shop.kdl"))
        .unwrap()
        .lines()
        .position(|l| l.starts_with("language"))
        .unwrap()
        + 1;
    assert!(err.contains("no catalogue for `fr` built in"), "{err}");
    assert!(err.contains(&format!("shop.kdl:{line}:")), "{err}");

    let dir = shop_folder("language \"de\" file=\"../de.ftl\"");
    let o = run(dir.path(), &["check", "combo-6v6-fixed.kdl"]);
    assert_eq!(o.status.code(), Some(1));
    assert!(
        stderr(&o).contains("liegt nicht im Ordner des Profils"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn a_translation_that_is_a_fifo_a_link_out_or_not_utf8_is_refused_at_once() {
    // A FIFO named as the translation once made `check` wait forever for
    // a writer; the translation is read under the same rules as a photo
    // or a logo (regular file, inside the folder, size limit).
    let dir = shop_folder("language \"xx\" file=\"xx.ftl\"");
    let fifo = dir.path().join("xx.ftl");
    assert!(
        Command::new("mkfifo")
            .arg(&fifo)
            .status()
            .unwrap()
            .success()
    );
    let o = run(dir.path(), &["check", "combo-6v6-fixed.kdl"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    assert!(
        stderr(&o).contains("is not a regular file"),
        "{}",
        stderr(&o)
    );

    std::fs::remove_file(&fifo).unwrap();
    std::os::unix::fs::symlink("/etc/hostname", &fifo).unwrap();
    let o = run(dir.path(), &["check", "combo-6v6-fixed.kdl"]);
    assert_eq!(o.status.code(), Some(1));
    assert!(
        stderr(&o).contains("leads outside the profile's folder"),
        "{}",
        stderr(&o)
    );

    std::fs::remove_file(&fifo).unwrap();
    std::fs::write(&fifo, b"term-x = a\xff\n").unwrap();
    let o = run(dir.path(), &["check", "combo-6v6-fixed.kdl"]);
    assert_eq!(o.status.code(), Some(1));
    assert!(
        stderr(&o).contains("xx.ftl:1:11: the translation file is not UTF-8 text"),
        "{}",
        stderr(&o)
    );
}

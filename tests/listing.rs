//! The listing document (`render --listing`), through the real binary and
//! the real typst: every demo job gives a PDF of one or two pages and its
//! Markdown, both carrying the mains-safety notice and the deferral to
//! local codes; nothing the shop keeps to itself (the customer, their
//! contacts, the complaint, the charges, anything marked private, the
//! reasons for accepting a figure) reaches either, checked by planting a
//! unique word in every such field. The same job gives the same bytes
//! (PDF, Markdown, photos) from any folder.

mod support;

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

use support::{NOTICE_PHRASES, bin, demo, real_typst, repo, stderr};

const DEMO_JOBS: [&str; 4] = [
    "combo-el84-cathode",
    "combo-6v6-fixed",
    "head-el34-quad",
    "stereo-el84-hifi",
];

fn ampreport(args: &[&std::ffi::OsStr]) -> Output {
    let cache = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("listing-cache-home");
    Command::new(bin())
        .args(args)
        .env_remove("AMPREPORT_TYPST")
        .env("XDG_CACHE_HOME", &cache)
        .env("XDG_CONFIG_HOME", cache.join("no-config-home"))
        .output()
        .expect("run ampreport")
}

/// Renders the listing of `job` to `pdf`; the Markdown is beside it.
fn render_listing(job: &Path, pdf: &Path, extra: &[&str]) -> Output {
    let mut args: Vec<&std::ffi::OsStr> = vec![
        "render".as_ref(),
        job.as_os_str(),
        "--listing".as_ref(),
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
        stderr(out)
    );
}

fn pdftotext(pdf: &Path) -> String {
    let out = Command::new("pdftotext")
        .arg(pdf)
        .arg("-")
        .output()
        .expect("pdftotext (poppler-utils)");
    String::from_utf8_lossy(&out.stdout).into_owned()
}

fn pages(pdf: &Path) -> usize {
    let out = Command::new("pdfinfo").arg(pdf).output().expect("pdfinfo");
    String::from_utf8_lossy(&out.stdout)
        .lines()
        .find_map(|l| l.strip_prefix("Pages:"))
        .and_then(|n| n.trim().parse().ok())
        .expect("a page count")
}

/// Without white space (lines wrap anywhere in a PDF) or Markdown's
/// backslash escapes.
fn flat(text: &str) -> String {
    text.chars()
        .filter(|c| !c.is_whitespace() && *c != '\u{200b}' && *c != '\\')
        .collect()
}

/// Copies the demo job `name` and the demo photos into `dir`.
fn copy_demo(name: &str, dir: &Path) -> PathBuf {
    let job = dir.join(format!("{name}.kdl"));
    std::fs::copy(demo(name), &job).unwrap();
    let photos = dir.join("photos");
    std::fs::create_dir_all(&photos).unwrap();
    for entry in std::fs::read_dir(repo().join("jobs").join("photos")).unwrap() {
        let entry = entry.unwrap();
        std::fs::copy(entry.path(), photos.join(entry.file_name())).unwrap();
    }
    job
}

/// The text of a KDL property in `text`: `name="…"` on the line starting
/// with `node`.
fn property(text: &str, node: &str, name: &str) -> String {
    let line = text
        .lines()
        .find(|l| l.trim_start().starts_with(node))
        .unwrap_or_else(|| panic!("no {node} line"));
    line.split(&format!("{name}=\""))
        .nth(1)
        .and_then(|s| s.split('"').next())
        .unwrap_or_else(|| panic!("no {name} on {line}"))
        .to_string()
}

#[test]
fn each_demo_job_gives_a_listing_of_at_most_two_pages_with_the_notice() {
    if !real_typst() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    for name in DEMO_JOBS {
        let pdf = dir.path().join(format!("{name}.listing.pdf"));
        let out = render_listing(&demo(name), &pdf, &[]);
        assert_ok(&out, name);
        let md_path = dir.path().join(format!("{name}.listing.md"));
        let md = std::fs::read_to_string(&md_path).expect("the Markdown beside the PDF");
        let text = pdftotext(&pdf);
        let n = pages(&pdf);
        assert!((1..=2).contains(&n), "{name}: {n} pages");
        let (pdf_flat, md_flat) = (flat(&text), flat(&md));
        for phrase in NOTICE_PHRASES {
            assert!(
                pdf_flat.contains(&flat(phrase)),
                "{name}: PDF lacks {phrase:?}"
            );
            assert!(
                md_flat.contains(&flat(phrase)),
                "{name}: Markdown lacks {phrase:?}"
            );
        }
        // The unit and the shop are there; the customer is not.
        let job_text = std::fs::read_to_string(demo(name)).unwrap();
        let model = property(&job_text, "unit ", "model");
        assert!(pdf_flat.contains(&flat(&model)), "{name}: model missing");
        assert!(md_flat.contains(&flat(&model)), "{name}: model missing");
        let customer = property(&job_text, "customer ", "name");
        assert!(
            !pdf_flat.contains(&flat(&customer)),
            "{name}: customer in PDF"
        );
        assert!(
            !md_flat.contains(&flat(&customer)),
            "{name}: customer in Markdown"
        );
        let shop = std::fs::read_to_string(repo().join("jobs/shop.kdl")).unwrap();
        let shop_name = shop
            .lines()
            .find_map(|l| l.strip_prefix("shop \""))
            .and_then(|l| l.split('"').next())
            .expect("the demo shop's name");
        assert!(pdf_flat.contains(&flat(shop_name)), "{name}: shop missing");
        // Each output valve of the final set is there with its idle share,
        // as calc gives it.
        let calc = ampreport(&["calc".as_ref(), demo(name).as_os_str(), "--json".as_ref()]);
        let v: serde_json::Value = serde_json::from_slice(&calc.stdout).unwrap();
        let last = v["sets"]
            .as_array()
            .unwrap()
            .iter()
            .find(|s| s["is_final"] == true)
            .unwrap();
        for valve in last["valves"].as_array().unwrap() {
            if valve["is_output"] != true {
                continue;
            }
            let Some(pct) = valve["plate_dissipation_pct"].as_f64() else {
                continue;
            };
            let position = valve["position"].as_str().unwrap();
            let row = match valve["channel"].as_str() {
                Some(channel) => format!("{position}({channel})|"),
                None => format!("{position}|"),
            };
            let cell = format!("|{:.0}%|", pct);
            let md_row = md
                .lines()
                .map(flat)
                .find(|l| l.starts_with(&format!("|{row}")))
                .unwrap_or_else(|| panic!("{name}: no row for {row}"));
            assert!(md_row.contains(&cell), "{name}: {md_row} lacks {cell}");
        }
        // Listing photos are files beside the Markdown, stripped and
        // shrunk like the ones in the PDF.
        for line in md.lines().filter(|l| l.starts_with("![")) {
            let file = line.split("](<").nth(1).unwrap().trim_end_matches(">)");
            let bytes = std::fs::read(dir.path().join(file)).expect("photo beside");
            assert!(!bytes.windows(4).any(|w| w == b"Exif"), "{file} keeps EXIF");
        }
    }
}

#[test]
fn nothing_private_reaches_the_listing_pdf_or_markdown() {
    if !real_typst() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = copy_demo("combo-6v6-fixed", dir.path());
    let mut text = std::fs::read_to_string(&job).unwrap();
    let plant = |text: &mut String, from: &str, to: &str| {
        assert!(text.contains(from), "the demo job has no {from:?}");
        *text = text.replace(from, to);
    };
    // Whole nodes that are private by nature or marked private.
    let cut_block = |text: &mut String, start: &str| {
        let at = text.find(start).unwrap();
        let body = at + start.len();
        let end = body + text[body..].find("\"\"\"").unwrap() + 3;
        text.replace_range(at..end, "");
    };
    cut_block(&mut text, "findings \"\"\"");
    cut_block(&mut text, "work \"\"\"");
    text.push_str("findings \"ZZPRIVFINDINGS\" private=#true\n");
    text.push_str("work \"ZZPRIVWORK\" private=#true\n");
    plant(&mut text, "Emeka Lindqvist", "ZZPRIVCUSTOMER");
    plant(&mut text, "+1 555 0178", "ZZPRIVCONTACT");
    plant(
        &mut text,
        "Cuts out after a few minutes; a burning smell from the chassis.",
        "ZZPRIVCOMPLAINT",
    );
    plant(
        &mut text,
        "parts {\n",
        "parts {\n    part R99 was=\"1k\" now=\"1k2\" reason=\"ZZPRIVPARTREASON\" private=#true\n",
    );
    plant(
        &mut text,
        "mods {\n",
        "mods {\n    mod \"Presence trimmer fitted\" why=\"ZZPRIVMODWHY\" private=#true\n",
    );
    plant(
        &mut text,
        "notes {\n",
        "notes {\n    note \"ZZPRIVNOTE\" private=#true\n    note \"ZZPUBLICNOTE\"\n",
    );
    plant(
        &mut text,
        "labour \"Bench run-in and hand-over report\"",
        "labour \"ZZPRIVLABOUR\"",
    );
    plant(
        &mut text,
        "Factory design: the chart puts 320 V on the plates; dissipation is inside the aim",
        "ZZPRIVACCEPTED",
    );
    std::fs::write(&job, &text).unwrap();
    let pdf = dir.path().join("job.listing.pdf");
    assert_ok(
        &render_listing(&job, &pdf, &[]),
        "listing with planted words",
    );
    let pdf_flat = flat(&pdftotext(&pdf));
    let md_flat = flat(&std::fs::read_to_string(dir.path().join("job.listing.md")).unwrap());
    for secret in [
        "ZZPRIVFINDINGS",
        "ZZPRIVWORK",
        "ZZPRIVCUSTOMER",
        "ZZPRIVCONTACT",
        "ZZPRIVCOMPLAINT",
        "ZZPRIVPARTREASON",
        "ZZPRIVMODWHY",
        "ZZPRIVNOTE",
        "ZZPRIVLABOUR",
        "ZZPRIVACCEPTED",
        // The charges' rate and currency.
        "48.00",
        "GBP",
    ] {
        assert!(!pdf_flat.contains(secret), "{secret} reached the PDF");
        assert!(!md_flat.contains(secret), "{secret} reached the Markdown");
    }
    // What is not private is there: the public note, the part and the mod
    // named without their reasons.
    for public in ["ZZPUBLICNOTE", "R99", "Presencetrimmerfitted"] {
        assert!(pdf_flat.contains(public), "{public} missing from the PDF");
        assert!(
            md_flat.contains(public),
            "{public} missing from the Markdown"
        );
    }
    // The hand-over keeps everything.
    let handover = dir.path().join("job.pdf");
    let out = ampreport(&[
        "render".as_ref(),
        job.as_os_str(),
        "-o".as_ref(),
        handover.as_os_str(),
    ]);
    assert_ok(&out, "hand-over");
    let all = flat(&pdftotext(&handover));
    for kept in [
        "ZZPRIVCUSTOMER",
        "ZZPRIVNOTE",
        "ZZPRIVPARTREASON",
        "ZZPRIVFINDINGS",
    ] {
        assert!(all.contains(kept), "{kept} missing from the hand-over");
    }
}

#[test]
fn the_serial_can_be_masked_or_hidden_and_o_names_the_pdf() {
    if !real_typst() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = copy_demo("combo-el84-cathode", dir.path());
    let serial = property(&std::fs::read_to_string(&job).unwrap(), "unit ", "serial");
    let pdf = dir.path().join("for-sale.pdf");
    assert_ok(
        &render_listing(&job, &pdf, &["--serial", "masked"]),
        "masked serial",
    );
    let md = std::fs::read_to_string(dir.path().join("for-sale.md")).unwrap();
    let last_two: String = serial
        .chars()
        .rev()
        .take(2)
        .collect::<Vec<_>>()
        .into_iter()
        .rev()
        .collect();
    assert!(!flat(&pdftotext(&pdf)).contains(&serial));
    assert!(!md.contains(&serial));
    assert!(md.contains(&format!("\u{2022}{last_two}")), "{md}");
    assert_ok(
        &render_listing(&job, &pdf, &["--serial", "hidden"]),
        "hidden serial",
    );
    let md = std::fs::read_to_string(dir.path().join("for-sale.md")).unwrap();
    assert!(!md.contains(&last_two) || !md.contains("Serial"), "{md}");
    assert!(!md.contains("**Serial:**"), "{md}");
    // The default output sits beside the job: NAME.listing.pdf and .md.
    let out = ampreport(&["render".as_ref(), job.as_os_str(), "--listing".as_ref()]);
    assert_ok(&out, "default output");
    assert!(dir.path().join("combo-el84-cathode.listing.pdf").is_file());
    assert!(dir.path().join("combo-el84-cathode.listing.md").is_file());
    // `-o -` has nowhere to put the Markdown.
    let out = ampreport(&[
        "render".as_ref(),
        job.as_os_str(),
        "--listing".as_ref(),
        "-o".as_ref(),
        "-".as_ref(),
    ]);
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
}

#[test]
fn a_listing_is_the_same_bytes_each_time_and_from_any_folder() {
    if !real_typst() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let job = copy_demo("combo-6v6-fixed", dir.path());
    let names = [
        "combo-6v6-fixed.listing.pdf",
        "combo-6v6-fixed.listing.md",
        "combo-6v6-fixed.listing-photo-1.jpg",
        "combo-6v6-fixed.listing-photo-2.png",
    ];
    let read_all = || -> Vec<Vec<u8>> {
        names
            .iter()
            .map(|n| std::fs::read(dir.path().join(n)).unwrap_or_else(|_| panic!("{n}")))
            .collect()
    };
    // From the job's folder, by its bare name.
    let cache = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("listing-cache-home");
    let run_in = |cwd: &Path, job: &Path| {
        Command::new(bin())
            .current_dir(cwd)
            .args([
                "render".as_ref(),
                job.as_os_str(),
                "--listing".as_ref(),
                "--force".as_ref(),
            ])
            .env_remove("AMPREPORT_TYPST")
            .env("XDG_CACHE_HOME", &cache)
            .env("XDG_CONFIG_HOME", cache.join("no-config-home"))
            .output()
            .unwrap()
    };
    assert_ok(
        &run_in(dir.path(), Path::new("combo-6v6-fixed.kdl")),
        "from the folder",
    );
    let first = read_all();
    // Again, from `/` with the full path.
    assert_ok(&run_in(Path::new("/"), &job), "from /");
    let second = read_all();
    for ((name, a), b) in names.iter().zip(&first).zip(&second) {
        assert!(a == b, "{name} differs between two renders");
    }
}

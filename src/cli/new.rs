//! `ampreport new [--from OLD_JOB] [--dir DIR]`: the next job file of the
//! shop. Its id is the next in the shop's numbering (the shop profile's
//! `job-numbers`, counting on from the highest id of the period among the
//! jobs already in the folder), its received date today. With `--from`, it
//! starts from a previous job of the same unit or model: the unit, the
//! mains, the line-up and the circuit facts are copied as they are written
//! there; the readings, parts, mods, safety tests, notes, photos,
//! acceptances, customer and charges are not. Without it, it is the
//! annotated skeleton of `init`. It never replaces a file.

use std::path::{Path, PathBuf};

use chrono::NaiveDate;

use super::args::NewArgs;
use super::exit::Exit;
use super::init::write_new;
use super::load;
use super::said::Said;
use crate::catalogue::{Catalogue, Msg};
use crate::job::numbering::{DEFAULT_PATTERN, Numbering};
use crate::ratings::RatingsTable;

/// The top-level nodes `--from` copies, in this order.
pub const CARRIED: &[&str] = &["unit", "mains", "valves", "circuit"];

pub fn run(args: &NewArgs) -> Exit {
    let dir = args.dir.clone().unwrap_or_else(|| PathBuf::from("."));
    if !dir.is_dir() {
        // Before the shop profile is read: English.
        eprintln!(
            "{}",
            super::ui::english(
                &Msg::new("cli-new-not-a-folder").arg("folder", dir.display().to_string())
            )
        );
        return Exit::Usage;
    }
    let mut said = Said::default();
    let shop = load::shop_profile(
        &dir.join("new-job.kdl"),
        choice(args),
        &mut said,
        &mut Vec::new(),
    );
    said.print();
    let shop = match shop {
        Ok(s) => s,
        Err(e) => return e,
    };
    // From here on the command speaks the shop profile's language.
    let cat = shop
        .as_ref()
        .map_or(Catalogue::english(), |s| &s.catalogue)
        .clone();
    let pattern = shop
        .as_ref()
        .and_then(|s| s.profile.job_numbers.clone())
        .unwrap_or_else(|| DEFAULT_PATTERN.to_string());
    // The profile's pattern was checked when it was read.
    let Ok(numbering) = Numbering::parse(&pattern) else {
        return Exit::InvalidInput;
    };
    let today = chrono::Local::now().date_naive();
    let ids = job_ids_in(&dir);
    let id = numbering.next_id(today, ids.iter().map(String::as_str));
    let text = match &args.from {
        Some(old) => match from_old(args, old, &id, today, &cat) {
            Ok(t) => t,
            Err(e) => return e,
        },
        None => skeleton(&id, today, &cat),
    };
    // What is written must read back as a job.
    if let Err(d) = crate::job::decode(&format!("{id}.kdl"), &text) {
        eprintln!("{:?}", miette::Report::new(d));
        eprintln!("{}", cat.text("cli-new-fault"));
        return Exit::Environment;
    }
    let path = dir.join(format!("{id}.kdl"));
    write_new(&path, &text, Msg::new("cli-new-next"), &cat)
}

/// The `job` ids of the job files in `dir` (every `.kdl` file but the
/// shop profile that reads as KDL and has one). Files that cannot be read
/// are skipped: they hold no id to count from.
pub fn job_ids_in(dir: &Path) -> Vec<String> {
    let Ok(entries) = std::fs::read_dir(dir) else {
        return Vec::new();
    };
    let mut ids = Vec::new();
    for entry in entries.flatten() {
        let path = entry.path();
        let is_job = path.extension().is_some_and(|e| e == "kdl")
            && path
                .file_name()
                .is_some_and(|n| n != crate::shop::SHOP_FILE)
            && entry.file_type().is_ok_and(|t| t.is_file());
        if !is_job {
            continue;
        }
        let Ok(text) = crate::input_file::read_text(&path, "job file") else {
            continue;
        };
        let Ok(doc) = crate::kdl_fast::parse_document(&text) else {
            continue;
        };
        let id = doc
            .nodes()
            .iter()
            .find(|n| n.name().value() == "job")
            .and_then(|n| n.get("id"))
            .and_then(|v| v.as_string())
            .map(str::to_string);
        ids.extend(id);
    }
    ids
}

/// The `job` line of a new job.
fn job_line(id: &str, today: NaiveDate) -> String {
    format!(
        "job id={} received=\"{}\"",
        kdl_string(id),
        today.format("%Y-%m-%d")
    )
}

/// `text` as a quoted KDL string (Rust's escapes for quotes, backslashes
/// and control characters are KDL 2.0's too).
fn kdl_string(text: &str) -> String {
    format!("{text:?}")
}

/// The annotated skeleton with the new id and today's date, its comments
/// in `cat`'s words.
fn skeleton(id: &str, today: NaiveDate, cat: &Catalogue) -> String {
    super::init::job_skeleton(cat)
        .lines()
        .map(|l| {
            if l.starts_with("job id=") {
                job_line(id, today)
            } else {
                l.to_string()
            }
        })
        .collect::<Vec<_>>()
        .join("\n")
        + "\n"
}

/// The shop profile as `--shop` and `--no-shop` choose it.
fn choice(args: &NewArgs) -> load::ShopChoice<'_> {
    load::ShopChoice {
        named: args.shop.as_deref(),
        none: args.no_shop,
    }
}

/// A new job from `old`: its unit, mains, line-up and circuit as written,
/// under comments in the words of `cat`.
fn from_old(
    args: &NewArgs,
    old: &Path,
    id: &str,
    today: NaiveDate,
    cat: &Catalogue,
) -> Result<String, Exit> {
    // The old job must be a valid job: its problems are shown as `check`
    // shows them, over the shop profile it would be checked with.
    let mut said = Said::default();
    let loaded = load::job(old, choice(args), &RatingsTable::builtin(), &mut said);
    said.print();
    let loaded = loaded?;
    let doc = crate::kdl_fast::parse_document(&loaded.text).map_err(|_| Exit::InvalidInput)?;
    let started = Msg::new("cli-new-started-from")
        .arg(
            "file",
            old.file_name()
                .map(|n| n.to_string_lossy().into_owned())
                .unwrap_or_default()
                .replace(['\n', '\r'], " "),
        )
        .arg("id", loaded.decoded.job.info.id.replace(['\n', '\r'], " "));
    let mut out = format!(
        "{}job-format {}\n\n{}\n",
        comment(&cat.say(&started)),
        crate::job::FORMAT_VERSION,
        job_line(id, today),
    );
    for name in CARRIED {
        if let Some(node) = doc.nodes().iter().find(|n| n.name().value() == *name) {
            let span = node.span();
            let text = loaded
                .text
                .get(span.offset()..span.offset() + span.len())
                .ok_or(Exit::InvalidInput)?;
            out.push('\n');
            out.push_str(text.trim());
            out.push('\n');
        }
    }
    out.push('\n');
    out.push_str(&comment(&cat.text("cli-new-readings")));
    out.push_str("//   measurements \"as found\" mains=\"…\" { … }\n");
    Ok(out)
}

/// `text` as KDL comment lines, one for each of its lines.
fn comment(text: &str) -> String {
    text.lines().map(|l| format!("// {l}\n")).collect()
}

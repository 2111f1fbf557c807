//! Build script: works out the SHA-256 of the bundled fonts (every file in
//! `fonts/`, by name) once at build time, so the program can name its
//! per-user font cache folder after the font bytes without hashing 9 MB on
//! every run. `src/typeset/font_cache.rs` reads it as
//! `AMPREPORT_FONTS_DIGEST` and a unit test checks it against the embedded
//! files.
//!
//! It also reads the character maps of the bundled fonts into a table of
//! the characters they can draw (`$OUT_DIR/font_coverage.rs`, read by
//! `src/typeset/fonts.rs`), which every render used to build at run time.
//!
//! It also works out the digest of everything else that decides what the
//! program prints (its sources, templates, ratings table, message
//! catalogues, manifest and lock file), `AMPREPORT_PROGRAM_DIGEST`, which the content key of an
//! incremental render uses to tell one build of ampreport from another
//! without reading the binary (see `src/cli/content_key.rs`).
//!
//! And it cuts the built-in message catalogues into parts by message group
//! (`$OUT_DIR/catalogue_parts.rs`), which `src/catalogue/mod.rs` parses
//! only when a message of that part is said.

use std::path::Path;

use sha2::{Digest, Sha256};

fn main() {
    let dir = Path::new("fonts");
    println!("cargo:rerun-if-changed=fonts");
    let mut names: Vec<String> = std::fs::read_dir(dir)
        .expect("the fonts/ folder is readable")
        .map(|e| {
            e.expect("a fonts/ entry")
                .file_name()
                .into_string()
                .expect("UTF-8 font file names")
        })
        .collect();
    names.sort();
    let mut hasher = Sha256::new();
    for name in &names {
        let path = dir.join(name);
        println!("cargo:rerun-if-changed={}", path.display());
        let bytes = std::fs::read(&path).expect("a font file is readable");
        // The same framing as `font_cache::digest_of` (name, NUL, length, bytes).
        hasher.update(name.as_bytes());
        hasher.update([0]);
        hasher.update((bytes.len() as u64).to_le_bytes());
        hasher.update(&bytes);
    }
    let hex: String = hasher
        .finalize()
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect();
    println!("cargo:rustc-env=AMPREPORT_FONTS_DIGEST={hex}");
    font_coverage(dir, &names);
    cjk_only(dir);
    program_digest();
    catalogue_parts();
}

/// The characters of the CJK face that typst may take from it, written as
/// sorted ranges to `$OUT_DIR/cjk_only.rs` for `src/typeset/fonts.rs`
/// (`needs_cjk`); a document without any of them is set without the CJK
/// file. Three tables, one for each way typst picks a face:
///
/// * `CJK_IN_BODY`: text set with the document's font lists (body: Noto
///   Sans, Arabic, Hebrew, Devanagari; monospaced: Noto Sans Mono, the
///   same three), in any of the four variants: the CJK face's characters
///   except those every variant reaches in another face of both lists.
///   The Arabic, Hebrew and Devanagari families have no italic, so both
///   their faces must have the character.
/// * `CJK_IN_SVG`: an SVG's text in Noto Sans: a character its face lacks
///   is taken from the face that has it and is most like Noto Sans (typst's
///   `FontBook::select_fallback`), which is a Noto face (Noto Sans, Arabic,
///   Hebrew, Devanagari) whenever one has it; so the CJK face's characters
///   except those every Noto Sans face, or both faces of one of the three
///   other families, have.
///
/// A unit test holds the tables to the fonts' character maps read at run
/// time.
fn cjk_only(dir: &Path) {
    use std::collections::BTreeSet;
    let cmap = |name: &str, index: u32| -> BTreeSet<u32> {
        let data = std::fs::read(dir.join(name)).expect("a font file is readable");
        let face = ttf_parser::Face::parse(&data, index).expect("a bundled face parses");
        let mut set = BTreeSet::new();
        for table in face.tables().cmap.expect("a character map").subtables {
            if table.is_unicode() {
                table.codepoints(|c| {
                    set.insert(c);
                });
            }
        }
        set
    };
    let all = |names: &[&str]| -> BTreeSet<u32> {
        let mut set = cmap(names[0], 0);
        for name in &names[1..] {
            let other = cmap(name, 0);
            set.retain(|c| other.contains(c));
        }
        set
    };
    let sans = all(&[
        "NotoSans-Regular.ttf",
        "NotoSans-Bold.ttf",
        "NotoSans-Italic.ttf",
        "NotoSans-BoldItalic.ttf",
    ]);
    let mono = all(&["NotoSansMono-Regular.ttf", "NotoSansMono-Bold.ttf"]);
    let mut scripts = BTreeSet::new();
    for family in ["Arabic", "Hebrew", "Devanagari"] {
        scripts.extend(all(&[
            &format!("NotoSans{family}-Regular.ttf"),
            &format!("NotoSans{family}-Bold.ttf"),
        ]));
    }
    let data = std::fs::read(dir.join("wqy-microhei.ttc")).expect("the CJK file is readable");
    let mut cjk = BTreeSet::new();
    for index in 0..ttf_parser::fonts_in_collection(&data).unwrap_or(1) {
        cjk.extend(cmap("wqy-microhei.ttc", index));
    }
    let table = |name: &str, keep: &dyn Fn(u32) -> bool| -> String {
        let mut ranges: Vec<(u32, u32)> = Vec::new();
        for &c in cjk.iter().filter(|&&c| keep(c)) {
            match ranges.last_mut() {
                Some((_, last)) if *last + 1 == c => *last = c,
                _ => ranges.push((c, c)),
            }
        }
        let mut text = format!("pub(crate) static {name}: &[(u32, u32)] = &[\n");
        for (first, last) in &ranges {
            text.push_str(&format!("    (0x{first:X}, 0x{last:X}),\n"));
        }
        text.push_str("];\n");
        text
    };
    // Both lists reach the character before the CJK family: one of the
    // three script families (in both lists) has it, or Noto Sans and Noto
    // Sans Mono both do.
    let in_body = |c: u32| !(scripts.contains(&c) || sans.contains(&c) && mono.contains(&c));
    let text = format!(
        "// Generated by build.rs from the fonts' character maps.\n{}{}",
        table("CJK_IN_BODY", &in_body),
        table("CJK_IN_SVG", &|c| !(sans.contains(&c)
            || scripts.contains(&c))),
    );
    let out = Path::new(&std::env::var("OUT_DIR").expect("cargo sets OUT_DIR")).join("cjk_only.rs");
    std::fs::write(out, text).expect("OUT_DIR is writable");
}

/// The built-in catalogues (`messages/en.ftl`, `messages/de.ftl`) cut into
/// parts by message group (`$OUT_DIR/catalogue_parts.rs`, read by
/// `src/catalogue/mod.rs`), so a run parses a part only when it says one
/// of its messages. A message's group is the first word of its key
/// (`doc`, `diag`, `month` …), for the terminal's messages (`cli-…`) the
/// first two (`cli-wrote`, `cli-typst` …): a render says one of them and
/// parsing all 26 KB of them for it was 3 % of its own instructions.
/// [`message_group`] is the rule, and `src/catalogue/mod.rs` has the same
/// one (`group_of`; a test holds the two to the same parts). Comment lines
/// are left out (they end any pattern before them, so leaving them out
/// changes no message); every other line goes with the message or term
/// it belongs to. The parts are listed by group, in order.
fn catalogue_parts() {
    let out = std::path::PathBuf::from(std::env::var("OUT_DIR").expect("cargo sets OUT_DIR"));
    let mut rust =
        String::from("pub(crate) const BUILT_IN_PARTS: &[(&str, &[(&str, &str)])] = &[\n");
    for lang in ["en", "de"] {
        let path = format!("messages/{lang}.ftl");
        println!("cargo:rerun-if-changed={path}");
        let text = std::fs::read_to_string(&path).expect("a built-in catalogue is readable");
        let mut parts: std::collections::BTreeMap<String, String> = Default::default();
        let mut current = String::new();
        for line in text.split_inclusive('\n') {
            if line.starts_with('#') {
                continue;
            }
            if line.starts_with(|c: char| c.is_ascii_alphabetic() || c == '-') {
                let key = line
                    .split(|c: char| c == '=' || c.is_whitespace())
                    .next()
                    .unwrap_or_default();
                current = message_group(key).to_owned();
            }
            parts.entry(current.clone()).or_default().push_str(line);
        }
        rust.push_str(&format!("    ({lang:?}, &[\n"));
        for (group, part) in &parts {
            rust.push_str(&format!("        ({group:?}, {part:?}),\n"));
        }
        rust.push_str("    ]),\n");
    }
    rust.push_str("];\n");
    std::fs::write(out.join("catalogue_parts.rs"), rust).expect("OUT_DIR is writable");
}

/// The group of a message key: its first word, or its first two for the
/// terminal's messages (`cli-wrote-stdout` is in `cli-wrote`).
fn message_group(key: &str) -> &str {
    let mut words = key.splitn(3, '-');
    let first = words.next().unwrap_or_default();
    match (first, words.next()) {
        ("cli", Some(second)) => &key[..first.len() + 1 + second.len()],
        _ => first,
    }
}

/// SHA-256 over every file under `src/`, `templates/`, `ratings/` and
/// `messages/` and
/// `Cargo.toml`, `Cargo.lock` and `build.rs`, by path, in path order.
fn program_digest() {
    let mut files = Vec::new();
    for dir in ["src", "templates", "ratings", "messages"] {
        println!("cargo:rerun-if-changed={dir}");
        collect(Path::new(dir), &mut files);
    }
    for file in ["Cargo.toml", "Cargo.lock", "build.rs"] {
        println!("cargo:rerun-if-changed={file}");
        files.push(Path::new(file).to_path_buf());
    }
    files.sort();
    let mut hasher = Sha256::new();
    for path in &files {
        let Ok(bytes) = std::fs::read(path) else {
            continue;
        };
        let name = path.to_string_lossy();
        hasher.update(name.as_bytes());
        hasher.update([0]);
        hasher.update((bytes.len() as u64).to_le_bytes());
        hasher.update(&bytes);
    }
    let hex: String = hasher
        .finalize()
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect();
    println!("cargo:rustc-env=AMPREPORT_PROGRAM_DIGEST={hex}");
}

fn collect(dir: &Path, out: &mut Vec<std::path::PathBuf>) {
    let Ok(entries) = std::fs::read_dir(dir) else {
        return;
    };
    for entry in entries.flatten() {
        let path = entry.path();
        match entry.file_type() {
            Ok(t) if t.is_dir() => collect(&path, out),
            Ok(t) if t.is_file() => out.push(path),
            _ => {}
        }
    }
}

/// The characters the bundled fonts can draw, as sorted, disjoint,
/// non-adjacent ranges `(first, last)`, written to
/// `$OUT_DIR/font_coverage.rs` for `src/typeset/fonts.rs`: reading the
/// character maps of 13 faces (one of them a CJK font of 20,000-odd
/// characters) into a set took several milliseconds of every render.
/// A unit test holds the table to the fonts' character maps read at run
/// time.
fn font_coverage(dir: &Path, names: &[String]) {
    let mut points: Vec<u32> = Vec::new();
    for name in names {
        if !(name.ends_with(".ttf") || name.ends_with(".otf") || name.ends_with(".ttc")) {
            continue;
        }
        let data = std::fs::read(dir.join(name)).expect("a font file is readable");
        let faces = ttf_parser::fonts_in_collection(&data).unwrap_or(1);
        for index in 0..faces {
            let Ok(face) = ttf_parser::Face::parse(&data, index) else {
                continue;
            };
            let Some(cmap) = face.tables().cmap else {
                continue;
            };
            for table in cmap.subtables {
                if table.is_unicode() {
                    table.codepoints(|c| points.push(c));
                }
            }
        }
    }
    points.sort_unstable();
    points.dedup();
    let mut ranges: Vec<(u32, u32)> = Vec::new();
    for c in points {
        match ranges.last_mut() {
            Some((_, last)) if *last + 1 == c => *last = c,
            _ => ranges.push((c, c)),
        }
    }
    let mut text = String::from(
        "/// Generated by build.rs from the fonts' character maps.\npub(crate) static FONT_COVERAGE: &[(u32, u32)] = &[\n",
    );
    for (first, last) in &ranges {
        text.push_str(&format!("    (0x{first:X}, 0x{last:X}),\n"));
    }
    text.push_str("];\n");
    let out =
        Path::new(&std::env::var("OUT_DIR").expect("cargo sets OUT_DIR")).join("font_coverage.rs");
    std::fs::write(out, text).expect("OUT_DIR is writable");
}

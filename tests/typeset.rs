//! Runs the real typst program through the `typeset` module: hostile user
//! text must come out of the PDF literally, output must be byte-for-byte
//! reproducible, and a failed run must leave the destination folder as it
//! was. Skipped, with a note, only where typst is not installed (and never
//! under CI, where it must be).

use std::path::{Path, PathBuf};
use std::process::Command;

use ampreport::typeset::{
    CompileOptions, FontPlace, FontsUsed, INSTALL_HINT, MIN_TYPST, Sandbox, TemplateSource,
    TypesetError, TypstProgram, compile, emit_source, font_cache_folder_name, font_rules, locate,
    locate_in, template_environment, typst_markup,
};
use chrono::NaiveDate;
use minijinja::context;

/// The typst on this machine, or `None` (with a note) if there is none.
fn typst() -> Option<TypstProgram> {
    match locate(None) {
        Ok(program) => Some(program),
        Err(err @ TypesetError::NotFound { .. }) if std::env::var_os("CI").is_none() => {
            eprintln!("note: skipping typst tests: {err}");
            None
        }
        Err(err) => panic!("typst is needed for these tests: {err:?}"),
    }
}

fn job_date() -> NaiveDate {
    NaiveDate::from_ymd_opt(2024, 5, 17).unwrap()
}

/// A font cache for these tests, inside the build's own temporary folder
/// rather than the user's cache.
fn test_cache() -> PathBuf {
    PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("typeset-font-cache")
}

/// The default options, with the fonts in [`test_cache`].
fn options(date: NaiveDate) -> CompileOptions {
    CompileOptions {
        fonts: FontPlace::CacheIn(test_cache()),
        ..CompileOptions::new(date)
    }
}

const CASE_TEMPLATE: &str = "\
{{ rules }}
#set document(title: {{ text|typst_string }})
CASESTART

{{ text }}

CASEPARAEND

= {{ text }}

CASEHEADEND

#table(columns: 1)[{{ text }}]

CASEEND
";

static TEMPLATES: &[(&str, &str)] = &[("case.typ", CASE_TEMPLATE)];

/// Fills the test template with `text` and returns the sandbox.
fn case_sandbox(text: &str) -> Sandbox {
    let env = template_environment(TemplateSource::embedded(TEMPLATES));
    let source = env
        .get_template("case.typ")
        .unwrap()
        .render(context! { rules => typst_markup(font_rules()), text => text })
        .unwrap();
    let mut sandbox = Sandbox::new();
    sandbox.insert("main.typ", source).unwrap();
    sandbox
}

fn pdftotext(pdf: &Path) -> String {
    let out = Command::new("pdftotext")
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

/// Drops whitespace (pdftotext rewraps lines) and the direction marks it
/// adds around right-to-left runs.
fn normalise(text: &str) -> String {
    text.chars()
        .filter(|c| !c.is_whitespace())
        .filter(|c| !matches!(c, '\u{200e}' | '\u{200f}' | '\u{202a}'..='\u{202e}' | '\u{2066}'..='\u{2069}'))
        .collect()
}

fn corpus() -> Vec<(&'static str, String)> {
    let mut long = String::new();
    for i in 0.. {
        if long.len() >= 10_000 {
            break;
        }
        long.push_str(&format!("word{i} "));
    }
    long.truncate(10_000);
    assert_eq!(long.chars().count(), 10_000);
    let cases: &[(&str, &str)] = &[
        ("read", "#read(\"/etc/passwd\")"),
        ("include", "#include \"x.typ\""),
        ("code block", "#{ panic(\"no\") } #let x = 1"),
        ("math", "$x^2$"),
        ("label", "<label>"),
        ("reference", "@ref"),
        ("line comment", "// comment"),
        ("block comment", "/* block */"),
        ("strong and emphasis", "*bold* _em_"),
        ("heading", "= Heading"),
        ("heading after newline", "first line\n= Heading"),
        ("dash list", "- item"),
        ("plus list", "+ item"),
        ("numbered list", "1. item"),
        ("term list", "/ Term: description"),
        ("list after newline", "notes:\n- item\n+ item\n1. item"),
        ("backslash", "\\"),
        ("backslash at end", "C:\\temp\\"),
        ("unicode escape", "\\u{41}"),
        ("backticks", "`raw` ```rust code```"),
        ("tilde", "~"),
        ("quotes", "\"quoted\" and 'single'"),
        ("shorthands", "a -- b --- c ... d -? e -1"),
        ("brackets", "] [ ) ( } {"),
        ("url", "https://example.invalid/a_b*c"),
        ("punctuation", "!%&|^:;,.?=+"),
        ("blank lines", "one\n\ntwo\r\n\r\nthree"),
        ("Greek", "Καλημέρα κόσμε"),
        ("Cyrillic", "Съешь же ещё этих булок"),
        ("Arabic", "مرحبا بالعالم"),
        ("Hebrew", "שלום עולם"),
        ("Devanagari", "नमस्ते दुनिया"),
        ("Chinese", "你好世界，电子管放大器"),
        ("Japanese", "こんにちは、真空管アンプ"),
        ("empty", ""),
    ];
    let mut all: Vec<(&str, String)> = cases.iter().map(|(n, t)| (*n, t.to_string())).collect();
    all.push(("long", long));
    all
}

#[test]
fn hostile_text_prints_literally() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let opts = options(job_date());
    let mut failures = Vec::new();
    for (name, text) in corpus() {
        let pdf = dir.path().join(format!("{}.pdf", name.replace(' ', "-")));
        if let Err(err) = compile(&program, &case_sandbox(&text), "main.typ", &opts, &pdf) {
            failures.push(format!("{name}: compile failed: {err}"));
            if let TypesetError::Compile { kept, .. } = &err {
                let _ = std::fs::remove_dir_all(kept);
            }
            continue;
        }
        let got = normalise(&pdftotext(&pdf));
        let want = normalise(&text);
        let expected = format!("CASESTART{want}CASEPARAEND{want}CASEHEADEND{want}CASEEND");
        if std::env::var_os("SHOW_EXTRACTED").is_some() {
            eprintln!("{name}: {got}");
        }
        if got != expected {
            failures.push(format!("{name}:\n  want {expected:?}\n  got  {got:?}"));
        }
    }
    assert!(failures.is_empty(), "{}", failures.join("\n"));
}

#[test]
fn title_string_is_kept_exactly() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("title.pdf");
    let title = "Amp \"Deluxe\" \\ #1 — Ωμέγα";
    let opts = options(job_date());
    compile(&program, &case_sandbox(title), "main.typ", &opts, &pdf).unwrap();
    let info = Command::new("pdfinfo")
        .args(["-enc", "UTF-8"])
        .arg(&pdf)
        .output()
        .unwrap();
    let info = String::from_utf8(info.stdout).unwrap();
    let line = info.lines().find(|l| l.starts_with("Title:")).unwrap();
    assert_eq!(line.trim_start_matches("Title:").trim(), title);
}

/// A sandbox with a plot, a second file and text in every bundled script.
fn rich_sandbox() -> Sandbox {
    let svg = r#"<svg xmlns="http://www.w3.org/2000/svg" width="200" height="100">
<rect width="200" height="100" fill="none" stroke="black"/>
<polyline points="0,90 50,60 100,40 150,30 200,25" fill="none" stroke="blue"/>
<text x="10" y="20" font-family="Noto Sans">Anode volts</text></svg>"#;
    let main = format!(
        "{}#set document(title: \"Check\")\n= Hand-over\n*Bold* _italic_ `mono 12.5 V`\n\n\
         Ωμέγα Жук مرحبا שלום नमस्ते 你好 こんにちは\n\n#image(\"plots/anode.svg\", width: 50%)\n\
         #include \"parts/more.typ\"\n",
        font_rules()
    );
    let mut sandbox = Sandbox::new();
    sandbox
        .insert("main.typ", main)
        .unwrap()
        .insert("plots/anode.svg", svg)
        .unwrap()
        .insert("parts/more.typ", "Second file.")
        .unwrap();
    sandbox
}

#[test]
fn same_inputs_give_identical_bytes() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let (a, b) = (dir.path().join("a.pdf"), dir.path().join("b.pdf"));
    let opts = options(job_date());
    let sandbox = rich_sandbox();
    let outcome = compile(&program, &sandbox, "main.typ", &opts, &a).unwrap();
    assert_eq!(outcome.warnings, "", "typst warned");
    compile(&program, &sandbox, "main.typ", &opts, &b).unwrap();
    let bytes = std::fs::read(&a).unwrap();
    assert!(bytes.starts_with(b"%PDF-"));
    assert_eq!(bytes, std::fs::read(&b).unwrap(), "two runs differ");
    let text = pdftotext(&a);
    assert!(text.contains("Second file."), "{text}");

    // A different date is a different document.
    let c = dir.path().join("c.pdf");
    let later = options(NaiveDate::from_ymd_opt(2024, 5, 18).unwrap());
    compile(&program, &sandbox, "main.typ", &later, &c).unwrap();
    assert_ne!(bytes, std::fs::read(&c).unwrap());
}

#[test]
fn fonts_from_the_cache_or_the_sandbox_give_identical_bytes() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let cache = dir.path().join("cache");
    let sandbox = rich_sandbox();
    let cached = CompileOptions {
        fonts: FontPlace::CacheIn(cache.clone()),
        ..CompileOptions::new(job_date())
    };
    let in_sandbox = CompileOptions {
        fonts: FontPlace::Sandbox,
        ..CompileOptions::new(job_date())
    };
    let (a, b, c) = (
        dir.path().join("a.pdf"),
        dir.path().join("b.pdf"),
        dir.path().join("c.pdf"),
    );
    // First run fills the cache, the second finds it.
    let first = compile(&program, &sandbox, "main.typ", &cached, &a).unwrap();
    let folder = cache.join(font_cache_folder_name());
    assert_eq!(first.fonts, FontsUsed::Cache(folder.clone()));
    assert!(folder.join("NotoSans-Regular.ttf").is_file());
    let second = compile(&program, &sandbox, "main.typ", &cached, &b).unwrap();
    assert_eq!(second.fonts, FontsUsed::Cache(folder));
    let third = compile(&program, &sandbox, "main.typ", &in_sandbox, &c).unwrap();
    assert_eq!(third.fonts, FontsUsed::Sandbox);
    let bytes = std::fs::read(&a).unwrap();
    assert!(bytes.starts_with(b"%PDF-"));
    assert_eq!(
        bytes,
        std::fs::read(&b).unwrap(),
        "cache reused: other bytes"
    );
    assert_eq!(
        bytes,
        std::fs::read(&c).unwrap(),
        "sandbox fonts: other bytes"
    );

    // A cache root that cannot be made falls back to the sandbox, same bytes.
    let blocked = dir.path().join("a-file");
    std::fs::write(&blocked, b"x").unwrap();
    let fallback = CompileOptions {
        fonts: FontPlace::CacheIn(blocked.join("cache")),
        ..CompileOptions::new(job_date())
    };
    let d = dir.path().join("d.pdf");
    let outcome = compile(&program, &sandbox, "main.typ", &fallback, &d).unwrap();
    assert_eq!(outcome.fonts, FontsUsed::Sandbox);
    assert_eq!(bytes, std::fs::read(&d).unwrap(), "fallback: other bytes");
}

#[test]
fn only_bundled_fonts_are_embedded() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("fonts.pdf");
    compile(
        &program,
        &rich_sandbox(),
        "main.typ",
        &options(job_date()),
        &pdf,
    )
    .unwrap();
    let out = Command::new("pdffonts").arg(&pdf).output().unwrap();
    let listing = String::from_utf8_lossy(&out.stdout);
    let fonts: Vec<&str> = listing
        .lines()
        .skip(2)
        .filter_map(|l| l.split_whitespace().next())
        .collect();
    assert!(!fonts.is_empty(), "{listing}");
    for font in fonts {
        let family = font.split_once('+').map_or(font, |(_, f)| f);
        assert!(
            family.starts_with("NotoSans") || family.starts_with("WenQuanYi"),
            "unexpected font {font} in\n{listing}"
        );
    }
}

/// The families `pdffonts` lists for `pdf`, without their subset tags.
fn embedded_families(pdf: &Path) -> Vec<String> {
    let out = Command::new("pdffonts").arg(pdf).output().unwrap();
    String::from_utf8_lossy(&out.stdout)
        .lines()
        .skip(2)
        .filter_map(|l| l.split_whitespace().next())
        .map(|f| f.split_once('+').map_or(f, |(_, f)| f).to_string())
        .collect()
}

#[test]
fn signs_the_body_font_lacks_come_from_mono_without_the_cjk_face() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let (signs, cjk) = (dir.path().join("signs.pdf"), dir.path().join("cjk.pdf"));
    let text = "about √2 × Vsec, at most ≤ 0.5 Ω, at least ≥ 2 MΩ";
    let opts = options(job_date());
    compile(&program, &case_sandbox(text), "main.typ", &opts, &signs).unwrap();
    let families = embedded_families(&signs);
    assert!(
        families.iter().any(|f| f == "NotoSansMono-Regular"),
        "{families:?}"
    );
    assert!(
        !families.iter().any(|f| f.starts_with("WenQuanYi")),
        "{families:?}"
    );
    assert!(normalise(&pdftotext(&signs)).contains(&normalise(text)));
    // CJK text still finds its face.
    let text = "√2 你好";
    compile(&program, &case_sandbox(text), "main.typ", &opts, &cjk).unwrap();
    let families = embedded_families(&cjk);
    assert!(
        families.iter().any(|f| f.starts_with("WenQuanYi")),
        "{families:?}"
    );
    assert!(normalise(&pdftotext(&cjk)).contains(&normalise(text)));
}

#[test]
fn pdf_a_2b_and_plain_pdf_both_compile() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let archived = dir.path().join("a2b.pdf");
    let opts = options(job_date());
    compile(&program, &rich_sandbox(), "main.typ", &opts, &archived).unwrap();
    let bytes = std::fs::read(&archived).unwrap();
    let has = |needle: &[u8]| bytes.windows(needle.len()).any(|w| w == needle);
    assert!(
        has(b"pdfaid:part") || has(b"<pdfaid:part>2"),
        "no PDF/A marker"
    );

    let plain = dir.path().join("plain.pdf");
    let opts = CompileOptions {
        pdf_standard: None,
        ..options(job_date())
    };
    compile(&program, &rich_sandbox(), "main.typ", &opts, &plain).unwrap();
    let plain_bytes = std::fs::read(&plain).unwrap();
    assert!(!plain_bytes.windows(11).any(|w| w == b"pdfaid:part"));
}

fn folder_listing(dir: &Path) -> Vec<String> {
    let mut names: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    names
}

/// Puts a stand-in PDF at `dir/report.pdf` and returns its path and bytes.
fn existing_pdf(dir: &Path) -> (PathBuf, Vec<u8>) {
    let path = dir.join("report.pdf");
    let bytes = b"%PDF-1.7 a good earlier report".to_vec();
    std::fs::write(&path, &bytes).unwrap();
    (path, bytes)
}

#[test]
fn a_typst_error_leaves_the_old_pdf_and_no_stray_files() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let (output, before) = existing_pdf(dir.path());
    let mut sandbox = Sandbox::new();
    sandbox
        .insert("main.typ", "Fine so far.\n#no-such-function(1)\n")
        .unwrap();
    let err = compile(
        &program,
        &sandbox,
        "main.typ",
        &options(job_date()),
        &output,
    )
    .unwrap_err();
    assert!(!err.is_environment());
    let TypesetError::Compile {
        diagnostics,
        kept,
        main,
        ..
    } = &err
    else {
        panic!("expected a compile error, got {err:?}");
    };
    assert!(diagnostics.contains("no-such-function"), "{diagnostics}");
    assert_eq!(std::fs::read(&output).unwrap(), before);
    assert_eq!(folder_listing(dir.path()), ["report.pdf"]);
    // The source is kept for inspection, without the bulky fonts.
    assert_eq!(
        std::fs::read_to_string(main).unwrap(),
        "Fine so far.\n#no-such-function(1)\n"
    );
    assert!(!kept.join("fonts").exists());
    let help = miette::Diagnostic::help(&err).unwrap().to_string();
    assert!(help.contains(&kept.display().to_string()), "{help}");
    let kept = kept.clone();
    let rendered = format!("{:?}", miette::Report::new(err));
    assert!(rendered.contains("no-such-function"), "{rendered}");
    std::fs::remove_dir_all(kept).unwrap();

    // With the fonts written into the sandbox, they are removed from the
    // kept folder too.
    let in_sandbox = CompileOptions {
        fonts: FontPlace::Sandbox,
        ..options(job_date())
    };
    let Err(TypesetError::Compile { kept, .. }) =
        compile(&program, &sandbox, "main.typ", &in_sandbox, &output)
    else {
        panic!("expected a compile error");
    };
    assert!(kept.join("main.typ").is_file() && !kept.join("fonts").exists());
    assert_eq!(std::fs::read(&output).unwrap(), before);
    std::fs::remove_dir_all(kept).unwrap();
}

#[test]
fn a_typst_that_fails_leaves_the_old_pdf_and_no_stray_files() {
    let false_program = TypstProgram {
        path: PathBuf::from("/bin/false"),
        version: MIN_TYPST,
    };
    if !false_program.path.exists() {
        eprintln!("note: no /bin/false here; skipping");
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let (output, before) = existing_pdf(dir.path());
    let err = compile(
        &false_program,
        &rich_sandbox(),
        "main.typ",
        &options(job_date()),
        &output,
    )
    .unwrap_err();
    // A program that fails without a word is at fault itself, not the
    // document.
    let TypesetError::Misbehaved { kept, what, .. } = &err else {
        panic!("expected a misbehaving typst, got {err:?}");
    };
    assert!(err.is_environment());
    let what = what.english();
    assert!(
        what.contains("exited with status 1 and printed no messages"),
        "{what}"
    );
    assert_eq!(std::fs::read(&output).unwrap(), before);
    assert_eq!(folder_listing(dir.path()), ["report.pdf"]);
    std::fs::remove_dir_all(kept).unwrap();

    // A program that "succeeds" without writing a PDF is no better.
    let true_program = TypstProgram {
        path: PathBuf::from("/bin/true"),
        version: MIN_TYPST,
    };
    let err = compile(
        &true_program,
        &rich_sandbox(),
        "main.typ",
        &options(job_date()),
        &output,
    )
    .unwrap_err();
    let TypesetError::Misbehaved { kept, what, .. } = &err else {
        panic!("expected a misbehaving typst, got {err:?}");
    };
    assert_eq!(what.english(), "reported success but wrote no file");
    assert_eq!(std::fs::read(&output).unwrap(), before);
    assert_eq!(folder_listing(dir.path()), ["report.pdf"]);
    std::fs::remove_dir_all(kept).unwrap();
}

#[test]
fn a_good_run_replaces_the_old_pdf_cleanly() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let (output, before) = existing_pdf(dir.path());
    compile(
        &program,
        &rich_sandbox(),
        "main.typ",
        &options(job_date()),
        &output,
    )
    .unwrap();
    let after = std::fs::read(&output).unwrap();
    assert_ne!(after, before);
    assert!(after.starts_with(b"%PDF-"));
    assert_eq!(folder_listing(dir.path()), ["report.pdf"]);
}

#[test]
fn emitted_source_compiles_to_the_same_pdf() {
    let Some(program) = typst() else { return };
    let dir = tempfile::tempdir().unwrap();
    let via_module = dir.path().join("module.pdf");
    let opts = options(job_date());
    let sandbox = rich_sandbox();
    compile(&program, &sandbox, "main.typ", &opts, &via_module).unwrap();

    let src = dir.path().join("source");
    emit_source(&sandbox, &src).unwrap();
    let by_hand = dir.path().join("by-hand.pdf");
    let status = Command::new(&program.path)
        .arg("compile")
        .arg("--root")
        .arg(&src)
        .arg("--font-path")
        .arg(src.join("fonts"))
        // The CJK font's folder, which these options hand over.
        .arg("--font-path")
        .arg(src.join("fonts-cjk"))
        .args(["--ignore-system-fonts", "--ignore-embedded-fonts"])
        .args([
            "--creation-timestamp",
            &opts.creation_timestamp().to_string(),
        ])
        .args(["--pdf-standard", "a-2b"])
        .arg(src.join("main.typ"))
        .arg(&by_hand)
        .status()
        .unwrap();
    assert!(status.success());
    assert_eq!(
        std::fs::read(&via_module).unwrap(),
        std::fs::read(&by_hand).unwrap()
    );
}

#[test]
fn missing_typst_names_the_install_command() {
    let err = locate(Some(Path::new("/no/such/typst"))).unwrap_err();
    assert!(err.is_environment());
    assert!(err.to_string().contains("/no/such/typst"), "{err}");
    let report = format!("{:?}", miette::Report::new(err));
    assert!(report.contains(INSTALL_HINT), "{report}");

    let empty = tempfile::tempdir().unwrap();
    let err = locate_in(None, None, Some(empty.path().as_os_str())).unwrap_err();
    assert!(matches!(err, TypesetError::NotFound { .. }));
    let report = format!("{:?}", miette::Report::new(err));
    assert!(report.contains(INSTALL_HINT), "{report}");
}

#[test]
fn the_installed_typst_is_in_range() {
    let Some(program) = typst() else { return };
    assert!(program.version >= MIN_TYPST, "{program}");
    if let Some(warning) = program.version_warning() {
        eprintln!("note: {warning}");
    }
}

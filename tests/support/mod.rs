//! Helpers shared by the fault tests: running the binary with a private
//! temporary folder and font cache, stand-in typst programs whose behaviour
//! is fixed (slow, crashing, lying about success), and small PDFs made with
//! lopdf that do or do not carry the mains-safety notice.

#![allow(dead_code)]

use std::collections::BTreeSet;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};
use std::time::{Duration, Instant};

/// The binary under test: this build's, or the one named by
/// `AMPREPORT_TEST_BIN` (to show that a fault test fails on an older
/// build: `AMPREPORT_TEST_BIN=/path/to/old/ampreport cargo test --test …`).
pub fn bin() -> String {
    std::env::var("AMPREPORT_TEST_BIN")
        .unwrap_or_else(|_| env!("CARGO_BIN_EXE_ampreport").to_owned())
}

/// The phrases the finished document must show (the program's own list).
pub use ampreport::report::handover::NOTICE_PHRASES;

pub fn repo() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

pub fn demo(name: &str) -> PathBuf {
    repo().join("jobs").join(format!("{name}.kdl"))
}

/// True when the real typst is on PATH; false, with a note, where it is not
/// installed (never under CI, where it must be).
pub fn real_typst() -> bool {
    match Command::new("typst").arg("--version").output() {
        Ok(out) if out.status.success() => true,
        _ if std::env::var_os("CI").is_none() => {
            eprintln!("note: skipping: no typst on PATH");
            false
        }
        _ => panic!("typst is needed for these tests under CI"),
    }
}

/// A scene for one test: a folder with a copy of a demo job and a good old
/// PDF beside it, a private temporary folder (`TMPDIR`) and a stand-in
/// typst folder.
pub struct Scene {
    pub root: tempfile::TempDir,
    pub dir: PathBuf,
    pub job: PathBuf,
    pub pdf: PathBuf,
    pub tmp: PathBuf,
    pub bin: PathBuf,
}

pub const GOOD_OLD_PDF: &[u8] = b"%PDF-1.7 the good old document\n%%EOF\n";

impl Scene {
    pub fn new() -> Self {
        let root = tempfile::tempdir().unwrap();
        let dir = root.path().join("work");
        let tmp = root.path().join("tmp");
        let bin = root.path().join("bin");
        for d in [&dir, &tmp, &bin] {
            std::fs::create_dir(d).unwrap();
        }
        let job = dir.join("job.kdl");
        std::fs::copy(demo("combo-el84-cathode"), &job).unwrap();
        let pdf = dir.join("job.pdf");
        std::fs::write(&pdf, GOOD_OLD_PDF).unwrap();
        Self {
            root,
            dir,
            job,
            pdf,
            tmp,
            bin,
        }
    }

    /// `ampreport ARGS` with this scene's TMPDIR and font cache.
    pub fn command(&self, args: &[&str]) -> Command {
        let mut c = self.program(&bin());
        c.args(args);
        c
    }

    /// `program` with this scene's environment (TMPDIR, font cache).
    pub fn program(&self, program: &str) -> Command {
        let mut c = Command::new(program);
        c.env_remove("AMPREPORT_TYPST")
            .env_remove("AMPREPORT_TIMEOUT")
            .env("TMPDIR", &self.tmp)
            .env("XDG_CACHE_HOME", cache_home());
        c
    }

    pub fn run(&self, args: &[&str]) -> Output {
        self.command(args).output().unwrap()
    }

    /// `render JOB -o PDF --typst TYPST EXTRA…`, run to its end.
    pub fn render(&self, typst: &Path, extra: &[&str]) -> Output {
        self.render_to(&self.pdf, typst, extra)
    }

    /// `render JOB -o OUTPUT --typst TYPST EXTRA…`, run to its end.
    pub fn render_to(&self, output: &Path, typst: &Path, extra: &[&str]) -> Output {
        self.render_command(output, typst, extra).output().unwrap()
    }

    /// `render JOB -o OUTPUT --typst TYPST EXTRA…`, not started yet.
    pub fn render_command(&self, output: &Path, typst: &Path, extra: &[&str]) -> Command {
        let mut args = vec![
            "render",
            self.job.to_str().unwrap(),
            "-o",
            output.to_str().unwrap(),
            "--typst",
            typst.to_str().unwrap(),
        ];
        args.extend_from_slice(extra);
        self.command(&args)
    }

    /// A stand-in typst: answers `--version` like typst 0.15.1, and for a
    /// compile runs `body` with `$out` set to the output path and `$root`
    /// to the `--root` folder.
    pub fn fake_typst(&self, name: &str, body: &str) -> PathBuf {
        let path = self.bin.join(name);
        let script = format!(
            "#!/bin/sh\nif [ \"$1\" = --version ]; then echo 'typst 0.15.1 (stand-in)'; exit 0; fi\n\
             root=''; prev=''; for a in \"$@\"; do if [ \"$prev\" = --root ]; then root=$a; fi; prev=$a; out=$a; done\n\
             {body}\n"
        );
        std::fs::write(&path, script).unwrap();
        make_executable(&path);
        path
    }

    /// A stand-in typst that writes a small complete PDF carrying the
    /// notice, as a real typst would.
    pub fn good_typst(&self) -> PathBuf {
        let pdf = self.bin.join("notice.pdf");
        std::fs::write(&pdf, pdf_with_text(NOTICE_PHRASES)).unwrap();
        self.fake_typst("good-typst", &format!("cp '{}' \"$out\"", pdf.display()))
    }

    /// Names in the job's folder.
    pub fn listing(&self) -> BTreeSet<String> {
        listing(&self.dir)
    }

    /// Names in the private temporary folder.
    pub fn temp_listing(&self) -> BTreeSet<String> {
        listing(&self.tmp)
    }

    pub fn pdf_is_the_good_old_one(&self) -> bool {
        std::fs::read(&self.pdf).unwrap() == GOOD_OLD_PDF
    }
}

/// The font cache the tests share, under the build's temporary folder.
pub fn cache_home() -> PathBuf {
    PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("faults-cache-home")
}

/// Runs the binary in `dir` as a user with no config folder of their own
/// would, without colour, with the tests' shared font cache.
pub fn run_in(dir: &Path, args: &[&str]) -> Output {
    Command::new(bin())
        .current_dir(dir)
        .args(args)
        .env("XDG_CONFIG_HOME", dir.join("no-config"))
        .env("XDG_CACHE_HOME", cache_home())
        .env_remove("AMPREPORT_TYPST")
        .env("NO_COLOR", "1")
        .output()
        .expect("run ampreport")
}

pub fn listing(dir: &Path) -> BTreeSet<String> {
    std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect()
}

pub fn stderr(out: &Output) -> String {
    String::from_utf8_lossy(&out.stderr).into_owned()
}

/// Whether the report `err` says `words`, however it was wrapped. Reports
/// are wrapped to a fixed width, so a long path (a long `TMPDIR`) moves the
/// line breaks, and a break may fall between words, after a hyphen or
/// inside a long word or path. A line break here, with the spaces and the
/// report's `│` margin around it, stands for the space between two words of
/// `words` or for nothing; every other character must match exactly.
pub fn says(err: &str, words: &str) -> bool {
    const BREAK: char = '\u{0}';
    let mut hay = Vec::with_capacity(err.len());
    for (i, line) in err.lines().enumerate() {
        let line = if i == 0 {
            line.trim_end()
        } else {
            hay.push(BREAK);
            line.trim().trim_start_matches('│').trim()
        };
        hay.extend(line.chars());
    }
    let needle: Vec<char> = words.chars().collect();
    let matches_at = |mut h: usize| {
        let mut n = 0;
        while n < needle.len() {
            match hay.get(h) {
                Some(&c) if c == needle[n] => n += 1,
                // A break where the words have a space stands for it, or
                // else for nothing (a line after a break never starts
                // with a space).
                Some(&BREAK) if needle[n] == ' ' => n += 1,
                Some(&BREAK) => {}
                _ => return false,
            }
            h += 1;
        }
        true
    };
    (0..hay.len().max(1)).any(matches_at)
}

#[cfg(unix)]
pub fn make_executable(path: &Path) {
    use std::os::unix::fs::PermissionsExt;
    std::fs::set_permissions(path, std::fs::Permissions::from_mode(0o755)).unwrap();
    // Another test thread forking while the script was open for writing can
    // make it briefly "text file busy"; wait until it runs.
    for _ in 0..200 {
        match Command::new(path)
            .arg("--version")
            .env("FAKE_TYPST_PROBE", "1")
            .output()
        {
            Err(e) if e.raw_os_error() == Some(26) => std::thread::sleep(Duration::from_millis(10)),
            _ => break,
        }
    }
}

/// A one-page PDF showing each of `lines`, made with lopdf.
pub fn pdf_with_text(lines: &[&str]) -> Vec<u8> {
    use lopdf::content::{Content, Operation};
    use lopdf::{Document, Object, Stream, dictionary};
    let mut doc = Document::with_version("1.7");
    let pages_id = doc.new_object_id();
    let font_id = doc.add_object(dictionary! {
        "Type" => "Font", "Subtype" => "Type1", "BaseFont" => "Helvetica",
        "Encoding" => "WinAnsiEncoding",
    });
    let resources_id = doc.add_object(dictionary! { "Font" => dictionary! { "F1" => font_id } });
    let mut operations = vec![
        Operation::new("BT", vec![]),
        Operation::new("Tf", vec!["F1".into(), 8.into()]),
        Operation::new("TL", vec![12.into()]),
        Operation::new("Td", vec![40.into(), 800.into()]),
    ];
    for line in lines {
        operations.push(Operation::new("Tj", vec![Object::string_literal(*line)]));
        operations.push(Operation::new("T*", vec![]));
    }
    operations.push(Operation::new("ET", vec![]));
    let content = Content { operations };
    let content_id = doc.add_object(Stream::new(dictionary! {}, content.encode().unwrap()));
    let page_id = doc.add_object(dictionary! {
        "Type" => "Page", "Parent" => pages_id, "Contents" => content_id,
        "Resources" => resources_id, "MediaBox" => vec![0.into(), 0.into(), 595.into(), 842.into()],
    });
    doc.objects.insert(
        pages_id,
        Object::Dictionary(
            dictionary! { "Type" => "Pages", "Kids" => vec![page_id.into()], "Count" => 1 },
        ),
    );
    let catalog_id = doc.add_object(dictionary! { "Type" => "Catalog", "Pages" => pages_id });
    doc.trailer.set("Root", catalog_id);
    let mut bytes = Vec::new();
    doc.save_to(&mut bytes).unwrap();
    bytes
}

/// Waits until `path` exists, for at most a minute.
pub fn wait_for_file(path: &Path) {
    let deadline = Instant::now() + Duration::from_secs(60);
    while !path.exists() {
        assert!(
            Instant::now() < deadline,
            "{} never appeared",
            path.display()
        );
        std::thread::sleep(Duration::from_millis(10));
    }
}

/// True while process `pid` runs (a zombie does not count).
#[cfg(target_os = "linux")]
pub fn alive(pid: i32) -> bool {
    std::fs::read_to_string(format!("/proc/{pid}/stat")).is_ok_and(|s| {
        s.rsplit(')')
            .next()
            .map(str::trim_start)
            .is_some_and(|rest| !rest.starts_with('Z'))
    })
}

/// Waits up to ten seconds for process `pid` to end.
#[cfg(target_os = "linux")]
pub fn wait_gone(pid: i32) -> bool {
    let deadline = Instant::now() + Duration::from_secs(10);
    while alive(pid) {
        if Instant::now() > deadline {
            return false;
        }
        std::thread::sleep(Duration::from_millis(20));
    }
    true
}

/// A child process that is killed and reaped when this is dropped,
/// however the test ends: a failing assertion (a panic) unwinds through
/// the drop, so a long-running child such as `ampreport watch` or a render
/// waiting on a sleeping stand-in typst never outlives its test. Use it
/// for every child that does not end by itself; it derefs to the
/// [`std::process::Child`].
pub struct KilledOnDrop(std::process::Child);

impl KilledOnDrop {
    /// Starts `command`, guarded.
    pub fn spawn(command: &mut Command) -> Self {
        Self(command.spawn().expect("start the child"))
    }
}

impl std::ops::Deref for KilledOnDrop {
    type Target = std::process::Child;
    fn deref(&self) -> &Self::Target {
        &self.0
    }
}

impl std::ops::DerefMut for KilledOnDrop {
    fn deref_mut(&mut self) -> &mut Self::Target {
        &mut self.0
    }
}

impl Drop for KilledOnDrop {
    fn drop(&mut self) {
        // Already ended (and reaped by `try_wait`), or killed now and
        // reaped, so neither a running process nor a zombie is left.
        if let Ok(None) = self.0.try_wait() {
            let _ = self.0.kill();
            let _ = self.0.wait();
        }
    }
}

/// Waits for a child with a limit, killing it past the limit.
pub fn wait_with_limit(
    child: &mut std::process::Child,
    limit: Duration,
) -> std::process::ExitStatus {
    let deadline = Instant::now() + limit;
    loop {
        if let Some(status) = child.try_wait().unwrap() {
            return status;
        }
        if Instant::now() > deadline {
            let _ = child.kill();
            let _ = child.wait();
            panic!("ampreport did not end within {limit:?}");
        }
        std::thread::sleep(Duration::from_millis(10));
    }
}

/// Runs git in `dir` with a fixed author and no signing; false when git
/// cannot be run here.
pub fn git(dir: &Path, args: &[&str]) -> bool {
    Command::new("git")
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
        .is_ok_and(|o| o.status.success())
}

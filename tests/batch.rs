//! Many jobs at once, the content-key skip and `watch`, through the real
//! binary with a stand-in typst that counts its compiles: folders searched
//! for jobs, `--out-dir` mirroring the tree, one failing job not stopping
//! the others, the summary and exit status; a render skipped only while
//! every input is unchanged (one test per kind of input); `check` and
//! `calc --json` over several jobs; `watch` rendering on save, keeping the
//! last good PDF when the job turns bad, and ending cleanly on Ctrl-C.

mod support;

use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};
use std::time::{Duration, Instant};

use support::{KilledOnDrop, NOTICE_PHRASES, Scene, git, pdf_with_text, stderr};

/// A scene whose stand-in typst appends a line to `compiles` on every
/// compile and writes a small PDF with the notice.
struct Counting {
    scene: Scene,
    typst: PathBuf,
    compiles: PathBuf,
    config: PathBuf,
}

impl Counting {
    fn new() -> Self {
        let scene = Scene::new();
        let compiles = scene.root.path().join("compiles.log");
        let pdf = scene.bin.join("notice.pdf");
        std::fs::write(&pdf, pdf_with_text(NOTICE_PHRASES)).unwrap();
        let typst = scene.fake_typst(
            "counting-typst",
            &format!(
                "echo compiled >> '{}'\ncp '{}' \"$out\"",
                compiles.display(),
                pdf.display()
            ),
        );
        // The job's PDF starts out missing, not the fault tests' old one.
        std::fs::remove_file(&scene.pdf).unwrap();
        let config = scene.root.path().join("config");
        std::fs::create_dir(&config).unwrap();
        Counting {
            scene,
            typst,
            compiles,
            config,
        }
    }

    fn compiles(&self) -> usize {
        std::fs::read_to_string(&self.compiles)
            .map(|s| s.lines().count())
            .unwrap_or(0)
    }

    fn command(&self, args: &[&str]) -> Command {
        let mut c = self.scene.command(args);
        c.env("XDG_CONFIG_HOME", &self.config)
            .env("NO_COLOR", "1")
            .current_dir(&self.scene.dir);
        c
    }

    /// `ampreport render ARGS --typst STAND-IN`, run to its end.
    fn render(&self, args: &[&str]) -> Output {
        let mut all = vec!["render"];
        all.extend_from_slice(args);
        all.extend_from_slice(&["--typst", self.typst.to_str().unwrap()]);
        self.command(&all).output().unwrap()
    }

    /// Renders the scene's job with `extra` options and says whether typst
    /// was run for it.
    fn typeset(&self, extra: &[&str]) -> bool {
        let before = self.compiles();
        let mut args = vec![self.scene.job.to_str().unwrap()];
        args.extend_from_slice(extra);
        let out = self.render(&args);
        assert!(out.status.success(), "{}", stderr(&out));
        let after = self.compiles();
        assert!(after - before <= 1);
        after > before
    }
}

fn text(out: &Output) -> String {
    String::from_utf8_lossy(&out.stdout).into_owned()
}

// ------------------------------------------------------------- skipping

#[test]
fn an_unchanged_job_is_not_typeset_again_and_force_typesets_it() {
    let c = Counting::new();
    assert!(c.typeset(&[]), "the first render typesets");
    let out = c.render(&[c.scene.job.to_str().unwrap()]);
    assert!(out.status.success());
    assert!(text(&out).contains("is up to date"), "{}", text(&out));
    assert_eq!(c.compiles(), 1, "the second render is skipped");
    assert!(c.typeset(&["--force"]), "--force typesets anyway");
    assert!(!c.typeset(&[]));
}

#[test]
fn a_change_to_the_job_file_typesets_again() {
    let c = Counting::new();
    assert!(c.typeset(&[]));
    let mut job = std::fs::read_to_string(&c.scene.job).unwrap();
    job.push_str("// one more comment\n");
    std::fs::write(&c.scene.job, &job).unwrap();
    assert!(c.typeset(&[]));
    assert!(!c.typeset(&[]));
}

#[test]
fn a_changed_or_missing_pdf_is_typeset_again() {
    let c = Counting::new();
    assert!(c.typeset(&[]));
    let mut pdf = std::fs::read(&c.scene.pdf).unwrap();
    pdf.extend_from_slice(b"% edited by hand\n");
    std::fs::write(&c.scene.pdf, &pdf).unwrap();
    assert!(c.typeset(&[]), "a PDF that is not what was made");
    std::fs::remove_file(&c.scene.pdf).unwrap();
    assert!(c.typeset(&[]), "a PDF that is gone");
    assert!(!c.typeset(&[]));
}

#[test]
fn a_shop_profile_coming_changing_or_left_out_typesets_again() {
    let c = Counting::new();
    assert!(c.typeset(&[]));
    let shop = c.scene.dir.join("shop.kdl");
    std::fs::write(&shop, "shop-format 1\nshop \"Test Bench\"\n").unwrap();
    assert!(c.typeset(&[]), "a shop profile found beside the job");
    assert!(!c.typeset(&[]));
    std::fs::write(&shop, "shop-format 1\nshop \"Test Bench Two\"\n").unwrap();
    assert!(c.typeset(&[]), "the profile changed");
    assert!(c.typeset(&["--no-shop"]), "no profile");
    assert!(!c.typeset(&["--no-shop"]));
    std::fs::remove_file(&shop).unwrap();
    assert!(!c.typeset(&[]), "no profile found is the same as --no-shop");
    // A profile from the user's configuration folder.
    let config_shop = c.config.join("ampreport").join("shop.kdl");
    std::fs::create_dir_all(config_shop.parent().unwrap()).unwrap();
    std::fs::write(&config_shop, "shop-format 1\nshop \"Home Bench\"\n").unwrap();
    assert!(c.typeset(&[]), "a profile in the configuration folder");
    // --shop FILE where none is beside the job.
    let named = c.scene.root.path().join("named-shop.kdl");
    std::fs::write(&named, "shop-format 1\nshop \"Named Bench\"\n").unwrap();
    assert!(c.typeset(&["--shop", named.to_str().unwrap()]));
    assert!(!c.typeset(&["--shop", named.to_str().unwrap()]));
}

#[test]
fn a_change_to_the_shop_logo_typesets_again() {
    let c = Counting::new();
    let logo = c.scene.dir.join("logo.svg");
    let svg = |fill: &str| {
        format!(
            "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"40\" height=\"20\"><rect width=\"40\" height=\"20\" fill=\"{fill}\"/></svg>\n"
        )
    };
    std::fs::write(&logo, svg("#123456")).unwrap();
    std::fs::write(
        c.scene.dir.join("shop.kdl"),
        "shop-format 1\nshop \"Test Bench\"\nlogo \"logo.svg\"\n",
    )
    .unwrap();
    assert!(c.typeset(&[]));
    assert!(!c.typeset(&[]));
    std::fs::write(&logo, svg("#654321")).unwrap();
    assert!(c.typeset(&[]), "the logo's bytes changed");
    assert!(!c.typeset(&[]));
}

#[test]
fn a_change_to_the_shops_translation_file_typesets_again() {
    let c = Counting::new();
    // The shop's own English words (the stand-in typst's PDF carries the
    // English notice the document is checked for).
    let english = std::fs::read_to_string(support::repo().join("messages/en.ftl")).unwrap();
    std::fs::write(c.scene.dir.join("own-words.ftl"), &english).unwrap();
    std::fs::write(
        c.scene.dir.join("shop.kdl"),
        "shop-format 1\nshop \"Test Bench\"\nlanguage \"en\" file=\"own-words.ftl\"\n",
    )
    .unwrap();
    assert!(c.typeset(&[]));
    assert!(!c.typeset(&[]));
    std::fs::write(
        c.scene.dir.join("own-words.ftl"),
        format!("{english}\n# one more line\n"),
    )
    .unwrap();
    assert!(c.typeset(&[]), "the translation file changed");
    assert!(!c.typeset(&[]));
}

#[test]
fn a_change_to_a_photo_typesets_again() {
    let c = Counting::new();
    let photo = c.scene.dir.join("chassis.png");
    let png = |shade: u8| {
        let image = image::RgbImage::from_pixel(16, 12, image::Rgb([shade, 90, 40]));
        image.save(&photo).unwrap();
    };
    png(200);
    let mut job = std::fs::read_to_string(&c.scene.job).unwrap();
    job.push_str("photos {\n    photo \"chassis.png\" caption=\"As it came in\"\n}\n");
    std::fs::write(&c.scene.job, job).unwrap();
    assert!(c.typeset(&[]));
    assert!(!c.typeset(&[]));
    png(10);
    assert!(c.typeset(&[]), "the photo's bytes changed");
    assert!(!c.typeset(&[]));
}

#[test]
fn the_skip_reads_the_named_files_where_the_job_and_its_profile_find_them() {
    // The profile and its logo one folder above the job, a photo in a
    // folder below it, and a decoy of the logo's name beside the job: the
    // skip, which works from the manifest's list of named files, reads
    // each where the job or the profile finds it.
    let c = Counting::new();
    let top = c.scene.root.path();
    let svg = |fill: &str| {
        format!(
            "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"40\" height=\"20\"><rect width=\"40\" height=\"20\" fill=\"{fill}\"/></svg>\n"
        )
    };
    std::fs::write(top.join("logo.svg"), svg("#123456")).unwrap();
    std::fs::write(c.scene.dir.join("logo.svg"), svg("#222222")).unwrap();
    std::fs::write(
        top.join("shop.kdl"),
        "shop-format 1\nshop \"Test Bench\"\nlogo \"logo.svg\"\n",
    )
    .unwrap();
    let photo = c.scene.dir.join("pics").join("chassis.png");
    std::fs::create_dir(photo.parent().unwrap()).unwrap();
    let png = |shade: u8| {
        let image = image::RgbImage::from_pixel(16, 12, image::Rgb([shade, 90, 40]));
        image.save(&photo).unwrap();
    };
    png(200);
    let mut job = std::fs::read_to_string(&c.scene.job).unwrap();
    job.push_str("photos {\n    photo \"pics/chassis.png\"\n}\n");
    std::fs::write(&c.scene.job, job).unwrap();
    assert!(c.typeset(&[]));
    assert!(!c.typeset(&[]));
    std::fs::write(c.scene.dir.join("logo.svg"), svg("#333333")).unwrap();
    assert!(!c.typeset(&[]), "the decoy beside the job is no input");
    std::fs::write(top.join("logo.svg"), svg("#654321")).unwrap();
    assert!(c.typeset(&[]), "the profile's logo changed");
    assert!(!c.typeset(&[]));
    png(10);
    assert!(c.typeset(&[]), "the photo changed");
    assert!(!c.typeset(&[]));
    // A nearer profile that names no logo takes over: rendered again.
    std::fs::write(
        c.scene.dir.join("shop.kdl"),
        "shop-format 1\nshop \"Test Bench\"\n",
    )
    .unwrap();
    assert!(c.typeset(&[]), "a nearer profile");
    assert!(!c.typeset(&[]));
    // A manifest whose list of files was edited is not believed: the key
    // worked out from it no longer matches the one recorded, so the job is
    // decoded and its own key decides. Unchanged, it is not typeset; with
    // the photo changed behind the edited list, it is.
    let manifest = c.scene.dir.join(".job.pdf.ampreport-key");
    let recorded = std::fs::read_to_string(&manifest).unwrap();
    assert!(
        recorded.contains("file \"photo\" \"pics/chassis.png\""),
        "{recorded}"
    );
    let edited: String = recorded
        .lines()
        .filter(|l| !l.starts_with("file "))
        .map(|l| format!("{l}\n"))
        .collect();
    std::fs::write(&manifest, &edited).unwrap();
    assert!(!c.typeset(&[]), "the decoded job's key still matches");
    std::fs::write(&manifest, &edited).unwrap();
    png(99);
    assert!(c.typeset(&[]), "a photo changed behind a list without it");
    assert!(!c.typeset(&[]));
}

#[test]
fn a_job_moved_with_its_pdf_within_a_repository_typesets_again() {
    // The footer's commit is git's answer for the job's path: moved to
    // another folder (with its PDF and the record beside it), the job is
    // not the file git knew, so the same bytes are typeset again.
    let c = Counting::new();
    let top = c.scene.root.path();
    if !git(top, &["init", "-q"]) {
        assert!(std::env::var_os("CI").is_none(), "git is needed under CI");
        eprintln!("note: skipping: git cannot be run");
        return;
    }
    assert!(git(top, &["add", "work/job.kdl"]) && git(top, &["commit", "-qm", "first"]));
    assert!(c.typeset(&[]));
    assert!(!c.typeset(&[]));
    let moved = top.join("moved");
    std::fs::rename(&c.scene.dir, &moved).unwrap();
    let typeset = |job: &str| {
        let before = c.compiles();
        let out = c
            .command(&["render", job, "--typst", c.typst.to_str().unwrap()])
            .current_dir(top)
            .output()
            .unwrap();
        assert!(out.status.success(), "{}", stderr(&out));
        c.compiles() > before
    };
    assert!(typeset("moved/job.kdl"), "moved to another folder");
    assert!(!typeset("moved/job.kdl"));
    std::fs::rename(moved.join("job.kdl"), moved.join("renamed.kdl")).unwrap();
    std::fs::rename(moved.join("job.pdf"), moved.join("renamed.pdf")).unwrap();
    std::fs::rename(
        moved.join(".job.pdf.ampreport-key"),
        moved.join(".renamed.pdf.ampreport-key"),
    )
    .unwrap();
    assert!(typeset("moved/renamed.kdl"), "renamed in its folder");
    assert!(!typeset("moved/renamed.kdl"));
}

#[test]
fn a_commit_of_the_job_typesets_again() {
    // The footer names the commit that last changed the job and marks
    // bytes that differ from it: committing the very bytes already
    // rendered changes the document.
    let c = Counting::new();
    let dir = &c.scene.dir;
    if !git(dir, &["init", "-q"]) {
        assert!(std::env::var_os("CI").is_none(), "git is needed under CI");
        eprintln!("note: skipping: git cannot be run");
        return;
    }
    assert!(git(dir, &["add", "job.kdl"]) && git(dir, &["commit", "-qm", "first"]));
    assert!(c.typeset(&[]));
    assert!(!c.typeset(&[]));
    let mut job = std::fs::read_to_string(&c.scene.job).unwrap();
    job.push_str("// second visit\n");
    std::fs::write(&c.scene.job, job).unwrap();
    assert!(c.typeset(&[]), "edited, not committed");
    assert!(git(dir, &["commit", "-qam", "second"]));
    assert!(c.typeset(&[]), "the same bytes, now committed");
    assert!(!c.typeset(&[]));
}

#[test]
fn in_a_folder_made_ready_by_init_repo_git_sees_no_rendered_file() {
    // What `init --repo` ignores covers everything a render leaves: the
    // PDF, the listing's Markdown and photos, and each file's manifest.
    let c = Counting::new();
    let dir = &c.scene.dir;
    if !git(dir, &["init", "-q"]) {
        assert!(std::env::var_os("CI").is_none(), "git is needed under CI");
        eprintln!("note: skipping: git cannot be run");
        return;
    }
    let photos = dir.join("photos");
    std::fs::create_dir(&photos).unwrap();
    for name in ["parlour-twelve-before.jpg", "parlour-twelve-after.png"] {
        std::fs::copy(
            PathBuf::from(env!("CARGO_MANIFEST_DIR"))
                .join("jobs/photos")
                .join(name),
            photos.join(name),
        )
        .unwrap();
    }
    std::fs::copy(support::demo("combo-6v6-fixed"), &c.scene.job).unwrap();
    let out = c.command(&["init", "--repo", "."]).output().unwrap();
    assert!(out.status.success(), "{}", stderr(&out));
    assert!(c.typeset(&[]));
    assert!(c.typeset(&["--listing"]));
    assert!(dir.join(".job.listing.md.ampreport-key").is_file());
    assert!(dir.join("job.listing-photo-1.jpg").is_file());
    let status = Command::new("git")
        .current_dir(dir)
        .args(["status", "--porcelain", "--untracked-files=all"])
        .env_remove("GIT_DIR")
        .env_remove("GIT_WORK_TREE")
        .env_remove("GIT_INDEX_FILE")
        .output()
        .unwrap();
    let mut seen: Vec<String> = String::from_utf8_lossy(&status.stdout)
        .lines()
        .map(str::to_string)
        .collect();
    seen.sort();
    assert_eq!(
        seen,
        [
            "?? .gitattributes",
            "?? .gitignore",
            "?? job.kdl",
            "?? photos/parlour-twelve-after.png",
            "?? photos/parlour-twelve-before.jpg"
        ],
        "git would offer to commit rendered files"
    );
}

#[test]
fn a_change_to_a_ratings_file_typesets_again() {
    let c = Counting::new();
    let ratings = c.scene.root.path().join("own-ratings.kdl");
    // A ratings file with no entries is enough: the key is over its bytes.
    let entry = |note: &str| format!("ratings-format 1\n// {note}\n");
    std::fs::write(&ratings, entry("invented, first")).unwrap();
    let r = ["--ratings", ratings.to_str().unwrap()];
    assert!(c.typeset(&r));
    assert!(!c.typeset(&r));
    std::fs::write(&ratings, entry("invented, second")).unwrap();
    assert!(c.typeset(&r), "the ratings file changed");
    assert!(c.typeset(&[]), "the ratings file left off");
}

#[test]
fn a_change_to_a_template_typesets_again() {
    let c = Counting::new();
    let templates = c.scene.root.path().join("templates");
    std::fs::create_dir(&templates).unwrap();
    let t = ["--templates", templates.to_str().unwrap()];
    assert!(c.typeset(&t), "an empty template folder is a new input");
    assert!(!c.typeset(&t));
    std::fs::write(
        templates.join("mains-safety.typ"),
        include_str!("../templates/mains-safety.typ"),
    )
    .unwrap();
    assert!(c.typeset(&t), "a template added to the folder");
    let mut changed = include_str!("../templates/mains-safety.typ").to_string();
    changed.push_str("\n// a shop's own line\n");
    std::fs::write(templates.join("mains-safety.typ"), changed).unwrap();
    assert!(c.typeset(&t), "a template changed");
    assert!(!c.typeset(&t));
    assert!(c.typeset(&[]), "back to the built-in templates");
}

#[test]
fn a_change_to_typst_or_its_version_typesets_again() {
    let c = Counting::new();
    assert!(c.typeset(&[]));
    let script = std::fs::read_to_string(&c.typst).unwrap();
    // The same program, another version.
    std::fs::write(
        &c.typst,
        script.replace("typst 0.15.1 (stand-in)", "typst 0.15.2 (stand-in)"),
    )
    .unwrap();
    support::make_executable(&c.typst);
    assert!(c.typeset(&[]), "typst reports another version");
    assert!(!c.typeset(&[]));
    // The same version, other bytes.
    std::fs::write(
        &c.typst,
        std::fs::read_to_string(&c.typst).unwrap() + "# rebuilt\n",
    )
    .unwrap();
    support::make_executable(&c.typst);
    assert!(c.typeset(&[]), "the typst program changed");
    assert!(!c.typeset(&[]));
}

#[test]
fn an_option_that_changes_the_document_typesets_again() {
    let c = Counting::new();
    assert!(c.typeset(&[]));
    assert!(c.typeset(&["--no-charges"]));
    assert!(!c.typeset(&["--no-charges"]));
    assert!(c.typeset(&[]));
    // --timeout does not change the document.
    assert!(!c.typeset(&["--timeout", "50"]));
    // --emit-source always typesets, so the command it prints is true.
    let source = c.scene.root.path().join("source");
    assert!(c.typeset(&["--emit-source", source.to_str().unwrap()]));
}

// ------------------------------------------------------------- batches

/// Three jobs in `jobs/` (one in `jobs/old/`), one of them broken at a
/// known line.
fn jobs_tree(c: &Counting) -> PathBuf {
    let jobs = c.scene.dir.join("jobs");
    std::fs::create_dir_all(jobs.join("old")).unwrap();
    for (name, demo) in [
        ("a.kdl", "combo-el84-cathode"),
        ("b.kdl", "head-el34-quad"),
        ("old/c.kdl", "stereo-el84-hifi"),
    ] {
        std::fs::copy(support::demo(demo), jobs.join(name)).unwrap();
    }
    std::fs::write(
        jobs.join("broken.kdl"),
        "job-format 1\njob id=\"X\"\nunit make=\"Tollan\" model=\"T\"\nmains nominal=\"-230V\"\n",
    )
    .unwrap();
    jobs
}

#[test]
fn a_folder_renders_every_job_and_one_failure_stops_no_other() {
    let c = Counting::new();
    let jobs = jobs_tree(&c);
    let out = c.render(&["jobs", "-j", "2"]);
    let said = text(&out);
    assert_eq!(out.status.code(), Some(1), "{said}\n{}", stderr(&out));
    assert_eq!(c.compiles(), 2, "a.kdl and b.kdl; old/ is not searched");
    assert!(jobs.join("a.pdf").is_file() && jobs.join("b.pdf").is_file());
    assert!(!jobs.join("broken.pdf").exists());
    assert!(!jobs.join("old/c.pdf").exists());
    assert!(
        said.contains("3 jobs in") && said.contains("2 rendered, 0 unchanged, 1 failed"),
        "{said}"
    );
    // The summary quotes the broken job's first error at its line.
    let failed = said
        .lines()
        .find(|l| l.trim_start().starts_with("failed jobs/broken.kdl"))
        .unwrap_or_else(|| panic!("no failure line: {said}"));
    assert!(failed.contains("broken.kdl:4:"), "{failed}");
    // Not a terminal: plain lines, no progress bar drawing.
    let all = format!("{said}{}", stderr(&out));
    assert!(!all.contains('\r') && !all.contains('\u{1b}'), "{all:?}");

    // Again, recursively: the two made before are unchanged.
    let out = c.render(&["jobs", "--recursive"]);
    let said = text(&out);
    assert!(said.contains("1 rendered, 2 unchanged, 1 failed"), "{said}");
    assert!(jobs.join("old/c.pdf").is_file());
    assert_eq!(c.compiles(), 3);
}

#[test]
fn typst_is_held_to_its_share_of_the_cores_only_when_jobs_run_side_by_side() {
    let c = Counting::new();
    let jobs = jobs_tree(&c);
    std::fs::remove_file(jobs.join("broken.kdl")).unwrap();
    let log = c.scene.root.path().join("arguments.log");
    let pdf = c.scene.bin.join("notice.pdf");
    let typst = c.scene.fake_typst(
        "logging-typst",
        &format!(
            "echo \"$*\" >> '{}'\ncp '{}' \"$out\"",
            log.display(),
            pdf.display()
        ),
    );
    // The `--jobs` value of each compile of one run, `None` where typst was
    // left its default.
    let run = |args: &[&str]| -> Vec<Option<usize>> {
        let _ = std::fs::remove_file(&log);
        let mut all = vec!["render"];
        all.extend_from_slice(args);
        all.extend_from_slice(&["--force", "--typst", typst.to_str().unwrap()]);
        let out = c.command(&all).output().unwrap();
        assert!(out.status.success(), "{}", stderr(&out));
        std::fs::read_to_string(&log)
            .unwrap()
            .lines()
            .map(|line| {
                let words: Vec<&str> = line.split_whitespace().collect();
                assert_eq!(words[0], "compile", "{line}");
                words
                    .iter()
                    .position(|w| *w == "--jobs")
                    .map(|i| words[i + 1].parse().unwrap())
            })
            .collect()
    };
    let cores = std::thread::available_parallelism().map_or(1, usize::from);
    let share = |workers: usize| Some((cores / workers).max(1));
    assert_eq!(run(&["jobs", "-j", "2"]), vec![share(2); 2]);
    assert_eq!(run(&["jobs", "-r", "-j", "3"]), vec![share(3); 3]);
    // More workers than jobs: as many workers as jobs.
    assert_eq!(run(&["jobs", "-j", "8"]), vec![share(2); 2]);
    // One at a time, or one job: typst's own default.
    assert_eq!(run(&["jobs", "-r", "-j", "1"]), vec![None; 3]);
    assert_eq!(run(&["jobs/a.kdl"]), vec![None]);
    assert_eq!(run(&["jobs/old"]), vec![None]);
    // By default, as many workers as cores.
    let default = if cores > 1 { share(cores.min(3)) } else { None };
    assert_eq!(run(&["jobs", "-r"]), vec![default; 3]);
}

/// The deepest nesting the depth check passes to the `kdl` crate: blocks
/// to the limit, and a run of `/-` comments inside the innermost one.
fn deepest_allowed_job() -> String {
    "a {\n".repeat(48) + &"/- ".repeat(48) + "x\n" + &"}\n".repeat(48)
}

#[test]
fn a_deeply_nested_job_fails_alone_and_does_not_abort_the_batch() {
    // Read on a worker thread with the 2 MiB default stack, this job
    // overflowed it and aborted every render of the batch (status 134).
    let c = Counting::new();
    let jobs = c.scene.dir.join("jobs");
    std::fs::create_dir_all(&jobs).unwrap();
    std::fs::copy(support::demo("combo-el84-cathode"), jobs.join("a.kdl")).unwrap();
    std::fs::write(jobs.join("deep.kdl"), deepest_allowed_job()).unwrap();
    std::fs::write(jobs.join("deeper.kdl"), deepest_allowed_job()).unwrap();
    let out = c.render(&["jobs", "-j", "2"]);
    let said = text(&out);
    assert_eq!(out.status.code(), Some(1), "{said}\n{}", stderr(&out));
    assert!(said.contains("1 rendered, 0 unchanged, 2 failed"), "{said}");
    assert!(jobs.join("a.pdf").is_file());
    assert!(!jobs.join("deep.pdf").exists() && !jobs.join("deeper.pdf").exists());
}

#[test]
fn out_dir_mirrors_the_tree_and_two_jobs_may_not_share_an_output() {
    let c = Counting::new();
    let jobs = jobs_tree(&c);
    std::fs::remove_file(jobs.join("broken.kdl")).unwrap();
    let out = c.render(&["jobs", "--recursive", "--out-dir", "pdfs"]);
    assert!(out.status.success(), "{}", stderr(&out));
    let pdfs = c.scene.dir.join("pdfs");
    for name in ["a.pdf", "b.pdf", "old/c.pdf"] {
        assert!(pdfs.join(name).is_file(), "{name}");
    }
    assert!(!jobs.join("a.pdf").exists());
    // Standard input is one job, never one of several.
    let out = c.render(&["-", "jobs"]);
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
    assert!(stderr(&out).contains("standard input"), "{}", stderr(&out));
    // -o is for one job only.
    let out = c.render(&["jobs", "-o", "x.pdf"]);
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
    // Two jobs with one output.
    std::fs::create_dir(c.scene.dir.join("more")).unwrap();
    std::fs::copy(jobs.join("a.kdl"), c.scene.dir.join("more/a.kdl")).unwrap();
    let out = c.render(&["jobs", "more", "--out-dir", "pdfs"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(
        stderr(&out).contains("would both be written to"),
        "{}",
        stderr(&out)
    );
}

#[test]
fn listings_render_over_folders_into_out_dir_and_never_pass_for_the_hand_over() {
    let c = Counting::new();
    let jobs = jobs_tree(&c);
    std::fs::remove_file(jobs.join("broken.kdl")).unwrap();
    let listing = ["jobs", "--recursive", "--listing", "--out-dir", "pdfs"];
    let out = c.render(&listing);
    assert!(out.status.success(), "{}", stderr(&out));
    assert!(text(&out).contains("3 rendered, 0 unchanged, 0 failed"));
    let pdfs = c.scene.dir.join("pdfs");
    for name in ["a", "b", "old/c"] {
        assert!(pdfs.join(format!("{name}.listing.pdf")).is_file(), "{name}");
        let md = std::fs::read_to_string(pdfs.join(format!("{name}.listing.md"))).unwrap();
        assert!(md.contains("Deadly voltages"), "{name}: {md}");
        assert!(!pdfs.join(format!("{name}.pdf")).exists(), "{name}");
    }
    assert!(!jobs.join("a.listing.pdf").exists() && !jobs.join("a.listing.md").exists());
    assert_eq!(c.compiles(), 3);

    // Nothing changed: nothing is typeset.
    let out = c.render(&listing);
    assert!(
        text(&out).contains("0 rendered, 3 unchanged"),
        "{}",
        text(&out)
    );
    assert_eq!(c.compiles(), 3);

    // The hand-over into the same folder is typeset: a listing is not it.
    let out = c.render(&["jobs", "--recursive", "--out-dir", "pdfs"]);
    assert!(
        text(&out).contains("3 rendered, 0 unchanged"),
        "{}",
        text(&out)
    );
    assert!(pdfs.join("old/c.pdf").is_file());
    assert_eq!(c.compiles(), 6);
    let out = c.render(&listing);
    assert!(
        text(&out).contains("0 rendered, 3 unchanged"),
        "{}",
        text(&out)
    );

    // Another --serial is another listing; a Markdown removed by hand is
    // written again.
    let out = c.render(&[
        "jobs/a.kdl",
        "--listing",
        "--serial",
        "hidden",
        "--out-dir",
        "pdfs",
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    assert_eq!(c.compiles(), 7);
    std::fs::remove_file(pdfs.join("b.listing.md")).unwrap();
    let out = c.render(&listing);
    assert!(
        text(&out).contains("2 rendered, 1 unchanged"),
        "{}",
        text(&out)
    );
    assert!(pdfs.join("b.listing.md").is_file());
}

#[test]
fn a_listing_and_a_hand_over_at_one_path_never_skip_each_other() {
    let c = Counting::new();
    let job = c.scene.job.to_str().unwrap();
    assert!(c.typeset(&["-o", "same.pdf"]));
    assert!(c.typeset(&["-o", "same.pdf", "--listing"]));
    assert!(!c.typeset(&["-o", "same.pdf", "--listing"]));
    assert!(c.typeset(&["-o", "same.pdf"]));
    // One job's listing: the "wrote" lines name the PDF, then the Markdown.
    let out = c.render(&[job, "--listing", "--force"]);
    let said = text(&out);
    let pdf = said.find("job.listing.pdf").expect(&said);
    let md = said.find("job.listing.md").expect(&said);
    assert!(pdf < md, "{said}");
}

#[test]
fn a_listing_photo_removed_by_hand_renders_the_listing_again() {
    let c = Counting::new();
    let photos = c.scene.dir.join("photos");
    std::fs::create_dir(&photos).unwrap();
    for name in ["parlour-twelve-before.jpg", "parlour-twelve-after.png"] {
        std::fs::copy(
            PathBuf::from(env!("CARGO_MANIFEST_DIR"))
                .join("jobs/photos")
                .join(name),
            photos.join(name),
        )
        .unwrap();
    }
    std::fs::copy(support::demo("combo-6v6-fixed"), &c.scene.job).unwrap();
    assert!(c.typeset(&["--listing"]));
    let beside = c.scene.dir.join("job.listing-photo-2.png");
    assert!(c.scene.dir.join("job.listing-photo-1.jpg").is_file());
    assert!(beside.is_file());
    assert!(!c.typeset(&["--listing"]));
    std::fs::remove_file(&beside).unwrap();
    assert!(c.typeset(&["--listing"]));
    assert!(beside.is_file());
}

#[test]
fn quiet_prints_only_failures_and_the_summary() {
    // --quiet is the program's own (errors only): in a batch it leaves the
    // failures and the summary.
    let c = Counting::new();
    jobs_tree(&c);
    let out = c.render(&["--quiet", "jobs"]);
    let said = text(&out);
    assert_eq!(out.status.code(), Some(1));
    assert!(!said.contains("rendered jobs/a.kdl"), "{said}");
    assert!(said.contains("failed jobs/broken.kdl"), "{said}");
    assert!(said.contains("2 rendered, 0 unchanged, 1 failed"), "{said}");
}

#[test]
fn check_and_calc_take_several_jobs() {
    let c = Counting::new();
    let jobs = jobs_tree(&c);
    std::fs::remove_file(jobs.join("broken.kdl")).unwrap();
    let out = c
        .command(&["check", "jobs", "--recursive"])
        .output()
        .unwrap();
    assert!(out.status.success(), "{}", stderr(&out));
    let said = text(&out);
    let heads: Vec<&str> = said.lines().filter(|l| l.starts_with("━━ ")).collect();
    assert_eq!(
        heads,
        ["━━ jobs/a.kdl", "━━ jobs/b.kdl", "━━ jobs/old/c.kdl"],
        "{said}"
    );

    // Several jobs: JSON Lines, one document per job, in order; each the
    // same as that job's own `calc --json`.
    let out = c
        .command(&["calc", "--json", "jobs/a.kdl", "jobs/b.kdl"])
        .output()
        .unwrap();
    assert!(out.status.success(), "{}", stderr(&out));
    let lines: Vec<serde_json::Value> = text(&out)
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect();
    assert_eq!(lines.len(), 2);
    for (line, name) in lines.iter().zip(["jobs/a.kdl", "jobs/b.kdl"]) {
        let one = c.command(&["calc", "--json", name]).output().unwrap();
        let alone: serde_json::Value = serde_json::from_slice(&one.stdout).unwrap();
        assert_eq!(*line, alone, "{name}");
    }
    // A job that cannot be read gives no line, and exit status 1; the
    // others still print.
    std::fs::write(jobs.join("broken.kdl"), "job-format 1\njob {\n").unwrap();
    let out = c
        .command(&["calc", "--json", "jobs/broken.kdl", "jobs/a.kdl"])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(1));
    assert_eq!(text(&out).lines().count(), 1);
}

// ------------------------------------------------------------- watch

/// Waits until `test` holds, for at most `limit`.
fn wait_until(limit: Duration, mut test: impl FnMut() -> bool) -> bool {
    let deadline = Instant::now() + limit;
    while Instant::now() < deadline {
        if test() {
            return true;
        }
        std::thread::sleep(Duration::from_millis(20));
    }
    test()
}

/// `ampreport watch JOB EXTRA… --typst COUNTING` with its standard output
/// in `log`, held in a guard that kills and reaps it should the test fail.
fn start_watch(c: &Counting, log: &Path, extra: &[&str], stderr: Stdio) -> KilledOnDrop {
    let mut args = vec!["watch", c.scene.job.to_str().unwrap()];
    args.extend_from_slice(extra);
    args.extend_from_slice(&["--typst", c.typst.to_str().unwrap()]);
    KilledOnDrop::spawn(
        c.command(&args)
            .stdin(Stdio::null())
            .stdout(std::fs::File::create(log).unwrap())
            .stderr(stderr),
    )
}

#[cfg(target_os = "linux")]
#[test]
fn a_watch_test_that_fails_leaves_no_watch_running() {
    // The guard every watch test holds its child in: a failing check
    // (a panic) unwinds through it, and it kills and reaps the watcher.
    let c = Counting::new();
    let log = c.scene.root.path().join("watch.out");
    let (told, pid) = std::sync::mpsc::channel();
    let failed = std::panic::catch_unwind(std::panic::AssertUnwindSafe(|| {
        let child = start_watch(&c, &log, &[], Stdio::null());
        told.send(child.id() as i32).unwrap();
        let rendered = || {
            std::fs::read_to_string(&log)
                .unwrap_or_default()
                .contains(" rendered ")
        };
        assert!(wait_until(Duration::from_secs(30), rendered));
        panic!("a check of a watch test fails here (on purpose)");
    }));
    assert!(failed.is_err());
    let pid = pid.recv().unwrap();
    assert!(
        std::fs::read_to_string(&log)
            .unwrap()
            .contains(" rendered "),
        "the watcher ran"
    );
    // Gone, and reaped: not even a zombie is left.
    assert!(
        !std::path::Path::new(&format!("/proc/{pid}")).exists(),
        "ampreport watch {pid} outlived its failed test"
    );
}

#[cfg(target_os = "linux")]
#[test]
fn watch_renders_on_save_keeps_the_last_good_pdf_and_stops_on_ctrl_c() {
    let c = Counting::new();
    let log = c.scene.root.path().join("watch.out");
    let mut child = start_watch(&c, &log, &[], Stdio::piped());
    let pid = child.id() as i32;
    let limit = Duration::from_secs(30);
    let rendered = || {
        std::fs::read_to_string(&log)
            .unwrap_or_default()
            .lines()
            .filter(|l| l.contains(" rendered "))
            .count()
    };
    assert!(wait_until(limit, || rendered() == 1), "the first render");
    let first = std::fs::read(&c.scene.pdf).unwrap();
    // Let the watcher settle before the first save.
    std::thread::sleep(Duration::from_millis(300));

    // A save renders again.
    let good = std::fs::read_to_string(&c.scene.job).unwrap();
    std::fs::write(&c.scene.job, format!("{good}// saved\n")).unwrap();
    assert!(wait_until(limit, || rendered() == 2), "render on save");

    // A bad save: the error is told and the last good PDF stays.
    std::fs::write(&c.scene.job, "job-format 1\njob {\n").unwrap();
    assert!(
        wait_until(limit, || std::fs::read_to_string(&log)
            .unwrap_or_default()
            .contains("failed")),
        "the failure is told"
    );
    assert_eq!(c.compiles(), 2);
    assert_eq!(std::fs::read(&c.scene.pdf).unwrap(), first);

    // Mended: rendered again.
    std::fs::write(&c.scene.job, format!("{good}// mended\n")).unwrap();
    assert!(wait_until(limit, || rendered() == 3), "render once mended");
    assert_eq!(c.compiles(), 3);

    // A shop profile saved beside the job is something it is made from.
    std::fs::write(
        c.scene.dir.join("shop.kdl"),
        "shop-format 1\nshop \"Test Bench\"\n",
    )
    .unwrap();
    assert!(
        wait_until(limit, || rendered() == 4),
        "render on a new profile"
    );
    std::fs::write(
        c.scene.dir.join("shop.kdl"),
        "shop-format 1\nshop \"Test Bench Two\"\n",
    )
    .unwrap();
    assert!(
        wait_until(limit, || rendered() == 5),
        "render on a changed profile"
    );

    // Ctrl-C: status 0, nothing left behind.
    // SAFETY: signals the child started above.
    unsafe { libc::kill(pid, libc::SIGINT) };
    let status = support::wait_with_limit(&mut child, limit);
    let mut err = String::new();
    use std::io::Read;
    child
        .stderr
        .take()
        .unwrap()
        .read_to_string(&mut err)
        .unwrap();
    assert_eq!(status.code(), Some(0), "{err}");
    assert!(err.contains("stopped watching"), "{err}");
    let lines = std::fs::read_to_string(&log).unwrap();
    assert_eq!(
        lines.lines().filter(|l| l.contains(" rendered ")).count(),
        5,
        "{lines}"
    );
    assert!(
        c.scene.temp_listing().is_empty(),
        "{:?}",
        c.scene.temp_listing()
    );
    let leftovers: Vec<String> = support::listing(&c.scene.dir)
        .into_iter()
        .filter(|n| n.contains(".tmp") || n.starts_with(".ampreport"))
        .collect();
    assert!(leftovers.is_empty(), "{leftovers:?}");
}

#[cfg(target_os = "linux")]
#[test]
fn watch_takes_no_read_of_its_own_for_a_save_and_renders_listings() {
    // The watcher is also told of files being opened: the render's own
    // reads of the job and its shop profile must not set off another
    // render, over and over.
    let c = Counting::new();
    std::fs::write(
        c.scene.dir.join("shop.kdl"),
        "shop-format 1\nshop \"Test Bench\"\n",
    )
    .unwrap();
    let log = c.scene.root.path().join("watch.out");
    let mut child = start_watch(&c, &log, &["--listing"], Stdio::null());
    let pid = child.id() as i32;
    let limit = Duration::from_secs(30);
    let said = || std::fs::read_to_string(&log).unwrap_or_default();
    let count = |what: &str| said().lines().filter(|l| l.contains(what)).count();
    assert!(
        wait_until(limit, || count(" rendered ") == 1),
        "the first render"
    );
    assert!(said().contains("job.listing.pdf"), "{}", said());
    assert!(c.scene.dir.join("job.listing.md").is_file());
    // Quiet for a while: nothing more is rendered or even looked at.
    std::thread::sleep(Duration::from_millis(1500));
    assert_eq!(count(" unchanged "), 0, "{}", said());
    assert_eq!(count(" rendered "), 1, "{}", said());
    // A save still renders.
    let good = std::fs::read_to_string(&c.scene.job).unwrap();
    std::fs::write(&c.scene.job, format!("{good}// saved\n")).unwrap();
    assert!(wait_until(limit, || count(" rendered ") == 2), "{}", said());
    std::thread::sleep(Duration::from_millis(1000));
    assert_eq!(count(" unchanged "), 0, "{}", said());
    assert_eq!(c.compiles(), 2);
    // SAFETY: signals the child started above.
    unsafe { libc::kill(pid, libc::SIGINT) };
    let status = support::wait_with_limit(&mut child, limit);
    assert_eq!(status.code(), Some(0));
}

#[cfg(target_os = "linux")]
#[test]
fn watch_keeps_the_last_good_listing_whole_when_its_markdown_cannot_be_placed() {
    // Each compile writes a PDF of its own; the second one also turns the
    // Markdown's name into a folder while typst runs.
    let c = Counting::new();
    let markdown = c.scene.dir.join("job.listing.md");
    let listing_pdf = c.scene.dir.join("job.listing.pdf");
    for n in 1..=3 {
        let text = format!("compile {n}");
        let mut lines = NOTICE_PHRASES.to_vec();
        lines.push(&text);
        std::fs::write(
            c.scene.bin.join(format!("notice-{n}.pdf")),
            pdf_with_text(&lines),
        )
        .unwrap();
    }
    let typst = c.scene.fake_typst(
        "blocking-typst",
        &format!(
            "echo compiled >> '{log}'\nn=$(wc -l < '{log}' | tr -d ' ')\n\
             if [ \"$n\" = 2 ]; then rm -f '{md}'; mkdir '{md}'; fi\n\
             cp '{bin}/notice-'$n.pdf \"$out\"",
            log = c.compiles.display(),
            md = markdown.display(),
            bin = c.scene.bin.display(),
        ),
    );
    let log = c.scene.root.path().join("watch.out");
    let _child = KilledOnDrop::spawn(
        c.command(&[
            "watch",
            c.scene.job.to_str().unwrap(),
            "--listing",
            "--typst",
            typst.to_str().unwrap(),
        ])
        .stdin(Stdio::null())
        .stdout(std::fs::File::create(&log).unwrap())
        .stderr(std::fs::File::create(c.scene.root.path().join("watch.err")).unwrap()),
    );
    let limit = Duration::from_secs(30);
    let said = || {
        std::fs::read_to_string(&log).unwrap_or_default()
            + &std::fs::read_to_string(c.scene.root.path().join("watch.err")).unwrap_or_default()
    };
    let count = |what: &str| said().lines().filter(|l| l.contains(what)).count();
    assert!(wait_until(limit, || count(" rendered ") == 1), "{}", said());
    let first = std::fs::read(&listing_pdf).unwrap();
    assert!(markdown.is_file());
    std::thread::sleep(Duration::from_millis(300));

    // The second render's Markdown cannot be put in place: its PDF is not
    // either, and nothing temporary is left.
    let good = std::fs::read_to_string(&c.scene.job).unwrap();
    std::fs::write(&c.scene.job, format!("{good}// saved\n")).unwrap();
    assert!(
        wait_until(limit, || c.compiles() == 2 && said().contains("failed")),
        "{}",
        said()
    );
    assert!(std::fs::read(&listing_pdf).unwrap() == first, "{}", said());
    assert!(markdown.is_dir());
    let temporaries = || -> Vec<String> {
        support::listing(&c.scene.dir)
            .into_iter()
            .filter(|n| n.ends_with(".ampreport-part"))
            .collect()
    };
    assert!(temporaries().is_empty(), "{:?}", temporaries());

    // With the folder gone, the next save lands both, together.
    std::fs::remove_dir(&markdown).unwrap();
    std::fs::write(&c.scene.job, format!("{good}// saved again\n")).unwrap();
    assert!(wait_until(limit, || count(" rendered ") == 2), "{}", said());
    assert!(std::fs::read(&listing_pdf).unwrap() != first);
    assert!(markdown.is_file());
    assert!(temporaries().is_empty(), "{:?}", temporaries());
}

#[cfg(target_os = "linux")]
#[test]
fn watch_asks_git_again_after_a_commit_made_while_it_watches() {
    // The content key holds the commit HEAD stands at. A job edited, then
    // committed while watch runs, then saved again with the same bytes
    // must render again: its footer no longer says the bytes are
    // uncommitted.
    let c = Counting::new();
    let dir = &c.scene.dir;
    if !git(dir, &["init", "-q"]) {
        assert!(std::env::var_os("CI").is_none(), "git is needed under CI");
        eprintln!("note: skipping: git cannot be run");
        return;
    }
    assert!(git(dir, &["add", "job.kdl"]) && git(dir, &["commit", "-qm", "first"]));
    let log = c.scene.root.path().join("watch.out");
    let mut child = start_watch(&c, &log, &[], Stdio::null());
    let pid = child.id() as i32;
    let limit = Duration::from_secs(30);
    let said = || std::fs::read_to_string(&log).unwrap_or_default();
    let count = |what: &str| said().lines().filter(|l| l.contains(what)).count();
    assert!(wait_until(limit, || count(" rendered ") == 1), "{}", said());
    std::thread::sleep(Duration::from_millis(300));
    let edited = format!(
        "{}// second visit\n",
        std::fs::read_to_string(&c.scene.job).unwrap()
    );
    std::fs::write(&c.scene.job, &edited).unwrap();
    assert!(wait_until(limit, || count(" rendered ") == 2), "{}", said());
    assert!(git(dir, &["commit", "-qam", "second"]));
    // The same bytes saved again (a later modification time): rendered,
    // not skipped as unchanged.
    std::thread::sleep(Duration::from_millis(1100));
    std::fs::write(&c.scene.job, &edited).unwrap();
    assert!(
        wait_until(limit, || count(" rendered ") == 3
            || count(" unchanged ") > 0),
        "{}",
        said()
    );
    assert_eq!(count(" unchanged "), 0, "{}", said());
    assert_eq!(c.compiles(), 3);
    // SAFETY: signals the child started above.
    unsafe { libc::kill(pid, libc::SIGINT) };
    let status = support::wait_with_limit(&mut child, limit);
    assert_eq!(status.code(), Some(0));
}

//! What `ampreport render` refuses to write over, and what it refuses to
//! read: the output may not be an input (job, ratings, template, the typst
//! program), a link, a device or a FIFO; a template folder's links are
//! never followed; the `--emit-source` folder is replaced only with
//! `--force` and never written through links; the PDF respects the umask;
//! a relative `--typst` path works. Stand-in typst programs make most of
//! these independent of the real one.

#![cfg(unix)]

mod support;

use std::os::unix::fs::{PermissionsExt, symlink};
use std::path::Path;

use support::{GOOD_OLD_PDF, Scene, real_typst, says, stderr};

#[test]
fn the_output_may_not_be_an_input() {
    let scene = Scene::new();
    let typst = scene.good_typst();
    let job_bytes = std::fs::read(&scene.job).unwrap();
    let ratings = scene.dir.join("shop-ratings.kdl");
    std::fs::write(&ratings, "ratings-format 1\n").unwrap();
    let templates = scene.dir.join("templates");
    std::fs::create_dir(&templates).unwrap();
    std::fs::write(
        templates.join("handover.typ"),
        "{{ font_rules }}\n#include \"mains-safety.typ\"\n",
    )
    .unwrap();
    let cases: Vec<(std::path::PathBuf, &str)> = vec![
        (scene.job.clone(), "the job file"),
        (scene.dir.join("./job.kdl"), "the job file"),
        (templates.join("handover.typ"), "the template folder"),
        (templates.join("new.pdf"), "the template folder"),
        (typst.clone(), "the typst program"),
    ];
    for (output, what) in cases {
        let out = scene.render_to(
            &output,
            &typst,
            &["--templates", templates.to_str().unwrap()],
        );
        let err = stderr(&out);
        assert_eq!(out.status.code(), Some(2), "{}: {err}", output.display());
        assert!(says(&err, what), "{}: {err}", output.display());
        assert!(!output.ends_with("new.pdf") || !output.exists());
    }
    assert_eq!(std::fs::read(&scene.job).unwrap(), job_bytes);
    assert!(templates.join("handover.typ").is_file());

    // A ratings file, also through a hard link's other name.
    let hard = scene.dir.join("same-ratings.pdf");
    std::fs::hard_link(&ratings, &hard).unwrap();
    for output in [&ratings, &hard] {
        let out = scene.render_to(output, &typst, &["--ratings", ratings.to_str().unwrap()]);
        assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
        assert!(says(&stderr(&out), "a ratings file"), "{}", stderr(&out));
    }
    assert_eq!(
        std::fs::read_to_string(&ratings).unwrap(),
        "ratings-format 1\n"
    );
}

#[test]
fn links_devices_fifos_and_folders_are_not_outputs() {
    let scene = Scene::new();
    let typst = scene.good_typst();
    let elsewhere = scene.root.path().join("elsewhere.pdf");
    std::fs::write(&elsewhere, GOOD_OLD_PDF).unwrap();
    let link = scene.dir.join("link.pdf");
    symlink(&elsewhere, &link).unwrap();
    let fifo = scene.dir.join("fifo.pdf");
    let c = std::ffi::CString::new(fifo.as_os_str().as_encoded_bytes()).unwrap();
    // SAFETY: a valid NUL-terminated path.
    assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o600) }, 0);
    let folder = scene.dir.join("folder.pdf");
    std::fs::create_dir(&folder).unwrap();
    for (output, words) in [
        (link.as_path(), "symbolic link"),
        (fifo.as_path(), "FIFO"),
        (Path::new("/dev/null"), "a device"),
        (folder.as_path(), "a folder"),
    ] {
        let out = scene.render_to(output, &typst, &[]);
        let err = stderr(&out);
        assert_eq!(out.status.code(), Some(2), "{}: {err}", output.display());
        assert!(says(&err, words), "{}: {err}", output.display());
    }
    // Each is still what it was.
    assert!(
        std::fs::symlink_metadata(&link)
            .unwrap()
            .file_type()
            .is_symlink()
    );
    assert_eq!(std::fs::read(&elsewhere).unwrap(), GOOD_OLD_PDF);
    use std::os::unix::fs::FileTypeExt;
    assert!(
        std::fs::symlink_metadata(&fifo)
            .unwrap()
            .file_type()
            .is_fifo()
    );
    assert!(
        std::fs::metadata("/dev/null")
            .unwrap()
            .file_type()
            .is_char_device()
    );
    assert!(folder.is_dir());
    // The link's target itself may be named.
    let out = scene.render_to(&elsewhere, &typst, &[]);
    assert!(out.status.success(), "{}", stderr(&out));
    assert_ne!(std::fs::read(&elsewhere).unwrap(), GOOD_OLD_PDF);
}

#[test]
fn a_template_folder_link_is_refused_and_named() {
    let scene = Scene::new();
    let typst = scene.good_typst();
    let secret = scene.root.path().join("secret.txt");
    std::fs::write(&secret, "root:x:0:0:the password file").unwrap();
    let templates = scene.dir.join("templates");
    std::fs::create_dir_all(templates.join("images")).unwrap();
    std::fs::write(
        templates.join("handover.typ"),
        "{{ font_rules }}\n#read(\"images/leak.txt\")\n#include \"mains-safety.typ\"\n",
    )
    .unwrap();
    symlink(&secret, templates.join("images/leak.txt")).unwrap();
    let emitted = scene.root.path().join("emitted");
    let out = scene.render(
        &typst,
        &[
            "--templates",
            templates.to_str().unwrap(),
            "--emit-source",
            emitted.to_str().unwrap(),
        ],
    );
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(1), "{err}");
    assert!(
        says(&err, "leak.txt") && says(&err, "symbolic link"),
        "{err}"
    );
    assert!(!says(&err, "password file"), "{err}");
    assert!(scene.pdf_is_the_good_old_one());
    assert!(!emitted.exists());

    // A linked template or a linked part is refused the same way.
    std::fs::remove_file(templates.join("images/leak.txt")).unwrap();
    std::fs::remove_file(templates.join("handover.typ")).unwrap();
    symlink(&secret, templates.join("handover.typ")).unwrap();
    let out = scene.render(&typst, &["--templates", templates.to_str().unwrap()]);
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(1), "{err}");
    assert!(
        says(&err, "handover.typ") && says(&err, "symbolic link"),
        "{err}"
    );
    assert!(!says(&err, "password file"), "{err}");
    std::fs::remove_file(templates.join("handover.typ")).unwrap();
    std::fs::write(
        templates.join("handover.typ"),
        "{{ font_rules }}\n{% include \"parts/secret.typ\" %}\n#include \"mains-safety.typ\"\n",
    )
    .unwrap();
    symlink(scene.root.path(), templates.join("parts")).unwrap();
    std::fs::write(scene.root.path().join("secret.typ"), "outside words").unwrap();
    let out = scene.render(&typst, &["--templates", templates.to_str().unwrap()]);
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(1), "{err}");
    assert!(says(&err, "symbolic link"), "{err}");
    assert!(scene.pdf_is_the_good_old_one());
}

/// A shop template in three files: the page, a header part and a file of
/// macros.
fn split_templates(dir: &Path) {
    std::fs::create_dir_all(dir.join("parts")).unwrap();
    std::fs::write(
        dir.join("handover.typ"),
        "{% import \"parts/macros.typ\" as m %}{{ font_rules }}\n\
         {% include \"parts/header.typ\" %}\n\
         {{ m.field(\"Serial\", unit.serial) }}\n\
         #include \"mains-safety.typ\"\n",
    )
    .unwrap();
    std::fs::write(
        dir.join("parts/header.typ"),
        "= Split shop sheet for {{ unit.make }} {{ unit.model }}\n",
    )
    .unwrap();
    std::fs::write(
        dir.join("parts/macros.typ"),
        "{% macro field(name, value) %}*{{ name }}:* {{ value }}{% endmacro %}\n",
    )
    .unwrap();
}

#[test]
fn a_shop_template_can_be_split_into_parts() {
    let scene = Scene::new();
    let typst = scene.good_typst();
    let templates = scene.dir.join("templates");
    split_templates(&templates);
    let emitted = scene.root.path().join("emitted");
    let out = scene.render(
        &typst,
        &[
            "--templates",
            templates.to_str().unwrap(),
            "--emit-source",
            emitted.to_str().unwrap(),
        ],
    );
    assert!(out.status.success(), "{}", stderr(&out));
    let main = std::fs::read_to_string(emitted.join("main.typ")).unwrap();
    assert!(
        main.contains("= Split shop sheet for Corvane Duet 15"),
        "{main}"
    );
    // The macro's markup is kept; the value in it is escaped once.
    assert!(main.contains("*Serial:* DU15\\-04417"), "{main}");
    std::fs::remove_dir_all(&emitted).unwrap();

    if !real_typst() {
        return;
    }
    let out = scene.render(
        Path::new("typst"),
        &["--templates", templates.to_str().unwrap()],
    );
    assert!(out.status.success(), "{}", stderr(&out));
    let text = std::process::Command::new("pdftotext")
        .arg(&scene.pdf)
        .arg("-")
        .output()
        .unwrap();
    let text = String::from_utf8_lossy(&text.stdout);
    assert!(
        text.contains("Split shop sheet for Corvane Duet 15"),
        "{text}"
    );
    assert!(text.contains("Serial: DU15-04417"), "{text}");
}

#[test]
fn the_source_folder_is_replaced_only_with_force_and_never_through_links() {
    let scene = Scene::new();
    let typst = scene.good_typst();
    let src = scene.root.path().join("src");
    std::fs::create_dir_all(src.join("fonts")).unwrap();
    std::fs::write(src.join("main.typ"), "hand-edited one-off").unwrap();
    std::fs::write(src.join("fonts/evil.ttf"), "planted font").unwrap();
    let out = scene.render(&typst, &["--emit-source", src.to_str().unwrap()]);
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(2), "{err}");
    assert!(says(&err, "not empty") && says(&err, "--force"), "{err}");
    assert_eq!(
        std::fs::read_to_string(src.join("main.typ")).unwrap(),
        "hand-edited one-off"
    );
    assert!(scene.pdf_is_the_good_old_one());

    // With --force the folder holds exactly the new source: no stray font.
    let outside = scene.root.path().join("outside.typ");
    std::fs::write(&outside, "not to be touched").unwrap();
    std::fs::remove_file(src.join("main.typ")).unwrap();
    symlink(&outside, src.join("main.typ")).unwrap();
    let out = scene.render(&typst, &["--emit-source", src.to_str().unwrap(), "--force"]);
    assert!(out.status.success(), "{}", stderr(&out));
    assert_eq!(
        std::fs::read_to_string(&outside).unwrap(),
        "not to be touched"
    );
    let meta = std::fs::symlink_metadata(src.join("main.typ")).unwrap();
    assert!(meta.file_type().is_file());
    assert!(!src.join("fonts/evil.ttf").exists());
    assert!(src.join("fonts/OFL-1.1.txt").is_file());
    assert!(
        std::fs::read_to_string(src.join("main.typ"))
            .unwrap()
            .contains("#include \"mains-safety.typ\"")
    );
    // Nothing is left beside it.
    let beside: Vec<String> = support::listing(scene.root.path())
        .into_iter()
        .filter(|n| n.starts_with(".ampreport"))
        .collect();
    assert!(beside.is_empty(), "{beside:?}");

    // A linked folder, or one holding the job, is refused even with --force.
    let link = scene.root.path().join("src-link");
    symlink(&src, &link).unwrap();
    for (dir, words) in [(&link, "symbolic link"), (&scene.dir, "the job file")] {
        let out = scene.render(&typst, &["--emit-source", dir.to_str().unwrap(), "--force"]);
        let err = stderr(&out);
        assert_eq!(out.status.code(), Some(2), "{err}");
        assert!(says(&err, words), "{err}");
    }
    assert!(scene.job.is_file());
}

/// Runs a render under `umask` and returns the new PDF's permission bits.
fn mode_under_umask(umask: &str) -> u32 {
    let scene = Scene::new();
    let typst = scene.good_typst();
    std::fs::remove_file(&scene.pdf).unwrap();
    let out = scene
        .program("/bin/sh")
        .args([
            "-c",
            &format!("umask {umask}; exec \"$0\" \"$@\""),
            &support::bin(),
            "render",
            scene.job.to_str().unwrap(),
            "-o",
            scene.pdf.to_str().unwrap(),
            "--typst",
            typst.to_str().unwrap(),
        ])
        .output()
        .unwrap();
    assert!(out.status.success(), "{}", stderr(&out));
    std::fs::metadata(&scene.pdf).unwrap().permissions().mode() & 0o777
}

#[test]
fn a_new_pdf_respects_the_umask() {
    assert_eq!(mode_under_umask("022"), 0o644);
    assert_eq!(mode_under_umask("077"), 0o600);
}

#[test]
fn a_relative_typst_path_is_resolved_once() {
    let scene = Scene::new();
    let good = scene.good_typst();
    // A wrapper named relative to the current folder, which is not the
    // folder typst is later started in.
    std::fs::write(
        scene.dir.join("wrapper.sh"),
        format!("#!/bin/sh\nexec '{}' \"$@\"\n", good.display()),
    )
    .unwrap();
    support::make_executable(&scene.dir.join("wrapper.sh"));
    let out = scene
        .command(&[
            "render",
            "job.kdl",
            "-o",
            "job.pdf",
            "--typst",
            "./wrapper.sh",
        ])
        .current_dir(&scene.dir)
        .output()
        .unwrap();
    assert!(out.status.success(), "{}", stderr(&out));
    assert!(!scene.pdf_is_the_good_old_one());
}

/// Names in `dir` that are a render's temporary files (`*.ampreport-part`).
fn temporaries(dir: &Path) -> Vec<String> {
    support::listing(dir)
        .into_iter()
        .filter(|n| n.ends_with(".ampreport-part"))
        .collect()
}

#[test]
fn a_listing_whose_markdown_cannot_be_written_leaves_the_old_pdf_in_place() {
    let scene = Scene::new();
    let pdf = scene.dir.join("job.listing.pdf");
    let markdown = scene.dir.join("job.listing.md");
    std::fs::write(&pdf, GOOD_OLD_PDF).unwrap();
    // Every check before typst passes; while typst runs, the Markdown's
    // name becomes a folder, so the Markdown cannot be put in place.
    let good = scene.good_typst();
    let notice = scene.bin.join("notice.pdf");
    let typst = scene.fake_typst(
        "folder-typst",
        &format!(
            "mkdir -p '{}'\ncp '{}' \"$out\"",
            markdown.display(),
            notice.display()
        ),
    );
    let mut before = scene.listing();
    before.insert("job.listing.md".to_owned());
    let out = scene.render_to(&pdf, &typst, &["--listing"]);
    let err = stderr(&out);
    assert_ne!(out.status.code(), Some(0), "{err}");
    assert!(says(&err, "job.listing.md"), "{err}");
    assert!(std::fs::read(&pdf).unwrap() == GOOD_OLD_PDF, "{err}");
    assert!(markdown.is_dir(), "{err}");
    assert!(temporaries(&scene.dir).is_empty(), "{:?}", scene.listing());
    assert_eq!(scene.listing(), before, "{err}");

    // With the folder gone, the same render writes both, together.
    std::fs::remove_dir(&markdown).unwrap();
    let out = scene.render_to(&pdf, &good, &["--listing"]);
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    assert!(std::fs::read(&pdf).unwrap() != GOOD_OLD_PDF);
    assert!(std::fs::read_to_string(&markdown).unwrap().contains('#'));
    assert!(temporaries(&scene.dir).is_empty(), "{:?}", scene.listing());
}

#[test]
fn in_a_batch_a_listing_whose_markdown_fails_keeps_its_old_pdf_and_the_others_land() {
    let scene = Scene::new();
    let other = scene.dir.join("other.kdl");
    std::fs::copy(&scene.job, &other).unwrap();
    let old_pdf = scene.dir.join("other.listing.pdf");
    std::fs::write(&old_pdf, GOOD_OLD_PDF).unwrap();
    let blocked = scene.dir.join("other.listing.md");
    scene.good_typst();
    let notice = scene.bin.join("notice.pdf");
    let typst = scene.fake_typst(
        "folder-typst",
        &format!(
            "mkdir -p '{}'\ncp '{}' \"$out\"",
            blocked.display(),
            notice.display()
        ),
    );
    let out = scene.run(&[
        "render",
        scene.dir.to_str().unwrap(),
        "--listing",
        "-j",
        "2",
        "--typst",
        typst.to_str().unwrap(),
    ]);
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(1), "{err}");
    assert!(std::fs::read(&old_pdf).unwrap() == GOOD_OLD_PDF, "{err}");
    assert!(blocked.is_dir(), "{err}");
    // The other job's listing is whole: its PDF and its Markdown.
    assert!(std::fs::read(scene.dir.join("job.listing.pdf")).unwrap() != GOOD_OLD_PDF);
    assert!(scene.dir.join("job.listing.md").is_file(), "{err}");
    assert!(temporaries(&scene.dir).is_empty(), "{:?}", scene.listing());
}

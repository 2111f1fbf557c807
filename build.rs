//! Build script: works out the SHA-256 of the bundled fonts (every file in
//! `fonts/`, by name) once at build time, so the program can name its
//! per-user font cache folder after the font bytes without hashing 9 MB on
//! every run. `src/typeset/font_cache.rs` reads it as
//! `AMPREPORT_FONTS_DIGEST` and a unit test checks it against the embedded
//! files.

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
}

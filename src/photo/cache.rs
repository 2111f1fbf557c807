//! Prepared photos kept between renders, so a photo is decoded, turned,
//! shrunk and encoded again only the first time it is seen: preparing the
//! two photos of a demo job took more processor time than the rest of
//! ampreport's own work on it, and it was done again on every render.
//!
//! **Where:** `photos/` in the per-user cache folder
//! ([`crate::folders::cache_dir`]: `$XDG_CACHE_HOME/ampreport/photos/`,
//! else `~/.cache/ampreport/photos/` on Linux), one file per prepared
//! photo, named after its key. The folder is made private to the user
//! (`0700`); a folder that is a link, belongs to someone else or that
//! others may write to is not used (the photo is prepared as if there
//! were no cache).
//!
//! **What decides an entry** ([`entry_key`], BLAKE3): the photo file's
//! bytes, its format as sniffed, everything that decides what
//! [`super::process`] makes of them (the print box, the resolution, the
//! JPEG quality, the decoding limits), the entry format, and ampreport
//! itself (its version and the digest of its sources and lock file taken
//! at build time, which covers the code that prepares a photo and the
//! version of the `image` crate). A photo that fails to prepare is never
//! kept: its error is worked out again each time.
//!
//! **An entry is never trusted blindly.** It holds a header (a fixed
//! mark, the entry format, its own key, the format, width and height, the
//! length of the picture), the picture, and a BLAKE3 hash of all of that.
//! It is used only when it is a regular file of at most
//! [`MAX_ENTRY_BYTES`] (opened without following a link and without
//! waiting on a FIFO), its mark and format match, the key it holds is the
//! key asked for (an entry copied or renamed from another photo, or left
//! by another version of ampreport, is foreign), the length adds up, the
//! hash matches, and the picture is a PNG or JPEG, as the photo was, whose
//! own header gives the width and height recorded, no larger than the
//! print box. Anything else is ignored and the photo is prepared afresh,
//! which replaces the entry. The hash catches damage (a torn write, a
//! flipped bit), not a forgery by someone who can write into the user's
//! own private cache folder; the folder's ownership and permissions are
//! what keep others out.
//!
//! **Writing** is atomic: a locked temporary file in the folder
//! (`.NAME.*.ampreport-part`, swept by a later run after a `kill -9`),
//! renamed into place. It is not flushed to disk: an entry lost or torn by
//! a power cut is caught by its hash and only costs preparing the photo
//! again.
//!
//! **Size:** when an entry is added and the folder holds more than
//! [`CAP_BYTES`], the entries used longest ago (by modification time,
//! which a hit renews) are removed until it holds at most three quarters
//! of that.

use std::io::Write;
use std::path::{Path, PathBuf};

use super::{JPEG_QUALITY, MAX_DECODE_BYTES, MAX_PHOTO_BYTES, MAX_PHOTO_SIDE, PRINT_BOX_MM};
use super::{PRINT_DPI, PhotoFormat, print_box_pixels};

/// The first bytes of every entry.
const MARK: &[u8; 25] = b"ampreport prepared photo\n";

/// The entry format; a change to the layout below raises it.
const ENTRY_FORMAT: u32 = 1;

/// Mark, format, key, photo format, width, height, picture length.
const HEADER_BYTES: usize = MARK.len() + 4 + 32 + 1 + 4 + 4 + 8;

/// The hash at the end of an entry.
const HASH_BYTES: usize = 32;

/// The largest entry read: a prepared picture is at most the print box
/// (630 × 472 pixels), far below this.
pub const MAX_ENTRY_BYTES: u64 = MAX_PHOTO_BYTES;

/// Past this, adding an entry removes the ones used longest ago.
pub const CAP_BYTES: u64 = 256 * 1024 * 1024;

/// The name of the cache's folder under the per-user cache root.
pub const FOLDER: &str = "photos";

/// What [`super::process`] made of a photo: the picture's bytes and size.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Prepared {
    pub bytes: Vec<u8>,
    pub width: u32,
    pub height: u32,
}

/// The key of a photo's entry: a BLAKE3 hash over the photo's bytes and
/// everything else that decides the prepared picture.
pub fn entry_key(photo: &[u8], format: PhotoFormat) -> [u8; 32] {
    entry_key_with(photo, format, &Parameters::current())
}

/// Everything besides the photo's bytes that decides its prepared picture.
#[derive(Debug, Clone, PartialEq)]
struct Parameters {
    program: (&'static str, &'static str),
    print_box_mm: (f64, f64),
    dpi: f64,
    jpeg_quality: u8,
    max_side: u32,
    max_decode_bytes: u64,
}

impl Parameters {
    fn current() -> Self {
        Parameters {
            program: (env!("CARGO_PKG_VERSION"), env!("AMPREPORT_PROGRAM_DIGEST")),
            print_box_mm: PRINT_BOX_MM,
            dpi: PRINT_DPI,
            jpeg_quality: JPEG_QUALITY,
            max_side: MAX_PHOTO_SIDE,
            max_decode_bytes: MAX_DECODE_BYTES,
        }
    }
}

fn entry_key_with(photo: &[u8], format: PhotoFormat, p: &Parameters) -> [u8; 32] {
    let mut h = blake3::Hasher::new();
    let mut feed = |name: &str, bytes: &[u8]| {
        h.update(&(name.len() as u64).to_le_bytes());
        h.update(name.as_bytes());
        h.update(&(bytes.len() as u64).to_le_bytes());
        h.update(bytes);
    };
    feed("entry format", &ENTRY_FORMAT.to_le_bytes());
    feed("ampreport version", p.program.0.as_bytes());
    feed("ampreport sources", p.program.1.as_bytes());
    feed("print box mm", &p.print_box_mm.0.to_le_bytes());
    feed("print box mm", &p.print_box_mm.1.to_le_bytes());
    feed("dpi", &p.dpi.to_le_bytes());
    feed("jpeg quality", &[p.jpeg_quality]);
    feed("max side", &p.max_side.to_le_bytes());
    feed("max decode bytes", &p.max_decode_bytes.to_le_bytes());
    feed("format", &[format_byte(format)]);
    feed("photo", photo);
    *h.finalize().as_bytes()
}

fn format_byte(format: PhotoFormat) -> u8 {
    match format {
        PhotoFormat::Png => 1,
        PhotoFormat::Jpeg => 2,
    }
}

/// The folder of prepared photos.
#[derive(Debug, Clone)]
pub struct PhotoCache {
    dir: PathBuf,
}

impl PhotoCache {
    /// The user's cache ([`crate::folders::cache_dir`]`/photos`), made if
    /// needed; `None` without a home folder, or when the folder cannot be
    /// made or may not be trusted (see [`PhotoCache::in_root`]).
    pub fn user() -> Option<PhotoCache> {
        PhotoCache::in_root(&crate::folders::cache_dir()?)
    }

    /// The cache in `root/photos`, made if needed (private to the user);
    /// `None` when it cannot be made, or when it is a link, not a folder,
    /// belongs to another user or may be written by others.
    pub fn in_root(root: &Path) -> Option<PhotoCache> {
        crate::folders::private_folder(root, FOLDER).map(|dir| PhotoCache { dir })
    }

    /// Where the entries are.
    pub fn dir(&self) -> &Path {
        &self.dir
    }

    /// The file holding the entry of `key`.
    pub fn entry_path(&self, key: &[u8; 32]) -> PathBuf {
        self.dir.join(entry_name(key))
    }

    /// The prepared picture kept for `key`, if there is a sound entry for
    /// it (see the module's notes); `None` otherwise.
    pub fn get(&self, key: &[u8; 32], format: PhotoFormat) -> Option<Prepared> {
        let name = entry_name(key);
        let read = crate::input_file::read_in_folder(&self.dir, &name, MAX_ENTRY_BYTES).ok()?;
        let prepared = parse_entry(&read.bytes, key, format)?;
        // A hit renews the entry's time, so the trim keeps what is used.
        if let Ok(file) = std::fs::File::open(&read.real) {
            let _ = file.set_modified(std::time::SystemTime::now());
        }
        Some(prepared)
    }

    /// Keeps `prepared` as the entry of `key`, replacing any entry there
    /// in one rename. Errors are ignored: the cache only saves work.
    pub fn put(&self, key: &[u8; 32], format: PhotoFormat, prepared: &Prepared) {
        let name = entry_name(key);
        crate::typeset::sweep_partials(&self.dir);
        let Ok(mut partial) = crate::typeset::locked_partial(&self.dir, &name) else {
            return;
        };
        if partial
            .write_all(&entry_bytes(key, format, prepared))
            .is_err()
        {
            return;
        }
        if partial.persist(self.dir.join(&name)).is_ok() {
            self.trim(CAP_BYTES);
        }
    }

    /// When the entries hold more than `cap` bytes, removes those used
    /// longest ago until they hold at most three quarters of it.
    fn trim(&self, cap: u64) {
        let Ok(read) = std::fs::read_dir(&self.dir) else {
            return;
        };
        let mut entries: Vec<(std::time::SystemTime, u64, PathBuf)> = read
            .flatten()
            .filter(|e| is_entry_name(&e.file_name().to_string_lossy()))
            .filter_map(|e| {
                let meta = e.metadata().ok()?;
                meta.is_file()
                    .then(|| (meta.modified().ok(), meta.len(), e.path()))
                    .and_then(|(time, len, path)| Some((time?, len, path)))
            })
            .collect();
        let mut total: u64 = entries.iter().map(|e| e.1).sum();
        if total <= cap {
            return;
        }
        entries.sort();
        for (_, len, path) in entries {
            if total <= cap / 4 * 3 {
                break;
            }
            if std::fs::remove_file(&path).is_ok() {
                total = total.saturating_sub(len);
            }
        }
    }
}

/// An entry's file name: its key in hex.
fn entry_name(key: &[u8; 32]) -> String {
    blake3::Hash::from_bytes(*key).to_hex().to_string()
}

fn is_entry_name(name: &str) -> bool {
    name.len() == 64 && name.bytes().all(|b| b.is_ascii_hexdigit())
}

/// The bytes of the entry of `key`.
fn entry_bytes(key: &[u8; 32], format: PhotoFormat, prepared: &Prepared) -> Vec<u8> {
    let mut out = Vec::with_capacity(HEADER_BYTES + prepared.bytes.len() + HASH_BYTES);
    out.extend_from_slice(MARK);
    out.extend_from_slice(&ENTRY_FORMAT.to_le_bytes());
    out.extend_from_slice(key);
    out.push(format_byte(format));
    out.extend_from_slice(&prepared.width.to_le_bytes());
    out.extend_from_slice(&prepared.height.to_le_bytes());
    out.extend_from_slice(&(prepared.bytes.len() as u64).to_le_bytes());
    out.extend_from_slice(&prepared.bytes);
    let hash = blake3::hash(&out);
    out.extend_from_slice(hash.as_bytes());
    out
}

/// The prepared picture an entry holds, when it is a sound entry of `key`
/// for a photo of `format`; `None` for anything else.
fn parse_entry(bytes: &[u8], key: &[u8; 32], format: PhotoFormat) -> Option<Prepared> {
    if bytes.len() < HEADER_BYTES + HASH_BYTES {
        return None;
    }
    let (body, hash) = bytes.split_at(bytes.len() - HASH_BYTES);
    if blake3::hash(body).as_bytes() != hash {
        return None;
    }
    let (header, picture) = body.split_at(HEADER_BYTES);
    let mut at = 0;
    let mut take = |n: usize| {
        let part = &header[at..at + n];
        at += n;
        part
    };
    if take(MARK.len()) != MARK
        || take(4) != ENTRY_FORMAT.to_le_bytes()
        || take(32) != key
        || take(1) != [format_byte(format)]
    {
        return None;
    }
    let width = u32::from_le_bytes(take(4).try_into().ok()?);
    let height = u32::from_le_bytes(take(4).try_into().ok()?);
    let length = u64::from_le_bytes(take(8).try_into().ok()?);
    if length != picture.len() as u64 {
        return None;
    }
    let (box_w, box_h) = print_box_pixels();
    if width == 0 || height == 0 || width > box_w || height > box_h {
        return None;
    }
    // The picture is what it says: the photo's format, of that size.
    if PhotoFormat::sniff(picture) != Some(format) {
        return None;
    }
    let size =
        image::ImageReader::with_format(std::io::Cursor::new(picture), format.image_format())
            .into_dimensions()
            .ok()?;
    if size != (width, height) {
        return None;
    }
    Some(Prepared {
        bytes: picture.to_vec(),
        width,
        height,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn png(w: u32, h: u32) -> Vec<u8> {
        let img = image::RgbImage::from_fn(w, h, |x, y| image::Rgb([x as u8, y as u8, 90]));
        let mut out = std::io::Cursor::new(Vec::new());
        img.write_to(&mut out, image::ImageFormat::Png).unwrap();
        out.into_inner()
    }

    fn prepared(w: u32, h: u32) -> Prepared {
        Prepared {
            bytes: png(w, h),
            width: w,
            height: h,
        }
    }

    fn cache() -> (tempfile::TempDir, PhotoCache) {
        let root = tempfile::tempdir().unwrap();
        let cache = PhotoCache::in_root(root.path()).unwrap();
        (root, cache)
    }

    #[test]
    fn an_entry_put_is_got_back_whole() {
        let (_root, cache) = cache();
        let key = entry_key(b"photo one", PhotoFormat::Png);
        assert_eq!(cache.get(&key, PhotoFormat::Png), None);
        let kept = prepared(40, 30);
        cache.put(&key, PhotoFormat::Png, &kept);
        assert_eq!(cache.get(&key, PhotoFormat::Png), Some(kept));
        // Asked for as the other format, it is not used.
        assert_eq!(cache.get(&key, PhotoFormat::Jpeg), None);
        // Nothing but the entry is left in the folder.
        let names: Vec<String> = std::fs::read_dir(cache.dir())
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .collect();
        assert_eq!(names, [entry_name(&key)]);
    }

    #[test]
    fn the_key_changes_with_the_bytes_the_format_and_every_parameter() {
        let base = Parameters::current();
        let key = |photo: &[u8], format, p: &Parameters| entry_key_with(photo, format, p);
        let k0 = key(b"abc", PhotoFormat::Png, &base);
        assert_eq!(k0, entry_key(b"abc", PhotoFormat::Png));
        assert_ne!(k0, key(b"abd", PhotoFormat::Png, &base));
        assert_ne!(k0, key(b"abc", PhotoFormat::Jpeg, &base));
        let changes: [fn(&mut Parameters); 8] = [
            |p| p.program.0 = "0.0.0-other",
            |p| p.program.1 = "another build",
            |p| p.print_box_mm.0 += 1.0,
            |p| p.print_box_mm.1 += 1.0,
            |p| p.dpi += 1.0,
            |p| p.jpeg_quality -= 1,
            |p| p.max_side -= 1,
            |p| p.max_decode_bytes -= 1,
        ];
        for (i, change) in changes.iter().enumerate() {
            let mut p = base.clone();
            change(&mut p);
            assert_ne!(k0, key(b"abc", PhotoFormat::Png, &p), "parameter {i}");
        }
    }

    #[test]
    fn a_damaged_entry_is_ignored_and_replaced() {
        let (_root, cache) = cache();
        let key = entry_key(b"photo", PhotoFormat::Png);
        let kept = prepared(20, 10);
        cache.put(&key, PhotoFormat::Png, &kept);
        let path = cache.entry_path(&key);
        let good = std::fs::read(&path).unwrap();
        // Every single flipped byte, anywhere in the entry, is caught.
        for i in (0..good.len()).step_by(7).chain([good.len() - 1]) {
            let mut bad = good.clone();
            bad[i] ^= 0x20;
            std::fs::write(&path, &bad).unwrap();
            assert_eq!(cache.get(&key, PhotoFormat::Png), None, "byte {i}");
        }
        // Cut short, empty, or longer than it says.
        for bad in [
            &good[..good.len() / 2],
            &[][..],
            &[good.as_slice(), b"x"].concat(),
        ] {
            std::fs::write(&path, bad).unwrap();
            assert_eq!(cache.get(&key, PhotoFormat::Png), None);
        }
        // Putting it again makes it sound.
        cache.put(&key, PhotoFormat::Png, &kept);
        assert_eq!(cache.get(&key, PhotoFormat::Png), Some(kept));
    }

    #[test]
    fn a_foreign_entry_is_not_used() {
        let (_root, cache) = cache();
        let a = entry_key(b"photo a", PhotoFormat::Png);
        let b = entry_key(b"photo b", PhotoFormat::Png);
        cache.put(&a, PhotoFormat::Png, &prepared(20, 10));
        // A's entry copied to B's name: sound in itself, but not B's.
        std::fs::copy(cache.entry_path(&a), cache.entry_path(&b)).unwrap();
        assert_eq!(cache.get(&b, PhotoFormat::Png), None);
        // An entry of another format of entry.
        let mut other = std::fs::read(cache.entry_path(&a)).unwrap();
        other[MARK.len()] = 9;
        let body = other.len() - HASH_BYTES;
        let hash = blake3::hash(&other[..body]);
        other[body..].copy_from_slice(hash.as_bytes());
        std::fs::write(cache.entry_path(&a), &other).unwrap();
        assert_eq!(cache.get(&a, PhotoFormat::Png), None);
    }

    #[test]
    fn an_entry_whose_picture_is_not_what_it_claims_is_not_used() {
        let (_root, cache) = cache();
        let key = entry_key(b"photo", PhotoFormat::Png);
        // Sound hashes, but the picture is 30 × 30 while the header says
        // 20 × 10; then not a picture at all; then larger than the box.
        for (claimed, bytes) in [
            ((20, 10), png(30, 30)),
            ((20, 10), b"\x89PNG\r\n\x1a\nnot really".to_vec()),
            ((2000, 10), png(2000, 10)),
        ] {
            let forged = Prepared {
                bytes,
                width: claimed.0,
                height: claimed.1,
            };
            std::fs::write(
                cache.entry_path(&key),
                entry_bytes(&key, PhotoFormat::Png, &forged),
            )
            .unwrap();
            assert_eq!(cache.get(&key, PhotoFormat::Png), None, "{claimed:?}");
        }
    }

    #[cfg(unix)]
    #[test]
    fn a_link_a_fifo_or_a_folder_in_place_of_an_entry_is_ignored() {
        let (root, cache) = cache();
        let key = entry_key(b"photo", PhotoFormat::Png);
        let kept = prepared(20, 10);
        // A link to a sound entry elsewhere is not followed.
        let elsewhere = root.path().join("elsewhere");
        std::fs::write(&elsewhere, entry_bytes(&key, PhotoFormat::Png, &kept)).unwrap();
        std::os::unix::fs::symlink(&elsewhere, cache.entry_path(&key)).unwrap();
        assert_eq!(cache.get(&key, PhotoFormat::Png), None);
        // Putting replaces the link itself, not its target.
        cache.put(&key, PhotoFormat::Png, &kept);
        assert!(
            !std::fs::symlink_metadata(cache.entry_path(&key))
                .unwrap()
                .is_symlink()
        );
        assert_eq!(cache.get(&key, PhotoFormat::Png), Some(kept.clone()));
        // A FIFO is not waited on.
        std::fs::remove_file(cache.entry_path(&key)).unwrap();
        let fifo = std::ffi::CString::new(cache.entry_path(&key).to_str().unwrap()).unwrap();
        // SAFETY: a valid NUL-terminated path.
        assert_eq!(unsafe { libc::mkfifo(fifo.as_ptr(), 0o600) }, 0);
        assert_eq!(cache.get(&key, PhotoFormat::Png), None);
        // A folder: not read, and putting cannot replace it (no error).
        std::fs::remove_file(cache.entry_path(&key)).unwrap();
        std::fs::create_dir(cache.entry_path(&key)).unwrap();
        assert_eq!(cache.get(&key, PhotoFormat::Png), None);
        cache.put(&key, PhotoFormat::Png, &kept);
        assert_eq!(cache.get(&key, PhotoFormat::Png), None);
    }

    #[cfg(unix)]
    #[test]
    fn a_folder_others_may_write_to_or_a_link_is_not_used() {
        use std::os::unix::fs::PermissionsExt;
        let root = tempfile::tempdir().unwrap();
        let made = PhotoCache::in_root(root.path()).unwrap();
        let mode = std::fs::metadata(made.dir()).unwrap().permissions().mode();
        assert_eq!(mode & 0o077, 0, "{mode:o}");
        for open in [0o777, 0o770, 0o722] {
            std::fs::set_permissions(made.dir(), std::fs::Permissions::from_mode(open)).unwrap();
            assert!(PhotoCache::in_root(root.path()).is_none(), "{open:o}");
        }
        // A link in place of the folder, even to a private folder.
        let other = tempfile::tempdir().unwrap();
        let linked = tempfile::tempdir().unwrap();
        std::os::unix::fs::symlink(other.path(), linked.path().join(FOLDER)).unwrap();
        assert!(PhotoCache::in_root(linked.path()).is_none());
        // A file in place of the folder.
        let file_root = tempfile::tempdir().unwrap();
        std::fs::write(file_root.path().join(FOLDER), b"x").unwrap();
        assert!(PhotoCache::in_root(file_root.path()).is_none());
    }

    #[test]
    fn a_full_cache_drops_the_entries_used_longest_ago() {
        let (_root, cache) = cache();
        let keys: Vec<[u8; 32]> = (0..4u8)
            .map(|i| entry_key(&[i], PhotoFormat::Png))
            .collect();
        let kept = prepared(40, 30);
        for key in &keys {
            cache.put(key, PhotoFormat::Png, &kept);
        }
        let size = std::fs::metadata(cache.entry_path(&keys[0])).unwrap().len();
        // Oldest first: 0, 1, 2, 3; then 0 is used again.
        let t = std::time::SystemTime::now();
        for (i, key) in keys.iter().enumerate() {
            let f = std::fs::File::options()
                .write(true)
                .open(cache.entry_path(key))
                .unwrap();
            f.set_modified(t - std::time::Duration::from_secs(100 - i as u64))
                .unwrap();
        }
        assert!(cache.get(&keys[0], PhotoFormat::Png).is_some());
        // A cap of three entries: trimmed to two (three quarters of it).
        cache.trim(size * 3);
        assert!(cache.entry_path(&keys[0]).is_file());
        assert!(!cache.entry_path(&keys[1]).exists());
        assert!(!cache.entry_path(&keys[2]).exists());
        assert!(cache.entry_path(&keys[3]).is_file());
    }
}

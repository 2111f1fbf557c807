//! The job's photos: which files a job reads ([`photo_paths`], the one
//! place that says so), and each file checked and made ready for a
//! document ([`prepare`]).
//!
//! The rules, each refused with an error at the line of the `photo`:
//!
//! * the path is relative to the job file's folder and stays inside it: no
//!   absolute path, no `..` part, no symbolic link that leads out;
//! * it is a regular file (not a folder, a FIFO, a device) of at most
//!   [`MAX_PHOTO_BYTES`];
//! * it is a PNG or a JPEG picture, known by its content (not its name),
//!   that decodes within [`MAX_PHOTO_SIDE`] pixels a side and
//!   [`MAX_DECODE_BYTES`] of memory.
//!
//! What typst receives is never the file itself: the picture is turned
//! upright as its EXIF orientation says, shrunk (never enlarged) to fit the
//! box it is printed in ([`PRINT_BOX_MM`] at [`PRINT_DPI`]), and encoded
//! again from its pixels, so none of the file's metadata (EXIF, GPS
//! position, camera, comments) reaches the document. The same file always
//! gives the same bytes.

mod cache;

use std::path::{Path, PathBuf};

pub use cache::{CAP_BYTES, MAX_ENTRY_BYTES, PhotoCache, Prepared, entry_key};
use image::{DynamicImage, ImageDecoder, ImageFormat, ImageReader, imageops::FilterType};

use crate::catalogue::Msg;
use crate::input_file::{InFolderError, read_in_folder};
use crate::job::{DecodeError, Job, Photo};

/// The largest photo file read: 20 MiB, more than a phone's
/// 12-megapixel JPEG needs (3 to 6 MB).
pub const MAX_PHOTO_BYTES: u64 = 20 * 1024 * 1024;

/// The most pixels along either side of a photo: 12 000.
pub const MAX_PHOTO_SIDE: u32 = 12_000;

/// The most memory a photo may take to decode: 512 MiB (a 40-megapixel
/// picture with four bytes a pixel is 160 MB).
pub const MAX_DECODE_BYTES: u64 = 512 * 1024 * 1024;

/// The box a photo is printed in, width and height in millimetres: the
/// templates print each photo to fit it.
pub const PRINT_BOX_MM: (f64, f64) = (80.0, 60.0);

/// The resolution a photo is printed at, in pixels per inch.
pub const PRINT_DPI: f64 = 200.0;

/// JPEG quality for photos that came as JPEG.
pub const JPEG_QUALITY: u8 = 85;

/// [`PRINT_BOX_MM`] in pixels at [`PRINT_DPI`].
pub fn print_box_pixels() -> (u32, u32) {
    let px = |mm: f64| (mm / 25.4 * PRINT_DPI).round() as u32;
    (px(PRINT_BOX_MM.0), px(PRINT_BOX_MM.1))
}

/// Every photo file `job` (read from `job_file`) refers to, joined to the
/// job file's folder as written: the inputs a render reads besides the job
/// itself. Nothing is checked here (see [`prepare`]).
pub fn photo_paths(job: &Job, job_file: &Path) -> Vec<PathBuf> {
    let folder = job_folder(job_file);
    job.photos
        .iter()
        .map(|p| folder.join(&p.path.value))
        .collect()
}

fn job_folder(job_file: &Path) -> PathBuf {
    match job_file.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    }
}

/// A photo ready for a document.
#[derive(Debug, Clone, PartialEq)]
pub struct PreparedPhoto {
    /// Its path in the typesetting folder: `photos/photo-1.jpg` …
    pub sandbox_path: String,
    /// The picture upright, shrunk and encoded again, with no metadata.
    pub bytes: Vec<u8>,
    pub caption: Option<String>,
    /// Whether the listing shows it.
    pub listing: bool,
    /// Its size in pixels as prepared.
    pub width: u32,
    pub height: u32,
    /// The file read (as joined to the job's folder).
    pub source: PathBuf,
}

/// The two formats a photo may have.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PhotoFormat {
    Png,
    Jpeg,
}

impl PhotoFormat {
    /// Known from the first bytes of the file, whatever its name says.
    pub fn sniff(bytes: &[u8]) -> Option<PhotoFormat> {
        if bytes.starts_with(b"\x89PNG\r\n\x1a\n") {
            Some(PhotoFormat::Png)
        } else if bytes.starts_with(&[0xFF, 0xD8, 0xFF]) {
            Some(PhotoFormat::Jpeg)
        } else {
            None
        }
    }

    fn image_format(self) -> ImageFormat {
        match self {
            PhotoFormat::Png => ImageFormat::Png,
            PhotoFormat::Jpeg => ImageFormat::Jpeg,
        }
    }

    fn extension(self) -> &'static str {
        match self {
            PhotoFormat::Png => "png",
            PhotoFormat::Jpeg => "jpg",
        }
    }
}

/// Checks and prepares every photo of `job`, read from `job_file`. All
/// problems are returned together, each pointing at its `photo` line.
pub fn prepare(job: &Job, job_file: &Path) -> Result<Vec<PreparedPhoto>, Vec<DecodeError>> {
    prepare_cached(job, job_file, None)
}

/// [`prepare`], taking each prepared picture from `cache` when it holds
/// a sound entry for the photo's bytes, and keeping it there otherwise
/// (see [`PhotoCache`]). The result is the same either way.
pub fn prepare_cached(
    job: &Job,
    job_file: &Path,
    cache: Option<&PhotoCache>,
) -> Result<Vec<PreparedPhoto>, Vec<DecodeError>> {
    let folder = job_folder(job_file);
    let mut out = Vec::new();
    let mut problems = Vec::new();
    for (i, photo) in job.photos.iter().enumerate() {
        match prepare_one(&folder, photo, i + 1, cache) {
            Ok(p) => out.push(p),
            Err(e) => problems.push(*e),
        }
    }
    if problems.is_empty() {
        Ok(out)
    } else {
        Err(problems)
    }
}

/// Checks and prepares one photo; `number` counts from 1 and names it in
/// the typesetting folder.
pub fn prepare_one(
    folder: &Path,
    photo: &Photo,
    number: usize,
    cache: Option<&PhotoCache>,
) -> Result<PreparedPhoto, Box<DecodeError>> {
    let written = &photo.path.value;
    let fail = |code: &'static str, message: Msg, label: &'static str, help: &'static str| {
        Box::new(
            DecodeError::error(code, photo.path.span, message, Msg::new(label))
                .with_help(Msg::new(help)),
        )
    };
    let read = read_in_folder(folder, written, MAX_PHOTO_BYTES).map_err(|e| match e {
        InFolderError::NotInside { .. } => {
            let absolute = Path::new(written).has_root() || written.starts_with('/');
            fail(
                if absolute {
                    "job::photo-absolute-path"
                } else {
                    "job::photo-outside-folder"
                },
                Msg::new(if absolute {
                    "diag-photo-absolute"
                } else {
                    "diag-photo-outside"
                })
                .arg("path", written.as_str()),
                "diag-photo-relative",
                "diag-photo-keep-inside",
            )
        }
        InFolderError::LeadsOutside { real, .. } => fail(
            "job::photo-link-outside",
            Msg::new("diag-photo-link")
                .arg("path", written.as_str())
                .arg("target", real.display().to_string()),
            "diag-leads-outside",
            "diag-photo-copy",
        ),
        InFolderError::NotAFile { path } => fail(
            "job::photo-not-a-file",
            Msg::new("diag-photo-not-file").arg("path", path.display().to_string()),
            "diag-not-a-file",
            "diag-photo-png-jpeg",
        ),
        InFolderError::TooLarge { path, size, .. } => fail(
            "job::photo-too-large",
            Msg::new("diag-photo-too-large")
                .arg("path", path.display().to_string())
                .arg("size", format!("{:.1}", size as f64 / 1e6))
                .arg("limit", (MAX_PHOTO_BYTES / (1024 * 1024)).to_string()),
            "diag-too-large",
            "diag-photo-smaller",
        ),
        InFolderError::Io { path, source } => fail(
            "job::photo-unreadable",
            Msg::new("diag-photo-cannot-read")
                .arg("path", path.display().to_string())
                .arg("error", crate::catalogue::os_error(&source)),
            "diag-this-file",
            "diag-photo-check-path",
        ),
    })?;
    let Some(format) = PhotoFormat::sniff(&read.bytes) else {
        return Err(fail(
            "job::photo-not-an-image",
            Msg::new("diag-photo-not-image")
                .arg("path", read.place.display().to_string())
                .arg("content", content_words(&read.bytes)),
            "diag-not-a-picture",
            "diag-photo-content-matters",
        ));
    };
    let (bytes, width, height) = process_cached(&read.bytes, format, cache).map_err(|why| {
        fail(
            "job::photo-unreadable",
            Msg::new("diag-photo-undecodable")
                .arg("path", read.place.display().to_string())
                .arg("why", why),
            "diag-this-file",
            "diag-photo-save-again",
        )
    })?;
    Ok(PreparedPhoto {
        sandbox_path: format!("photos/photo-{number}.{}", format.extension()),
        bytes,
        caption: photo.caption.clone(),
        listing: photo.listing,
        width,
        height,
        source: read.place,
    })
}

/// What a file that is not a picture looks like, in a few words.
fn content_words(bytes: &[u8]) -> &'static str {
    if bytes.is_empty() {
        "empty"
    } else if std::str::from_utf8(&bytes[..bytes.len().min(512)]).is_ok() {
        "text"
    } else {
        "neither"
    }
}

/// [`process`] through `cache`: the kept picture when there is a sound
/// entry for these bytes, else processed and kept. A failure is never
/// kept.
pub fn process_cached(
    bytes: &[u8],
    format: PhotoFormat,
    cache: Option<&PhotoCache>,
) -> Result<(Vec<u8>, u32, u32), Msg> {
    let Some(cache) = cache else {
        return process(bytes, format);
    };
    let key = entry_key(bytes, format);
    if let Some(kept) = cache.get(&key, format) {
        return Ok((kept.bytes, kept.width, kept.height));
    }
    let (picture, width, height) = process(bytes, format)?;
    let prepared = Prepared {
        bytes: picture,
        width,
        height,
    };
    cache.put(&key, format, &prepared);
    Ok((prepared.bytes, width, height))
}

/// What the image reader (the `image` crate) found wrong, in the
/// catalogue's words (`diag-image-…`): the kind of problem, with the
/// reader's own words quoted after it where they say more; a file
/// operation's failure as the operating system's answer.
pub fn image_problem(e: &image::ImageError) -> Msg {
    use image::ImageError as E;
    match e {
        E::Decoding(d) => Msg::new("diag-image-damaged").arg("detail", d.to_string()),
        E::Encoding(d) => Msg::new("diag-image-not-encoded").arg("detail", d.to_string()),
        E::Limits(_) => Msg::new("diag-image-too-large"),
        E::Unsupported(d) => Msg::new("diag-image-unsupported").arg("detail", d.to_string()),
        E::IoError(io) => crate::catalogue::os_error(io),
        E::Parameter(d) => Msg::new("diag-os-other").arg("detail", d.to_string()),
    }
}

/// Decodes the picture within the limits, turns it upright, shrinks it to
/// the print box and encodes it again. The encoded bytes and the size, or
/// why it failed in words (a message of the catalogue).
pub fn process(bytes: &[u8], format: PhotoFormat) -> Result<(Vec<u8>, u32, u32), Msg> {
    let mut reader = ImageReader::with_format(std::io::Cursor::new(bytes), format.image_format());
    let mut limits = image::Limits::default();
    limits.max_image_width = Some(MAX_PHOTO_SIDE);
    limits.max_image_height = Some(MAX_PHOTO_SIDE);
    limits.max_alloc = Some(MAX_DECODE_BYTES);
    reader.limits(limits);
    let undecodable = |e: image::ImageError| match e {
        image::ImageError::Limits(_) => Msg::new("diag-photo-too-large-to-decode")
            .arg("side", MAX_PHOTO_SIDE.to_string())
            .arg("megabytes", (MAX_DECODE_BYTES / (1024 * 1024)).to_string()),
        e => Msg::new("diag-photo-does-not-decode").arg("error", image_problem(&e)),
    };
    let mut decoder = reader.into_decoder().map_err(undecodable)?;
    if decoder.total_bytes() > MAX_DECODE_BYTES {
        return Err(undecodable(image::ImageError::Limits(
            image::error::LimitError::from_kind(image::error::LimitErrorKind::InsufficientMemory),
        )));
    }
    // A picture whose orientation cannot be read is taken as it is stored.
    let orientation = decoder
        .orientation()
        .unwrap_or(image::metadata::Orientation::NoTransforms);
    let mut picture = DynamicImage::from_decoder(decoder).map_err(undecodable)?;
    picture.apply_orientation(orientation);
    let (box_w, box_h) = print_box_pixels();
    if picture.width() > box_w || picture.height() > box_h {
        picture = picture.resize(box_w, box_h, FilterType::Lanczos3);
    }
    let (width, height) = (picture.width(), picture.height());
    let mut out = std::io::Cursor::new(Vec::new());
    let written = match format {
        PhotoFormat::Jpeg => {
            let rgb = DynamicImage::ImageRgb8(picture.to_rgb8());
            let encoder =
                image::codecs::jpeg::JpegEncoder::new_with_quality(&mut out, JPEG_QUALITY);
            rgb.write_with_encoder(encoder)
        }
        PhotoFormat::Png => {
            let pixels = if picture.color().has_alpha() {
                DynamicImage::ImageRgba8(picture.to_rgba8())
            } else {
                DynamicImage::ImageRgb8(picture.to_rgb8())
            };
            pixels.write_to(&mut out, ImageFormat::Png)
        }
    };
    written.map_err(|e| Msg::new("diag-photo-not-encoded").arg("error", image_problem(&e)))?;
    Ok((out.into_inner(), width, height))
}

#[cfg(test)]
mod tests {
    use super::*;
    use image::{Rgb, RgbImage};

    /// A job in `folder` whose photos are `paths`; decoded, with the job
    /// file's path.
    fn job_with(folder: &Path, paths: &[&str]) -> (Job, PathBuf) {
        let mut text = String::from(
            "job-format 1\njob id=\"T\"\nunit make=\"M\" model=\"N\"\nmains nominal=\"120V\"\nphotos {\n",
        );
        for p in paths {
            text.push_str(&format!("    photo {p:?} caption=\"c\"\n"));
        }
        text.push_str("}\n");
        let file = folder.join("job.kdl");
        std::fs::write(&file, &text).unwrap();
        let job = crate::job::decode("job.kdl", &text).unwrap().job;
        (job, file)
    }

    /// The codes of the problems preparing `paths` gives, in order.
    fn problems(folder: &Path, paths: &[&str]) -> Vec<&'static str> {
        let (job, file) = job_with(folder, paths);
        match prepare(&job, &file) {
            Ok(_) => Vec::new(),
            Err(p) => p.iter().map(|e| e.code).collect(),
        }
    }

    /// A `w` × `h` picture: the left half red, the right half blue.
    fn halves(w: u32, h: u32) -> RgbImage {
        RgbImage::from_fn(w, h, |x, _| {
            if x < w / 2 {
                Rgb([230, 20, 20])
            } else {
                Rgb([20, 20, 230])
            }
        })
    }

    fn png_bytes(img: &RgbImage) -> Vec<u8> {
        let mut out = std::io::Cursor::new(Vec::new());
        img.write_to(&mut out, ImageFormat::Png).unwrap();
        out.into_inner()
    }

    /// An EXIF block (big-endian TIFF) with the orientation tag and a GPS
    /// folder holding a latitude reference and `marker` as its processing
    /// method, as a camera writes one.
    fn exif_block(orientation: u16, marker: &[u8]) -> Vec<u8> {
        let mut t: Vec<u8> = b"MM\0\x2a\0\0\0\x08".to_vec();
        let entry = |t: &mut Vec<u8>, tag: u16, kind: u16, count: u32, value: [u8; 4]| {
            t.extend(tag.to_be_bytes());
            t.extend(kind.to_be_bytes());
            t.extend(count.to_be_bytes());
            t.extend(value);
        };
        // IFD0 at 8: two entries, then the next-IFD offset: 30 bytes.
        let gps_at: u32 = 8 + 30;
        t.extend(2u16.to_be_bytes());
        let o = orientation.to_be_bytes();
        entry(&mut t, 0x0112, 3, 1, [o[0], o[1], 0, 0]);
        entry(&mut t, 0x8825, 4, 1, gps_at.to_be_bytes());
        t.extend(0u32.to_be_bytes());
        // The GPS IFD: two entries (30 bytes), then the marker's bytes.
        let data_at: u32 = gps_at + 30;
        t.extend(2u16.to_be_bytes());
        entry(&mut t, 0x0001, 2, 2, [b'N', 0, 0, 0]);
        entry(
            &mut t,
            0x001B,
            7,
            marker.len() as u32,
            data_at.to_be_bytes(),
        );
        t.extend(0u32.to_be_bytes());
        t.extend(marker);
        t
    }

    /// A JPEG of `img` with an EXIF block put after its start marker.
    fn jpeg_with_exif(img: &RgbImage, orientation: u16, marker: &[u8]) -> Vec<u8> {
        let mut plain = std::io::Cursor::new(Vec::new());
        img.write_to(&mut plain, ImageFormat::Jpeg).unwrap();
        let plain = plain.into_inner();
        let mut app1 = b"Exif\0\0".to_vec();
        app1.extend(exif_block(orientation, marker));
        let mut out = plain[..2].to_vec();
        out.extend([0xFF, 0xE1]);
        out.extend(((app1.len() + 2) as u16).to_be_bytes());
        out.extend(app1);
        out.extend(&plain[2..]);
        out
    }

    fn contains(hay: &[u8], needle: &[u8]) -> bool {
        hay.windows(needle.len()).any(|w| w == needle)
    }

    /// A job folder `job/` with a picture `outside.png` beside it.
    fn folders() -> (tempfile::TempDir, PathBuf) {
        let dir = tempfile::tempdir().unwrap();
        let job = dir.path().join("job");
        std::fs::create_dir_all(job.join("photos")).unwrap();
        std::fs::write(dir.path().join("outside.png"), png_bytes(&halves(8, 8))).unwrap();
        (dir, job)
    }

    #[test]
    fn a_path_that_climbs_out_of_the_job_folder_is_refused() {
        let (_dir, job) = folders();
        assert_eq!(
            problems(&job, &["../outside.png", "photos/../../outside.png"]),
            ["job::photo-outside-folder", "job::photo-outside-folder"]
        );
    }

    #[test]
    fn an_absolute_path_is_refused_even_to_a_real_picture() {
        let (dir, job) = folders();
        let absolute = dir.path().join("outside.png");
        let absolute = absolute.to_str().unwrap();
        assert_eq!(problems(&job, &[absolute]), ["job::photo-absolute-path"]);
    }

    #[cfg(unix)]
    #[test]
    fn a_link_that_leads_out_of_the_job_folder_is_refused() {
        let (dir, job) = folders();
        std::os::unix::fs::symlink(dir.path().join("outside.png"), job.join("photos/out.png"))
            .unwrap();
        // A folder link on the way counts too.
        std::os::unix::fs::symlink(dir.path(), job.join("up")).unwrap();
        assert_eq!(
            problems(&job, &["photos/out.png", "up/outside.png"]),
            ["job::photo-link-outside", "job::photo-link-outside"]
        );
        // A link that stays inside the folder is followed.
        std::fs::write(job.join("photos/in.png"), png_bytes(&halves(8, 8))).unwrap();
        std::os::unix::fs::symlink("in.png", job.join("photos/alias.png")).unwrap();
        assert_eq!(problems(&job, &["photos/alias.png"]), Vec::<&str>::new());
    }

    #[test]
    fn a_text_file_named_jpg_is_refused_by_its_content() {
        let (_dir, job) = folders();
        std::fs::write(job.join("photos/notes.jpg"), "not a picture at all\n").unwrap();
        let (j, file) = job_with(&job, &["photos/notes.jpg"]);
        let err = prepare(&j, &file).unwrap_err();
        assert_eq!(err[0].code, "job::photo-not-an-image");
        assert!(
            err[0].message.contains("its content is text"),
            "{}",
            err[0].message
        );
        // And a PNG named .jpg is fine: the content decides.
        std::fs::write(job.join("photos/really.jpg"), png_bytes(&halves(8, 8))).unwrap();
        let (j, file) = job_with(&job, &["photos/really.jpg"]);
        let ready = prepare(&j, &file).unwrap();
        assert_eq!(PhotoFormat::sniff(&ready[0].bytes), Some(PhotoFormat::Png));
    }

    #[test]
    fn a_thirty_megabyte_file_is_refused_before_it_is_read() {
        let (_dir, job) = folders();
        let big = std::fs::File::create(job.join("photos/big.jpg")).unwrap();
        big.set_len(30_000_000).unwrap();
        let (j, file) = job_with(&job, &["photos/big.jpg"]);
        let err = prepare(&j, &file).unwrap_err();
        assert_eq!(err[0].code, "job::photo-too-large");
        assert!(err[0].message.contains("30.0 MB"), "{}", err[0].message);
        assert!(
            err[0].message.contains("limit is 20 MB"),
            "{}",
            err[0].message
        );
    }

    #[test]
    fn a_folder_or_a_missing_file_is_refused_at_its_line() {
        let (_dir, job) = folders();
        assert_eq!(
            problems(&job, &["photos", "photos/none.png"]),
            ["job::photo-not-a-file", "job::photo-unreadable"]
        );
        // Each problem points at its own `photo` line: lines 6 and 7.
        let (j, file) = job_with(&job, &["photos", "photos/none.png"]);
        let text = std::fs::read_to_string(&file).unwrap();
        let lines: Vec<usize> = prepare(&j, &file)
            .unwrap_err()
            .iter()
            .map(|e| crate::job::line_column(&text, e.span.offset()).0)
            .collect();
        assert_eq!(lines, [6, 7]);
    }

    #[test]
    fn a_rotated_jpeg_is_turned_upright_and_its_exif_and_gps_are_dropped() {
        let (_dir, job) = folders();
        let marker = b"GPS-MARKER-51.4779N";
        // Stored 80 × 40, left half red; orientation 6 means "turn 90°
        // clockwise to view" (EXIF 2.32, tag 0x0112), so upright it is
        // 40 × 80 with the red half on top.
        let stored = jpeg_with_exif(&halves(80, 40), 6, marker);
        assert!(contains(&stored, marker) && contains(&stored, b"Exif\0\0"));
        std::fs::write(job.join("photos/rotated.jpg"), &stored).unwrap();
        let (j, file) = job_with(&job, &["photos/rotated.jpg"]);
        let ready = prepare(&j, &file).unwrap().remove(0);
        assert_eq!((ready.width, ready.height), (40, 80));
        assert_eq!(ready.sandbox_path, "photos/photo-1.jpg");
        // What typst receives: no EXIF block, no GPS, no marker.
        assert!(!contains(&ready.bytes, b"Exif"), "EXIF kept");
        assert!(!contains(&ready.bytes, marker), "GPS data kept");
        let back = image::load_from_memory(&ready.bytes).unwrap().to_rgb8();
        assert_eq!(back.dimensions(), (40, 80));
        let top = back.get_pixel(20, 10);
        let bottom = back.get_pixel(20, 70);
        assert!(top[0] > 150 && top[2] < 100, "top is {top:?}, not red");
        assert!(
            bottom[2] > 150 && bottom[0] < 100,
            "bottom is {bottom:?}, not blue"
        );
    }

    #[test]
    fn a_large_photo_is_shrunk_to_its_print_size_and_a_small_one_kept() {
        let (_dir, job) = folders();
        // 3000 × 1000 into the 80 × 60 mm box at 200 dpi (630 × 472 px):
        // the width decides, 630 × 210.
        std::fs::write(job.join("photos/wide.png"), png_bytes(&halves(3000, 1000))).unwrap();
        std::fs::write(job.join("photos/small.png"), png_bytes(&halves(100, 50))).unwrap();
        let (j, file) = job_with(&job, &["photos/wide.png", "photos/small.png"]);
        let ready = prepare(&j, &file).unwrap();
        assert_eq!(print_box_pixels(), (630, 472));
        assert_eq!((ready[0].width, ready[0].height), (630, 210));
        assert_eq!((ready[1].width, ready[1].height), (100, 50));
        // The same file always gives the same bytes.
        let again = prepare(&j, &file).unwrap();
        assert_eq!(ready[0].bytes, again[0].bytes);
    }

    #[test]
    fn a_cached_photo_is_the_one_prepared_afresh_and_a_damaged_entry_is_rebuilt() {
        let (_dir, job) = folders();
        std::fs::write(job.join("photos/wide.png"), png_bytes(&halves(3000, 1000))).unwrap();
        let rotated = jpeg_with_exif(&halves(80, 40), 6, b"GPS-MARKER");
        std::fs::write(job.join("photos/rotated.jpg"), &rotated).unwrap();
        let (j, file) = job_with(&job, &["photos/wide.png", "photos/rotated.jpg"]);
        let fresh = prepare(&j, &file).unwrap();
        let root = tempfile::tempdir().unwrap();
        let cache = PhotoCache::in_root(root.path()).unwrap();
        // The first time prepares and keeps; the second takes what was kept.
        assert_eq!(prepare_cached(&j, &file, Some(&cache)).unwrap(), fresh);
        let entries = |c: &PhotoCache| std::fs::read_dir(c.dir()).unwrap().count();
        assert_eq!(entries(&cache), 2);
        assert_eq!(prepare_cached(&j, &file, Some(&cache)).unwrap(), fresh);
        // What is kept is what is used: a sound entry with other pixels of
        // the same size is taken as it is (the folder is the user's own).
        let wide = std::fs::read(job.join("photos/wide.png")).unwrap();
        let key = entry_key(&wide, PhotoFormat::Png);
        let other = png_bytes(&RgbImage::from_pixel(630, 210, Rgb([1, 2, 3])));
        let kept = Prepared {
            bytes: other.clone(),
            width: 630,
            height: 210,
        };
        cache.put(&key, PhotoFormat::Png, &kept);
        assert_eq!(
            prepare_cached(&j, &file, Some(&cache)).unwrap()[0].bytes,
            other
        );
        // A damaged entry is not used: the photo is prepared again and the
        // entry made sound.
        let path = cache.entry_path(&key);
        let mut bytes = std::fs::read(&path).unwrap();
        let middle = bytes.len() / 2;
        bytes[middle] ^= 1;
        std::fs::write(&path, &bytes).unwrap();
        assert_eq!(prepare_cached(&j, &file, Some(&cache)).unwrap(), fresh);
        assert_eq!(
            cache.get(&key, PhotoFormat::Png).unwrap().bytes,
            fresh[0].bytes
        );
        // A photo that cannot be prepared is never kept.
        std::fs::write(job.join("photos/broken.png"), b"\x89PNG\r\n\x1a\nbroken").unwrap();
        let (j, file) = job_with(&job, &["photos/broken.png"]);
        assert!(prepare_cached(&j, &file, Some(&cache)).is_err());
        assert_eq!(entries(&cache), 2);
    }
}

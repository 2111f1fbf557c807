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

use std::path::{Path, PathBuf};

use image::{DynamicImage, ImageDecoder, ImageFormat, ImageReader, imageops::FilterType};

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
    let folder = job_folder(job_file);
    let mut out = Vec::new();
    let mut problems = Vec::new();
    for (i, photo) in job.photos.iter().enumerate() {
        match prepare_one(&folder, photo, i + 1) {
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
) -> Result<PreparedPhoto, Box<DecodeError>> {
    let written = &photo.path.value;
    let fail = |code: &'static str, message: String, label: &str, help: &str| {
        Box::new(DecodeError::error(code, photo.path.span, message, label).with_help(help))
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
                if absolute {
                    format!("the photo `{written}` is an absolute path")
                } else {
                    format!("the photo `{written}` is not a path inside the job's folder")
                },
                "expected a path relative to the job file",
                "keep photos in the job's folder or a folder below it and name them from there, for example photo \"photos/chassis.jpg\"",
            )
        }
        InFolderError::LeadsOutside { real, .. } => fail(
            "job::photo-link-outside",
            format!(
                "the photo `{written}` is a link that leads outside the job's folder (to {})",
                real.display()
            ),
            "leads outside",
            "copy the photo into the job's folder instead of linking to it",
        ),
        InFolderError::NotAFile { path } => fail(
            "job::photo-not-a-file",
            format!("the photo {} is not a regular file", path.display()),
            "not a file",
            "a photo must be a PNG or JPEG file",
        ),
        InFolderError::TooLarge { path, size, .. } => fail(
            "job::photo-too-large",
            format!(
                "the photo {} is {:.1} MB; the limit is {} MB",
                path.display(),
                size as f64 / 1e6,
                MAX_PHOTO_BYTES / (1024 * 1024)
            ),
            "too large",
            "export the photo smaller (a document prints it about 8 cm wide; 2000 pixels across is plenty)",
        ),
        InFolderError::Io { path, source } => fail(
            "job::photo-unreadable",
            format!("cannot read the photo {}: {source}", path.display()),
            "this file",
            "check the path: it is relative to the job file's folder",
        ),
    })?;
    let Some(format) = PhotoFormat::sniff(&read.bytes) else {
        return Err(fail(
            "job::photo-not-an-image",
            format!(
                "the photo {} is not a PNG or JPEG picture (its content is {})",
                read.place.display(),
                content_words(&read.bytes)
            ),
            "not a picture",
            "a photo must be a PNG or JPEG file; the name's extension does not matter, the content does",
        ));
    };
    let (bytes, width, height) = process(&read.bytes, format).map_err(|why| {
        fail(
            "job::photo-unreadable",
            format!("the photo {} {why}", read.place.display()),
            "this file",
            "open the photo in an image editor and save it again as PNG or JPEG",
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

/// Decodes the picture within the limits, turns it upright, shrinks it to
/// the print box and encodes it again. The encoded bytes and the size, or
/// why it failed in words.
pub fn process(bytes: &[u8], format: PhotoFormat) -> Result<(Vec<u8>, u32, u32), String> {
    let mut reader = ImageReader::with_format(std::io::Cursor::new(bytes), format.image_format());
    let mut limits = image::Limits::default();
    limits.max_image_width = Some(MAX_PHOTO_SIDE);
    limits.max_image_height = Some(MAX_PHOTO_SIDE);
    limits.max_alloc = Some(MAX_DECODE_BYTES);
    reader.limits(limits);
    let undecodable = |e: image::ImageError| match e {
        image::ImageError::Limits(_) => format!(
            "is too large a picture to decode (at most {MAX_PHOTO_SIDE} pixels a side and {} MB of pixels)",
            MAX_DECODE_BYTES / (1024 * 1024)
        ),
        e => format!("does not decode as a picture ({e})"),
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
    written.map_err(|e| format!("could not be encoded again ({e})"))?;
    Ok((out.into_inner(), width, height))
}

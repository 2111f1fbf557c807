//! The shop's logo: a PNG or SVG file inside the profile's own folder,
//! checked by its content (not its name) before it goes near typst. Only
//! the bytes travel: the document's sandbox gets a regular file of its own
//! under a fixed name, never a link.

use std::path::Path;

use crate::catalogue::Msg;
use crate::input_file::{InFolderError, read_in_folder};
use crate::job::{DecodeError, Spanned};

/// The largest logo read, in bytes.
pub const LOGO_LIMIT: u64 = 4 * 1024 * 1024;

/// The largest logo picture, in pixels along either side.
const PIXEL_LIMIT: u32 = 8192;

/// A checked logo, ready for the sandbox.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Logo {
    pub kind: LogoKind,
    pub bytes: Vec<u8>,
    /// Where it was read from (links followed).
    pub source: std::path::PathBuf,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LogoKind {
    Png,
    Svg,
}

impl Logo {
    /// Its path inside the document's sandbox.
    pub fn sandbox_path(&self) -> &'static str {
        match self.kind {
            LogoKind::Png => "shop/logo.png",
            LogoKind::Svg => "shop/logo.svg",
        }
    }
}

/// Reads and checks the logo named in the profile at `profile`. Every
/// refusal points at the `logo` line of the profile.
pub fn read_logo(profile: &Path, logo: &Spanned<String>) -> Result<Logo, Box<DecodeError>> {
    let fail = |message: Msg, label: &'static str, help: &'static str| {
        Box::new(
            DecodeError::error("shop::logo", logo.span, message, Msg::new(label))
                .with_help(Msg::new(help))
                .in_file_kind("shop"),
        )
    };
    let folder = profile.parent().unwrap_or(Path::new("."));
    let written = logo.value.as_str();
    let read = read_in_folder(folder, logo.value.trim(), LOGO_LIMIT).map_err(|e| match e {
        InFolderError::NotInside { .. } => fail(
            Msg::new("diag-logo-outside").arg("path", written),
            "diag-expected-in-profile-folder",
            "diag-logo-keep-inside",
        ),
        InFolderError::LeadsOutside { real, .. } => fail(
            Msg::new("diag-logo-link")
                .arg("path", written)
                .arg("target", real.display().to_string()),
            "diag-leads-outside",
            "diag-logo-copy",
        ),
        InFolderError::NotAFile { path } => fail(
            Msg::new("diag-logo-not-file").arg("path", path.display().to_string()),
            "diag-not-a-file",
            "diag-logo-png-svg",
        ),
        InFolderError::TooLarge { path, size, limit } => fail(
            Msg::new("diag-logo-too-large")
                .arg("path", path.display().to_string())
                .arg("size", size.to_string())
                .arg("limit", limit.to_string()),
            "diag-too-large",
            "diag-logo-smaller",
        ),
        InFolderError::Io { path, source } => fail(
            Msg::new("diag-logo-cannot-read")
                .arg("path", path.display().to_string())
                .arg("error", crate::catalogue::os_error(&source)),
            "diag-this-file",
            "diag-logo-in-folder",
        ),
    })?;
    check_content(&read.bytes)
        .map_err(|why| {
            fail(
                Msg::new("diag-logo-refused")
                    .arg("path", read.place.display().to_string())
                    .arg("why", why),
                "diag-this-file",
                "diag-logo-self-contained",
            )
        })
        .map(|kind| Logo {
            kind,
            bytes: read.bytes,
            source: read.real,
        })
}

/// What the bytes are: a PNG that decodes, or an SVG document whose root
/// is `<svg>` and that refers to no other file. The reason in words when
/// neither, as a message of the catalogue.
pub fn check_content(bytes: &[u8]) -> Result<LogoKind, Msg> {
    const PNG_MAGIC: &[u8] = b"\x89PNG\r\n\x1a\n";
    if bytes.starts_with(PNG_MAGIC) {
        return check_png(bytes).map(|()| LogoKind::Png);
    }
    let text = std::str::from_utf8(bytes).map_err(|_| Msg::new("diag-logo-not-png-or-text"))?;
    let text = text.trim_start_matches('\u{feff}');
    if !text.contains("<svg") {
        return Err(Msg::new("diag-logo-not-png-or-svg"));
    }
    check_svg(text).map(|()| LogoKind::Svg)
}

fn check_png(bytes: &[u8]) -> Result<(), Msg> {
    let mut reader =
        image::ImageReader::with_format(std::io::Cursor::new(bytes), image::ImageFormat::Png);
    let mut limits = image::Limits::default();
    limits.max_image_width = Some(PIXEL_LIMIT);
    limits.max_image_height = Some(PIXEL_LIMIT);
    limits.max_alloc = Some(256 * 1024 * 1024);
    reader.limits(limits);
    reader.decode().map(|_| ()).map_err(|e| {
        Msg::new("diag-logo-png-undecodable").arg("error", crate::photo::image_problem(&e))
    })
}

/// What the XML reader (roxmltree) found wrong with an SVG drawing, in
/// the catalogue's words (`diag-xml-…`) with the line and column where it
/// has them; a case the program does not tell apart keeps the reader's
/// own words.
fn xml_problem(e: &roxmltree::Error) -> Msg {
    use roxmltree::Error as E;
    let what = match e {
        E::UnexpectedEndOfStream | E::UnclosedRootNode => Msg::new("diag-xml-ends-early"),
        E::NoRootNode => Msg::new("diag-xml-no-root"),
        E::DtdDetected => Msg::new("diag-xml-dtd"),
        E::UnexpectedCloseTag(expected, found, _) => Msg::new("diag-xml-wrong-close")
            .arg("expected", expected)
            .arg("found", found),
        E::UnknownEntityReference(name, _) => Msg::new("diag-xml-unknown-entity").arg("name", name),
        E::DuplicatedAttribute(name, _) => {
            Msg::new("diag-xml-duplicate-attribute").arg("name", name)
        }
        E::UnknownNamespace(name, _) => Msg::new("diag-xml-unknown-namespace").arg("name", name),
        E::InvalidName(_) => Msg::new("diag-xml-bad-name"),
        E::InvalidAttributeValue(_) => Msg::new("diag-xml-bad-attribute"),
        E::NodesLimitReached | E::AttributesLimitReached | E::NamespacesLimitReached => {
            Msg::new("diag-xml-too-many")
        }
        other => return Msg::new("diag-os-other").arg("detail", other.to_string()),
    };
    match e {
        E::UnexpectedEndOfStream
        | E::UnclosedRootNode
        | E::NoRootNode
        | E::DtdDetected
        | E::NodesLimitReached
        | E::AttributesLimitReached
        | E::NamespacesLimitReached => what,
        _ => {
            let pos = e.pos();
            Msg::new("diag-xml-at")
                .arg("what", what)
                .arg("line", pos.row.to_string())
                .arg("column", pos.col.to_string())
        }
    }
}

fn check_svg(text: &str) -> Result<(), Msg> {
    let options = roxmltree::ParsingOptions {
        allow_dtd: false,
        ..Default::default()
    };
    let doc = roxmltree::Document::parse_with_options(text, options)
        .map_err(|e| Msg::new("diag-logo-svg-malformed").arg("error", xml_problem(&e)))?;
    let root = doc.root_element();
    if root.tag_name().name() != "svg" {
        return Err(Msg::new("diag-logo-svg-root").arg("root", root.tag_name().name()));
    }
    for node in doc.descendants().filter(|n| n.is_element()) {
        for attr in node.attributes() {
            let value = attr.value().trim();
            let refers = matches!(attr.name(), "href" | "src")
                && !(value.starts_with('#') || value.starts_with("data:"));
            let url = value.contains("url(") && !value.contains("url(#");
            if refers || url {
                return Err(Msg::new("diag-logo-svg-refers")
                    .arg("value", attr.value())
                    .arg("element", node.tag_name().name()));
            }
        }
        if node.tag_name().name() == "style"
            && node
                .text()
                .is_some_and(|t| t.contains("url(") || t.contains("@import"))
        {
            return Err(Msg::new("diag-logo-svg-style"));
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    const SVG: &str = r##"<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 10"><rect width="10" height="10" fill="#000"/></svg>"##;

    /// A 1×1 PNG, written by the `image` crate itself.
    fn png() -> Vec<u8> {
        let mut out = std::io::Cursor::new(Vec::new());
        image::RgbImage::new(1, 1)
            .write_to(&mut out, image::ImageFormat::Png)
            .unwrap();
        out.into_inner()
    }

    #[test]
    fn content_decides_not_the_name() {
        assert_eq!(check_content(SVG.as_bytes()), Ok(LogoKind::Svg));
        assert_eq!(check_content(&png()), Ok(LogoKind::Png));
        let mut cut = png();
        cut.truncate(20);
        assert!(
            check_content(&cut)
                .unwrap_err()
                .english()
                .contains("does not decode")
        );
        assert!(check_content(b"GIF89a....").is_err());
        assert!(check_content(b"\xff\xd8\xff\xe0 a jpeg").is_err());
        assert!(
            check_content(b"<html><svg></svg></html>")
                .unwrap_err()
                .english()
                .contains("root is <html>")
        );
        assert!(
            check_content(b"<svg")
                .unwrap_err()
                .english()
                .contains("well-formed")
        );
    }

    #[test]
    fn an_svg_that_reaches_out_is_refused() {
        for bad in [
            r#"<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink"><image xlink:href="/etc/passwd"/></svg>"#,
            r#"<svg xmlns="http://www.w3.org/2000/svg"><image href="file:///etc/hosts"/></svg>"#,
            r#"<svg xmlns="http://www.w3.org/2000/svg"><rect fill="url(http://x/y#z)"/></svg>"#,
            r#"<svg xmlns="http://www.w3.org/2000/svg"><style>@import "a.css";</style></svg>"#,
            r#"<!DOCTYPE svg [<!ENTITY x SYSTEM "file:///etc/passwd">]><svg xmlns="http://www.w3.org/2000/svg">&x;</svg>"#,
        ] {
            assert!(check_content(bad.as_bytes()).is_err(), "{bad}");
        }
        let inner = r##"<svg xmlns="http://www.w3.org/2000/svg"><defs><linearGradient id="g"/></defs><rect fill="url(#g)"/><use href="#g"/></svg>"##;
        assert_eq!(check_content(inner.as_bytes()), Ok(LogoKind::Svg));
    }

    #[test]
    fn the_logo_stays_inside_the_profiles_folder() {
        let root = tempfile::tempdir().unwrap();
        let shop = root.path().join("shop");
        std::fs::create_dir(&shop).unwrap();
        let profile = shop.join("shop.kdl");
        std::fs::write(root.path().join("outside.svg"), SVG).unwrap();
        std::fs::write(shop.join("logo.svg"), SVG).unwrap();
        std::fs::write(shop.join("logo.png"), png()).unwrap();
        std::fs::write(shop.join("fake.png"), SVG).unwrap();
        let at = |s: &str| Spanned::new(s.to_string(), miette::SourceSpan::new(0.into(), 1));

        assert_eq!(
            read_logo(&profile, &at("logo.svg")).unwrap().kind,
            LogoKind::Svg
        );
        assert_eq!(
            read_logo(&profile, &at("./logo.png")).unwrap().kind,
            LogoKind::Png
        );
        // Named .png but holds SVG: the content decides.
        let fake = read_logo(&profile, &at("fake.png")).unwrap();
        assert_eq!(
            (fake.kind, fake.sandbox_path()),
            (LogoKind::Svg, "shop/logo.svg")
        );
        for bad in ["../outside.svg", "/etc/passwd", "missing.svg", "."] {
            let e = read_logo(&profile, &at(bad)).unwrap_err();
            assert_eq!(e.shown_code(), "shop::logo", "{bad}");
        }
        #[cfg(unix)]
        {
            std::os::unix::fs::symlink(root.path().join("outside.svg"), shop.join("link.svg"))
                .unwrap();
            let e = read_logo(&profile, &at("link.svg")).unwrap_err();
            assert!(
                e.message.contains("outside the profile's folder"),
                "{}",
                e.message
            );
        }
    }
}

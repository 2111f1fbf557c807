//! The listing document: a condition report for a buyer (a dealer's
//! consignment or resale listing), as a PDF and as Markdown, from the same
//! job and findings as the hand-over.
//!
//! What a listing must never show (the customer and their contacts, the
//! charges, the complaint, anything marked `private`, the technician's
//! reasons for accepting a figure) is left out when its context is built
//! ([`context`]); the PDF template and the Markdown are both made from that
//! context only. Both carry the mains-safety notice and the deferral to
//! local electrical codes, in the words of `templates/mains-safety.typ`;
//! the PDF's are checked in the finished file like the hand-over's.

mod context;
mod markdown;
mod notice;
pub mod words;

pub use context::{
    FamilyRow, Health, Ledger, LedgerRow, ListingContext, ListingFooter, ListingInputs,
    ListingUnit, PhotoFile, SerialShown, ServicedRow, ValveHealthRow, build_context, mask_serial,
};
pub use markdown::{inline as markdown_inline, render as markdown};
pub use notice::{Notice, notice, notice_in};

use crate::calc::Findings;
use crate::catalogue::Catalogue;
use crate::job::Job;
use crate::photo::PreparedPhoto;
use crate::report::handover::{
    HandoverError, MAIN_SOURCE, NOTICE_INCLUDE, NOTICE_SOURCE, ShopBlock, creation_date,
    fill_template, job_digest_of, notice_required, notice_source,
};
use crate::shop::{Logo, ShopProfile};
use crate::typeset::{CompileOptions, Sandbox, TemplateSource};

/// The template the listing is rendered from.
pub const TEMPLATE_NAME: &str = "listing.typ";

/// Room made for the filled listing before the fill starts (a demo job's
/// listing is some 10–20 KiB; a longer one grows as needed).
const LISTING_ROOM: usize = 32 * 1024;

/// The built-in listing template, for [`TemplateSource::embedded`].
pub static EMBEDDED_TEMPLATES: &[(&str, &str)] = &[(
    TEMPLATE_NAME,
    include_str!("../../../templates/listing.typ"),
)];

/// What the listing is made from besides the job itself.
#[derive(Debug, Clone)]
pub struct ListingInput<'a> {
    pub job: &'a Job,
    pub findings: &'a Findings,
    /// The job file's text, for the footer's checksum.
    pub job_text: &'a str,
    pub typst_version: String,
    pub shop: Option<&'a ShopProfile>,
    pub logo: Option<&'a Logo>,
    /// The shop's message catalogue: the notice's words and the listing's
    /// own (see [`words`]).
    pub catalogue: &'a Catalogue,
    pub serial: SerialShown,
    /// Every photo of the job, prepared; the listing takes those marked
    /// for it.
    pub photos: &'a [PreparedPhoto],
    /// The Markdown file's name without `.md`: the photo files written
    /// beside it are named from it (`NAME.listing-photo-1.jpg`).
    pub markdown_stem: String,
}

/// A ready listing: the PDF's sandbox and options, the Markdown, and the
/// photo files that go beside the Markdown.
#[derive(Debug, Clone)]
pub struct ListingDocument {
    pub sandbox: Sandbox,
    pub main: &'static str,
    pub options: CompileOptions,
    pub context: ListingContext,
    pub markdown: String,
    /// File name and bytes of each listing photo, for beside the Markdown.
    pub photo_files: Vec<(String, Vec<u8>)>,
}

/// Builds the listing's context, fills the template and lays out the
/// sandbox; writes the Markdown beside.
pub fn build(
    input: &ListingInput<'_>,
    templates: &TemplateSource,
) -> Result<ListingDocument, HandoverError> {
    let mut sandbox = Sandbox::new();
    let shop = match input.shop {
        Some(profile) => ShopBlock::from_profile(profile, input.logo),
        None => ShopBlock::default(),
    };
    if let (Some(logo), Some(_)) = (input.logo, input.shop) {
        sandbox.insert(logo.sandbox_path(), logo.bytes.clone())?;
    }
    let listed: Vec<&PreparedPhoto> = input.photos.iter().filter(|p| p.listing).collect();
    for photo in &listed {
        sandbox.insert(photo.sandbox_path.clone(), photo.bytes.clone())?;
    }
    let digest = job_digest_of(input.findings, input.job_text);
    let inputs = ListingInputs {
        shop,
        profile: input.shop,
        serial: input.serial,
        tool_version: env!("CARGO_PKG_VERSION"),
        typst_version: &input.typst_version,
        job_digest: &digest,
        revision: input.findings.job.git.as_ref(),
        photos: crate::report::photos::photo_rows(listed.iter().copied()),
        catalogue: input.catalogue,
    };
    let context = build_context(input.job, input.findings, &inputs);
    let source = fill_template(
        TEMPLATE_NAME,
        &context,
        input.catalogue,
        templates,
        LISTING_ROOM,
    )?;
    if !source.lines().any(|l| l.trim() == NOTICE_INCLUDE) {
        return Err(HandoverError::Template {
            name: TEMPLATE_NAME.to_string(),
            detail: crate::catalogue::Msg::new("cli-template-no-notice")
                .arg("what", "listing")
                .arg("line", NOTICE_INCLUDE),
            from_override: templates.from_override(TEMPLATE_NAME),
        });
    }
    sandbox.insert(MAIN_SOURCE, source)?;
    sandbox.insert(NOTICE_SOURCE, notice_source(input.catalogue)?)?;
    let photo_files: Vec<(String, Vec<u8>)> = listed
        .iter()
        .enumerate()
        .map(|(i, p)| {
            let extension = p.sandbox_path.rsplit('.').next().unwrap_or("png");
            (
                format!("{}-photo-{}.{extension}", input.markdown_stem, i + 1),
                p.bytes.clone(),
            )
        })
        .collect();
    let files: Vec<PhotoFile> = photo_files
        .iter()
        .zip(&listed)
        .map(|((name, _), p)| PhotoFile {
            file_name: name.clone(),
            caption: p.caption.clone(),
        })
        .collect();
    let markdown = markdown::render(&context, &files, &notice_in(input.catalogue));
    let cjk = crate::typeset::fit_fonts(&mut sandbox, MAIN_SOURCE)?;
    Ok(ListingDocument {
        sandbox,
        main: MAIN_SOURCE,
        options: CompileOptions {
            cjk,
            required_text: Some(notice_required(input.catalogue)),
            ..CompileOptions::new(creation_date(input.job))
        },
        context,
        markdown,
        photo_files,
    })
}

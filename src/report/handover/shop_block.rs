//! What the hand-over document takes from the shop profile: the shop block
//! of the header and footer (name, address, contact, logo), which a listing
//! document may reuse as it is because it holds nothing about the customer
//! or the money; and the hand-over's own closing block (warranty, terms,
//! signatures), which belongs to the hand-over alone.

use chrono::NaiveDate;
use serde::Serialize;

use crate::job::Job;
use crate::shop::{Logo, Paper, ShopProfile};

use crate::catalogue::Catalogue;

/// The shop block at the head of page 1 and in the footer. Without a
/// profile, every document carries the same neutral block.
#[derive(Debug, Clone, Serialize)]
pub struct ShopBlock {
    pub name: String,
    /// Address and contact lines, address first.
    pub lines: Vec<String>,
    pub address: Vec<String>,
    pub contact: Vec<String>,
    /// The logo's path inside the typesetting folder, or none.
    pub logo: Option<String>,
    /// True for the neutral block of a document made without a profile.
    pub neutral: bool,
}

impl Default for ShopBlock {
    fn default() -> Self {
        ShopBlock {
            name: "ampreport bench report".into(),
            lines: vec!["Valve amplifier service record".into()],
            address: Vec::new(),
            contact: Vec::new(),
            logo: None,
            neutral: true,
        }
    }
}

impl ShopBlock {
    /// The block for a shop's profile and its checked logo.
    pub fn from_profile(profile: &ShopProfile, logo: Option<&Logo>) -> ShopBlock {
        ShopBlock {
            name: profile.name.clone(),
            lines: profile
                .address
                .iter()
                .chain(&profile.contact)
                .cloned()
                .collect(),
            address: profile.address.clone(),
            contact: profile.contact.clone(),
            logo: logo.map(|l| l.sandbox_path().to_string()),
            neutral: false,
        }
    }
}

/// The paper: the profile's, else letter for a 100–130 V mains nominal,
/// else A4.
pub fn paper(profile: Option<&ShopProfile>, job: &Job) -> Paper {
    profile
        .and_then(|p| p.paper)
        .unwrap_or_else(|| Paper::for_mains(job.mains.nominal.value.0))
}

/// The closing block of the hand-over: who hands the unit over and when,
/// the warranty and the terms, and the lines to sign.
#[derive(Debug, Clone, Serialize)]
pub struct AcceptanceBlock {
    /// The technician signing for the shop, or none (a blank line to fill).
    pub technician: Option<String>,
    /// The hand-over date in words (the job's completion date), or none.
    pub date: Option<String>,
    /// The customer's name for the signature line, or none.
    pub customer: Option<String>,
    pub warranty: Option<WarrantyInfo>,
    pub terms: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct WarrantyInfo {
    pub text: String,
    /// "90 days", or none.
    pub period: Option<String>,
    /// The last day covered, in words, when the job has a completion date.
    pub until: Option<String>,
}

/// The acceptance block for a job and its shop profile.
pub fn acceptance(
    job: &Job,
    profile: Option<&ShopProfile>,
    catalogue: &Catalogue,
) -> AcceptanceBlock {
    let completed: Option<NaiveDate> = job.info.completed;
    let date_words = |d: NaiveDate| catalogue.date(d);
    AcceptanceBlock {
        technician: job.info.technician.clone(),
        date: completed.map(date_words),
        customer: job.customer.as_ref().map(|c| c.name.clone()),
        warranty: profile
            .and_then(|p| p.warranty.as_ref())
            .map(|w| WarrantyInfo {
                text: super::context::reflow(&w.text),
                period: w.period.map(|p| period_words(p, catalogue)),
                until: match (w.period, completed) {
                    (Some(p), Some(d)) => p.end_from(d).map(date_words),
                    _ => None,
                },
            }),
        terms: profile
            .and_then(|p| p.terms.as_deref())
            .map(super::context::reflow),
    }
}

/// A warranty period in the catalogue's words: "90 days", "1 year".
pub fn period_words(p: crate::shop::Period, catalogue: &Catalogue) -> String {
    let key = match p.unit {
        crate::shop::PeriodUnit::Days => "period-days",
        crate::shop::PeriodUnit::Weeks => "period-weeks",
        crate::shop::PeriodUnit::Months => "period-months",
        crate::shop::PeriodUnit::Years => "period-years",
    };
    catalogue.format(
        key,
        &[("count", crate::catalogue::Arg::from(p.count as usize))],
    )
}

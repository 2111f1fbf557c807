//! Presenting findings: one module per output kind. Reports decide nothing:
//! every status comes from [`crate::calc`].

pub mod json;
mod table;
pub mod terminal;

pub use table::{Align, TextTable};
pub mod handover;
pub mod plots;

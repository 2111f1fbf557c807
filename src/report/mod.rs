//! Presenting findings: one module per output kind. Reports decide nothing:
//! every status comes from [`crate::calc`].

pub mod attention;
pub mod compare;
pub mod handover;
pub mod json;
pub mod listing;
pub mod netlist;
pub mod network_chart;
pub mod photos;
pub mod plots;
pub mod response_chart;
pub mod summary;
mod table;
pub mod terminal;

pub use table::{Align, TextTable};

//! `ampreport`: turns a valve-amplifier repair job file into checked figures
//! and a hand-over document.
//!
//! Data flows one way: [`job`] decodes the KDL file, [`calc`] derives every
//! figure with [`ratings`] and [`units`], [`report`] presents the findings and
//! [`typeset`] runs the `typst` command. [`cli`] ties them to the command line.

pub mod allocator;
pub mod calc;
pub mod catalogue;
pub mod cli;
pub mod folders;
pub mod git;
pub mod input_file;
pub mod job;
pub mod kdl_fast;
pub mod photo;
pub mod problem_cap;
pub mod ratings;
pub mod report;
pub mod shop;
#[cfg(test)]
mod test_random;
pub mod typeset;
pub mod units;

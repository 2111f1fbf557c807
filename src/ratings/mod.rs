//! Valve ratings: the published limits and typical figures of each valve
//! type, which the checks compare measurements against.
//!
//! The rows live in a KDL file, `ratings/valves.kdl`, compiled into the
//! program. A shop can add types or correct figures with its own file in the
//! same format, without rebuilding. Every row carries a note saying where
//! its figures came from, and the report repeats it. The file format is
//! described in `docs/ratings.md`.

// Generated (see the file), so left as written.
#[rustfmt::skip]
mod builtin_rows;
mod class;
mod decode;
mod designation;
mod diagnostic;
mod draft;
mod rating;
mod table;

pub use class::{RectifierHeating, ValveClass};
pub use decode::FORMAT_VERSION;
pub use designation::{UnknownValve, designation_key};
pub use diagnostic::{RatingProblem, RatingsFileError, UnreadableRatingsFile};
pub use rating::{Heater, Rating, RatingOrigin};
pub use table::RatingsTable;

#[cfg(test)]
mod builtin_rows_tests;
#[cfg(test)]
mod builtin_tests;
#[cfg(test)]
mod tests;

//! Helpers shared by the benches (each bench is its own crate and takes
//! this file in with `mod common;`).

/// The median of a sample; the mean of the middle two for an even count.
pub fn median(mut xs: Vec<f64>) -> f64 {
    xs.sort_by(f64::total_cmp);
    let n = xs.len();
    if n % 2 == 1 {
        xs[n / 2]
    } else {
        (xs[n / 2 - 1] + xs[n / 2]) / 2.0
    }
}

//! The figures of one response curve that the document quotes: the gain at
//! the spot frequencies, the −3 dB corners and a mid scoop. Crossings and
//! the scoop's bottom are found on the sampled curve, then refined on the
//! solver itself (bisection and golden-section search on log frequency),
//! so they do not depend on the sampling.

use num_complex::Complex64;

use super::mna::{Singular, db};

/// Half power in dB: 10·log10(2) = 3.0103 dB.
pub const HALF_POWER_DB: f64 = 3.010_299_956_639_812;

/// A scoop counts when it dips at least this far below the lower of the
/// highest points on its two sides.
pub const SCOOP_MIN_DB: f64 = 2.0;

/// Which way the response crosses its −3 dB line at a corner.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum CornerKind {
    /// Rising through the line: the response falls away below it (a low cut).
    LowCut,
    /// Falling through the line: the response falls away above it (a high cut).
    HighCut,
}

#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Corner {
    pub frequency_hz: f64,
    pub kind: CornerKind,
}

#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Scoop {
    pub frequency_hz: f64,
    /// The gain at the bottom.
    pub gain_db: f64,
    /// How far below the lower of the two shoulders.
    pub depth_db: f64,
}

/// Bisection on log frequency for where `g(f)` changes sign between `lo`
/// and `hi` (`g(lo)` and `g(hi)` of opposite signs).
pub fn bisect(
    mut lo: f64,
    mut hi: f64,
    g: &dyn Fn(f64) -> Result<f64, Singular>,
) -> Result<f64, Singular> {
    let g_lo = g(lo)?;
    for _ in 0..60 {
        let mid = (lo * hi).sqrt();
        let v = g(mid)?;
        if (v < 0.0) == (g_lo < 0.0) {
            lo = mid;
        } else {
            hi = mid;
        }
        if hi / lo - 1.0 < 1e-13 {
            break;
        }
    }
    Ok((lo * hi).sqrt())
}

/// How far beyond each end of the sweep the reference level is looked
/// for: a shelf just outside the band (a low-pass's level below 20 Hz)
/// still sets where its −3 dB point is.
pub const REFERENCE_REACH: f64 = 100.0;

/// The −3 dB corners of a sampled curve (magnitudes `mag_db` at
/// `freqs`), relative to its highest level: the highest point of the
/// sweep, or of the response a factor [`REFERENCE_REACH`] below its first
/// or above its last frequency.
pub fn corners(
    freqs: &[f64],
    mag_db: &[f64],
    h: &dyn Fn(f64) -> Result<Complex64, Singular>,
) -> Result<Vec<Corner>, Singular> {
    let (Some(first), Some(last)) = (freqs.first(), freqs.last()) else {
        return Ok(Vec::new());
    };
    let beyond = db(h(first / REFERENCE_REACH)?).max(db(h(last * REFERENCE_REACH)?));
    let top = mag_db.iter().copied().fold(beyond, f64::max);
    let line = top - HALF_POWER_DB;
    let g = |f: f64| h(f).map(|v| db(v) - line);
    let mut out = Vec::new();
    for k in 0..freqs.len().saturating_sub(1) {
        let (a, b) = (mag_db[k] - line, mag_db[k + 1] - line);
        if (a < 0.0) != (b < 0.0) {
            out.push(Corner {
                frequency_hz: bisect(freqs[k], freqs[k + 1], &g)?,
                kind: if a < 0.0 {
                    CornerKind::LowCut
                } else {
                    CornerKind::HighCut
                },
            });
        }
    }
    Ok(out)
}

/// The deepest dip of a sampled curve that sits at least [`SCOOP_MIN_DB`]
/// below both of its shoulders, its bottom refined on the solver.
pub fn scoop(
    freqs: &[f64],
    mag_db: &[f64],
    h: &dyn Fn(f64) -> Result<Complex64, Singular>,
) -> Result<Option<Scoop>, Singular> {
    let n = mag_db.len();
    let mut best: Option<(usize, f64)> = None;
    for k in 1..n.saturating_sub(1) {
        if !(mag_db[k] < mag_db[k - 1] && mag_db[k] <= mag_db[k + 1]) {
            continue;
        }
        let left = mag_db[..k]
            .iter()
            .copied()
            .fold(f64::NEG_INFINITY, f64::max);
        let right = mag_db[k + 1..]
            .iter()
            .copied()
            .fold(f64::NEG_INFINITY, f64::max);
        let depth = left.min(right) - mag_db[k];
        if depth >= SCOOP_MIN_DB && best.is_none_or(|(_, d)| depth > d) {
            best = Some((k, depth));
        }
    }
    let Some((k, _)) = best else { return Ok(None) };
    // Golden-section search for the minimum on log frequency.
    let (mut a, mut b) = (freqs[k - 1].ln(), freqs[k + 1].ln());
    let r = (5f64.sqrt() - 1.0) / 2.0;
    let m = |x: f64| h(x.exp()).map(db);
    let mut c = b - r * (b - a);
    let mut d = a + r * (b - a);
    let (mut fc, mut fd) = (m(c)?, m(d)?);
    for _ in 0..80 {
        if fc < fd {
            b = d;
            d = c;
            fd = fc;
            c = b - r * (b - a);
            fc = m(c)?;
        } else {
            a = c;
            c = d;
            fc = fd;
            d = a + r * (b - a);
            fd = m(d)?;
        }
        if b - a < 1e-12 {
            break;
        }
    }
    let f = ((a + b) / 2.0).exp();
    let gain = m(f.ln())?;
    let left = mag_db[..k]
        .iter()
        .copied()
        .fold(f64::NEG_INFINITY, f64::max);
    let right = mag_db[k + 1..]
        .iter()
        .copied()
        .fold(f64::NEG_INFINITY, f64::max);
    Ok(Some(Scoop {
        frequency_hz: f,
        gain_db: gain,
        depth_db: left.min(right) - gain,
    }))
}

//! The phase-shift oscillator's rate: where a ladder's phase reaches 180°
//! (its response is real and negative) and how much it attenuates there,
//! which is the gain the stage it feeds back must supply. Searched from
//! 0.01 Hz to 1 MHz, since tremolo ladders run at a few hertz.

use num_complex::Complex64;

use super::features::bisect;
use super::mna::Singular;
use super::sweep::log_sweep;

/// The search's range and density.
pub const SEARCH_START_HZ: f64 = 0.01;
pub const SEARCH_STOP_HZ: f64 = 1e6;
pub const SEARCH_PER_DECADE: u32 = 60;

/// Where the phase is 180°.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Crossing {
    pub frequency_hz: f64,
    /// |H| there: the ladder's attenuation as a ratio (1/29 for three
    /// equal sections).
    pub ratio: f64,
}

/// The 180° point needing the least gain, if the phase gets there at all.
pub fn half_turn(
    h: &dyn Fn(f64) -> Result<Complex64, Singular>,
) -> Result<Option<Crossing>, Singular> {
    let freqs = log_sweep(SEARCH_START_HZ, SEARCH_STOP_HZ, SEARCH_PER_DECADE);
    let mut values = Vec::with_capacity(freqs.len());
    for &f in &freqs {
        values.push(h(f)?);
    }
    let im = |f: f64| h(f).map(|v| v.im);
    let mut best: Option<Crossing> = None;
    for k in 0..freqs.len() - 1 {
        let (a, b) = (values[k], values[k + 1]);
        let sign_change = (a.im < 0.0) != (b.im < 0.0);
        if !sign_change || (a.re >= 0.0 && b.re >= 0.0) {
            continue;
        }
        let f = bisect(freqs[k], freqs[k + 1], &im)?;
        let v = h(f)?;
        if v.re >= 0.0 {
            continue;
        }
        let ratio = v.norm();
        if best.is_none_or(|c| ratio > c.ratio) {
            best = Some(Crossing {
                frequency_hz: f,
                ratio,
            });
        }
    }
    Ok(best)
}

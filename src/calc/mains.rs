//! Mains correction, first order (common practice: transformer-fed voltages
//! scale linearly with the mains), and the high-line projection.

use crate::units::{Volts, Watts};

/// The factor that takes a reading at mains `measured` to mains `nominal`.
pub fn factor(measured: Volts, nominal: Volts) -> f64 {
    nominal / measured
}

/// V(corrected) = V · Vn / Vm.
pub fn corrected_volts(v: Volts, measured: Volts, nominal: Volts) -> Volts {
    v * factor(measured, nominal)
}

/// Currents scale like voltages, so P(corrected) ≈ P · (Vn / Vm)².
pub fn corrected_power(p: Watts, measured: Volts, nominal: Volts) -> Watts {
    let k = factor(measured, nominal);
    p * (k * k)
}

/// P(high) ≈ P(corrected) · (1 + t)².
pub fn high_line_power(corrected: Watts, tolerance: f64) -> Watts {
    corrected * ((1.0 + tolerance) * (1.0 + tolerance))
}

/// V(high) = V(corrected) · (1 + t).
pub fn high_line_volts(corrected: Volts, tolerance: f64) -> Volts {
    corrected * (1.0 + tolerance)
}

/// A chart drawn at design mains Vd expects V(chart) · Vn / Vd at nominal.
pub fn chart_expected(chart: Volts, design: Volts, nominal: Volts) -> Volts {
    chart * (nominal / design)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol
    }

    #[test]
    fn correction_to_nominal() {
        // Linear scaling with the mains (common practice, first order): 356 V at 124 V → 120 V.
        assert!(close(
            corrected_volts(Volts(356.0), Volts(124.0), Volts(120.0)).0,
            344.516,
            1e-3
        )); // 356·120/124
        // Power scales with the square: 14.562 W at 124 V → 14.562·(120/124)² = 13.638 W.
        assert!(close(
            corrected_power(Watts(14.562), Volts(124.0), Volts(120.0)).0,
            13.638,
            1e-3
        ));
    }

    #[test]
    fn high_line_projection() {
        // ANSI C84.1 Range A, from memory: 126 V is +5 % on 120 V; P·(1.05)² = P·1.1025.
        assert!(close(high_line_power(Watts(10.0), 0.05).0, 11.025, 1e-9));
        // IEC 60038, from memory: 230 V +10 % = 253 V.
        assert!(close(high_line_volts(Volts(230.0), 0.10).0, 253.0, 1e-9));
    }

    #[test]
    fn chart_reference_at_design_mains() {
        // A chart figure of 320 V drawn at 110 V mains expects 320·120/110 = 349.09 V at 120 V (common practice).
        assert!(close(
            chart_expected(Volts(320.0), Volts(110.0), Volts(120.0)).0,
            349.0909,
            1e-3
        ));
    }
}

//! Electrical-safety test results against the limits the job applied.

use super::findings::SafetyFinding;
use super::status::{Status, Verdict};
use crate::catalogue::{Arg, Catalogue};
use crate::job::{Safety, SafetyTest};
use crate::units::{QuantityKind, format_engineering};

fn q(x: f64, kind: QuantityKind) -> String {
    format_engineering(x, kind)
}

pub(crate) fn findings(safety: &Safety, cat: &Catalogue) -> Vec<SafetyFinding> {
    let verdict = |passed: bool, what: String, limit: String| verdict(passed, what, limit, cat);
    safety
        .tests
        .iter()
        .map(|t| match t {
            SafetyTest::EarthContinuity {
                measured,
                limit,
                cord,
            } => {
                let allowed = limit.0 + cord.map(|c| c.0).unwrap_or(0.0);
                let passed = measured.0 <= allowed + 1e-12;
                let limit_words = match cord {
                    Some(c) => cat.format(
                        "safety-limit-with-cord",
                        &[
                            ("limit", Arg::from(q(limit.0, QuantityKind::Resistance))),
                            ("cord", Arg::from(q(c.0, QuantityKind::Resistance))),
                            ("allowed", Arg::from(q(allowed, QuantityKind::Resistance))),
                        ],
                    ),
                    None => format!("≤ {}", q(limit.0, QuantityKind::Resistance)),
                };
                SafetyFinding {
                    test: "earth_continuity",
                    measured: q(measured.0, QuantityKind::Resistance),
                    limit: limit_words.clone(),
                    measured_value: measured.0,
                    limit_value: allowed,
                    unit: "ohm",
                    passed,
                    verdict: verdict(
                        passed,
                        cat.format(
                            "safety-earth",
                            &[("ohms", Arg::from(q(measured.0, QuantityKind::Resistance)))],
                        ),
                        limit_words,
                    ),
                }
            }
            SafetyTest::Insulation {
                measured,
                over_range,
                test_voltage,
                minimum,
            } => {
                let passed = measured.0 >= minimum.0;
                let shown = format!(
                    "{}{}",
                    if *over_range { "> " } else { "" },
                    q(measured.0, QuantityKind::Resistance)
                );
                let limit_words = cat.format(
                    "safety-insulation-limit",
                    &[
                        ("ohms", Arg::from(q(minimum.0, QuantityKind::Resistance))),
                        ("volts", Arg::from(q(test_voltage.0, QuantityKind::Voltage))),
                    ],
                );
                SafetyFinding {
                    test: "insulation",
                    measured: shown.clone(),
                    limit: limit_words.clone(),
                    measured_value: measured.0,
                    limit_value: minimum.0,
                    unit: "ohm",
                    passed,
                    verdict: verdict(
                        passed,
                        cat.format(
                            "safety-insulation",
                            &[
                                ("ohms", Arg::from(&shown)),
                                ("volts", Arg::from(q(test_voltage.0, QuantityKind::Voltage))),
                            ],
                        ),
                        limit_words,
                    ),
                }
            }
            SafetyTest::Leakage { measured, limit } => {
                let passed = measured.0 <= limit.0;
                let limit_words = format!("≤ {}", q(limit.0, QuantityKind::Current));
                SafetyFinding {
                    test: "leakage",
                    measured: q(measured.0, QuantityKind::Current),
                    limit: limit_words.clone(),
                    measured_value: measured.0,
                    limit_value: limit.0,
                    unit: "A",
                    passed,
                    verdict: verdict(
                        passed,
                        cat.format(
                            "safety-leakage",
                            &[("amps", Arg::from(q(measured.0, QuantityKind::Current)))],
                        ),
                        limit_words,
                    ),
                }
            }
        })
        .collect()
}

fn verdict(passed: bool, what: String, limit: String, cat: &Catalogue) -> Verdict {
    let args = [("what", Arg::from(what)), ("limit", Arg::from(&limit))];
    if passed {
        Verdict::ok(cat.format("safety-meets", &args), limit)
    } else {
        Verdict::new(Status::Over, cat.format("safety-fails", &args), limit)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::job::ProtectionClass;
    use crate::units::{Amps, Ohms, Volts};

    #[test]
    fn limits_are_applied() {
        let s = Safety {
            class: ProtectionClass::One,
            tests: vec![
                // IET Code of Practice for In-service Inspection and Testing, from memory: Class I earth ≤ 0.1 Ω plus the cord.
                SafetyTest::EarthContinuity {
                    measured: Ohms(0.14),
                    limit: Ohms(0.1),
                    cord: Some(Ohms(0.05)),
                },
                SafetyTest::EarthContinuity {
                    measured: Ohms(0.16),
                    limit: Ohms(0.1),
                    cord: Some(Ohms(0.05)),
                },
                // Same source, from memory: insulation ≥ 1 MΩ at 500 V DC for Class I.
                SafetyTest::Insulation {
                    measured: Ohms(0.8e6),
                    over_range: false,
                    test_voltage: Volts(500.0),
                    minimum: Ohms(1e6),
                },
                SafetyTest::Leakage {
                    measured: Amps(0.4e-3),
                    limit: Amps(0.5e-3),
                },
            ],
        };
        let f = findings(&s, crate::catalogue::Catalogue::english());
        let passed: Vec<bool> = f.iter().map(|f| f.passed).collect();
        assert_eq!(passed, [true, false, false, true]);
        assert!((f[0].limit_value - 0.15).abs() < 1e-12);
    }
}

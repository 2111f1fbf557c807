//! The solver against textbook results: first-order corners, the
//! three-section phase-shift ladder, pot dividers, a valve source's output
//! impedance, a twin-T notch; and the decoder's structural errors.

use super::*;
use crate::job::{Job, decode_with_ratings};

/// A minimal job whose one mod carries `network` (the body of a
/// `network` node).
pub(crate) fn job_text(network: &str) -> String {
    format!(
        r#"job-format 1
job id="T-1"
unit make="Testbench" model="Fixture"
mains nominal="230V"
valves {{
    valve V1 type="12AX7" role=preamp
    valve V2 type=EL84 role=output
}}
mods {{
    mod "fixture" {{
        network "fixture" {{
{network}
        }}
    }}
}}
"#
    )
}

fn job(network: &str) -> Job {
    let text = job_text(network);
    match decode_with_ratings("t.kdl", &text, &RatingsTable::builtin()) {
        Ok(d) => d.job,
        Err(e) => panic!("{:?}", miette::Report::new(e)),
    }
}

/// The problems the decoder finds, with their 1-based line numbers.
fn problems(network: &str) -> Vec<(usize, String)> {
    let text = job_text(network);
    match decode_with_ratings("t.kdl", &text, &RatingsTable::builtin()) {
        Ok(_) => Vec::new(),
        Err(e) => e
            .errors()
            .map(|p| (e.line_column(p.span.offset()).0, p.message.clone()))
            .collect(),
    }
}

fn network(job: &Job) -> &Network {
    job.mods[0].network.as_ref().expect("a network")
}

fn solver(job: &Job, which: State, setting: usize) -> Solver {
    let (resolved, _) =
        resolve_state(network(job), which, setting, job, &RatingsTable::builtin()).unwrap();
    Solver::new(&resolved)
}

fn rel(a: f64, b: f64) -> f64 {
    ((a - b) / b).abs()
}

const TAU: f64 = 2.0 * std::f64::consts::PI;

#[test]
fn rc_low_pass_matches_the_first_order_formula() {
    let j = job(r#"
        source node=in
        load node=out
        resistor R1 value="1k" from=in to=out
        capacitor C1 value="1u" from=out to=ground
    "#);
    let s = solver(&j, State::Before, 0);
    // fc = 1/(2πRC) (textbook first-order RC): 1/(2π × 1 kΩ × 1 µF) = 159.155 Hz.
    let fc = 1.0 / (TAU * 1e3 * 1e-6);
    let h = s.response(fc).unwrap();
    // At the corner |H| = 1/√2 (−3.0103 dB) and the phase is −45° (textbook).
    assert!((db(h) + HALF_POWER_DB).abs() < 1e-9, "{}", db(h));
    assert!((degrees(h) + 45.0).abs() < 1e-9);
    // H = 1/(1 + jf/fc) at every point (textbook), to 1e-9.
    for f in audio_sweep() {
        let want = num_complex::Complex64::new(1.0, f / fc).inv();
        assert!((s.response(f).unwrap() - want).norm() < 1e-9);
    }
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    let c = &found.curves[0];
    assert_eq!(c.corners.len(), 1);
    assert_eq!(c.corners[0].kind, CornerKind::HighCut);
    // Within 0.1 % of the textbook corner.
    assert!(
        rel(c.corners[0].frequency_hz, fc) < 1e-3,
        "{}",
        c.corners[0].frequency_hz
    );
    assert!(c.scoop.is_none());
    assert_eq!(c.magnitude_db.len(), 121);
}

#[test]
fn rc_high_pass_and_rl_corners_match_the_formulas() {
    let j = job(r#"
        source node=in
        load node=out resistance="100k"
        capacitor C1 value="22n" from=in to=out
    "#);
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    // fc = 1/(2π · 100 kΩ · 22 nF) = 72.343 Hz (textbook first-order RC).
    let fc = 1.0 / (TAU * 100e3 * 22e-9);
    let c = &found.curves[0].corners[0];
    assert_eq!(c.kind, CornerKind::LowCut);
    assert!(rel(c.frequency_hz, fc) < 1e-3, "{}", c.frequency_hz);

    let j = job(r#"
        source node=in
        load node=out
        inductor L1 value="1H" from=in to=out
        resistor R1 value="1k" from=out to=ground
    "#);
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    // fc = R/(2πL) (textbook first-order RL): 1 kΩ / (2π × 1 H) = 159.155 Hz.
    let fc = 1e3 / TAU;
    let c = &found.curves[0].corners[0];
    assert_eq!(c.kind, CornerKind::HighCut);
    assert!(rel(c.frequency_hz, fc) < 1e-3, "{}", c.frequency_hz);
}

/// Three equal RC sections, series C and shunt R (or series R and shunt
/// C), from an ideal source into no load.
fn ladder(high_pass: bool) -> String {
    let mut s = String::from("source node=n0\nload node=n3\n");
    for i in 1..=3 {
        if high_pass {
            s += &format!("capacitor C{i} value=\"10n\" from=n{} to=n{i}\n", i - 1);
            s += &format!("resistor R{i} value=\"220k\" from=n{i} to=ground\n");
        } else {
            s += &format!("resistor R{i} value=\"220k\" from=n{} to=n{i}\n", i - 1);
            s += &format!("capacitor C{i} value=\"10n\" from=n{i} to=ground\n");
        }
    }
    s + "oscillator\n"
}

#[test]
fn three_equal_sections_turn_half_way_at_the_textbook_frequency_and_lose_29_times() {
    let (r, c) = (220e3, 10e-9);
    // Series C, shunt R: f = 1/(2πRC√6), attenuation 1/29 (textbook
    // phase-shift oscillator, unloaded equal sections).
    let j = job(&ladder(true));
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    let p = &found.oscillator[0].points[0];
    let f = p.frequency_hz.unwrap();
    assert!(rel(f, 1.0 / (TAU * r * c * 6f64.sqrt())) < 1e-3, "{f}");
    assert!(
        rel(p.gain_needed.unwrap(), 29.0) < 1e-3,
        "{:?}",
        p.gain_needed
    );
    assert!(
        rel(
            f,
            crate::calc::phase_shift_frequency(Ohms(r), crate::units::Farads(c)).0
        ) < 1e-9
    );
    // Series R, shunt C: f = √6/(2πRC), again 1/29 (textbook).
    let j = job(&ladder(false));
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    let p = &found.oscillator[0].points[0];
    assert!(rel(p.frequency_hz.unwrap(), 6f64.sqrt() / (TAU * r * c)) < 1e-3);
    assert!(rel(p.attenuation.unwrap(), 1.0 / 29.0) < 1e-3);
}

#[test]
fn a_speed_pot_moves_the_rate_over_its_range() {
    // The last shunt resistor is 100k in series with a 1M linear pot as a
    // variable resistor: more resistance, a slower rate.
    let j = job(r#"
        source node=n0 impedance="10k"
        load node=n3 resistance="1M"
        capacitor C1 value="22n" from=n0 to=n1
        resistor R1 value="220k" from=n1 to=ground
        capacitor C2 value="22n" from=n1 to=n2
        resistor R2 value="220k" from=n2 to=ground
        capacitor C3 value="22n" from=n2 to=n3
        resistor R3 value="100k" from=n3 to=s
        pot VR1 value="1M" ccw=s wiper=ground setting=5
        oscillator speed=VR1
    "#);
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    let points = &found.oscillator[0].points;
    assert_eq!(points.len(), 11);
    let rates: Vec<f64> = points.iter().map(|p| p.frequency_hz.unwrap()).collect();
    assert!(rates.windows(2).all(|w| w[1] < w[0]), "{rates:?}");
    assert!(points.iter().all(|p| p.gain_needed.unwrap() > 1.0));
}

#[test]
fn pot_dividers_follow_their_taper() {
    let text = |taper: &str| {
        format!(
            r#"
        source node=in
        load node=out
        pot VR1 value="1M" taper={taper} ccw=ground wiper=out cw=in setting="5 10 0"
    "#
        )
    };
    let j = job(&text("audio"));
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    // Audio law: 10 % of the track below the wiper at half rotation → 20·log10(0.1) = −20 dB.
    assert!((found.curves[0].gain_1khz_db + 20.0).abs() < 1e-9);
    // Fully up: the end residual of 0.1 % above the wiper, 20·log10(1/1.001).
    assert!((found.curves[1].gain_1khz_db - 20.0 * (1.0f64 / 1.001).log10()).abs() < 1e-9);
    // Fully down: 0.001/1.001 of the source.
    assert!((found.curves[2].gain_1khz_db - 20.0 * (0.001f64 / 1.001).log10()).abs() < 1e-9);
    let j = job(&text("linear"));
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    // Linear: half way is half the voltage, 20·log10(0.5) = −6.0206 dB.
    assert!((found.curves[0].gain_1khz_db + 6.020_599_913).abs() < 1e-6);
}

#[test]
fn a_valve_source_has_ra_parallel_plate_load_output_impedance() {
    let j = job(r#"
        source node=in valve=V1 plate-load="100k"
        load node=in resistance="38461.538"
    "#);
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    let s = &found.sources[0];
    // 12AX7 ra 62.5 kΩ (from memory of manufacturer data) ∥ 100 kΩ = 38.4615 kΩ.
    assert!(rel(s.impedance_ohms.unwrap(), 38_461.538) < 1e-6);
    // A = μ·RL/(RL + ra) = 100 × 100k / 162.5k = 61.54 (textbook stage gain).
    assert!(rel(s.stage_gain.unwrap(), 61.538_46) < 1e-5);
    // Into an equal load: half the EMF, −6.02 dB (voltage divider).
    assert!((found.curves[0].gain_1khz_db + 6.0206).abs() < 1e-3);

    let j = job(r#"
        source node=in valve=V1 plate-load="100k" cathode-resistor="1k5"
        load node=in
    "#);
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    // Unbypassed: (ra + (μ+1)·Rk) ∥ RL = (62.5k + 151.5k) ∥ 100k = 68.153 kΩ (textbook).
    assert!(
        rel(
            found.sources[0].impedance_ohms.unwrap(),
            214e3 * 100e3 / 314e3
        ) < 1e-9
    );
}

#[test]
fn a_twin_t_notch_is_found_as_a_scoop_at_its_centre() {
    // Twin-T: R, R in series with 2C to ground; C, C in series with R/2 to
    // ground. Null at f0 = 1/(2πRC) (textbook twin-T notch).
    let j = job(r#"
        source node=in
        load node=out resistance="10M"
        resistor R1 value="10k" from=in to=a
        resistor R2 value="10k" from=a to=out
        capacitor C3 value="200n" from=a to=ground
        capacitor C1 value="100n" from=in to=b
        capacitor C2 value="100n" from=b to=out
        resistor R3 value="5k" from=b to=ground
    "#);
    let found = derive(network(&j), &j, &RatingsTable::builtin());
    let scoop = found.curves[0].scoop.as_ref().expect("a notch");
    let f0 = 1.0 / (TAU * 10e3 * 100e-9);
    assert!(rel(scoop.frequency_hz, f0) < 1e-3, "{}", scoop.frequency_hz);
    assert!(scoop.depth_db > 40.0, "{}", scoop.depth_db);
}

#[test]
fn edits_make_the_after_network_and_its_changes() {
    let j = job(r#"
        source node=in impedance="10k"
        load node=out resistance="1M"
        resistor R1 value="100k" from=in to=out
        capacitor C1 value="1n" from=out to=ground
        link S1 from=in to=x
        capacitor C2 value="100p" from=x to=out
        after {
            change R1 value="47k"
            remove S1
            remove C2
            capacitor C9 value="470p" from=in to=out
        }
    "#);
    let net = network(&j);
    let after = net.after();
    let refs: Vec<&str> = after
        .parts
        .iter()
        .map(|p| p.reference.value.as_str())
        .collect();
    assert_eq!(refs, ["R1", "C1", "C9"]);
    assert_eq!(after.parts[0].kind.value(), Some(47e3));
    let found = derive(net, &j, &RatingsTable::builtin());
    assert_eq!(found.curves.len(), 2);
    assert_eq!(found.changes.len(), 1);
    let d = found.curves[1].gain_5khz_db - found.curves[0].gain_5khz_db;
    assert!((found.changes[0].change_5khz_db - d).abs() < 1e-12);
    assert_eq!(
        found.edits,
        [
            "R1 100 kΩ → 47 kΩ",
            "S1 removed",
            "C2 (100 pF) removed",
            "C9 added: capacitor 470 pF between in and out"
        ]
    );
}

#[test]
fn a_floating_node_is_an_error_at_its_line_naming_it() {
    let p = problems(
        r#"
        source node=in
        load node=out
        resistor R1 value="1k" from=in to=out
        resistor R2 value="1k" from=out to=ground
        capacitor C1 value="1n" from=x to=y
    "#,
    );
    assert_eq!(p.len(), 1, "{p:?}");
    // Line 17 of the job text: the capacitor.
    assert_eq!(p[0].0, 17);
    assert!(
        p[0].1.contains("nodes `x` and `y`") && p[0].1.contains("C1"),
        "{}",
        p[0].1
    );
}

#[test]
fn a_removal_that_leaves_a_node_floating_points_at_the_removal() {
    let p = problems(
        r#"
        source node=in
        load node=out
        resistor R1 value="1k" from=in to=out
        resistor R2 value="1k" from=out to=ground
        capacitor C1 value="1n" from=x to=t
        resistor R3 value="1k" from=t to=ground
        after {
            remove R3
        }
    "#,
    );
    assert_eq!(p.len(), 1, "{p:?}");
    assert_eq!(p[0].0, 20, "{p:?}");
    assert!(
        p[0].1.contains("nodes `x` and `t`") && p[0].1.contains("after the mod's edits"),
        "{p:?}"
    );
}

#[test]
fn loops_of_ideal_connections_are_errors_naming_the_parts() {
    let p = problems(
        r#"
        source node=in
        load node=out
        resistor R1 value="1k" from=in to=out
        link S1 from=out to=a
        link S2 from=a to=ground
        link S3 from=ground to=out
    "#,
    );
    assert_eq!(p.len(), 1, "{p:?}");
    assert_eq!(p[0].0, 18);
    assert!(p[0].1.contains("S2, S1 and S3 form a loop"), "{}", p[0].1);
    let p = problems(
        r#"
        source node=in
        load node=out
        resistor R1 value="1k" from=in to=out
        resistor R2 value="1k" from=out to=ground
        link S1 from=in to=ground
    "#,
    );
    assert_eq!(p.len(), 1, "{p:?}");
    assert!(
        p[0].1.contains("the source and S1") && p[0].1.contains("shorted"),
        "{}",
        p[0].1
    );
    let p = problems(
        r#"
        source node=in impedance="1k"
        load node=out
        resistor R1 value="1k" from=in to=out
        resistor R2 value="1k" from=out to=ground
        link S1 from=in to=a
        link S2 from=a to=in
    "#,
    );
    assert!(
        p[0].1.contains("S1 and S2") && p[0].1.contains("loop"),
        "{p:?}"
    );
}

#[test]
fn bad_networks_are_errors_with_a_reason() {
    let cases: &[(&str, &str)] = &[
        (
            "source node=in\nresistor R1 value=\"1k\" from=in to=ground",
            "needs a `load`",
        ),
        (
            "source node=ground\nload node=out\nresistor R1 value=\"1k\" from=out to=ground",
            "cannot sit on `ground`",
        ),
        (
            "source node=in\nload node=out\nresistor R1 value=\"1k\" from=in to=0",
            "reference node",
        ),
        (
            "source node=in\nload node=out\nresistor R1 value=\"1k\" from=in to=in",
            "to itself",
        ),
        (
            "source node=in\nload node=out resistance=\"1M\"\nresistor R1 value=\"1k\" from=in to=ground",
            "no part leads",
        ),
        (
            "source node=in\nload node=out\nresistor R1 value=\"-1k\" from=in to=out",
            "negative",
        ),
        (
            "source node=in\nload node=out\npot VR1 value=\"1M\" ccw=ground wiper=out cw=in setting=11",
            "0 to 10",
        ),
        (
            "source node=in\nload node=out\npot VR1 value=\"1M\" ccw=ground wiper=out cw=in setting=\"1 2\"\npot VR2 value=\"1M\" ccw=ground wiper=out cw=in setting=\"1 2 3\"",
            "settings",
        ),
        (
            "source node=in\nload node=out\nresistor R1 value=\"1k\" from=in to=out\nafter {\nchange R9 value=\"2k\"\n}",
            "no part R9",
        ),
        (
            "source node=in\nload node=out\nresistor R1 value=\"1k\" from=in to=out\nafter {\nresistor R1 value=\"2k\" from=in to=out\n}",
            "already has a part R1",
        ),
        (
            "source node=in valve=V2 plate-load=\"5k\"\nload node=out\nresistor R1 value=\"1k\" from=in to=out",
            "no typical μ and ra",
        ),
        (
            "source node=in\nload node=out\ninductor L1 value=\"10uF\" from=in to=out",
            "inductance",
        ),
        (
            "source node=in\nload node=out\nresistor R1 value=\"1k\" from=in to=out\noscillator speed=VR7",
            "not a pot",
        ),
    ];
    for (net, want) in cases {
        let p = problems(net);
        assert!(
            p.iter().any(|(_, m)| m.contains(want)),
            "{net}: wanted “{want}” in {p:?}"
        );
    }
}

/// A generated network of `nodes` nodes: a chain so every node reaches
/// ground, and parts between pseudo-random pairs (a fixed linear
/// congruential sequence, so the test is the same every run).
fn generated(nodes: usize, seed: u64) -> String {
    let mut x = seed;
    let mut next = move |m: u64| {
        x = x
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        (x >> 33) % m
    };
    let mut s = String::from("source node=n0 impedance=\"22k\"\n");
    s += &format!("load node=n{} resistance=\"470k\"\n", nodes - 1);
    for k in 1..nodes {
        s += &format!(
            "resistor RC{k} value=\"{}k\" from=n{} to=n{k}\n",
            1 + next(200),
            k - 1
        );
    }
    for i in 0..nodes * 2 {
        let a = next(nodes as u64);
        let b = next(nodes as u64);
        let to = if a == b {
            "ground".to_string()
        } else {
            format!("n{b}")
        };
        s += &match next(4) {
            0 => format!(
                "capacitor CX{i} value=\"{}n\" from=n{a} to={to}\n",
                1 + next(100)
            ),
            1 => format!(
                "resistor RX{i} value=\"{}k\" from=n{a} to={to}\n",
                1 + next(500)
            ),
            2 => format!(
                "inductor LX{i} value=\"{}m\" from=n{a} to={to}\n",
                10 + next(900)
            ),
            _ => format!(
                "capacitor CY{i} value=\"{}p\" from=n{a} to={to}\n",
                10 + next(900)
            ),
        };
    }
    s
}

#[test]
fn the_sparse_elimination_is_held_to_nalgebras_dense_lu() {
    // nalgebra's LU decomposition is the reference (docs/performance.md).
    let mut texts: Vec<String> = (0..12)
        .map(|i| generated(3 + i * 3, 17 + i as u64))
        .collect();
    texts.push(ladder(true));
    texts.push(
        "source node=in\nload node=out\nresistor R1 value=\"1k\" from=in to=out\nlink S1 from=out to=a\nresistor R2 value=\"2k\" from=a to=ground\n"
            .to_string(),
    );
    let crosscheck = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/networks/crosscheck.kdl"
    ))
    .unwrap();
    let ratings = RatingsTable::builtin();
    let crosscheck = decode_with_ratings("c.kdl", &crosscheck, &ratings)
        .unwrap()
        .job;
    let mut checked = 0;
    let mut check = |j: &Job, net: &Network| {
        for which in [State::Before, State::After] {
            let st = state(net, which);
            for k in 0..st.setting_count() {
                let (resolved, _) = resolve_state(net, which, k, j, &ratings).unwrap();
                let s = Solver::new(&resolved);
                for f in log_sweep(1.0, 1e6, 10) {
                    let (a, b) = (s.response(f).unwrap(), s.response_reference(f).unwrap());
                    assert!(
                        (a - b).norm() <= 1e-9 * b.norm().max(1e-12),
                        "{f} Hz: {a} against {b}"
                    );
                    checked += 1;
                }
            }
        }
    };
    for t in &texts {
        let j = job(t);
        check(&j, network(&j));
    }
    for m in &crosscheck.mods {
        check(&crosscheck, m.network.as_ref().unwrap());
    }
    assert!(checked > 1000, "{checked}");
}

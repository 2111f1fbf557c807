//! The AC solver: modified nodal analysis on complex numbers. A network
//! state at one set of pot settings is resolved into two-terminal
//! elements between numbered nodes ([`Resolved`]); [`Solver`] stamps their
//! conductance, capacitance and inverse-inductance matrices once, then at
//! each angular frequency ω solves the complex system
//! (G + j(ωC − Γ/ω)) x = b for the node voltages and the currents of the
//! ideal sources: by Gaussian elimination that skips the matrix's exact
//! zeros, held identical to nalgebra's dense LU decomposition (the
//! measured reason is in docs/performance.md).

use nalgebra::{DMatrix, DVector};
use num_complex::Complex64;

use super::taper;
use crate::job::network::{GROUND, NetworkState, PartKind};

/// What an element is, with its value in the base SI unit.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum ElementKind {
    Resistor(f64),
    Capacitor(f64),
    Inductor(f64),
    /// An ideal short (a link): a zero-volt source in the analysis.
    Short,
}

/// One two-terminal element between nodes `a` and `b` (0 is ground).
#[derive(Debug, Clone, PartialEq)]
pub struct Element {
    /// The part's reference, with the side of a pot's track:
    /// `VR1` gives `VR1.ccw` and `VR1.cw`.
    pub name: String,
    pub kind: ElementKind,
    pub a: usize,
    pub b: usize,
}

/// A network state at one set of pot settings, ready to solve.
#[derive(Debug, Clone, PartialEq)]
pub struct Resolved {
    /// Node names; index 0 is ground.
    pub nodes: Vec<String>,
    pub elements: Vec<Element>,
    pub source_node: usize,
    /// The source's output impedance in ohms; none for an ideal source.
    pub source_ohms: Option<f64>,
    pub load_node: usize,
    pub load_ohms: Option<f64>,
    /// Each pot's wiper setting in this resolution.
    pub pots: Vec<(String, f64)>,
}

/// Resolves `state` at its setting `index` (0-based), the source's output
/// impedance already worked out (`None` for an ideal source), with any pot
/// settings in `overrides` taking the place of the state's own.
pub fn resolve(
    state: &NetworkState,
    index: usize,
    source_ohms: Option<f64>,
    overrides: &[(String, f64)],
) -> Resolved {
    let mut nodes = vec![GROUND.to_string()];
    let mut id = |name: &str| -> usize {
        match nodes.iter().position(|n| n == name) {
            Some(i) => i,
            None => {
                nodes.push(name.to_string());
                nodes.len() - 1
            }
        }
    };
    let source_node = id(&state.source.node.value);
    let mut elements = Vec::new();
    let mut pots = Vec::new();
    for part in &state.parts {
        let name = &part.reference.value;
        match &part.kind {
            PartKind::Resistor { value, a, b } => elements.push(Element {
                name: name.clone(),
                kind: ElementKind::Resistor(value.0),
                a: id(&a.value),
                b: id(&b.value),
            }),
            PartKind::Capacitor { value, a, b } => elements.push(Element {
                name: name.clone(),
                kind: ElementKind::Capacitor(value.0),
                a: id(&a.value),
                b: id(&b.value),
            }),
            PartKind::Inductor { value, a, b } => elements.push(Element {
                name: name.clone(),
                kind: ElementKind::Inductor(value.0),
                a: id(&a.value),
                b: id(&b.value),
            }),
            PartKind::Link { a, b } => elements.push(Element {
                name: name.clone(),
                kind: ElementKind::Short,
                a: id(&a.value),
                b: id(&b.value),
            }),
            PartKind::Pot {
                value,
                taper: law,
                ccw,
                wiper,
                cw,
                settings,
                ..
            } => {
                let setting = overrides
                    .iter()
                    .find(|(r, _)| r == name)
                    .map(|(_, s)| *s)
                    .unwrap_or_else(|| crate::job::network::pick_setting(settings, index));
                pots.push((name.clone(), setting));
                let (lower, upper) = taper::split(value.0, *law, setting);
                let w = id(&wiper.value);
                if let Some(ccw) = ccw {
                    elements.push(Element {
                        name: format!("{name}.ccw"),
                        kind: ElementKind::Resistor(lower),
                        a: id(&ccw.value),
                        b: w,
                    });
                }
                if let Some(cw) = cw {
                    elements.push(Element {
                        name: format!("{name}.cw"),
                        kind: ElementKind::Resistor(upper),
                        a: w,
                        b: id(&cw.value),
                    });
                }
            }
        }
    }
    let load_node = id(&state.load.node.value);
    Resolved {
        nodes,
        elements,
        source_node,
        source_ohms,
        load_node,
        load_ohms: state.load.resistance.map(|r| r.0),
        pots,
    }
}

/// Why a solve failed.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("the network's equations are singular at {frequency_hz:.4} Hz")]
pub struct Singular {
    pub frequency_hz: f64,
}

/// A resolved network's stamped matrices, solved at any frequency.
#[derive(Debug, Clone)]
pub struct Solver {
    /// Unknowns: node voltages 1..n (ground left out), then one current
    /// per ideal source.
    size: usize,
    /// The matrix's structurally non-zero entries: the place in the
    /// row-major matrix, and the conductance, capacitance and inverse
    /// inductance stamped there.
    entries: Vec<(usize, f64, f64, f64)>,
    /// One past each row's last structurally non-zero column.
    row_end: Vec<usize>,
    rhs: Vec<f64>,
    /// The unknown holding the load node's voltage.
    out: usize,
}

impl Solver {
    pub fn new(net: &Resolved) -> Solver {
        let n = net.nodes.len() - 1;
        let shorts = net
            .elements
            .iter()
            .filter(|e| e.kind == ElementKind::Short)
            .count();
        let ideal = usize::from(net.source_ohms.is_none());
        let size = n + shorts + ideal;
        let mut g = DMatrix::zeros(size, size);
        let mut c = DMatrix::zeros(size, size);
        let mut gamma = DMatrix::zeros(size, size);
        let mut rhs = DVector::zeros(size);
        // Node k's unknown is k − 1; ground has none.
        let stamp = |m: &mut DMatrix<f64>, a: usize, b: usize, y: f64| {
            if a > 0 {
                m[(a - 1, a - 1)] += y;
            }
            if b > 0 {
                m[(b - 1, b - 1)] += y;
            }
            if a > 0 && b > 0 {
                m[(a - 1, b - 1)] -= y;
                m[(b - 1, a - 1)] -= y;
            }
        };
        // A voltage source from a (+) to b (−) with current unknown `row`.
        let branch = |m: &mut DMatrix<f64>, a: usize, b: usize, row: usize| {
            if a > 0 {
                m[(a - 1, row)] += 1.0;
                m[(row, a - 1)] += 1.0;
            }
            if b > 0 {
                m[(b - 1, row)] -= 1.0;
                m[(row, b - 1)] -= 1.0;
            }
        };
        let mut next = n;
        for e in &net.elements {
            match e.kind {
                ElementKind::Resistor(r) => stamp(&mut g, e.a, e.b, 1.0 / r),
                ElementKind::Capacitor(f) => stamp(&mut c, e.a, e.b, f),
                ElementKind::Inductor(h) => stamp(&mut gamma, e.a, e.b, 1.0 / h),
                ElementKind::Short => {
                    branch(&mut g, e.a, e.b, next);
                    next += 1;
                }
            }
        }
        if let Some(r) = net.load_ohms {
            stamp(&mut g, net.load_node, 0, 1.0 / r);
        }
        match net.source_ohms {
            // Norton form: a current of 1/Zs into the node beside 1/Zs to ground.
            Some(z) => {
                stamp(&mut g, net.source_node, 0, 1.0 / z);
                rhs[net.source_node - 1] += 1.0 / z;
            }
            None => {
                branch(&mut g, net.source_node, 0, next);
                rhs[next] = 1.0;
            }
        }
        let mut entries = Vec::new();
        let mut row_end = vec![0; size];
        for i in 0..size {
            for j in 0..size {
                let (gv, cv, lv) = (g[(i, j)], c[(i, j)], gamma[(i, j)]);
                if gv != 0.0 || cv != 0.0 || lv != 0.0 {
                    entries.push((i * size + j, gv, cv, lv));
                    row_end[i] = j + 1;
                }
            }
        }
        Solver {
            size,
            entries,
            row_end,
            rhs: rhs.iter().copied().collect(),
            out: net.load_node - 1,
        }
    }

    /// The system matrix at angular frequency `w`, row-major, and the
    /// right-hand side.
    fn system(&self, w: f64) -> (Vec<Complex64>, Vec<Complex64>) {
        let n = self.size;
        let mut a = vec![Complex64::new(0.0, 0.0); n * n];
        for &(at, g, c, inv_l) in &self.entries {
            a[at] = Complex64::new(g, w * c - inv_l / w);
        }
        let b = self.rhs.iter().map(|&v| Complex64::new(v, 0.0)).collect();
        (a, b)
    }

    /// The voltage at the load per volt of source EMF at `frequency_hz`,
    /// by Gaussian elimination with partial pivoting that skips the exact
    /// zeros of a network's sparse matrix ([`eliminate`]).
    pub fn response(&self, frequency_hz: f64) -> Result<Complex64, Singular> {
        let w = 2.0 * std::f64::consts::PI * frequency_hz;
        let (mut a, mut b) = self.system(w);
        let v = eliminate(&mut a, &mut b, self.size, self.out, self.row_end.clone());
        match v {
            Some(v) if v.re.is_finite() && v.im.is_finite() => Ok(v),
            _ => Err(Singular { frequency_hz }),
        }
    }

    /// The same response through nalgebra's dense LU decomposition: the
    /// reference [`Solver::response`] is held to (see docs/performance.md).
    pub fn response_reference(&self, frequency_hz: f64) -> Result<Complex64, Singular> {
        let w = 2.0 * std::f64::consts::PI * frequency_hz;
        let singular = || Singular { frequency_hz };
        let (a, b) = self.system(w);
        let a = DMatrix::from_row_slice(self.size, self.size, &a);
        let b = DVector::from_vec(b);
        let x = a.lu().solve(&b).ok_or_else(singular)?;
        let v = x[self.out];
        if v.re.is_finite() && v.im.is_finite() {
            Ok(v)
        } else {
            Err(singular())
        }
    }
}

/// Solves `a x = b` (`a` row-major, `n` × `n`, both overwritten) for
/// unknown `want` by Gaussian elimination with partial pivoting, the
/// pivot chosen by largest |re|² + |im|² as a dense LU would. `end` holds,
/// per row, one past its last column that may be non-zero (any larger
/// figure is safe); it is kept up to date as rows mix, and a row whose
/// entry below the pivot is exactly zero is left alone: on a network's
/// sparse matrix this skips most of the work and changes no result, since
/// the skipped operations would subtract exact zeros. `None` when a pivot
/// is zero.
pub fn eliminate(
    a: &mut [Complex64],
    b: &mut [Complex64],
    n: usize,
    want: usize,
    mut end: Vec<usize>,
) -> Option<Complex64> {
    let zero = Complex64::new(0.0, 0.0);
    for k in 0..n {
        let mut p = k;
        let mut best = a[k * n + k].norm_sqr();
        for i in k + 1..n {
            let v = a[i * n + k].norm_sqr();
            if v > best {
                best = v;
                p = i;
            }
        }
        if best == 0.0 || !best.is_finite() {
            return None;
        }
        if p != k {
            for j in k..n {
                a.swap(k * n + j, p * n + j);
            }
            b.swap(k, p);
            end.swap(k, p);
        }
        let pivot = a[k * n + k];
        let last = end[k];
        let (top, rest) = a.split_at_mut((k + 1) * n);
        let row_k = &top[k * n..k * n + n];
        for (r, row_i) in rest.chunks_exact_mut(n).enumerate() {
            let f = row_i[k];
            if f == zero {
                continue;
            }
            let f = f / pivot;
            row_i[k] = zero;
            for j in k + 1..last {
                row_i[j] -= f * row_k[j];
            }
            let i = k + 1 + r;
            b[i] -= f * b[k];
            end[i] = end[i].max(last);
        }
    }
    // Back substitution, from the last unknown up to the one wanted.
    for k in (want..n).rev() {
        let mut s = b[k];
        for j in k + 1..end[k] {
            s -= a[k * n + j] * b[j];
        }
        b[k] = s / a[k * n + k];
    }
    Some(b[want])
}
/// Magnitude in dB, floored at −300 dB so a zero stays a number.
pub fn db(h: Complex64) -> f64 {
    20.0 * h.norm().max(1e-15).log10()
}

/// Phase in degrees, in (−180°, 180°].
pub fn degrees(h: Complex64) -> f64 {
    let d = h.arg().to_degrees();
    if d <= -180.0 { d + 360.0 } else { d }
}

//! The hand-over document's two charts, drawn with plotters' SVG backend so
//! they stay vector graphics in the PDF: output-valve plate dissipation as a
//! share of its rating for each measurement set, and the supply chain's
//! corrected node voltages against the bands the chart allows.
//!
//! Both are built to survive a black-and-white printer: measurement sets
//! differ by fill pattern (hatched, solid dark, solid light …) or by marker
//! shape, never by colour alone, and every bar and marker carries its figure
//! as text. The charts only draw what [`crate::calc`] worked out.

use std::cell::Cell;
use std::collections::HashMap;

use plotters::coord::Shift;
use plotters::coord::types::RangedCoordf64;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};

use crate::calc::Findings;
use crate::catalogue::{Arg, Catalogue};

mod obstacles;
mod svg_out;
mod warm_up;
pub(crate) use obstacles::Obstacles;
pub(crate) use svg_out::SvgOut;
pub use warm_up::{WarmUpChart, WarmUpLine, warm_up_chart, warm_up_svg};

/// Font named in the SVG text elements: the bundled body font, which typst
/// uses when it draws the SVG.
pub(crate) const FONT: &str = "Noto Sans";

/// Greys used by both charts (greyscale by design).
pub(crate) const INK: RGBColor = RGBColor(20, 20, 20);
pub(crate) const DARK: RGBColor = RGBColor(90, 90, 90);
pub(crate) const MID: RGBColor = RGBColor(160, 160, 160);
pub(crate) const LIGHT: RGBColor = RGBColor(222, 222, 222);
pub(crate) const GRID: RGBColor = RGBColor(232, 232, 232);
pub(crate) const PAPER: RGBColor = RGBColor(255, 255, 255);

/// Highest percentage the dissipation axis reaches; a bar beyond it is
/// drawn to the top of the chart and labelled with its figure.
const DISSIPATION_AXIS_LIMIT: f64 = 400.0;

/// Width and height of both SVGs in pixels (CSS px; typst scales them).
pub const SIZE: (u32, u32) = (760, 330);

/// Why a chart could not be drawn.
#[derive(Debug, thiserror::Error)]
#[error("could not draw the {chart} chart: {message}")]
pub struct PlotError {
    pub chart: &'static str,
    pub message: String,
}

impl PlotError {
    /// The failure as a catalogue message (`cli-chart-failed`), the
    /// plotting library's own words quoted as its detail.
    pub fn msg(&self) -> crate::catalogue::Msg {
        crate::catalogue::Msg::new("cli-chart-failed")
            .arg("chart", self.chart.replace(' ', "-"))
            .arg("detail", self.message.as_str())
    }
}

/// The guide drawn behind the dissipation bars.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Guide {
    /// Fixed bias: the aim band, as percentages of the rating.
    Aim { low_pct: f64, high_pct: f64 },
    /// Cathode bias: the caution line, as a percentage of the rating.
    Caution { pct: f64 },
    /// Mixed bias kinds: only the 100 % line is drawn.
    None,
}

/// One measurement set's figures, one per category of the chart.
#[derive(Debug, Clone, PartialEq)]
pub struct Series {
    pub label: String,
    pub values: Vec<Option<f64>>,
}

/// Data for the plate-dissipation chart.
#[derive(Debug, Clone, PartialEq)]
pub struct DissipationChart {
    /// One label per output valve: position and type.
    pub valves: Vec<String>,
    /// Plate dissipation as % of the rating, per set, per valve.
    pub series: Vec<Series>,
    pub guide: Guide,
    /// The chart's fixed words, in the document's language.
    pub words: Catalogue,
}

/// A supply node on the chain chart.
#[derive(Debug, Clone, PartialEq)]
pub struct SupplyNode {
    pub name: String,
    /// (low, expected, high) volts at nominal mains, when the job gives a
    /// chart figure.
    pub band: Option<(f64, f64, f64)>,
}

/// Data for the supply-chain chart.
#[derive(Debug, Clone, PartialEq)]
pub struct SupplyChart {
    pub nodes: Vec<SupplyNode>,
    /// Corrected volts per set, per node.
    pub series: Vec<Series>,
    pub nominal_volts: f64,
    /// The chart's fixed words, in the document's language.
    pub words: Catalogue,
}

/// The dissipation chart's data, or `None` when no output valve has a
/// plate-dissipation figure in any set. Linear in the sets and valves: each
/// valve's column is found by its position through an index, never by
/// comparing it with every other.
pub fn dissipation_chart(findings: &Findings, cat: &Catalogue) -> Option<DissipationChart> {
    let mut valves: Vec<(&str, &str)> = Vec::new();
    let mut column: HashMap<&str, usize> = HashMap::new();
    let mut kinds: Vec<&str> = Vec::new();
    for set in &findings.sets {
        for v in set
            .valves
            .iter()
            .filter(|v| v.is_output && v.plate_dissipation_pct.is_some())
        {
            column.entry(v.position.as_str()).or_insert_with(|| {
                valves.push((v.position.as_str(), v.valve_type.as_str()));
                valves.len() - 1
            });
            // At most the two bias kinds: a short list.
            if !kinds.contains(&v.bias.as_str()) {
                kinds.push(v.bias.as_str());
            }
        }
    }
    if valves.is_empty() {
        return None;
    }
    let series = findings
        .sets
        .iter()
        .map(|set| {
            // The first valve of the set at each position decides.
            let mut values: Vec<Option<Option<f64>>> = vec![None; valves.len()];
            for v in &set.valves {
                if let Some(&i) = column.get(v.position.as_str())
                    && values[i].is_none()
                {
                    values[i] = Some(v.plate_dissipation_pct);
                }
            }
            Series {
                label: set.label.clone(),
                values: values.into_iter().map(Option::flatten).collect(),
            }
        })
        .collect();
    let s = &findings.settings;
    let guide = match kinds.as_slice() {
        ["fixed"] => Guide::Aim {
            low_pct: s.fixed_bias_low_pct,
            high_pct: s.fixed_bias_high_pct,
        },
        ["cathode"] => Guide::Caution {
            pct: s.cathode_bias_caution_pct,
        },
        _ => Guide::None,
    };
    Some(DissipationChart {
        valves: valves.iter().map(|(p, t)| format!("{p} {t}")).collect(),
        series,
        guide,
        words: cat.clone(),
    })
}

/// The supply chart's data, or `None` when no set reads any node. Linear
/// in the sets and nodes, like [`dissipation_chart`].
pub fn supply_chart(findings: &Findings, cat: &Catalogue) -> Option<SupplyChart> {
    let mut nodes: Vec<SupplyNode> = Vec::new();
    let mut column: HashMap<&str, usize> = HashMap::new();
    for set in &findings.sets {
        for n in &set.nodes {
            let band = n.expected_volts.map(|e| {
                let t = n.tolerance_pct / 100.0;
                (e * (1.0 - t), e, e * (1.0 + t))
            });
            match column.get(n.name.as_str()) {
                Some(&i) => {
                    if nodes[i].band.is_none() {
                        nodes[i].band = band;
                    }
                }
                None => {
                    column.insert(n.name.as_str(), nodes.len());
                    nodes.push(SupplyNode {
                        name: n.name.clone(),
                        band,
                    });
                }
            }
        }
    }
    if nodes.is_empty() {
        return None;
    }
    let series = findings
        .sets
        .iter()
        .map(|set| {
            let mut values = vec![None; nodes.len()];
            for n in &set.nodes {
                if let Some(&i) = column.get(n.name.as_str())
                    && values[i].is_none()
                {
                    values[i] = Some(n.corrected_volts);
                }
            }
            Series {
                label: set.label.clone(),
                values,
            }
        })
        .collect();
    Some(SupplyChart {
        nodes,
        series,
        nominal_volts: findings.mains.nominal_volts,
        words: cat.clone(),
    })
}

/// At most this many measurement sets (or response curves) share one
/// chart; a job with more gets one chart per group of sets, so every chart
/// stays readable and the document's cost grows in step with the job.
pub const SETS_PER_CHART: usize = 8;

/// At most this many valves (or supply nodes) across one chart.
pub const COLUMNS_PER_CHART: usize = 12;

/// One chart of a long job's figures, and which share of them it shows in
/// words ("readings “as found” to “after the swap”; V3 EL34 to V8 EL34"),
/// or `None` when one chart shows everything.
#[derive(Debug, Clone, PartialEq)]
pub struct ChartPart<T> {
    pub chart: T,
    pub part: Option<String>,
}

/// `n` items cut into the fewest groups of at most `most`, as even as can
/// be (20 by 8 gives 7, 7, 6).
pub(crate) fn even_groups(n: usize, most: usize) -> Vec<std::ops::Range<usize>> {
    if n == 0 {
        return Vec::new();
    }
    let count = n.div_ceil(most.max(1));
    let (size, extra) = (n / count, n % count);
    let mut start = 0;
    (0..count)
        .map(|g| {
            let len = size + usize::from(g < extra);
            let range = start..start + len;
            start += len;
            range
        })
        .collect()
}

/// "“a”" or "“a” to “b”", for the first and last of a group.
pub(crate) fn span_words(first: &str, last: &str, quote: bool, cat: &Catalogue) -> String {
    let q = |t: &str| {
        if quote {
            format!("“{}”", label_text(t, 24))
        } else {
            label_text(t, 24)
        }
    };
    if first == last {
        q(first)
    } else {
        cat.format(
            "chart-span",
            &[("first", Arg::from(q(first))), ("last", Arg::from(q(last)))],
        )
    }
}

/// Cuts series over columns into charts of at most [`SETS_PER_CHART`]
/// sets and [`COLUMNS_PER_CHART`] columns, dropping a part with no figure
/// at all. `make` builds a part's chart from its series and column range.
fn split_series<T>(
    series: &[Series],
    columns: &[String],
    cat: &Catalogue,
    make: impl Fn(Vec<Series>, std::ops::Range<usize>) -> T,
) -> Vec<ChartPart<T>> {
    let set_groups = even_groups(series.len(), SETS_PER_CHART);
    let column_groups = even_groups(columns.len(), COLUMNS_PER_CHART);
    let whole = set_groups.len() <= 1 && column_groups.len() <= 1;
    let mut parts = Vec::new();
    for sets in &set_groups {
        for cols in &column_groups {
            let cut: Vec<Series> = series[sets.clone()]
                .iter()
                .map(|s| Series {
                    label: s.label.clone(),
                    values: s.values.get(cols.clone()).unwrap_or_default().to_vec(),
                })
                .collect();
            if !whole && cut.iter().all(|s| s.values.iter().all(Option::is_none)) {
                continue;
            }
            let mut words = Vec::new();
            if set_groups.len() > 1 {
                let span = span_words(
                    &series[sets.start].label,
                    &series[sets.end - 1].label,
                    true,
                    cat,
                );
                words.push(cat.format("chart-part-readings", &[("span", Arg::from(span))]));
            }
            if column_groups.len() > 1 {
                words.push(span_words(
                    &columns[cols.start],
                    &columns[cols.end - 1],
                    false,
                    cat,
                ));
            }
            parts.push(ChartPart {
                chart: make(cut, cols.clone()),
                part: (!whole).then(|| words.join("; ")),
            });
        }
    }
    parts
}

/// The dissipation chart cut into parts for a long job (see
/// [`SETS_PER_CHART`]); one part holding the whole chart otherwise.
pub fn split_dissipation(chart: &DissipationChart) -> Vec<ChartPart<DissipationChart>> {
    split_series(
        &chart.series,
        &chart.valves,
        &chart.words,
        |series, cols| DissipationChart {
            valves: chart.valves[cols].to_vec(),
            series,
            guide: chart.guide,
            words: chart.words.clone(),
        },
    )
}

/// The supply chart cut into parts for a long job, like
/// [`split_dissipation`].
pub fn split_supply(chart: &SupplyChart) -> Vec<ChartPart<SupplyChart>> {
    let names: Vec<String> = chart.nodes.iter().map(|n| n.name.clone()).collect();
    split_series(&chart.series, &names, &chart.words, |series, cols| {
        SupplyChart {
            nodes: chart.nodes[cols].to_vec(),
            series,
            nominal_volts: chart.nominal_volts,
            words: chart.words.clone(),
        }
    })
}

/// Text that is safe and short enough for a chart label: control
/// characters (which XML cannot hold) are dropped and long names are cut.
pub fn label_text(text: &str, max_chars: usize) -> String {
    let clean: String = text
        .chars()
        .map(|c| if c.is_whitespace() { ' ' } else { c })
        .filter(|c| !c.is_control() && !is_xml_forbidden(*c))
        .collect();
    let clean = crate::typeset::drawable(&clean);
    let clean = clean.split_whitespace().collect::<Vec<_>>().join(" ");
    if clean.chars().count() <= max_chars {
        clean
    } else {
        let cut: String = clean.chars().take(max_chars.saturating_sub(1)).collect();
        format!("{}…", cut.trim_end())
    }
}

/// Characters XML 1.0 does not allow in a document.
fn is_xml_forbidden(c: char) -> bool {
    matches!(c, '\u{FFFE}' | '\u{FFFF}')
}

/// A whole-number percentage for a label.
fn pct_label(v: f64) -> String {
    let mut label = whole(v);
    label.push_str(" %");
    label
}

/// A figure as a whole number, or in scientific notation when it would
/// take more than six digits, so a label stays short whatever the value.
fn whole(v: f64) -> String {
    if v.abs() < 999_999.5 {
        // `format!("{v:.0}")`'s text without its exact float path.
        crate::units::fixed(v, 0)
    } else {
        format!("{v:.2e}")
    }
}

/// Largest magnitude a chart works with: every figure is clamped to it
/// before the axis is chosen, so the arithmetic below stays finite.
const CHART_LIMIT: f64 = 1e9;

/// The chart's figures with anything not finite dropped and the rest held
/// within ±[`CHART_LIMIT`].
fn finite_values(values: &[Option<f64>]) -> impl Iterator<Item = f64> + '_ {
    values
        .iter()
        .flatten()
        .filter(|v| v.is_finite())
        .map(|v| v.clamp(-CHART_LIMIT, CHART_LIMIT))
}

/// A value axis: from `bottom` to `top` in steps of `step`, with at most
/// [`Axis::MAX_STEPS`] steps whatever the data, so a chart costs the same
/// for any figures.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Axis {
    pub bottom: f64,
    pub top: f64,
    pub step: f64,
}

impl Axis {
    pub const MAX_STEPS: f64 = 12.0;

    /// The smallest axis on a 1-2-5 step that holds `lo..=hi` with a
    /// little room (`pad` steps) at each end. Any finite inputs give a
    /// finite axis at least one unit tall; non-finite ones are treated as
    /// zero.
    pub(crate) fn fit(lo: f64, hi: f64, pad: f64, min_step: f64) -> Axis {
        let clean = |v: f64| {
            if v.is_finite() {
                v.clamp(-CHART_LIMIT, CHART_LIMIT)
            } else {
                0.0
            }
        };
        let (lo, hi) = (clean(lo.min(hi)), clean(lo.max(hi)));
        let span = (hi - lo).max(1.0);
        let mut step = min_step.max(1.0);
        'search: for _ in 0..40 {
            for m in [1.0, 2.0, 5.0] {
                let candidate = step * m;
                if span / candidate + 2.0 * pad <= Self::MAX_STEPS {
                    step = candidate;
                    break 'search;
                }
            }
            step *= 10.0;
        }
        let bottom = ((lo / step) - pad).floor() * step;
        let top = ((hi / step) + pad).ceil() * step;
        let top = if top - bottom < step {
            bottom + step
        } else {
            top
        };
        Axis { bottom, top, step }
    }

    /// Labels the axis needs, bottom and top included.
    pub(crate) fn labels(&self) -> usize {
        (((self.top - self.bottom) / self.step).round() as usize + 1)
            .min(2 * Self::MAX_STEPS as usize + 2)
    }

    /// `v` held on the axis.
    pub(crate) fn hold(&self, v: f64) -> f64 {
        if v.is_finite() {
            v.clamp(self.bottom, self.top)
        } else {
            self.bottom
        }
    }
}

/// plotters writes a font size `s` into the SVG as `s / 1.24`: the size in
/// pixels the text is really set at.
const SVG_FONT_SCALE: f64 = 1.0 / 1.24;

/// The width in pixels of `text` set in the chart font at `size`,
/// estimated from Noto Sans's advance widths (figures 0.572 em).
pub(crate) fn text_width(text: &str, size: u32) -> f64 {
    let em = f64::from(size) * SVG_FONT_SCALE;
    text.chars()
        .map(|c| match c {
            '0'..='9' | '+' | '−' | '–' => 0.572,
            ' ' | '\u{a0}' => 0.26,
            '.' | ',' | ':' | ';' | 'i' | 'l' | 'j' | 'I' => 0.28,
            '%' => 0.84,
            'm' | 'w' | 'M' | 'W' => 0.86,
            c if c.is_uppercase() => 0.66,
            _ => 0.56,
        })
        .sum::<f64>()
        * em
}

/// A rectangle in pixels, `x0 <= x1`, `y0 <= y1` (y grows downwards).
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct PixelBox {
    pub x0: f64,
    pub y0: f64,
    pub x1: f64,
    pub y1: f64,
}

impl PixelBox {
    pub(crate) fn new(a: (f64, f64), b: (f64, f64)) -> Self {
        PixelBox {
            x0: a.0.min(b.0),
            y0: a.1.min(b.1),
            x1: a.0.max(b.0),
            y1: a.1.max(b.1),
        }
    }

    /// A `w` × `h` box centred on `(cx, cy)`.
    fn centred(cx: f64, cy: f64, w: f64, h: f64) -> Self {
        PixelBox::new((cx - w / 2.0, cy - h / 2.0), (cx + w / 2.0, cy + h / 2.0))
    }

    /// A square of half-width `r` around a point.
    pub(crate) fn around(p: (i32, i32), r: f64) -> Self {
        let (x, y) = (f64::from(p.0), f64::from(p.1));
        PixelBox::new((x - r, y - r), (x + r, y + r))
    }

    fn centre(&self) -> (f64, f64) {
        ((self.x0 + self.x1) / 2.0, (self.y0 + self.y1) / 2.0)
    }

    fn area(&self) -> f64 {
        (self.x1 - self.x0) * (self.y1 - self.y0)
    }

    /// The area both boxes cover.
    pub(crate) fn overlap(&self, o: &PixelBox) -> f64 {
        let w = self.x1.min(o.x1) - self.x0.max(o.x0);
        let h = self.y1.min(o.y1) - self.y0.max(o.y0);
        if w > 0.0 && h > 0.0 { w * h } else { 0.0 }
    }

    fn intersection(&self, o: &PixelBox) -> Option<PixelBox> {
        (self.overlap(o) > 0.0).then(|| PixelBox {
            x0: self.x0.max(o.x0),
            y0: self.y0.max(o.y0),
            x1: self.x1.min(o.x1),
            y1: self.y1.min(o.y1),
        })
    }

    /// How much of the segment `a`–`b` runs inside the box
    /// (Liang–Barsky clipping).
    pub(crate) fn crossing(&self, a: (f64, f64), b: (f64, f64)) -> f64 {
        let (dx, dy) = (b.0 - a.0, b.1 - a.1);
        let (mut t0, mut t1) = (0.0f64, 1.0f64);
        for (p, q) in [
            (-dx, a.0 - self.x0),
            (dx, self.x1 - a.0),
            (-dy, a.1 - self.y0),
            (dy, self.y1 - a.1),
        ] {
            if p == 0.0 {
                if q < 0.0 {
                    return 0.0;
                }
            } else {
                let t = q / p;
                if p < 0.0 {
                    t0 = t0.max(t);
                } else {
                    t1 = t1.min(t);
                }
            }
        }
        if t1 > t0 {
            (t1 - t0) * dx.hypot(dy)
        } else {
            0.0
        }
    }

    fn corners(&self) -> [(i32, i32); 2] {
        [
            (self.x0.round() as i32, self.y0.round() as i32),
            (self.x1.round() as i32, self.y1.round() as i32),
        ]
    }
}

/// A straight line between two pixel points, and what crossing one pixel
/// of it costs a label.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Line {
    pub from: (f64, f64),
    pub to: (f64, f64),
    pub weight: f64,
}

impl Line {
    pub(crate) fn new(from: (f64, f64), to: (f64, f64), weight: f64) -> Self {
        Line { from, to, weight }
    }
}

/// Draws `text` centred in `b` on a patch of whatever lies behind it (paper,
/// or the band colour where it overlaps a band), so a line it could not
/// avoid passes behind the figure rather than through it. `style` is a
/// centred style (`anchored(size, HPos::Center, VPos::Center)`, made once
/// per chart).
pub(crate) fn draw_label(
    area: &DrawingArea<SvgOut<'_>, Shift>,
    b: &PixelBox,
    bands: &[PixelBox],
    text: &str,
    style: &TextStyle<'static>,
) -> Result<(), String> {
    area.draw(&Rectangle::new(b.corners(), PAPER.filled()))
        .map_err(|e| e.to_string())?;
    for band in bands {
        if let Some(part) = b.intersection(band) {
            area.draw(&Rectangle::new(part.corners(), LIGHT.filled()))
                .map_err(|e| e.to_string())?;
        }
    }
    let (cx, cy) = b.centre();
    area.draw(&Label::new(
        text,
        (cx.round() as i32, cy.round() as i32),
        style,
    ))
    .map_err(|e| e.to_string())
}

/// A text at a point, drawn as plotters' `Text` draws one (one
/// `draw_text` of the backend), with a style borrowed rather than owned: a
/// style is made once per chart and not again for each of its hundreds of
/// texts (making one is two allocations, its font's family and style
/// names), nor the text copied into a string of its own.
pub(crate) struct Label<'s> {
    text: &'s str,
    at: [(i32, i32); 1],
    style: &'s TextStyle<'static>,
}

impl<'s> Label<'s> {
    pub(crate) fn new(text: &'s str, at: (i32, i32), style: &'s TextStyle<'static>) -> Self {
        Label {
            text,
            at: [at],
            style,
        }
    }
}

impl<'a> plotters::element::PointCollection<'a, (i32, i32)> for &'a Label<'_> {
    type Point = &'a (i32, i32);
    type IntoIter = &'a [(i32, i32)];
    fn point_iter(self) -> &'a [(i32, i32)] {
        &self.at
    }
}

impl<DB: DrawingBackend> plotters::element::Drawable<DB> for Label<'_> {
    fn draw<I: Iterator<Item = (i32, i32)>>(
        &self,
        mut points: I,
        backend: &mut DB,
        _: (u32, u32),
    ) -> Result<(), plotters_backend::DrawingErrorKind<DB::ErrorType>> {
        if let Some(at) = points.next() {
            return backend.draw_text(self.text, self.style, at);
        }
        Ok(())
    }
}

/// Height of a figure label's box at font size 12 (set at 9.7 px), in
/// pixels.
pub(crate) const LABEL_HEIGHT: f64 = 12.0;

pub(crate) fn err(chart: &'static str) -> impl Fn(String) -> PlotError {
    move |message| PlotError { chart, message }
}

pub(crate) fn font(size: u32) -> TextStyle<'static> {
    (FONT, size).into_font().color(&INK)
}

pub(crate) fn anchored(size: u32, h: HPos, v: VPos) -> TextStyle<'static> {
    font(size).pos(Pos::new(h, v))
}

/// How a set's bars are filled.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Overlay {
    /// Diagonal hatching: reserved for the first set, as found.
    Hatch,
    Solid,
    /// Small dots over the fill, for sets beyond the plain greys.
    Dots,
}

/// The solid greys for the sets after the first, in order.
const FILLS: [RGBColor; 5] = [
    DARK,
    LIGHT,
    MID,
    RGBColor(45, 45, 45),
    RGBColor(195, 195, 195),
];

/// How set `k` is drawn in the bar chart: hatching for the first set (as
/// found), a distinct solid grey for each later set, and the same greys
/// dotted once they run out.
fn bar_pattern(k: usize) -> (RGBColor, Overlay) {
    if k == 0 {
        return (PAPER, Overlay::Hatch);
    }
    let i = k - 1;
    let overlay = if i < FILLS.len() {
        Overlay::Solid
    } else {
        Overlay::Dots
    };
    (FILLS[i % FILLS.len()], overlay)
}

/// Draws a bar's fill with its overlay. A dotted bar's dots are one SVG
/// path ([`DotPath`]: plotters' SVG writer has no paths of many parts, and
/// one `<rect>` per dot made the charts several times larger), written
/// right after the bar's fill.
fn fill_bar(
    area: &DrawingArea<SvgOut<'_>, Shift>,
    a: (i32, i32),
    b: (i32, i32),
    k: usize,
    spacing: i32,
) -> Result<(), String> {
    let (fill, overlay) = bar_pattern(k);
    area.draw(&Rectangle::new([a, b], fill.filled()))
        .map_err(|e| e.to_string())?;
    match overlay {
        Overlay::Hatch => hatch(area, a, b, spacing)?,
        Overlay::Dots => {
            let colour = if fill.0 < 128 { PAPER } else { INK };
            area.draw(&DotPath {
                corners: [a, b],
                colour,
            })
            .map_err(|e| e.to_string())?;
        }
        Overlay::Solid => {}
    }
    area.draw(&Rectangle::new([a, b], INK.stroke_width(1)))
        .map_err(|e| e.to_string())?;
    Ok(())
}

/// The dots over a bar between two corners, as one SVG `<path>` element
/// written straight into the chart's document ([`push_dot_path`]): an
/// element of plotters' for the chart's own writer only.
struct DotPath {
    corners: [(i32, i32); 2],
    colour: RGBColor,
}

impl<'a> plotters::element::PointCollection<'a, (i32, i32)> for &'a DotPath {
    type Point = &'a (i32, i32);
    type IntoIter = &'a [(i32, i32)];
    fn point_iter(self) -> &'a [(i32, i32)] {
        &self.corners
    }
}

impl plotters::element::Drawable<SvgOut<'_>> for DotPath {
    fn draw<I: Iterator<Item = (i32, i32)>>(
        &self,
        mut corners: I,
        backend: &mut SvgOut<'_>,
        _: (u32, u32),
    ) -> Result<(), plotters_backend::DrawingErrorKind<svg_out::Error>> {
        if let (Some(a), Some(b)) = (corners.next(), corners.next()) {
            push_dot_path(backend.document(), a, b, self.colour);
        }
        Ok(())
    }
}

/// Writes the dots over a bar from `a` to `b` as one SVG path of 1-pixel
/// squares, every 5 pixels, each row shifted by 2 from the one before
/// (nothing when the bar is too small to hold one), onto `svg`.
fn push_dot_path(svg: &mut String, a: (i32, i32), b: (i32, i32), colour: RGBColor) {
    let (x0, x1) = (a.0.min(b.0), a.0.max(b.0));
    let (y0, y1) = (a.1.min(b.1), a.1.max(b.1));
    let start = svg.len();
    svg.push_str("<path d=\"");
    let first = svg.len();
    // The numbers written straight into the path, as `write!(d, "M{x}
    // {y}h1v1h-1z")` wrote them: a long job's charts hold millions of
    // dots, and the formatting machinery was half of drawing its bars.
    let mut y = y0 + 3;
    while y < y1 - 1 {
        // The row's y once for all its dots.
        let mut row = itoa::Buffer::new();
        let row = row.format(y);
        let mut x = x0 + 3 + ((y - y0) / 5 % 2) * 2;
        while x < x1 - 1 {
            svg.push('M');
            svg_out::push_i64(svg, i64::from(x));
            svg.push(' ');
            svg.push_str(row);
            svg.push_str("h1v1h-1z");
            x += 5;
        }
        y += 5;
    }
    if svg.len() == first {
        svg.truncate(start);
        return;
    }
    svg.push_str("\" opacity=\"1\" fill=\"");
    svg_out::push_rgb(svg, colour);
    svg.push_str("\" stroke=\"none\"/>\n");
}

/// Legend entries laid out left to right from `left`, wrapping before
/// `right`: the top-left corner of each entry's swatch, and the number of
/// rows. Each entry is `swatch` pixels of mark, a gap and its text.
pub(crate) fn legend_layout(
    labels: &[String],
    left: i32,
    right: i32,
    swatch: i32,
) -> (Vec<(i32, i32)>, i32) {
    let mut out = Vec::new();
    let (mut x, mut row) = (left, 0);
    for label in labels {
        let w = swatch + 8 + text_width(label, 13).ceil() as i32;
        if x > left && x + w > right {
            row += 1;
            x = left;
        }
        out.push((x, LEGEND_TOP + row * LEGEND_ROW));
        x += w + 22;
    }
    (out, row + 1)
}

/// The first legend row's centre line, and the height of each row.
const LEGEND_TOP: i32 = 20;
const LEGEND_ROW: i32 = 22;

/// The top margin that leaves room for `rows` legend rows.
fn legend_margin(rows: i32) -> i32 {
    LEGEND_TOP + (rows - 1) * LEGEND_ROW + 24
}

/// Diagonal lines (lower left to upper right) filling a pixel rectangle.
fn hatch(
    area: &DrawingArea<SvgOut<'_>, Shift>,
    (x0, y0): (i32, i32),
    (x1, y1): (i32, i32),
    spacing: i32,
) -> Result<(), String> {
    let (x0, x1) = (x0.min(x1), x0.max(x1));
    let (y0, y1) = (y0.min(y1), y0.max(y1));
    let mut c = x0 + y0 + spacing;
    let style = INK.stroke_width(1);
    while c < x1 + y1 {
        // Points on x + y = c inside the rectangle.
        let xa = x0.max(c - y1);
        let xb = x1.min(c - y0);
        if xa < xb {
            area.draw(&Segment::new((xa, c - xa), (xb, c - xb), &style))
                .map_err(|e| e.to_string())?;
        }
        c += spacing;
    }
    Ok(())
}

/// A path of two points, drawn as plotters' `PathElement` draws one (one
/// `draw_path` of the backend) without a list of its own: the hatching
/// and dashes are thousands of such strokes in a long job's charts.
struct Segment<'s> {
    points: [(i32, i32); 2],
    style: &'s ShapeStyle,
}

impl<'s> Segment<'s> {
    fn new(from: (i32, i32), to: (i32, i32), style: &'s ShapeStyle) -> Self {
        Segment {
            points: [from, to],
            style,
        }
    }
}

impl<'a> plotters::element::PointCollection<'a, (i32, i32)> for &'a Segment<'_> {
    type Point = &'a (i32, i32);
    type IntoIter = &'a [(i32, i32)];
    fn point_iter(self) -> &'a [(i32, i32)] {
        &self.points
    }
}

impl<DB: DrawingBackend> plotters::element::Drawable<DB> for Segment<'_> {
    fn draw<I: Iterator<Item = (i32, i32)>>(
        &self,
        points: I,
        backend: &mut DB,
        _: (u32, u32),
    ) -> Result<(), plotters_backend::DrawingErrorKind<DB::ErrorType>> {
        backend.draw_path(points, self.style)
    }
}

/// A horizontal dashed line in pixel coordinates.
pub(crate) fn dashed(
    area: &DrawingArea<SvgOut<'_>, Shift>,
    x0: i32,
    x1: i32,
    y: i32,
    style: ShapeStyle,
) -> Result<(), String> {
    let mut x = x0;
    while x < x1 {
        let end = (x + 8).min(x1);
        area.draw(&Segment::new((x, y), (end, y), &style))
            .map_err(|e| e.to_string())?;
        x += 13;
    }
    Ok(())
}

/// A bar chart legend's swatch, centred on `y`, from `x`.
fn legend_swatch_bar(
    area: &DrawingArea<SvgOut<'_>, Shift>,
    x: i32,
    y: i32,
    k: usize,
) -> Result<(), String> {
    fill_bar(area, (x, y - 7), (x + 22, y + 7), k, 6)
}

/// The axes every chart shares: no x labels or upright grid (each chart
/// draws its own categories or frequencies), `y_labels` labelled values
/// with light horizontal rules, and the y axis described by `y_desc`.
///
/// No minor grid (`max_light_lines(0)`): it used to be drawn in the paper's
/// colour straight onto the paper, a hundred or more invisible lines per
/// chart that plotters wrote and typst read for nothing. The charts of
/// `plots/warm_up.rs` and `network_chart.rs` leave it out the same way.
pub(crate) fn draw_mesh<X, Y>(
    ctx: &mut ChartContext<'_, SvgOut<'_>, Cartesian2d<X, Y>>,
    y_labels: usize,
    y_format: &dyn Fn(&Y::ValueType) -> String,
    y_desc: &str,
) -> Result<(), String>
where
    X: Ranged + plotters::coord::ranged1d::ValueFormatter<X::ValueType>,
    Y: Ranged + plotters::coord::ranged1d::ValueFormatter<Y::ValueType>,
{
    ctx.configure_mesh()
        .disable_x_mesh()
        .x_labels(0)
        .x_label_formatter(&|_| String::new())
        .y_labels(y_labels)
        .y_label_formatter(y_format)
        .y_desc(y_desc)
        .axis_desc_style(font(14))
        .label_style(font(13))
        .max_light_lines(0)
        .bold_line_style(GRID.stroke_width(1))
        .axis_style(INK.stroke_width(1))
        .draw()
        .map_err(|e| e.to_string())
}

/// Draws the plate-dissipation chart as an SVG document.
pub fn dissipation_svg(chart: &DissipationChart) -> Result<String, PlotError> {
    dissipation_svg_with(chart, &mut ChartCache::default())
}

/// [`dissipation_svg`] for one of a long job's chart parts, drawn one after
/// another with the same `cache`: a part whose frame is the one drawn
/// last starts from a copy of it.
pub fn dissipation_svg_with(
    chart: &DissipationChart,
    cache: &mut ChartCache,
) -> Result<String, PlotError> {
    let mut svg = String::new();
    let plain = Cell::new(true);
    draw_dissipation(chart, &mut svg, cache, &plain).map_err(err("plate dissipation"))?;
    cache.last_len = svg.len();
    cache.last_plain = plain.get();
    Ok(svg)
}

/// What the start of a dissipation or supply chart's SVG depends on: its
/// opening, the paper, and the frame plotters draws (axes, value labels,
/// rules, the axis's description), which is all it draws before the
/// chart's own figures.
#[derive(Debug, Clone)]
struct Frame {
    margin_top: i32,
    margin_right: i32,
    /// The x axis runs from 0 to this many columns.
    columns: usize,
    bottom: f64,
    top: f64,
    y_labels: usize,
    y_desc: String,
}

impl PartialEq for Frame {
    /// The same frame, to the bit (0 and −0 print differently).
    fn eq(&self, o: &Frame) -> bool {
        self.margin_top == o.margin_top
            && self.margin_right == o.margin_right
            && self.columns == o.columns
            && self.bottom.to_bits() == o.bottom.to_bits()
            && self.top.to_bits() == o.top.to_bits()
            && self.y_labels == o.y_labels
            && self.y_desc == o.y_desc
    }
}

/// The start of the chart drawn last (its SVG up to and including its
/// frame), for the next part of a long job's chart: the parts of one
/// chart nearly always share their frame, and plotters' laying out and
/// drawing of it was a sixth of drawing a part. A part with another frame
/// draws its own and keeps that.
///
/// It also keeps the length of the part drawn last: the next part's SVG
/// is given room for about as much at once, rather than being copied to
/// a larger buffer again and again as it grows.
///
/// And it keeps whether the part drawn last wrote only plain texts
/// ([`crate::typeset::chart_text_is_plain`]; the frame's own texts count
/// for each part that copies it): [`ChartCache::last_plain`].
#[derive(Debug, Default)]
pub struct ChartCache {
    /// The frame, the SVG up to and with it, and whether its texts were
    /// plain.
    start: Option<(Frame, String, bool)>,
    last_len: usize,
    last_plain: bool,
}

impl ChartCache {
    /// Whether every text of the chart drawn last with this cache (by
    /// [`dissipation_svg_with`] or [`supply_svg_with`]) was plain
    /// ([`crate::typeset::chart_text_is_plain`]), so that its SVG needs no
    /// CJK face (`Sandbox::insert_plain_chart`). False before any.
    pub fn last_plain(&self) -> bool {
        self.last_plain
    }
}

/// The chart's plotting area in `root` for `frame`.
fn frame_context<'a, 'b>(
    root: &'a DrawingArea<SvgOut<'b>, Shift>,
    frame: &Frame,
) -> Result<ChartContext<'a, SvgOut<'b>, Cartesian2d<RangedCoordf64, RangedCoordf64>>, String> {
    ChartBuilder::on(root)
        .margin_top(frame.margin_top)
        .margin_right(frame.margin_right)
        .margin_left(8)
        .margin_bottom(6)
        .x_label_area_size(34)
        .y_label_area_size(62)
        .build_cartesian_2d(0f64..frame.columns as f64, frame.bottom..frame.top)
        .map_err(|e| e.to_string())
}

/// Opens a chart's SVG in `svg` with the paper and `frame` drawn, as
/// `SvgOut::with_string`, `fill` and [`draw_mesh`] write them, copied
/// from `cache` when its frame is this one; returns the drawing area and
/// the plotting area to draw the figures on.
fn open_chart<'b>(
    svg: &'b mut String,
    frame: &Frame,
    cache: &mut ChartCache,
    plain: &'b Cell<bool>,
) -> Result<DrawingArea<SvgOut<'b>, Shift>, String> {
    let (start, start_plain) = match &cache.start {
        Some((kept, start, start_plain)) if kept == frame => (start, *start_plain),
        _ => {
            let mut start = String::new();
            let start_plain = Cell::new(true);
            {
                let root = SvgOut::opening(&mut start, SIZE)
                    .noting_text(&start_plain)
                    .into_drawing_area();
                root.fill(&PAPER).map_err(|e| e.to_string())?;
                let mut ctx = frame_context(&root, frame)?;
                draw_mesh(
                    &mut ctx,
                    frame.y_labels,
                    &|v| crate::units::fixed(*v, 0),
                    &frame.y_desc,
                )?;
            }
            let start_plain = start_plain.get();
            let kept = cache.start.insert((frame.clone(), start, start_plain));
            (&kept.1, start_plain)
        }
    };
    if !start_plain {
        plain.set(false);
    }
    svg.reserve(start.len().max(cache.last_len + cache.last_len / 8));
    svg.push_str(start);
    Ok(SvgOut::after_opening(svg, SIZE)
        .noting_text(plain)
        .into_drawing_area())
}

/// Runs a chart's drawing function into a fresh SVG string.
pub(crate) fn to_svg<T>(
    chart: &T,
    what: &'static str,
    draw: fn(&T, &mut String) -> Result<(), String>,
) -> Result<String, PlotError> {
    let mut svg = String::new();
    draw(chart, &mut svg).map_err(err(what))?;
    Ok(svg)
}

/// The plate-dissipation chart.
fn draw_dissipation(
    chart: &DissipationChart,
    svg: &mut String,
    cache: &mut ChartCache,
    plain: &Cell<bool>,
) -> Result<(), String> {
    let n = chart.valves.len().max(1);
    let sets = chart.series.len().max(1);
    let highest = chart
        .series
        .iter()
        .flat_map(|s| finite_values(&s.values))
        .fold(0.0f64, f64::max);
    // Room above the tallest bar (or the rating line) for its figure; a
    // bar far past its rating runs off the top with its figure there.
    let top = ((highest.clamp(100.0, DISSIPATION_AXIS_LIMIT) + 14.0) / 10.0).ceil() * 10.0;
    let axis = Axis::fit(0.0, top, 0.0, 10.0);
    let top = axis.top;

    // The legend first: it wraps onto as many rows as the sets need, and
    // the plot starts below it.
    let legend_labels: Vec<String> = chart
        .series
        .iter()
        .map(|s| label_text(&s.label, 24))
        .collect();
    let right_edge = SIZE.0 as i32 - 104;
    let (legend, rows) = legend_layout(&legend_labels, 70, right_edge, 22);

    let frame = Frame {
        margin_top: legend_margin(rows),
        margin_right: 104,
        columns: n,
        bottom: 0.0,
        top,
        y_labels: axis.labels(),
        y_desc: chart.words.text("chart-dissipation-axis"),
    };
    let root = open_chart(svg, &frame, cache, plain)?;
    let mut ctx = frame_context(&root, &frame)?;

    let (left, _) = ctx.backend_coord(&(0.0, 0.0));
    let (right, _) = ctx.backend_coord(&(n as f64, 0.0));

    // The guide first, so the bars sit on top of it; its words go in the
    // right margin, clear of the bars.
    match chart.guide {
        Guide::Aim { low_pct, high_pct } => {
            let (low_pct, high_pct) = (axis.hold(low_pct), axis.hold(high_pct));
            ctx.draw_series(std::iter::once(Rectangle::new(
                [(0.0, low_pct), (n as f64, high_pct)],
                LIGHT.filled(),
            )))
            .map_err(|e| e.to_string())?;
            let mid = ctx.backend_coord(&(0.0, (low_pct + high_pct) / 2.0)).1;
            root.draw(&Text::new(
                chart.words.text("chart-fixed-bias-aim"),
                (right + 8, mid - 8),
                anchored(12, HPos::Left, VPos::Center),
            ))
            .map_err(|e| e.to_string())?;
            root.draw(&Text::new(
                format!("{low_pct:.0}–{high_pct:.0} %"),
                (right + 8, mid + 8),
                anchored(12, HPos::Left, VPos::Center),
            ))
            .map_err(|e| e.to_string())?;
        }
        Guide::Caution { pct } => {
            let y = ctx.backend_coord(&(0.0, axis.hold(pct))).1;
            dashed(&root, left, right, y, INK.stroke_width(1))?;
            root.draw(&Text::new(
                chart
                    .words
                    .format("chart-caution", &[("pct", Arg::from(format!("{pct:.0}")))]),
                (right + 8, y + 2),
                anchored(12, HPos::Left, VPos::Top),
            ))
            .map_err(|e| e.to_string())?;
        }
        Guide::None => {}
    }

    // Bars: each valve a group, each set a bar in it. The group widens
    // with the number of sets so each bar keeps a usable column.
    let group = (0.62 + 0.08 * (sets as f64 - 2.0)).clamp(0.62, 0.88);
    let bar = group / sets as f64;
    // Each bar's column: its slot of the group, `bar` wide.
    let mut bars: Vec<(PixelBox, PixelBox, String)> = Vec::new();
    for (k, series) in chart.series.iter().enumerate() {
        for (i, value) in series.values.iter().enumerate() {
            let Some(figure) = value.filter(|v| v.is_finite()) else {
                continue;
            };
            let v = axis.hold(figure);
            let slot = i as f64 + (1.0 - group) / 2.0 + k as f64 * bar;
            let x0 = slot + bar * 0.05;
            let x1 = slot + bar * 0.95;
            let a = ctx.backend_coord(&(x0, v));
            let b = ctx.backend_coord(&(x1, 0.0));
            fill_bar(&root, a, b, k, 7)?;
            let pixels = PixelBox::new(
                (f64::from(a.0), f64::from(a.1)),
                (f64::from(b.0), f64::from(b.1)),
            );
            let c0 = f64::from(ctx.backend_coord(&(slot, 0.0)).0);
            let c1 = f64::from(ctx.backend_coord(&(slot + bar, 0.0)).0);
            let column = PixelBox::new((c0, 0.0), (c1, f64::from(SIZE.1)));
            bars.push((pixels, column, pct_label(figure)));
        }
    }

    // The rating line over everything.
    let y100 = ctx.backend_coord(&(0.0, 100.0)).1;
    root.draw(&PathElement::new(
        vec![(left, y100), (right, y100)],
        INK.stroke_width(2),
    ))
    .map_err(|e| e.to_string())?;
    root.draw(&Text::new(
        chart.words.text("chart-full-rating"),
        (right + 8, y100 - 2),
        anchored(12, HPos::Left, VPos::Bottom),
    ))
    .map_err(|e| e.to_string())?;

    // Each bar's figure just above it, inside the bar's own column, moved
    // up clear of the rating and caution lines when they run through that
    // place. A figure wider than its column stands on end.
    let (_, plot_top) = ctx.backend_coord(&(0.0, top));
    let (_, plot_bottom) = ctx.backend_coord(&(0.0, 0.0));
    let mut obstacles = Obstacles::new(PixelBox::new(
        (f64::from(left), f64::from(plot_top)),
        (f64::from(right), f64::from(plot_bottom)),
    ));
    for (b, _, _) in &bars {
        obstacles.add_solid(*b);
    }
    let (l, r) = (f64::from(left), f64::from(right));
    obstacles.add_line(Line::new((l, f64::from(y100)), (r, f64::from(y100)), 40.0));
    match chart.guide {
        Guide::Caution { pct } => {
            let y = f64::from(ctx.backend_coord(&(0.0, axis.hold(pct))).1);
            obstacles.add_line(Line::new((l, y), (r, y), 25.0));
        }
        Guide::Aim { low_pct, high_pct } => {
            let lo = f64::from(ctx.backend_coord(&(0.0, axis.hold(low_pct))).1);
            let hi = f64::from(ctx.backend_coord(&(0.0, axis.hold(high_pct))).1);
            obstacles.add_band(PixelBox::new((l, hi), (r, lo)));
        }
        Guide::None => {}
    }
    let bands = obstacles.bands().to_vec();
    let figure = anchored(12, HPos::Center, VPos::Center);
    let upright_figure = figure.clone().transform(FontTransform::Rotate270);
    for (pixels, column, text) in &bars {
        let w = text_width(text, 12) + 4.0;
        let upright = w > column.x1 - column.x0;
        let (bw, bh) = if upright {
            (LABEL_HEIGHT, w)
        } else {
            (w, LABEL_HEIGHT)
        };
        let cx = (pixels.x0 + pixels.x1) / 2.0;
        let candidates: Vec<PixelBox> = (0..60)
            .map(|k| {
                let bottom = pixels.y0 - 2.0 - f64::from(k) * 2.0;
                PixelBox::new((cx - bw / 2.0, bottom - bh), (cx + bw / 2.0, bottom))
            })
            .collect();
        let place = obstacles.place(&candidates);
        if upright {
            draw_label(&root, &place, &bands, text, &upright_figure)?;
        } else {
            draw_label(&root, &place, &bands, text, &figure)?;
        }
    }

    // Category labels under the axis.
    let category = anchored(13, HPos::Center, VPos::Top);
    for (i, label) in chart.valves.iter().enumerate() {
        let (x, y) = ctx.backend_coord(&(i as f64 + 0.5, 0.0));
        root.draw(&Label::new(&label_text(label, 18), (x, y + 8), &category))
            .map_err(|e| e.to_string())?;
    }

    // Legend along the top, wrapped.
    let legend_style = anchored(13, HPos::Left, VPos::Center);
    for (k, ((x, y), text)) in legend.iter().zip(&legend_labels).enumerate() {
        legend_swatch_bar(&root, *x, *y, k)?;
        root.draw(&Label::new(text, (x + 30, *y), &legend_style))
            .map_err(|e| e.to_string())?;
    }
    root.present().map_err(|e| e.to_string())?;
    Ok(())
}

/// How set `k` is marked in the supply chart.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Marker {
    HollowCircle,
    FilledTriangle,
    HollowSquare,
    FilledDiamond,
    FilledCircle,
    HollowTriangle,
    FilledSquare,
    HollowDiamond,
}

pub(crate) fn marker(k: usize) -> Marker {
    match k % 8 {
        0 => Marker::HollowCircle,
        1 => Marker::FilledTriangle,
        2 => Marker::HollowSquare,
        3 => Marker::FilledDiamond,
        4 => Marker::FilledCircle,
        5 => Marker::HollowTriangle,
        6 => Marker::FilledSquare,
        _ => Marker::HollowDiamond,
    }
}

pub(crate) fn draw_marker(
    area: &DrawingArea<SvgOut<'_>, Shift>,
    (x, y): (i32, i32),
    m: Marker,
) -> Result<(), String> {
    let r = 6;
    let result = match m {
        Marker::HollowCircle => area
            .draw(&Circle::new((x, y), r, PAPER.filled()))
            .and_then(|_| area.draw(&Circle::new((x, y), r, INK.stroke_width(2)))),
        Marker::FilledTriangle => area.draw(&Polygon::new(
            vec![(x, y - r - 1), (x + r + 1, y + r), (x - r - 1, y + r)],
            INK.filled(),
        )),
        Marker::HollowSquare => area
            .draw(&Rectangle::new(
                [(x - r, y - r), (x + r, y + r)],
                PAPER.filled(),
            ))
            .and_then(|_| {
                area.draw(&Rectangle::new(
                    [(x - r, y - r), (x + r, y + r)],
                    INK.stroke_width(2),
                ))
            }),
        Marker::FilledDiamond => area.draw(&Polygon::new(
            vec![
                (x, y - r - 1),
                (x + r + 1, y),
                (x, y + r + 1),
                (x - r - 1, y),
            ],
            INK.filled(),
        )),
        Marker::FilledCircle => area.draw(&Circle::new((x, y), r, INK.filled())),
        Marker::HollowTriangle => {
            let pts = vec![
                (x, y - r - 1),
                (x + r + 1, y + r),
                (x - r - 1, y + r),
                (x, y - r - 1),
            ];
            area.draw(&Polygon::new(pts.clone(), PAPER.filled()))
                .and_then(|_| area.draw(&PathElement::new(pts, INK.stroke_width(2))))
        }
        Marker::FilledSquare => area.draw(&Rectangle::new(
            [(x - r, y - r), (x + r, y + r)],
            INK.filled(),
        )),
        Marker::HollowDiamond => {
            let pts = vec![
                (x, y - r - 1),
                (x + r + 1, y),
                (x, y + r + 1),
                (x - r - 1, y),
                (x, y - r - 1),
            ];
            area.draw(&Polygon::new(pts.clone(), PAPER.filled()))
                .and_then(|_| area.draw(&PathElement::new(pts, INK.stroke_width(2))))
        }
    };
    result.map_err(|e| e.to_string())
}

/// Places for a marker's figure, best first: beside the marker on the
/// preferred side, above and below it, diagonally, then the other side,
/// then further out.
pub(crate) fn label_spots(p: (i32, i32), w: f64, h: f64, left_first: bool) -> Vec<PixelBox> {
    let (x, y) = (f64::from(p.0), f64::from(p.1));
    let side = if left_first { -1.0 } else { 1.0 };
    let beside = |s: f64, far: f64| PixelBox::centred(x + s * (11.0 + far + w / 2.0), y, w, h);
    let diagonal = |s: f64, up: f64| {
        PixelBox::centred(x + s * (5.0 + w / 2.0), y + up * (8.0 + h / 2.0), w, h)
    };
    let straight = |up: f64| PixelBox::centred(x, y + up * (10.0 + h / 2.0), w, h);
    vec![
        beside(side, 0.0),
        straight(-1.0),
        straight(1.0),
        diagonal(side, -1.0),
        diagonal(side, 1.0),
        beside(-side, 0.0),
        diagonal(-side, -1.0),
        diagonal(-side, 1.0),
        beside(side, 10.0),
        beside(-side, 10.0),
        straight(-2.2),
        straight(2.2),
    ]
}

/// One reading on the supply chart: its volts and where its marker sits.
type Reading = (f64, (i32, i32));

/// Draws the supply-chain chart as an SVG document.
pub fn supply_svg(chart: &SupplyChart) -> Result<String, PlotError> {
    supply_svg_with(chart, &mut ChartCache::default())
}

/// [`supply_svg`] for one of a long job's chart parts, like
/// [`dissipation_svg_with`].
pub fn supply_svg_with(chart: &SupplyChart, cache: &mut ChartCache) -> Result<String, PlotError> {
    let mut svg = String::new();
    let plain = Cell::new(true);
    draw_supply(chart, &mut svg, cache, &plain).map_err(err("supply chain"))?;
    cache.last_len = svg.len();
    cache.last_plain = plain.get();
    Ok(svg)
}

fn draw_supply(
    chart: &SupplyChart,
    svg: &mut String,
    cache: &mut ChartCache,
    plain: &Cell<bool>,
) -> Result<(), String> {
    let n = chart.nodes.len().max(1);
    let sets = chart.series.len().max(1);
    let mut figures: Vec<f64> = chart
        .series
        .iter()
        .flat_map(|s| finite_values(&s.values))
        .collect();
    for node in &chart.nodes {
        if let Some((lo, _, hi)) = node.band {
            figures.extend(finite_values(&[Some(lo), Some(hi)]));
        }
    }
    let lo = figures.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = figures.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    let (lo, hi) = if lo.is_finite() && hi.is_finite() {
        (lo, hi)
    } else {
        (0.0, 100.0)
    };
    // Whole 50 V steps for a supply chain, coarser when the figures spread
    // wider; never below zero unless a reading is.
    let axis = Axis::fit(lo.min(hi - 1.0), hi, 0.3, 50.0);
    let axis = Axis {
        bottom: if lo >= 0.0 {
            axis.bottom.max(0.0)
        } else {
            axis.bottom
        },
        ..axis
    };
    let (bottom, top) = (axis.bottom, axis.top);

    let band_text = chart.words.text("chart-expected-band");
    let legend_labels: Vec<String> = std::iter::once(band_text.clone())
        .chain(chart.series.iter().map(|s| label_text(&s.label, 24)))
        .collect();
    let (legend, rows) = legend_layout(&legend_labels, 70, SIZE.0 as i32 - 16, 22);

    let frame = Frame {
        margin_top: legend_margin(rows),
        margin_right: 16,
        columns: n,
        bottom,
        top,
        y_labels: 2 * axis.labels(),
        y_desc: chart.words.format(
            "chart-supply-axis",
            &[("nominal", Arg::from(whole(chart.nominal_volts)))],
        ),
    };
    let root = open_chart(svg, &frame, cache, plain)?;
    let mut ctx = frame_context(&root, &frame)?;
    let (left, _) = ctx.backend_coord(&(0.0, bottom));

    // Bands: the expected figure ± tolerance, as a grey column per node.
    let (_, plot_top) = ctx.backend_coord(&(0.0, top));
    let (right, plot_bottom) = ctx.backend_coord(&(n as f64, bottom));
    let mut obstacles = Obstacles::new(PixelBox::new(
        (f64::from(left), f64::from(plot_top)),
        (f64::from(right), f64::from(plot_bottom)),
    ));
    for (i, node) in chart.nodes.iter().enumerate() {
        if let Some((lo, expected, hi)) = node.band {
            let (lo, expected, hi) = (axis.hold(lo), axis.hold(expected), axis.hold(hi));
            let x0 = i as f64 + 0.22;
            let x1 = i as f64 + 0.78;
            ctx.draw_series(std::iter::once(Rectangle::new(
                [(x0, lo), (x1, hi)],
                LIGHT.filled(),
            )))
            .map_err(|e| e.to_string())?;
            let a = ctx.backend_coord(&(x0, expected));
            let b = ctx.backend_coord(&(x1, expected));
            dashed(&root, a.0, b.0, a.1, INK.stroke_width(1))?;
            let (p, q) = (ctx.backend_coord(&(x0, lo)), ctx.backend_coord(&(x1, hi)));
            obstacles.add_band(PixelBox::new(
                (f64::from(p.0), f64::from(p.1)),
                (f64::from(q.0), f64::from(q.1)),
            ));
            obstacles.add_line(Line::new(
                (f64::from(a.0), f64::from(a.1)),
                (f64::from(b.0), f64::from(b.1)),
                12.0,
            ));
        }
    }

    // One polyline and marker per set, offset sideways so sets sit side by
    // side: every line first, then every marker over them.
    let spread = if sets > 1 {
        0.36 / (sets - 1) as f64
    } else {
        0.0
    };
    let offset = |k: usize| {
        if sets == 1 {
            0.5
        } else {
            0.5 - 0.18 + k as f64 * spread
        }
    };
    let points: Vec<Vec<Reading>> = chart
        .series
        .iter()
        .enumerate()
        .map(|(k, series)| {
            series
                .values
                .iter()
                .enumerate()
                .filter_map(|(i, v)| {
                    v.filter(|v| v.is_finite())
                        .map(|v| (v, ctx.backend_coord(&(i as f64 + offset(k), axis.hold(v)))))
                })
                .collect()
        })
        .collect();
    for line in &points {
        let path: Vec<(i32, i32)> = line.iter().map(|(_, p)| *p).collect();
        if path.len() > 1 {
            root.draw(&PathElement::new(path.clone(), MID.stroke_width(1)))
                .map_err(|e| e.to_string())?;
            for pair in path.windows(2) {
                let (a, b) = (pair[0], pair[1]);
                obstacles.add_line(Line::new(
                    (f64::from(a.0), f64::from(a.1)),
                    (f64::from(b.0), f64::from(b.1)),
                    20.0,
                ));
            }
        }
    }
    for (k, line) in points.iter().enumerate() {
        for (_, p) in line {
            draw_marker(&root, *p, marker(k))?;
            obstacles.add_solid(PixelBox::around(*p, 9.0));
        }
    }

    // Figures last, each where it covers no marker, figure or line if
    // there is such a place near its marker: the first set's on the left
    // by preference, the second's on the right (with more than two sets
    // the table carries the figures).
    if sets <= 2 {
        let bands = obstacles.bands().to_vec();
        let figure = anchored(12, HPos::Center, VPos::Center);
        for (k, line) in points.iter().enumerate() {
            for (v, p) in line {
                let text = whole(*v);
                let w = text_width(&text, 12) + 4.0;
                let candidates = label_spots(*p, w, LABEL_HEIGHT, k == 0);
                let place = obstacles.place(&candidates);
                draw_label(&root, &place, &bands, &text, &figure)?;
            }
        }
    }

    let category = anchored(13, HPos::Center, VPos::Top);
    for (i, node) in chart.nodes.iter().enumerate() {
        let (x, y) = ctx.backend_coord(&(i as f64 + 0.5, bottom));
        root.draw(&Label::new(
            &label_text(&node.name, 18),
            (x, y + 8),
            &category,
        ))
        .map_err(|e| e.to_string())?;
    }

    // Legend: the band, then each set's marker, wrapped.
    let (x, y) = legend[0];
    root.draw(&Rectangle::new(
        [(x, y - 7), (x + 22, y + 7)],
        LIGHT.filled(),
    ))
    .map_err(|e| e.to_string())?;
    dashed(&root, x, x + 22, y, INK.stroke_width(1))?;
    let legend_style = anchored(13, HPos::Left, VPos::Center);
    root.draw(&Label::new(&band_text, (x + 30, y), &legend_style))
        .map_err(|e| e.to_string())?;
    for (k, ((x, y), text)) in legend
        .iter()
        .skip(1)
        .zip(legend_labels.iter().skip(1))
        .enumerate()
    {
        draw_marker(&root, (x + 11, *y), marker(k))?;
        root.draw(&Label::new(text, (x + 30, *y), &legend_style))
            .map_err(|e| e.to_string())?;
    }
    root.present().map_err(|e| e.to_string())?;
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_chart_that_cannot_be_drawn_is_said_in_the_readers_language() {
        let e = PlotError {
            chart: "plate dissipation",
            message: "backend failed".into(),
        };
        assert_eq!(
            e.to_string(),
            "could not draw the plate dissipation chart: backend failed"
        );
        assert_eq!(e.msg().english(), e.to_string());
        let de = crate::catalogue::Catalogue::built_in("de").unwrap();
        assert_eq!(
            de.say(&e.msg()),
            "das Diagramm der Anodenverlustleistung ließ sich nicht zeichnen: backend failed"
        );
        for chart in [
            "supply chain",
            "warm-up",
            "network response",
            "frequency response",
        ] {
            let e = PlotError {
                chart,
                message: "x".into(),
            };
            assert_eq!(e.msg().english(), e.to_string(), "{chart}");
        }
    }

    /// The text content of every `<text>` element, trimmed.
    fn texts(svg: &str) -> Vec<String> {
        svg.split("<text")
            .skip(1)
            .filter_map(|t| {
                let start = t.find('>')? + 1;
                let end = t.find("</text>")?;
                Some(t[start..end].trim().to_string())
            })
            .collect()
    }

    /// `<rect>` elements filled with `colour` (as `#RRGGBB`).
    fn rects_filled(svg: &str, colour: &str) -> usize {
        svg.lines()
            .filter(|l| l.contains("<rect") && l.contains(&format!("fill=\"{colour}\"")))
            .count()
    }

    fn hex(c: RGBColor) -> String {
        format!("#{:02X}{:02X}{:02X}", c.0, c.1, c.2)
    }

    /// The value of attribute `name` in one SVG element.
    fn attr(element: &str, name: &str) -> Option<String> {
        let start = element.find(&format!(" {name}=\""))? + name.len() + 3;
        let end = element[start..].find('"')? + start;
        Some(element[start..end].to_string())
    }

    fn num(element: &str, name: &str) -> f64 {
        attr(element, name).and_then(|v| v.parse().ok()).unwrap()
    }

    struct SvgRect {
        b: PixelBox,
        fill: String,
    }

    /// Every `<rect>` but the page background.
    fn rects(svg: &str) -> Vec<SvgRect> {
        svg.lines()
            .filter(|l| l.trim_start().starts_with("<rect"))
            .skip(1)
            .map(|l| {
                let (x, y) = (num(l, "x"), num(l, "y"));
                SvgRect {
                    b: PixelBox::new((x, y), (x + num(l, "width"), y + num(l, "height"))),
                    fill: attr(l, "fill").unwrap(),
                }
            })
            .collect()
    }

    /// Label patches: paper-coloured rectangles the height of a figure.
    fn patches(svg: &str) -> Vec<PixelBox> {
        rects(svg)
            .into_iter()
            .filter(|r| r.fill == hex(PAPER) && (r.b.y1 - r.b.y0 - LABEL_HEIGHT).abs() < 1.5)
            .map(|r| r.b)
            .collect()
    }

    /// The boxes of the plotted markers (circles and polygons), outside
    /// the legend row.
    fn markers(svg: &str) -> Vec<PixelBox> {
        let mut out = Vec::new();
        for l in svg.lines().map(str::trim_start) {
            if l.starts_with("<circle") && attr(l, "fill").as_deref() == Some("none") {
                let (x, y, r) = (num(l, "cx"), num(l, "cy"), num(l, "r"));
                out.push(PixelBox::new(
                    (x - r - 1.0, y - r - 1.0),
                    (x + r + 1.0, y + r + 1.0),
                ));
            } else if l.starts_with("<polygon") {
                let pts: Vec<(f64, f64)> = attr(l, "points")
                    .unwrap()
                    .split_whitespace()
                    .map(|p| {
                        let (x, y) = p.split_once(',').unwrap();
                        (x.parse().unwrap(), y.parse().unwrap())
                    })
                    .collect();
                let xs = pts.iter().map(|p| p.0);
                let ys = pts.iter().map(|p| p.1);
                out.push(PixelBox::new(
                    (
                        xs.clone().fold(f64::INFINITY, f64::min),
                        ys.clone().fold(f64::INFINITY, f64::min),
                    ),
                    (
                        xs.fold(f64::NEG_INFINITY, f64::max),
                        ys.fold(f64::NEG_INFINITY, f64::max),
                    ),
                ));
            }
        }
        out.retain(|b| b.y0 > 40.0);
        out
    }

    fn two_sets() -> DissipationChart {
        DissipationChart {
            words: crate::catalogue::Catalogue::english().clone(),
            valves: vec!["V3 EL84".into(), "V4 EL84".into()],
            series: vec![
                Series {
                    label: "as found".into(),
                    values: vec![Some(121.3), Some(120.6)],
                },
                Series {
                    label: "as left".into(),
                    values: vec![Some(88.2), None],
                },
            ],
            guide: Guide::Caution { pct: 90.0 },
        }
    }

    /// What the fonts' check answers for an SVG, read in full.
    fn svg_needs_cjk(svg: &str) -> bool {
        let mut sandbox = crate::typeset::Sandbox::new();
        sandbox.insert("plots/chart.svg", svg).unwrap();
        crate::typeset::needs_cjk(&sandbox)
    }

    /// A chart says whether its texts were plain, part after part with
    /// one cache, and the fonts' check reading it agrees.
    #[test]
    fn a_chart_says_whether_its_texts_were_plain() {
        let mut cache = ChartCache::default();
        assert!(!cache.last_plain());
        let mut cjk = two_sets();
        cjk.valves[1] = "V4 \u{4e2d}".into();
        for (chart, plain) in [(two_sets(), true), (cjk, false), (two_sets(), true)] {
            let svg = dissipation_svg_with(&chart, &mut cache).unwrap();
            assert_eq!(cache.last_plain(), plain);
            assert_eq!(svg_needs_cjk(&svg), !plain);
        }
    }

    /// A frame's texts count for every part that copies it from the
    /// cache, as for the part that drew it.
    #[test]
    fn a_kept_frame_brings_its_texts_word_along() {
        for (desc, plain) in [
            ("Plate dissipation, % of rating", true),
            ("\u{9633}\u{6781} %", false),
            ("a font: 9px", false),
        ] {
            let frame = Frame {
                margin_top: 10,
                margin_right: 12,
                columns: 3,
                bottom: 0.0,
                top: 120.0,
                y_labels: 5,
                y_desc: desc.to_string(),
            };
            let mut cache = ChartCache::default();
            for round in ["drawn", "copied"] {
                let mut svg = String::new();
                let word = Cell::new(true);
                drop(open_chart(&mut svg, &frame, &mut cache, &word).unwrap());
                assert!(svg.contains(desc) && svg.ends_with("</svg>\n"), "{svg}");
                assert_eq!(word.get(), plain, "{desc}, {round}");
                assert_eq!(svg_needs_cjk(&svg), !plain, "{desc}, {round}");
            }
        }
    }

    #[test]
    fn dissipation_bars_carry_their_figures() {
        let svg = dissipation_svg(&two_sets()).unwrap();
        let t = texts(&svg);
        for want in [
            "121 %",
            "88 %",
            "V3 EL84",
            "V4 EL84",
            "as found",
            "as left",
            "caution 90 %",
            "100 % rating",
        ] {
            assert!(t.iter().any(|x| x == want), "{want} missing from {t:?}");
        }
        // 120.6 rounds to 121 too: two "121 %" labels, and no bar for the missing figure.
        assert_eq!(t.iter().filter(|x| *x == "121 %").count(), 2);
        assert_eq!(
            t.iter()
                .filter(|x| x.ends_with(" %") && x.chars().next().unwrap().is_ascii_digit())
                .count(),
            3
        );
        // Three bars plus one legend swatch per set: as found white (hatched), as left dark.
        assert_eq!(rects_filled(&svg, &hex(DARK)), 1 + 1);
        assert!(t.iter().any(|x| x == "Plate dissipation, % of rating"));
    }

    #[test]
    fn the_grid_is_its_labelled_rules_only() {
        // The labelled rules are drawn in the grid's grey; no minor grid in
        // the paper's colour (invisible on the paper, drawn for nothing).
        let svg = dissipation_svg(&two_sets()).unwrap();
        let rules = svg
            .lines()
            .filter(|l| l.starts_with("<line ") && l.contains("stroke=\"#E8E8E8\""))
            .count();
        assert!(rules >= 5, "{rules} grid rules");
        assert!(
            !svg.lines().any(|l| l.contains("stroke=\"#FFFFFF\"")),
            "a line in the paper's colour"
        );
    }

    #[test]
    fn dotted_bars_are_one_path_each_with_every_dot() {
        // Eight sets: the seventh and eighth are dotted (greys run out).
        let mut chart = two_sets();
        chart.series = (0..8)
            .map(|k| Series {
                label: format!("set {k}"),
                values: vec![Some(80.0 + k as f64), Some(60.0)],
            })
            .collect();
        let svg = dissipation_svg(&chart).unwrap();
        // Two dotted sets: two bars and a legend swatch each.
        let paths: Vec<&str> = svg.lines().filter(|l| l.starts_with("<path ")).collect();
        assert_eq!(paths.len(), 6, "{paths:?}");
        // Each path holds the 1-pixel squares the dots always were: every
        // 5 pixels from 3 inside the bar, alternate rows shifted by 2.
        let dot_path = |a, b, colour| {
            let mut svg = String::new();
            push_dot_path(&mut svg, a, b, colour);
            (!svg.is_empty()).then_some(svg)
        };
        let element = dot_path((10, 40), (24, 10), PAPER).unwrap();
        assert!(element.ends_with("fill=\"#FFFFFF\" stroke=\"none\"/>\n"));
        let d = element.split('"').nth(1).unwrap();
        let squares: Vec<(i32, i32)> = d
            .split('M')
            .skip(1)
            .map(|sq| {
                let xy = sq.strip_suffix("h1v1h-1z").unwrap();
                let (x, y) = xy.split_once(' ').unwrap();
                (x.parse().unwrap(), y.parse().unwrap())
            })
            .collect();
        let mut want = Vec::new();
        for y in (13..39).step_by(5) {
            let first = 13 + ((y - 10) / 5 % 2) * 2;
            for x in (first..23).step_by(5) {
                want.push((x, y));
            }
        }
        assert_eq!(squares, want);
        assert_eq!(dot_path((0, 0), (3, 3), INK), None, "too small for a dot");
    }

    #[test]
    fn fixed_bias_draws_the_aim_band() {
        let mut chart = two_sets();
        chart.guide = Guide::Aim {
            low_pct: 50.0,
            high_pct: 70.0,
        };
        let svg = dissipation_svg(&chart).unwrap();
        let t = texts(&svg);
        assert!(
            t.iter().any(|x| x == "fixed-bias aim") && t.iter().any(|x| x == "50–70 %"),
            "{t:?}"
        );
        assert!(!t.iter().any(|x| x.starts_with("caution")));
        // The band; figures over it sit on patches of its colour, smaller
        // than a figure's height.
        let tall_light = rects(&svg)
            .iter()
            .filter(|r| r.fill == hex(LIGHT) && r.b.y1 - r.b.y0 > LABEL_HEIGHT)
            .count();
        assert_eq!(tall_light, 1);
    }

    #[test]
    fn the_axis_reaches_above_the_tallest_bar() {
        let mut chart = two_sets();
        chart.series[0].values[0] = Some(187.0);
        let svg = dissipation_svg(&chart).unwrap();
        let t = texts(&svg);
        assert!(t.iter().any(|x| x == "200"), "{t:?}");
        assert!(t.iter().any(|x| x == "187 %"));
    }

    #[test]
    fn supply_chart_marks_bands_and_readings() {
        let chart = SupplyChart {
            words: crate::catalogue::Catalogue::english().clone(),
            nodes: vec![
                SupplyNode {
                    name: "B+1".into(),
                    band: Some((314.0, 349.0, 384.0)),
                },
                SupplyNode {
                    name: "B+2".into(),
                    band: None,
                },
            ],
            series: vec![
                Series {
                    label: "as found".into(),
                    values: vec![Some(345.2), Some(323.0)],
                },
                Series {
                    label: "as left".into(),
                    values: vec![Some(353.0), None],
                },
            ],
            nominal_volts: 120.0,
        };
        let svg = supply_svg(&chart).unwrap();
        let t = texts(&svg);
        for want in [
            "345",
            "323",
            "353",
            "B+1",
            "B+2",
            "as found",
            "as left",
            "expected ± tolerance",
            "Volts DC, corrected to 120 V mains",
        ] {
            assert!(t.iter().any(|x| x == want), "{want} missing from {t:?}");
        }
        // One band column plus the legend swatch (label patches are lower).
        let tall_light = rects(&svg)
            .iter()
            .filter(|r| r.fill == hex(LIGHT) && r.b.y1 - r.b.y0 > LABEL_HEIGHT)
            .count();
        assert_eq!(tall_light, 2);
        // Two hollow circles (as found) and their legend; one triangle (as left) and its legend.
        assert_eq!(svg.matches("<circle").count(), 2 * (2 + 1));
        assert_eq!(svg.matches("<polygon").count(), 1 + 1);
    }

    #[test]
    fn boxes_measure_overlaps_and_crossings() {
        let b = PixelBox::new((0.0, 0.0), (10.0, 10.0));
        assert_eq!(b.overlap(&PixelBox::new((5.0, 5.0), (20.0, 20.0))), 25.0);
        assert_eq!(b.overlap(&PixelBox::new((10.0, 0.0), (20.0, 10.0))), 0.0);
        // A horizontal line through the middle crosses 10 px of it; a
        // diagonal corner to corner 10·√2; a line beside it none.
        assert!((b.crossing((-5.0, 5.0), (15.0, 5.0)) - 10.0).abs() < 1e-9);
        assert!((b.crossing((0.0, 0.0), (10.0, 10.0)) - 200f64.sqrt()).abs() < 1e-9);
        assert_eq!(b.crossing((-5.0, 12.0), (15.0, 12.0)), 0.0);
        assert_eq!(b.crossing((12.0, -5.0), (12.0, 15.0)), 0.0);
        // A segment that ends inside counts up to its end.
        assert!((b.crossing((-5.0, 5.0), (4.0, 5.0)) - 4.0).abs() < 1e-9);
    }

    #[test]
    fn a_label_goes_to_the_first_clear_place() {
        let mut o = Obstacles::new(PixelBox::new((0.0, 0.0), (100.0, 100.0)));
        o.add_line(Line::new((0.0, 50.0), (100.0, 50.0), 20.0));
        o.add_solid(PixelBox::new((40.0, 20.0), (60.0, 30.0)));
        let on_line = PixelBox::centred(50.0, 50.0, 20.0, 10.0);
        let on_marker = PixelBox::centred(50.0, 25.0, 20.0, 10.0);
        let outside = PixelBox::centred(105.0, 80.0, 20.0, 10.0);
        let clear = PixelBox::centred(50.0, 75.0, 20.0, 10.0);
        assert!(o.cost(&on_line) > 0.0 && o.cost(&on_marker) > 0.0 && o.cost(&outside) > 0.0);
        assert_eq!(o.cost(&clear), 0.0);
        assert_eq!(o.place(&[on_line, on_marker, outside, clear]), clear);
        // Once placed it is solid: the same spot is no longer clear.
        assert!(o.cost(&clear) > 0.0);
    }

    #[test]
    fn supply_figures_never_cover_markers_or_each_other() {
        // Many nodes close together: the figures of neighbouring markers
        // compete for the same room.
        let nodes: Vec<SupplyNode> = (0..9)
            .map(|i| SupplyNode {
                name: format!("B+{}", i + 1),
                band: Some((
                    300.0 - 8.0 * i as f64 - 25.0,
                    300.0 - 8.0 * i as f64,
                    300.0 - 8.0 * i as f64 + 25.0,
                )),
            })
            .collect();
        let chart = SupplyChart {
            words: crate::catalogue::Catalogue::english().clone(),
            series: vec![
                Series {
                    label: "as found".into(),
                    values: (0..9).map(|i| Some(301.0 - 8.0 * i as f64)).collect(),
                },
                Series {
                    label: "as left".into(),
                    values: (0..9).map(|i| Some(296.0 - 7.0 * i as f64)).collect(),
                },
            ],
            nodes,
            nominal_volts: 230.0,
        };
        let svg = supply_svg(&chart).unwrap();
        let labels = patches(&svg);
        let marks = markers(&svg);
        assert_eq!(labels.len(), 18, "one figure per reading");
        assert_eq!(marks.len(), 18);
        for (i, a) in labels.iter().enumerate() {
            assert!(
                a.x0 >= 0.0 && a.x1 <= f64::from(SIZE.0),
                "{a:?} off the chart"
            );
            for m in &marks {
                assert_eq!(a.overlap(m), 0.0, "figure {a:?} covers marker {m:?}");
            }
            for b in &labels[i + 1..] {
                assert_eq!(a.overlap(b), 0.0, "figures {a:?} and {b:?} overlap");
            }
        }
        for v in chart.series.iter().flat_map(|s| s.values.iter().flatten()) {
            assert!(texts(&svg).contains(&format!("{v:.0}")), "{v}");
        }
    }

    #[test]
    fn a_bar_figure_stays_off_the_rating_line() {
        let mut chart = two_sets();
        // Just under the rating and just under the caution line: the
        // figure's usual place, right above the bar, is on the line.
        chart.series[0].values = vec![Some(97.0), Some(89.0)];
        chart.series[1].values = vec![Some(99.5), Some(40.0)];
        let svg = dissipation_svg(&chart).unwrap();
        let lines: Vec<f64> = svg
            .lines()
            .filter(|l| l.trim_start().starts_with("<polyline") && l.contains("stroke-width=\"2\""))
            .map(|l| {
                let points = attr(l, "points").unwrap();
                let first = points.split_whitespace().next().unwrap().to_string();
                first.split_once(',').unwrap().1.parse().unwrap()
            })
            .collect();
        assert_eq!(lines.len(), 1, "one rating line");
        let y100 = lines[0];
        let labels = patches(&svg);
        assert_eq!(labels.len(), 4);
        for b in &labels {
            assert!(
                b.y1 <= y100 - 1.0 || b.y0 >= y100 + 1.0,
                "{b:?} on the line at {y100}"
            );
        }
        assert!(texts(&svg).iter().any(|t| t == "97 %"));
    }

    #[test]
    fn text_widths_follow_the_figures() {
        // Noto Sans figures are 0.572 em wide; at size 12 the SVG sets 9.68 px.
        assert!((text_width("300", 12) - 3.0 * 0.572 * 12.0 / 1.24).abs() < 1e-9);
        assert!(text_width("100 %", 12) > text_width("100", 12));
    }

    #[test]
    fn labels_are_cleaned_for_xml_and_cut() {
        assert_eq!(label_text("V3\u{1}\nEL84", 20), "V3 EL84");
        assert_eq!(label_text("abcdefghij", 5), "abcd…");
        let svg = dissipation_svg(&DissipationChart {
            words: crate::catalogue::Catalogue::english().clone(),
            valves: vec!["<V&3>".into()],
            series: vec![Series {
                label: "a \"b\"".into(),
                values: vec![Some(50.0)],
            }],
            guide: Guide::None,
        })
        .unwrap();
        assert!(svg.contains("&lt;V&amp;3&gt;"), "{svg}");
        assert!(!svg.contains("<V&3>"));
    }
}

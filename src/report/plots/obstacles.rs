//! Where a chart's figures may go: the markers, bars, lines and bands a
//! label should keep clear of, held in a grid of buckets so that pricing a
//! candidate place looks only at what lies near it. A chart with n marks
//! and their n labels costs O(n) to label, not O(n²).
//!
//! The price of a place is the same sum, in the same order, as a scan of
//! every obstacle would give: obstacles that do not touch the candidate add
//! exactly nothing, so the bucketed sum skips them without changing a bit
//! of the result.

use super::{Line, PixelBox};

/// The side of a bucket in pixels: about two label heights, so a label
/// touches a handful of buckets.
const CELL: f64 = 24.0;

/// Which list an obstacle is in.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Kind {
    Solid,
    Line,
    Band,
}

/// What a figure's label must keep clear of, for choosing where it goes.
#[derive(Debug, Clone)]
pub(crate) struct Obstacles {
    /// Labels must stay inside.
    pub area: PixelBox,
    /// Markers, bars and labels already placed: never covered.
    solid: Vec<PixelBox>,
    /// Lines a label should not sit on.
    lines: Vec<Line>,
    /// Shaded bands: a label sits inside one or outside it, not across its
    /// edge.
    bands: Vec<PixelBox>,
    /// The buckets, row by row: each the first of its entries in
    /// `entries` ([`NONE`] when it has none).
    cells: Vec<u32>,
    /// Every bucket's entries in one list, each linked to the next of its
    /// bucket (newest first): an obstacle filed into a bucket costs one
    /// push here, where a list per bucket grew by one allocation after
    /// another.
    entries: Vec<Entry>,
    columns: usize,
    rows: usize,
    /// Where bucket (0, 0) starts.
    origin: (f64, f64),
    /// The lists [`Obstacles::near`] fills, kept between calls so that
    /// placing a label allocates nothing.
    scratch: [Vec<u32>; 3],
}

/// The bucket columns and rows a box reaches into.
type Span = (
    std::ops::RangeInclusive<usize>,
    std::ops::RangeInclusive<usize>,
);

/// One obstacle filed in one bucket, and the bucket's next entry.
#[derive(Debug, Clone, Copy)]
struct Entry {
    kind: Kind,
    index: u32,
    next: u32,
}

/// The end of a bucket's entries.
const NONE: u32 = u32::MAX;

impl Obstacles {
    /// Obstacles for labels that must stay inside `area`. The buckets cover
    /// the area with a margin; anything beyond it goes into the edge
    /// buckets, so nothing is ever missed.
    pub(crate) fn new(area: PixelBox) -> Self {
        let margin = 4.0 * CELL;
        let origin = (area.x0 - margin, area.y0 - margin);
        let span = |a: f64, b: f64| {
            let n = ((b - a + 2.0 * margin) / CELL).ceil();
            if n.is_finite() && n >= 1.0 {
                (n as usize).min(4096)
            } else {
                1
            }
        };
        let columns = span(area.x0, area.x1);
        let rows = span(area.y0, area.y1);
        Obstacles {
            area,
            solid: Vec::new(),
            lines: Vec::new(),
            bands: Vec::new(),
            cells: vec![NONE; columns * rows],
            entries: Vec::new(),
            columns,
            rows,
            origin,
            scratch: Default::default(),
        }
    }

    /// A marker, bar or placed label: a label never covers it.
    pub(crate) fn add_solid(&mut self, b: PixelBox) {
        self.file(Kind::Solid, self.solid.len(), &b);
        self.solid.push(b);
    }

    /// A line a label should not sit on.
    pub(crate) fn add_line(&mut self, line: Line) {
        let reach = PixelBox::new(line.from, line.to);
        self.file(Kind::Line, self.lines.len(), &reach);
        self.lines.push(line);
    }

    /// A shaded band a label should not straddle.
    pub(crate) fn add_band(&mut self, b: PixelBox) {
        self.file(Kind::Band, self.bands.len(), &b);
        self.bands.push(b);
    }

    /// The shaded bands, in the order they were added.
    pub(crate) fn bands(&self) -> &[PixelBox] {
        &self.bands
    }

    /// The bucket columns and rows `b` reaches into (edge buckets for
    /// anything outside the grid).
    fn span(&self, b: &PixelBox) -> Span {
        let index = |v: f64, origin: f64, n: usize| -> usize {
            let i = ((v - origin) / CELL).floor();
            if i.is_nan() || i < 0.0 {
                0
            } else {
                (i as usize).min(n - 1)
            }
        };
        let (c0, c1) = (
            index(b.x0, self.origin.0, self.columns),
            index(b.x1, self.origin.0, self.columns),
        );
        let (r0, r1) = (
            index(b.y0, self.origin.1, self.rows),
            index(b.y1, self.origin.1, self.rows),
        );
        (c0..=c1, r0..=r1)
    }

    fn file(&mut self, kind: Kind, index: usize, b: &PixelBox) {
        let index = u32::try_from(index).unwrap_or(u32::MAX);
        let (columns, rows) = self.span(b);
        for r in rows {
            for c in columns.clone() {
                let cell = &mut self.cells[r * self.columns + c];
                let next = *cell;
                *cell = u32::try_from(self.entries.len()).unwrap_or(NONE);
                self.entries.push(Entry { kind, index, next });
            }
        }
    }

    /// The obstacles of each kind in the buckets of `span` (from
    /// [`Obstacles::span`]), each once, in the order they were added, into
    /// `found` (emptied first).
    fn near(&self, span: &Span, found: &mut [Vec<u32>; 3]) {
        for list in found.iter_mut() {
            list.clear();
        }
        let (columns, rows) = span.clone();
        for r in rows {
            for c in columns.clone() {
                let mut at = self.cells[r * self.columns + c];
                while let Some(e) = self.entries.get(at as usize) {
                    found[e.kind as usize].push(e.index);
                    at = e.next;
                }
            }
        }
        for list in found.iter_mut() {
            list.sort_unstable();
            list.dedup();
        }
    }

    /// How bad a label at `b` would be; 0 when it is clear of everything.
    #[cfg(test)]
    pub(crate) fn cost(&self, b: &PixelBox) -> f64 {
        let mut found = Default::default();
        self.near(&self.span(b), &mut found);
        self.price(b, &found)
    }

    /// [`Obstacles::cost`] of `b` with the obstacles near it (`near` of
    /// its span) given.
    fn price(&self, b: &PixelBox, [solid, lines, bands]: &[Vec<u32>; 3]) -> f64 {
        let mut cost = (b.area() - b.overlap(&self.area)) * 1000.0;
        cost += solid
            .iter()
            .map(|&i| b.overlap(&self.solid[i as usize]) * 60.0)
            .sum::<f64>();
        cost += lines
            .iter()
            .map(|&i| {
                let l = &self.lines[i as usize];
                b.crossing(l.from, l.to) * l.weight
            })
            .sum::<f64>();
        cost += bands
            .iter()
            .filter(|&&i| {
                let o = b.overlap(&self.bands[i as usize]);
                o > 0.0 && o < b.area() - 1e-9
            })
            .count() as f64
            * 5.0;
        cost
    }

    /// The cheapest of `candidates`, in order of preference: each step down
    /// the list costs a little, so the first clear one wins. The choice is
    /// then solid for later labels.
    ///
    /// A price is never below zero, so a candidate's rank alone bounds its
    /// price from below: once that bound reaches the best price so far, no
    /// later candidate can win (on a tie the earlier one does), and the
    /// rest are not priced. The choice is the one pricing every candidate
    /// gives ([`Obstacles::place_pricing_all`] in the tests).
    ///
    /// Candidates next to each other (a ladder of places a few pixels
    /// apart) mostly reach into the same buckets: the obstacles near them
    /// are gathered once for each run of candidates with the same buckets.
    pub(crate) fn place(&mut self, candidates: &[PixelBox]) -> PixelBox {
        let mut best: Option<(f64, PixelBox)> = None;
        let mut found = std::mem::take(&mut self.scratch);
        let mut gathered: Option<Span> = None;
        for (rank, b) in candidates.iter().enumerate() {
            let floor = rank as f64 * 2.0;
            if let Some((price, _)) = best
                && floor.total_cmp(&price).is_ge()
            {
                break;
            }
            let span = self.span(b);
            if gathered.as_ref() != Some(&span) {
                self.near(&span, &mut found);
                gathered = Some(span);
            }
            let price = self.price(b, &found) + floor;
            if best.is_none_or(|(p, _)| price.total_cmp(&p).is_lt()) {
                best = Some((price, *b));
            }
        }
        self.scratch = found;
        let (_, best) = best.expect("at least one candidate");
        self.add_solid(best);
        best
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The price a scan of every obstacle gives, as the charts priced
    /// places before the buckets.
    fn scanned(o: &Obstacles, b: &PixelBox) -> f64 {
        let mut cost = (b.area() - b.overlap(&o.area)) * 1000.0;
        cost += o.solid.iter().map(|s| b.overlap(s) * 60.0).sum::<f64>();
        cost += o
            .lines
            .iter()
            .map(|l| b.crossing(l.from, l.to) * l.weight)
            .sum::<f64>();
        cost += o
            .bands
            .iter()
            .filter(|band| {
                let v = b.overlap(band);
                v > 0.0 && v < b.area() - 1e-9
            })
            .count() as f64
            * 5.0;
        cost
    }

    impl Obstacles {
        /// [`Obstacles::place`] as it was: every candidate priced, the
        /// first cheapest taken.
        fn place_pricing_all(&mut self, candidates: &[PixelBox]) -> PixelBox {
            let best = candidates
                .iter()
                .enumerate()
                .map(|(rank, b)| (self.cost(b) + rank as f64 * 2.0, *b))
                .min_by(|a, b| a.0.total_cmp(&b.0))
                .map(|(_, b)| b)
                .expect("at least one candidate");
            self.add_solid(best);
            best
        }
    }

    /// A small deterministic generator (an LCG), so the test needs no crate.
    fn lcg(state: &mut u64) -> f64 {
        *state = state
            .wrapping_mul(6_364_136_223_846_793_005)
            .wrapping_add(1_442_695_040_888_963_407);
        (*state >> 11) as f64 / (1u64 << 53) as f64
    }

    #[test]
    fn bucketed_prices_equal_a_full_scan_to_the_bit() {
        let mut seed = 7;
        let mut o = Obstacles::new(PixelBox::new((70.0, 40.0), (650.0, 300.0)));
        for _ in 0..300 {
            let (x, y) = (lcg(&mut seed) * 800.0 - 20.0, lcg(&mut seed) * 360.0 - 15.0);
            match (lcg(&mut seed) * 3.0) as u32 {
                0 => o.add_solid(PixelBox::around((x as i32, y as i32), 9.0)),
                1 => o.add_line(Line::new(
                    (x, y),
                    (
                        x + lcg(&mut seed) * 300.0 - 150.0,
                        y + lcg(&mut seed) * 80.0 - 40.0,
                    ),
                    20.0,
                )),
                _ => o.add_band(PixelBox::new((x, y), (x + 40.0, y + 90.0))),
            }
        }
        for _ in 0..2000 {
            let (x, y) = (lcg(&mut seed) * 900.0 - 60.0, lcg(&mut seed) * 420.0 - 40.0);
            let b = PixelBox::new((x, y), (x + 30.0, y + 12.0));
            assert_eq!(o.cost(&b).to_bits(), scanned(&o, &b).to_bits(), "{b:?}");
        }
    }

    #[test]
    fn placing_stops_early_yet_chooses_as_pricing_every_candidate_does() {
        let mut seed = 11;
        let area = PixelBox::new((70.0, 40.0), (650.0, 300.0));
        let (mut quick, mut full) = (Obstacles::new(area), Obstacles::new(area));
        for o in [&mut quick, &mut full] {
            o.add_line(Line::new((70.0, 120.0), (650.0, 120.0), 40.0));
            o.add_band(PixelBox::new((70.0, 150.0), (650.0, 200.0)));
        }
        let mut stopped_early = 0;
        for _ in 0..600 {
            let (x, y) = (lcg(&mut seed) * 640.0 + 40.0, lcg(&mut seed) * 300.0 + 20.0);
            let solid = PixelBox::around((x as i32, y as i32), 6.0);
            quick.add_solid(solid);
            full.add_solid(solid);
            // The bar chart's ladder of places, and the markers' spots.
            let candidates: Vec<PixelBox> = if lcg(&mut seed) < 0.5 {
                (0..60)
                    .map(|k| {
                        let bottom = y - 8.0 - f64::from(k) * 2.0;
                        PixelBox::new((x - 12.0, bottom - 12.0), (x + 12.0, bottom))
                    })
                    .collect()
            } else {
                crate::report::plots::label_spots((x as i32, y as i32), 26.0, 12.0, true)
            };
            let a = quick.place(&candidates);
            let b = full.place_pricing_all(&candidates);
            assert_eq!(a, b);
            if candidates.iter().position(|c| *c == a) < Some(candidates.len() - 1) {
                stopped_early += 1;
            }
        }
        assert!(stopped_early > 300, "{stopped_early}");
    }

    #[test]
    fn what_lies_far_outside_still_counts() {
        let mut o = Obstacles::new(PixelBox::new((0.0, 0.0), (100.0, 100.0)));
        let far = PixelBox::new((5000.0, 5000.0), (5010.0, 5010.0));
        o.add_solid(far);
        assert_eq!(o.cost(&far).to_bits(), scanned(&o, &far).to_bits());
        assert!(o.cost(&far) > 0.0);
    }
}

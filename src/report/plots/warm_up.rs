//! The warm-up chart: each valve's idle current against minutes since
//! power-on, one line and marker shape per valve, for the readings a set
//! took while the amplifier warmed up.

use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, VPos};

use super::SvgOut;
use super::{
    GRID, INK, MID, PAPER, PlotError, SIZE, anchored, draw_marker, font, label_text, legend_layout,
    legend_margin, marker, to_svg,
};
use crate::calc::SetFindings;
use crate::catalogue::Catalogue;

/// One valve's readings: (minutes, mA).
#[derive(Debug, Clone, PartialEq)]
pub struct WarmUpLine {
    pub label: String,
    pub points: Vec<(f64, f64)>,
}

/// Data for the warm-up chart of one set.
#[derive(Debug, Clone, PartialEq)]
pub struct WarmUpChart {
    pub lines: Vec<WarmUpLine>,
    /// True when some current includes the screen current (Ik).
    pub cathode_current: bool,
    /// The chart's fixed words, in the document's language.
    pub words: Catalogue,
}

/// The chart's data for a set, or `None` when it has no warm-up readings
/// with a current.
pub fn warm_up_chart(set: &SetFindings, cat: &Catalogue) -> Option<WarmUpChart> {
    let mut lines: Vec<WarmUpLine> = Vec::new();
    let mut cathode_current = false;
    for p in &set.warm_up {
        let Some(ma) = p.current_ma else { continue };
        cathode_current |= p.includes_screen;
        match lines.iter_mut().find(|l| l.label == p.position) {
            Some(l) => l.points.push((p.minutes, ma)),
            None => lines.push(WarmUpLine {
                label: p.position.clone(),
                points: vec![(p.minutes, ma)],
            }),
        }
    }
    (!lines.is_empty()).then(|| WarmUpChart {
        lines,
        cathode_current,
        words: cat.clone(),
    })
}

/// Draws the warm-up chart as an SVG document.
pub fn warm_up_svg(chart: &WarmUpChart) -> Result<String, PlotError> {
    to_svg(chart, "warm-up", draw)
}

fn draw(chart: &WarmUpChart, svg: &mut String) -> Result<(), String> {
    // Half the height of the other charts: it is a small figure.
    let size = (SIZE.0, SIZE.1 * 3 / 4);
    let root = SvgOut::with_string(svg, size).into_drawing_area();
    root.fill(&PAPER).map_err(|e| e.to_string())?;
    let all = chart.lines.iter().flat_map(|l| l.points.iter());
    let t_max = all.clone().map(|p| p.0).fold(1.0f64, f64::max);
    let i_max = all.map(|p| p.1).fold(1.0f64, f64::max);
    let right_t = nice_ceiling(t_max);
    let top = nice_ceiling(i_max * 1.15);

    let labels: Vec<String> = chart
        .lines
        .iter()
        .map(|l| label_text(&l.label, 24))
        .collect();
    let (legend, rows) = legend_layout(&labels, 70, size.0 as i32 - 16, 22);
    let mut ctx = ChartBuilder::on(&root)
        .margin_top(legend_margin(rows))
        .margin_right(24)
        .margin_left(8)
        .margin_bottom(6)
        .x_label_area_size(44)
        .y_label_area_size(62)
        .build_cartesian_2d(0f64..right_t, 0f64..top)
        .map_err(|e| e.to_string())?;
    let y_desc = chart.words.text(if chart.cathode_current {
        "chart-idle-current-ik"
    } else {
        "chart-idle-current"
    });
    let x_desc = chart.words.text("chart-minutes");
    ctx.configure_mesh()
        .x_labels(8)
        .y_labels(6)
        .x_label_formatter(&|v| format!("{v:.0}"))
        .y_label_formatter(&|v| format!("{v:.0}"))
        .x_desc(x_desc)
        .y_desc(y_desc)
        .axis_desc_style(font(14))
        .label_style(font(13))
        .max_light_lines(0)
        .bold_line_style(GRID.stroke_width(1))
        .axis_style(INK.stroke_width(1))
        .draw()
        .map_err(|e| e.to_string())?;
    for line in &chart.lines {
        let path: Vec<(i32, i32)> = line.points.iter().map(|p| ctx.backend_coord(p)).collect();
        if path.len() > 1 {
            root.draw(&PathElement::new(path, MID.stroke_width(2)))
                .map_err(|e| e.to_string())?;
        }
    }
    for (k, line) in chart.lines.iter().enumerate() {
        for p in &line.points {
            draw_marker(&root, ctx.backend_coord(p), marker(k))?;
        }
    }
    for (k, ((x, y), text)) in legend.iter().zip(&labels).enumerate() {
        draw_marker(&root, (x + 11, *y), marker(k))?;
        root.draw(&Text::new(
            text.clone(),
            (x + 30, *y),
            anchored(13, HPos::Left, VPos::Center),
        ))
        .map_err(|e| e.to_string())?;
    }
    root.present().map_err(|e| e.to_string())?;
    Ok(())
}

/// A round axis end at or above `v`: 1, 2 or 5 times a power of ten.
fn nice_ceiling(v: f64) -> f64 {
    let v = v.max(1e-9);
    let p = 10f64.powf(v.log10().floor());
    [1.0, 2.0, 5.0, 10.0]
        .iter()
        .map(|m| m * p)
        .find(|c| *c >= v)
        .unwrap_or(10.0 * p)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn axes_end_on_round_figures() {
        assert_eq!(nice_ceiling(31.0), 50.0);
        assert_eq!(nice_ceiling(4.0), 5.0);
        assert_eq!(nice_ceiling(120.0), 200.0);
        assert_eq!(nice_ceiling(10.0), 10.0);
    }

    #[test]
    fn each_valve_gets_a_line_and_its_legend() {
        let chart = WarmUpChart {
            words: crate::catalogue::Catalogue::english().clone(),
            lines: vec![
                WarmUpLine {
                    label: "V3".into(),
                    points: vec![(1.0, 12.0), (5.0, 22.5), (30.0, 26.0)],
                },
                WarmUpLine {
                    label: "V4".into(),
                    points: vec![(1.0, 11.0), (5.0, 21.0), (30.0, 25.0)],
                },
            ],
            cathode_current: false,
        };
        let svg = warm_up_svg(&chart).unwrap();
        let texts: Vec<&str> = svg
            .split("<text")
            .skip(1)
            .filter_map(|t| Some(t[t.find('>')? + 1..t.find("</text>")?].trim()))
            .collect();
        assert!(texts.contains(&"V3") && texts.contains(&"V4"), "{texts:?}");
        assert!(svg.contains("Minutes since power-on"));
        // Two lines of three readings: the polylines with width 2.
        assert_eq!(
            svg.lines()
                .filter(|l| l.contains("<polyline")
                    && l.contains("stroke-width=\"2\"")
                    && l.contains("#A0A0A0"))
                .count(),
            2
        );
    }
}

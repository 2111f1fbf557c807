//! The charts' SVG writer: a plotters drawing backend that writes the same
//! SVG, byte for byte, as plotters' own SVG backend (`plotters-svg`), for
//! a fraction of the work.
//!
//! plotters' backend builds every attribute as a string of its own through
//! `format!` (each number, each colour as `#RRGGBB`, the opacity as a
//! float) and then copies it into the document; a long job's charts are
//! tens of thousands of elements, and that writing was most of what the
//! charts cost (see docs/performance.md, "Sixth pass"). This one writes
//! each number and colour straight into the document. The elements, their
//! attributes, their order and their escaping are plotters-svg 0.3.7's;
//! `tests::writes_what_plotters_svg_writes` draws the same scenes through
//! both and compares the text, and plotters-svg stays a dependency as that
//! reference.

use plotters_backend::text_anchor::{HPos, VPos};
use plotters_backend::{
    BackendColor, BackendCoord, BackendStyle, BackendTextStyle, DrawingBackend, DrawingErrorKind,
    FontStyle, FontTransform,
};

/// Nothing this backend does can fail; the type plotters' own SVG backend
/// names for its errors.
pub(crate) type Error = std::io::Error;

/// An SVG document written into a string, as
/// `plotters::prelude::SVGBackend::with_string` writes it.
pub(crate) struct SvgOut<'a> {
    buf: &'a mut String,
    size: (u32, u32),
    /// The `<svg>` element is open until [`DrawingBackend::present`].
    open: bool,
    /// The font sizes written so far, as plotters prints them
    /// (`size / 1.24` as a float): a chart uses three or four.
    font_sizes: Vec<(u64, String)>,
    /// Cleared at the first text written that the fonts' check would have
    /// to look at ([`crate::typeset::chart_text_is_plain`]), when the
    /// document's writer asked for it ([`SvgOut::noting_text`]).
    plain: Option<&'a std::cell::Cell<bool>>,
}

impl<'a> SvgOut<'a> {
    /// A new document of `size` pixels in `buf`.
    pub(crate) fn with_string(buf: &'a mut String, size: (u32, u32)) -> Self {
        buf.push_str("<svg width=\"");
        push_u32(buf, size.0);
        buf.push_str("\" height=\"");
        push_u32(buf, size.1);
        buf.push_str("\" viewBox=\"0 0 ");
        push_u32(buf, size.0);
        buf.push(' ');
        push_u32(buf, size.1);
        buf.push_str("\" xmlns=\"http://www.w3.org/2000/svg\">\n");
        SvgOut {
            buf,
            size,
            open: true,
            font_sizes: Vec::new(),
            plain: None,
        }
    }

    /// This writer, clearing `plain` at the first text it writes that
    /// the fonts' check has to read ([`crate::typeset::chart_text_is_plain`]):
    /// while `plain` holds, everything written here leaves an SVG that
    /// needs no CJK face, and the check can take the writer's word for it.
    pub(crate) fn noting_text(mut self, plain: &'a std::cell::Cell<bool>) -> Self {
        self.plain = Some(plain);
        self
    }

    /// The opening of a document as [`SvgOut::with_string`] writes it, and
    /// what is drawn on it, without the closing tag: the start of a chart
    /// kept to be copied (`plots::open_chart`).
    pub(crate) fn opening(buf: &'a mut String, size: (u32, u32)) -> Self {
        let mut out = SvgOut::with_string(buf, size);
        out.open = false;
        out
    }

    /// A document whose opening (from [`SvgOut::opening`]) is already in
    /// `buf`: what is drawn goes after it, and the closing tag at the end.
    pub(crate) fn after_opening(buf: &'a mut String, size: (u32, u32)) -> Self {
        SvgOut {
            buf,
            size,
            open: true,
            font_sizes: Vec::new(),
            plain: None,
        }
    }

    /// The document written so far, for an element plotters has none for
    /// (a bar's dots as one path: `plots::DotPath`), which writes itself
    /// onto its end.
    pub(crate) fn document(&mut self) -> &mut String {
        self.buf
    }

    /// Where in `font_sizes` the text of `size` is, written there first
    /// if it is new.
    fn font_size(&mut self, size: f64) -> usize {
        let key = size.to_bits();
        match self.font_sizes.iter().position(|(k, _)| *k == key) {
            Some(at) => at,
            None => {
                self.font_sizes.push((key, format!("{}", size / 1.24)));
                self.font_sizes.len() - 1
            }
        }
    }
}

fn push_u32(buf: &mut String, n: u32) {
    push_i64(buf, i64::from(n));
}

fn push_i32(buf: &mut String, n: i32) {
    push_i64(buf, i64::from(n));
}

/// `n` in decimal, as `format!("{n}")` writes it (through `itoa`: a
/// long job's charts write millions of numbers, and pushing the digits
/// one character at a time cost some 130 instructions a number).
pub(super) fn push_i64(buf: &mut String, n: i64) {
    buf.push_str(itoa::Buffer::new().format(n));
}

/// `#RRGGBB` in capitals, as plotters-svg writes a colour.
fn push_colour(buf: &mut String, c: BackendColor) {
    const HEX: &[u8; 16] = b"0123456789ABCDEF";
    let (r, g, b) = c.rgb;
    buf.push('#');
    for v in [r, g, b] {
        buf.push(char::from(HEX[usize::from(v >> 4)]));
        buf.push(char::from(HEX[usize::from(v & 15)]));
    }
}

/// `#RRGGBB` in capitals for an opaque colour of plotters'.
pub(super) fn push_rgb(buf: &mut String, c: plotters::style::RGBColor) {
    let plotters::style::RGBColor(r, g, b) = c;
    push_colour(
        buf,
        BackendColor {
            alpha: 1.0,
            rgb: (r, g, b),
        },
    );
}

/// The opacity as `format!("{}", alpha)` writes it (nearly always "1").
fn push_opacity(buf: &mut String, c: BackendColor) {
    if c.alpha == 1.0 {
        buf.push('1');
    } else {
        use std::fmt::Write as _;
        let _ = write!(buf, "{}", c.alpha);
    }
}

/// Text as plotters-svg escapes an attribute or an element's text.
fn push_escaped(buf: &mut String, value: &str) {
    let mut rest = value;
    // The five are ASCII, so a byte equal to one of them is that
    // character, and the text either side of it is whole characters.
    while let Some(at) = rest
        .bytes()
        .position(|b| matches!(b, b'<' | b'>' | b'&' | b'"' | b'\''))
    {
        buf.push_str(&rest[..at]);
        buf.push_str(match rest.as_bytes()[at] {
            b'<' => "&lt;",
            b'>' => "&gt;",
            b'&' => "&amp;",
            b'"' => "&quot;",
            _ => "&apos;",
        });
        rest = &rest[at + 1..];
    }
    buf.push_str(rest);
}

/// The points of a polyline or polygon: `x,y ` for each.
fn push_points<I: IntoIterator<Item = BackendCoord>>(buf: &mut String, path: I) {
    for (x, y) in path {
        push_i32(buf, x);
        buf.push(',');
        push_i32(buf, y);
        buf.push(' ');
    }
}

impl DrawingBackend for SvgOut<'_> {
    type ErrorType = Error;

    fn get_size(&self) -> (u32, u32) {
        self.size
    }

    fn ensure_prepared(&mut self) -> Result<(), DrawingErrorKind<Error>> {
        Ok(())
    }

    fn present(&mut self) -> Result<(), DrawingErrorKind<Error>> {
        if self.open {
            self.buf.push_str("</svg>\n");
            self.open = false;
        }
        Ok(())
    }

    fn draw_pixel(
        &mut self,
        point: BackendCoord,
        color: BackendColor,
    ) -> Result<(), DrawingErrorKind<Error>> {
        if color.alpha == 0.0 {
            return Ok(());
        }
        let buf = &mut *self.buf;
        buf.push_str("<rect x=\"");
        push_i32(buf, point.0);
        buf.push_str("\" y=\"");
        push_i32(buf, point.1);
        buf.push_str("\" width=\"1\" height=\"1\" stroke=\"none\" opacity=\"");
        push_opacity(buf, color);
        buf.push_str("\" fill=\"");
        push_colour(buf, color);
        buf.push_str("\"/>\n");
        Ok(())
    }

    fn draw_line<S: BackendStyle>(
        &mut self,
        from: BackendCoord,
        to: BackendCoord,
        style: &S,
    ) -> Result<(), DrawingErrorKind<Error>> {
        let color = style.color();
        if color.alpha == 0.0 {
            return Ok(());
        }
        let buf = &mut *self.buf;
        buf.push_str("<line opacity=\"");
        push_opacity(buf, color);
        buf.push_str("\" stroke=\"");
        push_colour(buf, color);
        buf.push_str("\" stroke-width=\"");
        push_u32(buf, style.stroke_width());
        buf.push_str("\" x1=\"");
        push_i32(buf, from.0);
        buf.push_str("\" y1=\"");
        push_i32(buf, from.1);
        buf.push_str("\" x2=\"");
        push_i32(buf, to.0);
        buf.push_str("\" y2=\"");
        push_i32(buf, to.1);
        buf.push_str("\"/>\n");
        Ok(())
    }

    fn draw_rect<S: BackendStyle>(
        &mut self,
        upper_left: BackendCoord,
        bottom_right: BackendCoord,
        style: &S,
        fill: bool,
    ) -> Result<(), DrawingErrorKind<Error>> {
        let color = style.color();
        if color.alpha == 0.0 {
            return Ok(());
        }
        let buf = &mut *self.buf;
        buf.push_str("<rect x=\"");
        push_i32(buf, upper_left.0);
        buf.push_str("\" y=\"");
        push_i32(buf, upper_left.1);
        buf.push_str("\" width=\"");
        push_i64(buf, i64::from(bottom_right.0.wrapping_sub(upper_left.0)));
        buf.push_str("\" height=\"");
        push_i64(buf, i64::from(bottom_right.1.wrapping_sub(upper_left.1)));
        buf.push_str("\" opacity=\"");
        push_opacity(buf, color);
        if fill {
            buf.push_str("\" fill=\"");
            push_colour(buf, color);
            buf.push_str("\" stroke=\"none\"/>\n");
        } else {
            buf.push_str("\" fill=\"none\" stroke=\"");
            push_colour(buf, color);
            buf.push_str("\"/>\n");
        }
        Ok(())
    }

    fn draw_path<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(
        &mut self,
        path: I,
        style: &S,
    ) -> Result<(), DrawingErrorKind<Error>> {
        let color = style.color();
        if color.alpha == 0.0 {
            return Ok(());
        }
        let buf = &mut *self.buf;
        buf.push_str("<polyline fill=\"none\" opacity=\"");
        push_opacity(buf, color);
        buf.push_str("\" stroke=\"");
        push_colour(buf, color);
        buf.push_str("\" stroke-width=\"");
        push_u32(buf, style.stroke_width());
        buf.push_str("\" points=\"");
        push_points(buf, path);
        buf.push_str("\"/>\n");
        Ok(())
    }

    fn fill_polygon<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(
        &mut self,
        path: I,
        style: &S,
    ) -> Result<(), DrawingErrorKind<Error>> {
        let color = style.color();
        if color.alpha == 0.0 {
            return Ok(());
        }
        let buf = &mut *self.buf;
        buf.push_str("<polygon opacity=\"");
        push_opacity(buf, color);
        buf.push_str("\" fill=\"");
        push_colour(buf, color);
        buf.push_str("\" points=\"");
        push_points(buf, path);
        buf.push_str("\"/>\n");
        Ok(())
    }

    fn draw_circle<S: BackendStyle>(
        &mut self,
        center: BackendCoord,
        radius: u32,
        style: &S,
        fill: bool,
    ) -> Result<(), DrawingErrorKind<Error>> {
        let color = style.color();
        if color.alpha == 0.0 {
            return Ok(());
        }
        let buf = &mut *self.buf;
        buf.push_str("<circle cx=\"");
        push_i32(buf, center.0);
        buf.push_str("\" cy=\"");
        push_i32(buf, center.1);
        buf.push_str("\" r=\"");
        push_u32(buf, radius);
        buf.push_str("\" opacity=\"");
        push_opacity(buf, color);
        if fill {
            buf.push_str("\" fill=\"");
            push_colour(buf, color);
            buf.push_str("\" stroke=\"none");
        } else {
            buf.push_str("\" fill=\"none\" stroke=\"");
            push_colour(buf, color);
        }
        buf.push_str("\" stroke-width=\"");
        push_u32(buf, style.stroke_width());
        buf.push_str("\"/>\n");
        Ok(())
    }

    fn draw_text<S: BackendTextStyle>(
        &mut self,
        text: &str,
        style: &S,
        pos: BackendCoord,
    ) -> Result<(), DrawingErrorKind<Error>> {
        let color = style.color();
        if color.alpha == 0.0 {
            return Ok(());
        }
        if let Some(plain) = self.plain
            && plain.get()
            && !crate::typeset::chart_text_is_plain(style.family().as_str(), text)
        {
            plain.set(false);
        }
        let (x0, y0) = pos;
        let anchor = style.anchor();
        let text_anchor = match anchor.h_pos {
            HPos::Left => "start",
            HPos::Right => "end",
            HPos::Center => "middle",
        };
        let dy = match anchor.v_pos {
            VPos::Top => "0.76em",
            VPos::Center => "0.5ex",
            VPos::Bottom => "-0.5ex",
        };
        // The size's text is borrowed from the list beside the document,
        // not copied for each text.
        let size = self.font_size(style.size());
        let size = &self.font_sizes[size].1;
        let buf = &mut *self.buf;
        buf.push_str("<text x=\"");
        push_i32(buf, x0);
        buf.push_str("\" y=\"");
        push_i32(buf, y0);
        buf.push_str("\" dy=\"");
        buf.push_str(dy);
        buf.push_str("\" text-anchor=\"");
        buf.push_str(text_anchor);
        buf.push_str("\" font-family=\"");
        push_escaped(buf, style.family().as_str());
        buf.push_str("\" font-size=\"");
        buf.push_str(size);
        buf.push_str("\" opacity=\"");
        push_opacity(buf, color);
        buf.push_str("\" fill=\"");
        push_colour(buf, color);
        buf.push('"');
        match style.style() {
            FontStyle::Normal => {}
            FontStyle::Bold => buf.push_str(" font-weight=\"bold\""),
            other => {
                buf.push_str(" font-style=\"");
                push_escaped(buf, other.as_str());
                buf.push('"');
            }
        }
        let degrees = match style.transform() {
            FontTransform::Rotate90 => Some("90"),
            FontTransform::Rotate180 => Some("180"),
            FontTransform::Rotate270 => Some("270"),
            _ => None,
        };
        if let Some(degrees) = degrees {
            buf.push_str(" transform=\"rotate(");
            buf.push_str(degrees);
            buf.push_str(", ");
            push_i32(buf, x0);
            buf.push_str(", ");
            push_i32(buf, y0);
            buf.push_str(")\"");
        }
        buf.push_str(">\n");
        push_escaped(buf, text);
        buf.push_str("\n</text>\n");
        Ok(())
    }
}

impl Drop for SvgOut<'_> {
    fn drop(&mut self) {
        let _ = self.present();
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use plotters::coord::Shift;
    use plotters::prelude::*;
    use plotters::style::text_anchor::Pos;

    /// A scene using every kind of element the backend writes, with
    /// coordinates, colours, widths, fonts and texts from `seed`.
    fn scene<DB: DrawingBackend>(root: &DrawingArea<DB, Shift>, seed: u64) {
        let mut next = crate::test_random::xorshift(seed | 1);
        let texts = [
            "0",
            "123 %",
            "Plate dissipation, % of rating",
            "a <b> & \"c\" 'd'",
            "Ünïcödé – −12.5 µF",
            "",
        ];
        for _ in 0..60 {
            let mut coord = || ((next() % 2000) as i32 - 500, (next() % 2000) as i32 - 500);
            let (a, b, c) = (coord(), coord(), coord());
            let n = next();
            let colour = RGBColor((n >> 8) as u8, (n >> 16) as u8, (n >> 24) as u8);
            let alpha = [1.0, 0.5, 0.0, 0.25][(n >> 32) as usize % 4];
            let style = ShapeStyle {
                color: colour.mix(alpha),
                filled: n & 1 == 0,
                stroke_width: (n >> 40) as u32 % 4,
            };
            let _ = match n % 7 {
                0 => root.draw(&Rectangle::new([a, b], style)),
                1 => root.draw(&PathElement::new(vec![a, b, c], style)),
                2 => root.draw(&Polygon::new(vec![a, b, c], style)),
                3 => root.draw(&Circle::new(a, (n >> 44) as u32 % 20, style)),
                4 => root.draw_pixel(a, &colour.mix(alpha)),
                5 => root.draw(&plotters::element::Pixel::new(a, style)),
                _ => {
                    let h = [HPos::Left, HPos::Center, HPos::Right][(n >> 20) as usize % 3];
                    let v = [VPos::Top, VPos::Center, VPos::Bottom][(n >> 22) as usize % 3];
                    let t = match (n >> 24) % 4 {
                        0 => FontTransform::None,
                        1 => FontTransform::Rotate90,
                        2 => FontTransform::Rotate180,
                        _ => FontTransform::Rotate270,
                    };
                    let s = [FontStyle::Normal, FontStyle::Bold, FontStyle::Italic]
                        [(n >> 26) as usize % 3];
                    let size = [12.0, 13.0, 14.0, 9.5, 11.0][(n >> 28) as usize % 5];
                    let font = ("Noto Sans", size, s)
                        .into_font()
                        .color(&colour.mix(alpha))
                        .pos(Pos::new(h, v))
                        .transform(t);
                    root.draw(&Text::new(
                        texts[(n >> 30) as usize % texts.len()].to_string(),
                        a,
                        font,
                    ))
                }
            };
        }
        let _ = root.draw(&PathElement::new(Vec::<(i32, i32)>::new(), BLACK));
    }

    #[test]
    fn writes_what_plotters_svg_writes() {
        for seed in 0..200u64 {
            let size = (300 + (seed as u32 % 7) * 91, 200 + (seed as u32 % 5) * 37);
            let mut theirs = String::new();
            {
                let root = SVGBackend::with_string(&mut theirs, size).into_drawing_area();
                root.fill(&WHITE).unwrap();
                scene(&root, seed.wrapping_mul(0x9e37_79b9_7f4a_7c15));
                root.present().unwrap();
            }
            let mut ours = String::new();
            {
                let root = SvgOut::with_string(&mut ours, size).into_drawing_area();
                root.fill(&WHITE).unwrap();
                scene(&root, seed.wrapping_mul(0x9e37_79b9_7f4a_7c15));
                root.present().unwrap();
            }
            assert!(theirs.len() > 1000, "seed {seed}: {theirs}");
            assert_eq!(ours, theirs, "seed {seed}");
        }
    }

    #[test]
    fn a_chart_drawn_both_ways_is_the_same_text() {
        // A chart with a mesh, axis labels and a description, as the
        // charts draw theirs.
        fn chart<DB: DrawingBackend>(root: DrawingArea<DB, Shift>) {
            root.fill(&WHITE).unwrap();
            let mut ctx = ChartBuilder::on(&root)
                .margin(10)
                .x_label_area_size(30)
                .y_label_area_size(60)
                .build_cartesian_2d(0f64..10.0, -5f64..120.0)
                .unwrap();
            ctx.configure_mesh()
                .y_desc("Plate dissipation, % of rating")
                .y_labels(9)
                .label_style(("Noto Sans", 13))
                .draw()
                .unwrap();
            ctx.draw_series(LineSeries::new(
                (0..10).map(|i| (f64::from(i), f64::from(i * i))),
                &BLACK,
            ))
            .unwrap();
            root.present().unwrap();
        }
        let mut theirs = String::new();
        chart(SVGBackend::with_string(&mut theirs, (760, 330)).into_drawing_area());
        let mut ours = String::new();
        chart(SvgOut::with_string(&mut ours, (760, 330)).into_drawing_area());
        assert!(theirs.contains("<text") && theirs.contains("<line"));
        assert_eq!(ours, theirs);
    }

    /// What the fonts' check answers for an SVG, read in full.
    fn needs_cjk(svg: &str) -> bool {
        let mut sandbox = crate::typeset::Sandbox::new();
        sandbox.insert("plots/chart.svg", svg).unwrap();
        crate::typeset::needs_cjk(&sandbox)
    }

    /// When the writer says every text it wrote was plain, the fonts'
    /// check, reading the whole SVG, finds that it needs no CJK face:
    /// random scenes of texts in several families, among them the words
    /// the check looks for (`font:`, `font-family`, `&#`), entities,
    /// characters only the CJK face has and characters the other faces
    /// have. Each answer comes up many times.
    #[test]
    fn a_plain_chart_text_leaves_the_svg_needing_no_cjk_face() {
        let texts = [
            "0",
            "123 %",
            "Plate dissipation, % of rating",
            "a <b> & \"c\" 'd'",
            "Ünïcödé – −12.5 µF Ω ±",
            "",
            "font",
            "a font: 9px",
            "font-family=\"serif\"",
            "b; font-family: x",
            "&#x4e2d;",
            "&#20013; and &#65;",
            "&#",
            "V3 \u{4e2d}",
            "\u{2192} \u{2225}",
            "≤ ≥ √",
            ":text <text",
            "fon",
            "t:",
        ];
        let families = [
            "Noto Sans",
            "Noto Sans",
            "Noto Sans",
            "Noto Sans Mono",
            "sans-serif",
            "Noto Sans\"",
            "WenQuanYi Micro Hei",
            "noto sans",
        ];
        let mut seen = [0usize; 3];
        for seed in 0..3000u64 {
            let mut next =
                crate::test_random::xorshift(seed.wrapping_mul(0x9e37_79b9_7f4a_7c15) | 1);
            let plain = std::cell::Cell::new(true);
            let mut svg = String::new();
            {
                let root = SvgOut::with_string(&mut svg, (400, 300))
                    .noting_text(&plain)
                    .into_drawing_area();
                root.fill(&WHITE).unwrap();
                for _ in 0..next() % 4 {
                    let n = next();
                    let family = families[(n % 8) as usize];
                    let text = texts[((n >> 8) % texts.len() as u64) as usize];
                    let alpha = if n >> 20 & 7 == 0 { 0.0 } else { 1.0 };
                    let font = (family, 12.0).into_font().color(&BLACK.mix(alpha));
                    root.draw(&Text::new(text.to_string(), (10, 20), font))
                        .unwrap();
                    root.draw(&Rectangle::new([(1, 2), (30, 40)], BLUE.filled()))
                        .unwrap();
                }
            }
            let needs = needs_cjk(&svg);
            if plain.get() {
                assert!(!needs, "seed {seed}: {svg}");
            }
            seen[usize::from(plain.get()) * 2 + usize::from(needs)] += 1;
        }
        // Not plain and needing the face, not plain and not needing it,
        // plain (and so not needing it).
        assert!(seen[1] > 300 && seen[0] > 100 && seen[2] > 300, "{seen:?}");
    }
}

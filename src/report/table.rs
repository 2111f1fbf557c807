//! A plain text table for the terminal: columns sized to their widest cell,
//! numbers right-aligned.

/// Column alignment.
#[derive(Clone, Copy, PartialEq, Eq)]
pub enum Align {
    Left,
    Right,
}

pub struct TextTable {
    headers: Vec<String>,
    align: Vec<Align>,
    rows: Vec<Vec<String>>,
}

impl TextTable {
    pub fn new(headers: &[(&str, Align)]) -> Self {
        TextTable {
            headers: headers.iter().map(|(h, _)| h.to_string()).collect(),
            align: headers.iter().map(|(_, a)| *a).collect(),
            rows: Vec::new(),
        }
    }

    pub fn row(&mut self, cells: Vec<String>) {
        self.rows.push(cells);
    }

    pub fn columns(&self) -> usize {
        self.headers.len()
    }

    pub fn is_empty(&self) -> bool {
        self.rows.is_empty()
    }

    /// Renders with `indent` spaces before each line.
    pub fn render(&self, indent: usize) -> String {
        self.render_with(indent, &|_, _, s| s.to_string())
    }

    /// As [`TextTable::render`]; `paint(row, column, cell)` may colour a
    /// body cell after padding (so colour codes do not upset the widths).
    pub fn render_with(
        &self,
        indent: usize,
        paint: &dyn Fn(usize, usize, &str) -> String,
    ) -> String {
        let cols = self.headers.len();
        let width = |i: usize| {
            self.rows
                .iter()
                .map(|r| r.get(i).map(|c| c.chars().count()).unwrap_or(0))
                .chain([self.headers[i].chars().count()])
                .max()
                .unwrap_or(0)
        };
        let widths: Vec<usize> = (0..cols).map(width).collect();
        let pad = |text: &str, i: usize| {
            let n = widths[i].saturating_sub(text.chars().count());
            match self.align[i] {
                Align::Left => format!("{text}{}", " ".repeat(n)),
                Align::Right => format!("{}{text}", " ".repeat(n)),
            }
        };
        let mut out = String::new();
        let line =
            |cells: Vec<String>| format!("{}{}\n", " ".repeat(indent), cells.join("  ").trim_end());
        out.push_str(&line((0..cols).map(|i| pad(&self.headers[i], i)).collect()));
        for (r, row) in self.rows.iter().enumerate() {
            out.push_str(&line(
                (0..cols)
                    .map(|i| paint(r, i, &pad(row.get(i).map(String::as_str).unwrap_or(""), i)))
                    .collect(),
            ));
        }
        out
    }
}

//! One table type, written as an aligned text table, CSV or JSON.

use std::fmt::Write as _;

use clap::ValueEnum;
use serde_json::{Map, Number, Value};

/// How results are written.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Format {
    /// An aligned table for reading.
    Table,
    /// JSON: one object for a single result, otherwise an array of objects.
    Json,
    /// Comma-separated values with a header row.
    Csv,
}

/// A value in a table cell.
#[derive(Debug, Clone)]
pub enum Cell {
    /// A number, shown with `decimals` places in text tables, with `decimals` + 8 places (trailing
    /// zeros dropped) in CSV, and in full in JSON.
    Num { value: f64, decimals: usize },
    /// A whole number.
    Int(i64),
    /// Yes or no.
    Bool(bool),
    /// Text.
    Text(String),
    /// No value (written empty in CSV, null in JSON, "—" in tables).
    Empty,
}

impl Cell {
    pub fn num(value: f64, decimals: usize) -> Self {
        Cell::Num { value, decimals }
    }

    pub fn text(s: impl Into<String>) -> Self {
        Cell::Text(s.into())
    }

    fn display(&self) -> String {
        match self {
            Cell::Num { value, decimals } => format!("{value:.decimals$}"),
            Cell::Int(i) => i.to_string(),
            Cell::Bool(b) => (if *b { "yes" } else { "no" }).into(),
            Cell::Text(s) => s.clone(),
            Cell::Empty => "—".into(),
        }
    }

    fn csv(&self) -> String {
        match self {
            Cell::Num { value, decimals } => csv_number(*value, decimals + 8),
            Cell::Int(i) => i.to_string(),
            Cell::Bool(b) => b.to_string(),
            Cell::Text(s) => s.clone(),
            Cell::Empty => String::new(),
        }
    }

    fn json(&self) -> Value {
        match self {
            Cell::Num { value, .. } => Number::from_f64(*value).map_or(Value::Null, Value::Number),
            Cell::Int(i) => Value::Number((*i).into()),
            Cell::Bool(b) => Value::Bool(*b),
            Cell::Text(s) => Value::String(s.clone()),
            Cell::Empty => Value::Null,
        }
    }
}

/// `value` with `places` decimals, trailing zeros (and a bare point) dropped, so float noise such as
/// 0.19999999999999996 is written 0.2 while every stated digit is kept.
fn csv_number(value: f64, places: usize) -> String {
    if !value.is_finite() {
        return value.to_string();
    }
    let text = format!("{value:.places$}");
    let text = if text.contains('.') { text.trim_end_matches('0').trim_end_matches('.').to_string() } else { text };
    if text == "-0" {
        "0".into()
    } else {
        text
    }
}

/// Rows of named columns, with a title and notes for the text form.
#[derive(Debug, Default)]
pub struct Table {
    pub title: String,
    pub columns: Vec<String>,
    pub rows: Vec<Vec<Cell>>,
    pub notes: Vec<String>,
    /// JSON as one object rather than an array (for a single result).
    pub single: bool,
}

impl Table {
    pub fn new(title: impl Into<String>, columns: Vec<&str>) -> Self {
        Table { title: title.into(), columns: columns.into_iter().map(String::from).collect(), ..Default::default() }
    }

    /// Removes the named columns and their cells.
    pub fn drop_columns(&mut self, names: &[&str]) {
        let keep: Vec<bool> = self.columns.iter().map(|c| !names.contains(&c.as_str())).collect();
        self.columns.retain(|c| !names.contains(&c.as_str()));
        for r in &mut self.rows {
            let mut k = keep.iter();
            r.retain(|_| *k.next().unwrap_or(&true));
        }
    }

    pub fn render(&self, format: Format) -> String {
        match format {
            Format::Table if self.single && self.rows.len() == 1 => self.vertical(),
            Format::Table => self.horizontal(),
            Format::Csv => self.csv(),
            Format::Json => self.json(),
        }
    }

    fn vertical(&self) -> String {
        let mut out = format!("{}\n", self.title);
        let w = self.columns.iter().map(|c| c.len()).max().unwrap_or(0);
        for (c, v) in self.columns.iter().zip(&self.rows[0]) {
            let _ = writeln!(out, "  {c:<w$}  {}", v.display());
        }
        self.notes_into(&mut out);
        out
    }

    fn horizontal(&self) -> String {
        let cells: Vec<Vec<String>> = self.rows.iter().map(|r| r.iter().map(Cell::display).collect()).collect();
        let widths: Vec<usize> = self
            .columns
            .iter()
            .enumerate()
            .map(|(i, c)| cells.iter().map(|r| r[i].chars().count()).chain([c.len()]).max().unwrap_or(0))
            .collect();
        let mut out = format!("{}\n", self.title);
        let line = |out: &mut String, items: Vec<&str>| {
            let parts: Vec<String> = items.iter().zip(&widths).map(|(s, w)| format!("{s:>w$}")).collect();
            let _ = writeln!(out, "  {}", parts.join("  "));
        };
        line(&mut out, self.columns.iter().map(String::as_str).collect());
        for r in &cells {
            line(&mut out, r.iter().map(String::as_str).collect());
        }
        self.notes_into(&mut out);
        out
    }

    fn notes_into(&self, out: &mut String) {
        for n in &self.notes {
            let _ = writeln!(out, "  {n}");
        }
    }

    fn csv(&self) -> String {
        let mut w = csv::Writer::from_writer(Vec::new());
        let _ = w.write_record(&self.columns);
        for r in &self.rows {
            let _ = w.write_record(r.iter().map(Cell::csv));
        }
        String::from_utf8(w.into_inner().unwrap_or_default()).unwrap_or_default()
    }

    fn json(&self) -> String {
        let objects: Vec<Value> = self
            .rows
            .iter()
            .map(|r| {
                Value::Object(
                    self.columns.iter().map(|c| c.to_string()).zip(r.iter().map(Cell::json)).collect::<Map<_, _>>(),
                )
            })
            .collect();
        let v = if self.single && objects.len() == 1 { objects[0].clone() } else { Value::Array(objects) };
        serde_json::to_string_pretty(&v).unwrap_or_default() + "\n"
    }
}

#[cfg(test)]
mod tests {
    use super::csv_number;

    #[test]
    fn csv_numbers_drop_float_noise_and_keep_the_stated_digits() {
        assert_eq!(csv_number(0.19999999999999996, 10), "0.2");
        assert_eq!(csv_number(12.0, 10), "12");
        assert_eq!(csv_number(-0.000000000001, 10), "0");
        assert_eq!(csv_number(50.111622024036, 12), "50.111622024036");
        assert_eq!(csv_number(f64::NAN, 3), "NaN");
    }
}

//! A table's rows for a template, carrying their own text length and
//! their cells written by the program.
//!
//! Templates ask `{{ rows|text_length }}` of every table (the hand-over
//! keeps a short table whole by its row count and characters). Walking
//! the rows through minijinja's values for that is slow: a row made from
//! a Rust struct is a map whose every field is found by comparing its name
//! with each name before it, so a long job paid for each of its thousands
//! of rows twice. A [`Rows`] list works its length out from the Rust values,
//! with the same count the filter's walk gives (every string's characters,
//! numbers and other scalars as they print, map keys left out), and the
//! `text_length` filter reads it.
//!
//! Printing a long table cell by cell through the template engine was the
//! largest part of a long job's own work (a 1,000-set job has some 200,000
//! cells, each an attribute lookup, a filter call and an escape). Each row
//! type therefore writes its own cells as Typst code ([`TypstRow`]), escaped
//! exactly as the template's filters escape them, and a template prints a
//! whole table's rows with `{{ rows|typst_rows }}`.
//!
//! For templates a [`Rows`] is still an ordinary list: it loops, has a
//! `length`, is false when empty, and can be indexed and filtered; the rows
//! become template values only when a template reads one. Serialized
//! anywhere else it is the plain list.

use std::ops::Deref;
use std::sync::{Arc, OnceLock};

use minijinja::value::{Enumerator, Object, ObjectRepr, Value};
use serde::ser::{self, Serialize, Serializer};

/// A row of a table whose cells the program writes as Typst code.
pub trait TypstRow {
    /// Writes the row's cells as the built-in template's loop over the
    /// table printed them: the row begins on a new line indented by two
    /// spaces, and every cell (and the row) ends with a comma. Every piece
    /// of text is escaped (`escape_content`, `escape_markup`,
    /// `escape_string`), so nothing in it can run code.
    fn write_cells(&self, out: &mut String);

    /// What the `text_length` filter's walk counts in the row made a
    /// template value (every string's characters, keys left out, a
    /// [`CountedText`] by its count), worked out from the fields
    /// directly; `None` (the default) for the walk itself. A row type that
    /// answers must be held to the walk by a test.
    fn text_length(&self) -> Option<usize> {
        None
    }
}

/// A table's rows. Dereferences to the `Vec` of rows (shared, so handing
/// them to a template copies nothing); serialized for a template it is a
/// list of the rows that knows its text length and its cells, and
/// serialized anywhere else it is the plain list.
#[derive(Debug, Clone, PartialEq)]
pub struct Rows<T>(Arc<Vec<T>>);

impl<T> Rows<T> {
    /// The rows as a plain vector.
    pub fn into_vec(self) -> Vec<T>
    where
        T: Clone,
    {
        Arc::unwrap_or_clone(self.0)
    }
}

impl<T> Default for Rows<T> {
    fn default() -> Self {
        Rows(Arc::new(Vec::new()))
    }
}

impl<T> Deref for Rows<T> {
    type Target = Vec<T>;
    fn deref(&self) -> &Vec<T> {
        &self.0
    }
}

impl<T> From<Vec<T>> for Rows<T> {
    fn from(rows: Vec<T>) -> Self {
        Rows(Arc::new(rows))
    }
}

impl<T> FromIterator<T> for Rows<T> {
    fn from_iter<I: IntoIterator<Item = T>>(iter: I) -> Self {
        Rows(Arc::new(iter.into_iter().collect()))
    }
}

impl<'a, T> IntoIterator for &'a Rows<T> {
    type Item = &'a T;
    type IntoIter = std::slice::Iter<'a, T>;
    fn into_iter(self) -> Self::IntoIter {
        self.0.iter()
    }
}

impl<T> Serialize for Rows<T>
where
    T: Serialize + TypstRow + std::fmt::Debug + Send + Sync + 'static,
{
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        if !minijinja::value::serializing_for_value() {
            return self.0.serialize(serializer);
        }
        Value::from_object(RowList {
            rows: self.0.clone(),
            values: OnceLock::new(),
            text_length: OnceLock::new(),
        })
        .serialize(serializer)
    }
}

/// Text of a row that a template may read but that costs something to
/// make, such as a checker's reason as a sentence: the hand-over template
/// never prints it, but its characters count in the table's text length
/// (and with it the `keep` rule). Serialized through
/// [`serialize_counted_text`], it is made when a template reads it, and
/// only counted ([`CountedText::char_count`]) when a [`Rows`] list works
/// out its text length.
pub trait CountedText {
    /// The text.
    fn text(&self) -> String;
    /// `self.text().chars().count()`, without making the text.
    fn char_count(&self) -> usize;
}

thread_local! {
    /// True while [`RowSource::text_length`] walks rows on this thread:
    /// a [`CountedText`] then tells the walk its count instead of its text.
    static COUNTING: std::cell::Cell<bool> = const { std::cell::Cell::new(false) };
}

/// The name under which a [`CountedText`] hands its count to the walk
/// (as a unit variant whose index is the count); no other serializer
/// ever sees it.
const COUNTED: &str = "ampreport::typeset::rows::CountedText";

/// Serializes `text` as its string, or, inside the text-length walk of a
/// [`Rows`] list, as its count alone.
pub fn serialize_counted_text<S: Serializer>(
    text: &impl CountedText,
    serializer: S,
) -> Result<S::Ok, S::Error> {
    if COUNTING.with(std::cell::Cell::get)
        && let Ok(count) = u32::try_from(text.char_count())
    {
        return serializer.serialize_unit_variant(COUNTED, count, "");
    }
    serializer.serialize_str(&text.text())
}

/// Sets [`COUNTING`] for as long as it lives, and back to what it was
/// after (also when a walk panics).
struct CountingWalk(bool);

impl CountingWalk {
    fn start() -> Self {
        CountingWalk(COUNTING.with(|c| c.replace(true)))
    }
}

impl Drop for CountingWalk {
    fn drop(&mut self) {
        COUNTING.with(|c| c.set(self.0));
    }
}

/// What a [`RowList`] needs of its rows, whatever their type.
trait RowSource: std::fmt::Debug + Send + Sync {
    fn len(&self) -> usize;
    fn values(&self) -> Vec<Value>;
    fn text_length(&self) -> usize;
    fn write_cells(&self, out: &mut String);
}

impl<T> RowSource for Vec<T>
where
    T: Serialize + TypstRow + std::fmt::Debug + Send + Sync,
{
    fn len(&self) -> usize {
        Vec::len(self)
    }

    fn values(&self) -> Vec<Value> {
        self.iter().map(Value::from_serialize).collect()
    }

    fn text_length(&self) -> usize {
        // The walk of the filter starts at the list (depth 0), so each row
        // is at depth 1.
        let _counting = CountingWalk::start();
        self.iter()
            .map(|row| {
                row.text_length()
                    .unwrap_or_else(|| row.serialize(Counter { depth: 1 }).unwrap_or(0))
            })
            .sum()
    }

    fn write_cells(&self, out: &mut String) {
        for row in self {
            row.write_cells(out);
        }
    }
}

/// The template value of [`Rows`]: the shared rows, made into template
/// values only when a template reads one, their text length counted when
/// first asked for.
#[derive(Debug)]
pub struct RowList {
    rows: Arc<dyn RowSource>,
    values: OnceLock<Vec<Value>>,
    text_length: OnceLock<usize>,
}

impl RowList {
    /// What the `text_length` filter gives for the list.
    pub fn text_length(&self) -> usize {
        *self.text_length.get_or_init(|| self.rows.text_length())
    }

    /// Every row's cells as Typst code ([`TypstRow::write_cells`]).
    pub fn cells(&self) -> String {
        // About what a row of the hand-over's tables takes, so the text
        // seldom grows (and is copied) on the way.
        let mut out = String::with_capacity(self.rows.len() * 192);
        self.rows.write_cells(&mut out);
        out
    }
}

impl Object for RowList {
    fn repr(self: &Arc<Self>) -> ObjectRepr {
        ObjectRepr::Seq
    }

    fn get_value(self: &Arc<Self>, key: &Value) -> Option<Value> {
        let index = key.as_usize()?;
        if index >= self.rows.len() {
            return None;
        }
        self.values
            .get_or_init(|| self.rows.values())
            .get(index)
            .cloned()
    }

    fn enumerate(self: &Arc<Self>) -> Enumerator {
        Enumerator::Seq(self.rows.len())
    }
}

/// The deepest level the filter's walk counts (`text_length` in
/// `template_env.rs`).
pub(crate) const MAX_DEPTH: usize = 16;

/// Counts the characters of text a value holds, as the `text_length`
/// filter would in the template value the value becomes.
struct Counter {
    depth: usize,
}

/// A scalar's characters as it prints in a template.
fn printed(value: Value) -> usize {
    value.to_string().chars().count()
}

#[derive(Debug)]
struct Never;

impl std::fmt::Display for Never {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("cannot count")
    }
}

impl std::error::Error for Never {}

impl ser::Error for Never {
    fn custom<M: std::fmt::Display>(_msg: M) -> Self {
        Never
    }
}

/// The sum over the items of a list or map, each one level deeper.
struct Sum {
    depth: usize,
    total: usize,
}

impl Sum {
    fn add<V: Serialize + ?Sized>(&mut self, value: &V) -> Result<(), Never> {
        self.total += value.serialize(Counter {
            depth: self.depth + 1,
        })?;
        Ok(())
    }
}

impl Counter {
    fn leaf(&self, n: usize) -> Result<usize, Never> {
        Ok(if self.depth > MAX_DEPTH { 0 } else { n })
    }

    fn sum(self) -> Sum {
        Sum {
            depth: self.depth,
            total: 0,
        }
    }
}

impl Serializer for Counter {
    type Ok = usize;
    type Error = Never;
    type SerializeSeq = Sum;
    type SerializeTuple = Sum;
    type SerializeTupleStruct = Sum;
    type SerializeTupleVariant = Sum;
    type SerializeMap = Sum;
    type SerializeStruct = Sum;
    type SerializeStructVariant = Sum;

    fn serialize_bool(self, v: bool) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_i8(self, v: i8) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_i16(self, v: i16) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_i32(self, v: i32) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_i64(self, v: i64) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_i128(self, v: i128) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_u8(self, v: u8) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_u16(self, v: u16) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_u32(self, v: u32) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_u64(self, v: u64) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_u128(self, v: u128) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_f32(self, v: f32) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_f64(self, v: f64) -> Result<usize, Never> {
        self.leaf(printed(Value::from(v)))
    }
    fn serialize_char(self, _v: char) -> Result<usize, Never> {
        self.leaf(1)
    }
    fn serialize_str(self, v: &str) -> Result<usize, Never> {
        self.leaf(v.chars().count())
    }
    fn serialize_bytes(self, v: &[u8]) -> Result<usize, Never> {
        self.leaf(printed(Value::from_bytes(v.to_vec())))
    }
    fn serialize_none(self) -> Result<usize, Never> {
        Ok(0)
    }
    fn serialize_some<V: Serialize + ?Sized>(self, value: &V) -> Result<usize, Never> {
        value.serialize(self)
    }
    fn serialize_unit(self) -> Result<usize, Never> {
        Ok(0)
    }
    fn serialize_unit_struct(self, _name: &'static str) -> Result<usize, Never> {
        Ok(0)
    }
    fn serialize_unit_variant(
        self,
        name: &'static str,
        index: u32,
        variant: &'static str,
    ) -> Result<usize, Never> {
        if name == COUNTED {
            // A CountedText's count, in place of its text.
            return self.leaf(index as usize);
        }
        self.leaf(variant.chars().count())
    }
    fn serialize_newtype_struct<V: Serialize + ?Sized>(
        self,
        _name: &'static str,
        value: &V,
    ) -> Result<usize, Never> {
        value.serialize(self)
    }
    fn serialize_newtype_variant<V: Serialize + ?Sized>(
        self,
        _name: &'static str,
        _index: u32,
        _variant: &'static str,
        value: &V,
    ) -> Result<usize, Never> {
        // A map of the variant's name to the value.
        if self.depth > MAX_DEPTH {
            return Ok(0);
        }
        value.serialize(Counter {
            depth: self.depth + 1,
        })
    }
    fn serialize_seq(self, _len: Option<usize>) -> Result<Sum, Never> {
        Ok(self.sum())
    }
    fn serialize_tuple(self, _len: usize) -> Result<Sum, Never> {
        Ok(self.sum())
    }
    fn serialize_tuple_struct(self, _name: &'static str, _len: usize) -> Result<Sum, Never> {
        Ok(self.sum())
    }
    fn serialize_tuple_variant(
        self,
        _name: &'static str,
        _index: u32,
        _variant: &'static str,
        _len: usize,
    ) -> Result<Sum, Never> {
        // A map of the variant's name to the list: one level more.
        Ok(Sum {
            depth: self.depth + 1,
            total: 0,
        })
    }
    fn serialize_map(self, _len: Option<usize>) -> Result<Sum, Never> {
        Ok(self.sum())
    }
    fn serialize_struct(self, _name: &'static str, _len: usize) -> Result<Sum, Never> {
        Ok(self.sum())
    }
    fn serialize_struct_variant(
        self,
        _name: &'static str,
        _index: u32,
        _variant: &'static str,
        _len: usize,
    ) -> Result<Sum, Never> {
        Ok(Sum {
            depth: self.depth + 1,
            total: 0,
        })
    }
}

impl Sum {
    /// The total, or nothing when the container itself lies past the
    /// deepest level counted.
    fn total(self) -> usize {
        if self.depth > MAX_DEPTH {
            0
        } else {
            self.total
        }
    }
}

impl ser::SerializeSeq for Sum {
    type Ok = usize;
    type Error = Never;
    fn serialize_element<V: Serialize + ?Sized>(&mut self, value: &V) -> Result<(), Never> {
        self.add(value)
    }
    fn end(self) -> Result<usize, Never> {
        Ok(self.total())
    }
}

impl ser::SerializeTuple for Sum {
    type Ok = usize;
    type Error = Never;
    fn serialize_element<V: Serialize + ?Sized>(&mut self, value: &V) -> Result<(), Never> {
        self.add(value)
    }
    fn end(self) -> Result<usize, Never> {
        Ok(self.total())
    }
}

impl ser::SerializeTupleStruct for Sum {
    type Ok = usize;
    type Error = Never;
    fn serialize_field<V: Serialize + ?Sized>(&mut self, value: &V) -> Result<(), Never> {
        self.add(value)
    }
    fn end(self) -> Result<usize, Never> {
        Ok(self.total())
    }
}

impl ser::SerializeTupleVariant for Sum {
    type Ok = usize;
    type Error = Never;
    fn serialize_field<V: Serialize + ?Sized>(&mut self, value: &V) -> Result<(), Never> {
        self.add(value)
    }
    fn end(self) -> Result<usize, Never> {
        Ok(self.total())
    }
}

impl ser::SerializeMap for Sum {
    type Ok = usize;
    type Error = Never;
    fn serialize_key<K: Serialize + ?Sized>(&mut self, _key: &K) -> Result<(), Never> {
        Ok(())
    }
    fn serialize_value<V: Serialize + ?Sized>(&mut self, value: &V) -> Result<(), Never> {
        self.add(value)
    }
    fn end(self) -> Result<usize, Never> {
        Ok(self.total())
    }
}

impl ser::SerializeStruct for Sum {
    type Ok = usize;
    type Error = Never;
    fn serialize_field<V: Serialize + ?Sized>(
        &mut self,
        _key: &'static str,
        value: &V,
    ) -> Result<(), Never> {
        self.add(value)
    }
    fn end(self) -> Result<usize, Never> {
        Ok(self.total())
    }
}

impl ser::SerializeStructVariant for Sum {
    type Ok = usize;
    type Error = Never;
    fn serialize_field<V: Serialize + ?Sized>(
        &mut self,
        _key: &'static str,
        value: &V,
    ) -> Result<(), Never> {
        self.add(value)
    }
    fn end(self) -> Result<usize, Never> {
        Ok(self.total())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::typeset::template_env::text_length_walk;

    #[derive(serde::Serialize, Clone, Debug)]
    struct Row {
        name: String,
        value: Option<String>,
        missing: Option<String>,
        count: u32,
        ratio: f64,
        whole: f64,
        flag: bool,
        list: Vec<String>,
        inner: Inner,
        kind: Kind,
        wrapped: Wrap,
    }

    #[derive(serde::Serialize, Clone, Debug)]
    struct Inner {
        a: String,
        b: Vec<Vec<String>>,
    }

    #[derive(serde::Serialize, Clone, Debug)]
    #[allow(dead_code)]
    enum Kind {
        Plain,
        Carrying(String),
    }

    #[derive(serde::Serialize, Clone, Debug)]
    struct Wrap(String);

    impl TypstRow for Row {
        fn write_cells(&self, out: &mut String) {
            out.push_str("\n  ");
            out.push_str(&crate::typeset::escape::escape_content(&self.name));
            out.push(',');
        }
    }

    impl TypstRow for serde_json::Value {
        fn write_cells(&self, _out: &mut String) {}
    }

    fn row(i: usize) -> Row {
        Row {
            name: format!("V{i} “quoted” ünïcödé {}", "x".repeat(i % 7)),
            value: (i % 2 == 0).then(|| format!("{i}.5 V")),
            missing: None,
            count: i as u32 * 37,
            ratio: i as f64 / 3.0,
            whole: 2.0,
            flag: i % 3 == 0,
            list: (0..i % 4).map(|k| format!("item {k}")).collect(),
            inner: Inner {
                a: "–".repeat(i),
                b: vec![vec!["deep".into(); i % 3]; 2],
            },
            kind: if i % 2 == 0 {
                Kind::Plain
            } else {
                Kind::Carrying(format!("carried {i}"))
            },
            wrapped: Wrap(format!("w{i}")),
        }
    }

    #[test]
    fn the_length_carried_is_the_filters_walk_of_the_same_rows() {
        for n in [0, 1, 2, 5, 17] {
            let rows: Vec<Row> = (0..n).map(row).collect();
            let walked = text_length_walk(&Value::from_serialize(&rows));
            let value = Value::from_serialize(Rows::from(rows.clone()));
            let list = value
                .downcast_object_ref::<RowList>()
                .expect("rows become a row list");
            assert_eq!(list.text_length(), walked, "{n} rows");
            assert!(walked > 0 || n == 0);
        }
    }

    #[test]
    fn rows_deep_inside_are_counted_as_the_walk_counts_them() {
        // Nested lists past the walk's deepest level count nothing.
        let mut deep = serde_json::json!("bottom text");
        for _ in 0..20 {
            deep = serde_json::json!([deep, "level"]);
        }
        let rows = vec![deep.clone(), deep];
        let walked = text_length_walk(&Value::from_serialize(&rows));
        let value = Value::from_serialize(Rows::from(rows));
        let list = value.downcast_object_ref::<RowList>().unwrap();
        assert_eq!(list.text_length(), walked);
    }

    #[test]
    fn a_template_sees_an_ordinary_list() {
        let env = minijinja::Environment::new();
        let rows: Rows<Row> = (0..3).map(row).collect();
        let empty: Rows<Row> = Rows::default();
        let ctx = minijinja::context! { rows => Value::from_serialize(&rows), empty => Value::from_serialize(&empty) };
        let out = env
            .render_str(
                "{{ rows|length }} {% for r in rows %}{{ r.count }},{% endfor %} {{ rows[1].name }} {% if empty %}full{% else %}empty{% endif %} {{ rows|map(attribute='count')|join('+') }} {{ rows|selectattr('flag')|list|length }}",
                ctx,
            )
            .unwrap();
        assert_eq!(out, format!("3 0,37,74, {} empty 0+37+74 1", row(1).name));
    }

    #[test]
    fn outside_a_template_it_is_the_plain_list() {
        let rows: Rows<Row> = (0..2).map(row).collect();
        assert_eq!(
            serde_json::to_value(&rows).unwrap(),
            serde_json::to_value(rows.as_slice()).unwrap()
        );
    }
}

//! Table outputs in three formats, from one description (columns, metadata, rows of cells):
//!
//! - **CSV**: the metadata as leading `# key: value` lines (see [`Meta::comment_block`]), then
//!   `# units: {...}` (column to unit, compact JSON), then a plain header row and the rows.
//!   `pandas.read_csv(path, comment="#")` reads it.
//! - **ECSV** (Enhanced Character Separated Values 1.0, the open text format astropy reads with
//!   units and metadata): a YAML header in `# ` lines — `%ECSV 1.0`, `---`, `datatype` (one
//!   flow mapping per column with `name`, `unit` where it has one, `datatype`, `description`),
//!   `delimiter: ','`, `meta` (an ordered map, `!!omap`), `schema: astropy-2.0` — then the
//!   header row and the rows as CSV. A missing value is an empty field (astropy masks it);
//!   booleans are `True`/`False`. Every string in the header is written as a JSON string, which
//!   is a YAML double-quoted scalar.
//! - **JSON**: `{"meta": {...}, "columns": [names], "units": {name: unit}, "rows": [[values in
//!   column order], ...]}` (`null` for a missing value): row-major, so that
//!   `pandas.DataFrame(d["rows"], columns=d["columns"])` reads it.
//!
//! Numbers are written in the shortest form that reads back to the same double
//! ([`NumberText`] in CSV and ECSV, serde_json's text in JSON).

use super::columns::{Column, DataType};
use super::meta::Meta;
use super::number_text::NumberText;
use serde_json::Value;
use std::io::Write;

/// The format of a table file, chosen by its extension.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum TableFormat {
    /// Comma-separated values with `#` metadata lines (any extension but the two below).
    Csv,
    /// The JSON object of the output (`.json`).
    Json,
    /// ECSV 1.0 (`.ecsv`).
    Ecsv,
}

impl TableFormat {
    /// The format named by `path`'s extension (in any letter case): `.json`, `.ecsv`, else CSV
    /// (also for `-`, standard output).
    pub fn from_path(path: &std::path::Path) -> Self {
        match path
            .extension()
            .and_then(|e| e.to_str())
            .map(str::to_ascii_lowercase)
            .as_deref()
        {
            Some("json") => TableFormat::Json,
            Some("ecsv") => TableFormat::Ecsv,
            _ => TableFormat::Csv,
        }
    }
}

/// One cell of a row.
#[derive(Debug, Clone, PartialEq)]
pub enum Cell {
    /// Text.
    Text(String),
    /// A finite number.
    Number(f64),
    /// A whole number.
    Count(u64),
    /// A flag.
    Flag(bool),
    /// No value.
    Empty,
}

impl Cell {
    /// A number, or [`Cell::Empty`] if it is not finite.
    pub fn number(v: f64) -> Self {
        if v.is_finite() {
            Cell::Number(v)
        } else {
            Cell::Empty
        }
    }

    /// The cell as a JSON value (`null` for no value).
    pub fn json(&self) -> Value {
        match self {
            Cell::Text(s) => Value::String(s.clone()),
            Cell::Number(v) => serde_json::Number::from_f64(*v).map_or(Value::Null, Value::Number),
            Cell::Count(n) => Value::from(*n),
            Cell::Flag(b) => Value::Bool(*b),
            Cell::Empty => Value::Null,
        }
    }
}

/// A cell as its JSON value would be written (`null` for no value), without building the
/// value: [`write_json`] writes each row's cells straight from the slice.
impl serde::Serialize for Cell {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        match self {
            Cell::Text(text) => s.serialize_str(text),
            Cell::Number(v) => s.serialize_f64(*v),
            Cell::Count(n) => s.serialize_u64(*n),
            Cell::Flag(b) => s.serialize_bool(*b),
            Cell::Empty => s.serialize_unit(),
        }
    }
}

/// The shortest decimal text that reads back to `v` (finite), as CSV and ECSV cells hold it.
pub fn format_number(v: f64) -> String {
    String::from_utf8_lossy(NumberText::new().format(v)).into_owned()
}

/// The cells of a serialisable row (a struct whose field names are the column names), in the
/// order of `columns`; a field that is absent, `null` or not finite is empty.
pub fn cells_of<T: serde::Serialize>(row: &T, columns: &[Column]) -> Vec<Cell> {
    let value = serde_json::to_value(row).unwrap_or(Value::Null);
    columns
        .iter()
        .map(|c| match value.get(&c.name) {
            Some(Value::String(s)) => Cell::Text(s.clone()),
            Some(Value::Bool(b)) => Cell::Flag(*b),
            Some(Value::Number(n)) => match (c.datatype, n.as_u64()) {
                (DataType::Int64 | DataType::UInt8, Some(k)) => Cell::Count(k),
                _ => n.as_f64().map_or(Cell::Empty, Cell::number),
            },
            _ => Cell::Empty,
        })
        .collect()
}

/// A table to write: its columns, its metadata, and `len` rows produced on demand by `row`
/// (so that a large profile is never held twice).
pub struct Tabular<'a> {
    /// The columns.
    pub columns: &'a [Column],
    /// The metadata.
    pub meta: &'a Meta,
    /// Number of rows.
    pub len: usize,
    /// The cells of row `i`, in column order.
    pub row: &'a dyn Fn(usize) -> Vec<Cell>,
}

/// Write `t` as CSV (see the module documentation).
pub fn write_csv(w: &mut dyn Write, t: &Tabular) -> std::io::Result<()> {
    w.write_all(t.meta.comment_block().as_bytes())?;
    writeln!(w, "# units: {}", super::columns::units_json(t.columns))?;
    write_csv_rows(w, t, "true", "false")
}

/// The header row and the rows of `t` as CSV records, flags as `yes`/`no` (CSV
/// `true`/`false`, ECSV `True`/`False`), numbers as [`NumberText`] writes them.
fn write_csv_rows(w: &mut dyn Write, t: &Tabular, yes: &str, no: &str) -> std::io::Result<()> {
    let mut line = CsvLine::default();
    for c in t.columns {
        line.field(c.name.as_bytes());
    }
    w.write_all(line.end())?;
    for i in 0..t.len {
        for cell in &(t.row)(i) {
            line.cell(cell, yes, no);
        }
        w.write_all(line.end())?;
    }
    Ok(())
}

/// One CSV record at a time, written into a reused buffer (a 5 000-row profile writes 170 000
/// numbers: no allocation per cell or row). The text is the csv crate's with its default
/// settings, which the files have always been written with (a test compares the two): fields
/// joined by `,`, a record ended by `\n`; a field that holds `,`, `"`, `\r` or `\n` quoted,
/// with its `"` doubled; and a record of one empty field written `""`.
#[derive(Default)]
struct CsvLine {
    text: Vec<u8>,
    /// Whether the record has a field yet (it may be empty text).
    started: bool,
    numbers: NumberText,
    counts: itoa::Buffer,
}

impl CsvLine {
    /// Append `cell` as a field.
    fn cell(&mut self, cell: &Cell, yes: &str, no: &str) {
        match cell {
            Cell::Text(text) => self.field(text.as_bytes()),
            Cell::Number(v) => {
                self.delimit();
                self.text.extend_from_slice(self.numbers.format(*v));
            }
            Cell::Count(n) => {
                self.delimit();
                self.text
                    .extend_from_slice(self.counts.format(*n).as_bytes());
            }
            Cell::Flag(b) => self.field(if *b { yes } else { no }.as_bytes()),
            Cell::Empty => self.delimit(),
        }
    }

    /// Append `field`, quoted if it must be.
    fn field(&mut self, field: &[u8]) {
        self.delimit();
        if field
            .iter()
            .any(|b| matches!(b, b',' | b'"' | b'\r' | b'\n'))
        {
            self.text.push(b'"');
            for &b in field {
                if b == b'"' {
                    self.text.push(b'"');
                }
                self.text.push(b);
            }
            self.text.push(b'"');
        } else {
            self.text.extend_from_slice(field);
        }
    }

    /// Start a field: a `,` after the first, and the buffer emptied of the last record before
    /// the first (it keeps its capacity).
    fn delimit(&mut self) {
        if self.started {
            self.text.push(b',');
        } else {
            self.text.clear();
            self.started = true;
        }
    }

    /// The record's text with its terminator; the next field starts a new record.
    fn end(&mut self) -> &[u8] {
        if !self.started {
            self.text.clear();
        }
        if self.text.is_empty() {
            // A lone empty field, told apart from a blank line.
            self.text.extend_from_slice(b"\"\"");
        }
        self.text.push(b'\n');
        self.started = false;
        &self.text
    }
}

/// A JSON value as YAML flow text: JSON with `, ` and `: ` separators (valid YAML 1.1 and 1.2),
/// floats with a decimal point and a signed exponent so that YAML 1.1 loaders read them as
/// floats.
fn yaml_flow(v: &Value) -> String {
    match v {
        Value::Array(items) => {
            let parts: Vec<String> = items.iter().map(yaml_flow).collect();
            format!("[{}]", parts.join(", "))
        }
        Value::Object(map) => {
            let parts: Vec<String> = map
                .iter()
                .map(|(k, v)| format!("{}: {}", Value::String(k.clone()), yaml_flow(v)))
                .collect();
            format!("{{{}}}", parts.join(", "))
        }
        Value::Number(n) if n.is_f64() => {
            let text = n.to_string();
            match text.split_once('e') {
                Some((mantissa, exponent)) => {
                    let mantissa = if mantissa.contains('.') {
                        mantissa.to_string()
                    } else {
                        format!("{mantissa}.0")
                    };
                    let exponent = if exponent.starts_with('-') {
                        exponent.to_string()
                    } else {
                        format!("+{exponent}")
                    };
                    format!("{mantissa}e{exponent}")
                }
                None => text,
            }
        }
        other => other.to_string(),
    }
}

/// Write `t` as ECSV 1.0 (see the module documentation).
pub fn write_ecsv(w: &mut dyn Write, t: &Tabular) -> std::io::Result<()> {
    writeln!(w, "# %ECSV 1.0")?;
    writeln!(w, "# ---")?;
    writeln!(w, "# datatype:")?;
    for c in t.columns {
        let mut entry = serde_json::Map::new();
        entry.insert("name".into(), Value::String(c.name.clone()));
        if !c.unit.is_empty() {
            entry.insert("unit".into(), Value::String(c.unit.clone()));
        }
        entry.insert("datatype".into(), Value::String(c.datatype.ecsv().into()));
        entry.insert("description".into(), Value::String(c.description.clone()));
        // In column order: name, unit, datatype, description (serde_json sorts keys, so
        // write the mapping by hand).
        let fields: Vec<String> = ["name", "unit", "datatype", "description"]
            .iter()
            .filter_map(|k| {
                entry
                    .get(*k)
                    .map(|v| format!("{}: {}", Value::String((*k).into()), yaml_flow(v)))
            })
            .collect();
        writeln!(w, "# - {{{}}}", fields.join(", "))?;
    }
    writeln!(w, "# delimiter: ','")?;
    writeln!(w, "# meta: !!omap")?;
    for (k, v) in t.meta.entries() {
        writeln!(w, "# - {{{}: {}}}", Value::String(k.clone()), yaml_flow(v))?;
    }
    writeln!(w, "# schema: astropy-2.0")?;
    write_csv_rows(w, t, "True", "False")
}

/// Write `t` as a JSON object `{meta, columns, units, rows}` (see the module documentation).
pub fn write_json(w: &mut dyn Write, t: &Tabular) -> std::io::Result<()> {
    // Streamed by hand so that a large table is not built as one JSON value.
    let names: Vec<&str> = t.columns.iter().map(|c| c.name.as_str()).collect();
    write!(
        w,
        "{{\"meta\":{},\"columns\":{},\"units\":{},\"rows\":[",
        t.meta.to_json(),
        serde_json::to_string(&names)?,
        super::columns::units_json(t.columns)
    )?;
    // Each row is serialised from its cells (no JSON value built) into one reused line.
    let mut line = Vec::new();
    for i in 0..t.len {
        line.clear();
        line.extend_from_slice(if i > 0 { b",\n" } else { b"\n" });
        serde_json::to_writer(&mut line, &(t.row)(i))?;
        w.write_all(&line)?;
    }
    w.write_all(b"]}\n")
}

/// Write `t` to `path` in `format`: CSV, ECSV, or JSON — `json` if given (an output with its
/// own JSON shape), else the row-major table of [`write_json`]. `-` is standard output; a file
/// is written atomically.
pub fn write_table_file<J: serde::Serialize>(
    path: &std::path::Path,
    format: TableFormat,
    t: &Tabular,
    json: Option<&J>,
) -> crate::error::Result<()> {
    crate::output::write_output(path, |w| match (format, json) {
        (TableFormat::Csv, _) => write_csv(w, t),
        (TableFormat::Ecsv, _) => write_ecsv(w, t),
        (TableFormat::Json, None) => write_json(w, t),
        (TableFormat::Json, Some(v)) => {
            serde_json::to_writer_pretty(&mut *w, v).map_err(std::io::Error::other)?;
            w.write_all(b"\n")
        }
    })
}

/// An ECSV table as read back: its columns, metadata, header row and rows of text.
#[derive(Debug, Clone, PartialEq)]
pub struct EcsvTable {
    /// The columns of the `datatype` list.
    pub columns: Vec<Column>,
    /// The `meta` map.
    pub meta: Meta,
    /// The rows, as text, in column order.
    pub rows: Vec<Vec<String>>,
}

/// Whether `text` starts like an ECSV file.
pub fn is_ecsv_text(text: &str) -> bool {
    text.starts_with("# %ECSV")
}

/// Read an ECSV text written by [`write_ecsv`], checking the header against the ECSV 1.0
/// rules: the first line `# %ECSV 1.0`, then `# ---`; a `datatype` list whose every entry has a
/// `name` and a `datatype` of the standard's names; delimiter `,` (or the default space, which
/// this reader does not take); the header row of the data equal to the `datatype` names; every
/// row as many fields as columns. Errors name the line.
pub fn read_ecsv(text: &str) -> Result<EcsvTable, String> {
    const STANDARD_TYPES: [&str; 17] = [
        "bool",
        "int8",
        "int16",
        "int32",
        "int64",
        "uint8",
        "uint16",
        "uint32",
        "uint64",
        "float16",
        "float32",
        "float64",
        "float128",
        "complex64",
        "complex128",
        "complex256",
        "string",
    ];
    let mut lines = text.lines().enumerate();
    let mut next = |want: &str| match lines.next() {
        Some((_, l)) if l.trim_end() == want => Ok(()),
        Some((i, l)) => Err(format!("line {}: expected `{want}`, found `{l}`", i + 1)),
        None => Err(format!("expected `{want}`, found the end")),
    };
    next("# %ECSV 1.0")?;
    next("# ---")?;
    let mut columns: Vec<Column> = Vec::new();
    let mut meta = Meta::default();
    let mut delimiter = None;
    let mut section = "";
    let mut header_end = 0;
    for (i, line) in text.lines().enumerate().skip(2) {
        let at = |why: String| format!("line {}: {why}", i + 1);
        let Some(body) = line.strip_prefix("# ") else {
            if line.starts_with('#') {
                return Err(at(format!("a header line must start with `# `: `{line}`")));
            }
            header_end = i;
            break;
        };
        if let Some(item) = body.strip_prefix("- ") {
            let item = item.trim();
            let Some(inner) = item.strip_prefix('{').and_then(|s| s.strip_suffix('}')) else {
                return Err(at(format!(
                    "expected a flow mapping {{...}}, found `{item}`"
                )));
            };
            match section {
                "datatype" => {
                    let v: Value = serde_json::from_str(item)
                        .map_err(|e| at(format!("a datatype entry that is not a mapping: {e}")))?;
                    let text_of = |k: &str| v.get(k).and_then(Value::as_str).map(String::from);
                    let name =
                        text_of("name").ok_or_else(|| at("a column without `name`".into()))?;
                    let datatype = text_of("datatype")
                        .ok_or_else(|| at(format!("column {name} has no `datatype`")))?;
                    if !STANDARD_TYPES.contains(&datatype.as_str()) {
                        return Err(at(format!(
                            "column {name}: datatype {datatype} is not one of {}",
                            STANDARD_TYPES.join(", ")
                        )));
                    }
                    let datatype = DataType::from_ecsv(&datatype).unwrap_or(DataType::String);
                    columns.push(Column {
                        name,
                        unit: text_of("unit").unwrap_or_default(),
                        datatype,
                        description: text_of("description").unwrap_or_default(),
                    });
                }
                "meta" => {
                    let (key, value) = inner
                        .split_once(": ")
                        .ok_or_else(|| at(format!("expected {{key: value}}, found `{item}`")))?;
                    let key: String = serde_json::from_str(key)
                        .map_err(|e| at(format!("a meta key that is not a string: {e}")))?;
                    let value: Value =
                        serde_json::from_str(value).map_err(|e| at(format!("meta {key}: {e}")))?;
                    meta = meta.with(&key, value);
                }
                _ => return Err(at("a list item outside `datatype` and `meta`".into())),
            }
            continue;
        }
        let (key, value) = body
            .split_once(':')
            .ok_or_else(|| at(format!("expected `key: value`, found `{body}`")))?;
        section = "";
        match (key, value.trim()) {
            ("datatype", "") => section = "datatype",
            ("meta", "!!omap") => section = "meta",
            ("delimiter", d) => delimiter = Some(d.to_string()),
            ("schema", _) => {}
            (other, _) => return Err(at(format!("unknown header key `{other}`"))),
        }
    }
    if columns.is_empty() {
        return Err("the header has no `datatype` list".into());
    }
    if delimiter.as_deref() != Some("','") {
        return Err("the header must say `delimiter: ','`".into());
    }
    let data: String = text
        .lines()
        .skip(header_end)
        .flat_map(|l| [l, "\n"])
        .collect();
    let mut reader = csv::ReaderBuilder::new()
        .has_headers(true)
        .from_reader(data.as_bytes());
    let header = reader
        .headers()
        .map_err(|e| format!("line {}: {e}", header_end + 1))?
        .clone();
    if !header.iter().eq(columns.iter().map(|c| c.name.as_str())) {
        return Err(format!(
            "line {}: the header row does not list the datatype names in order",
            header_end + 1
        ));
    }
    let mut rows = Vec::new();
    for (k, record) in reader.records().enumerate() {
        let line = header_end + 2 + k;
        let record = record.map_err(|e| format!("line {line}: {e}"))?;
        if record.len() != columns.len() {
            return Err(format!(
                "line {line}: {} fields for {} columns",
                record.len(),
                columns.len()
            ));
        }
        rows.push(record.iter().map(String::from).collect());
    }
    Ok(EcsvTable {
        columns,
        meta,
        rows,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::output::meta::Provenance;

    fn demo() -> (Vec<Column>, Meta, Vec<Vec<Cell>>) {
        let columns = vec![
            Column {
                name: "mass_g".into(),
                unit: "g".into(),
                datatype: DataType::Float64,
                description: "mass, \"quoted\"".into(),
            },
            Column {
                name: "ok".into(),
                unit: String::new(),
                datatype: DataType::Bool,
                description: "a flag".into(),
            },
            Column {
                name: "note".into(),
                unit: String::new(),
                datatype: DataType::String,
                description: "text".into(),
            },
        ];
        let meta = Meta::new(&Provenance::new("starpoise test"), "demo")
            .with("x", 0.7)
            .with("tolerance", 1e-10)
            .with("nested", serde_json::json!({"a": [1.5, "b"]}));
        let rows = vec![
            vec![
                Cell::number(1.9884098706980498e33),
                Cell::Flag(true),
                Cell::Text("a, b".into()),
            ],
            vec![
                Cell::Empty,
                Cell::Flag(false),
                Cell::Text("say \"hi\"".into()),
            ],
        ];
        (columns, meta, rows)
    }

    /// The demo table written by `writer`.
    fn render(writer: fn(&mut dyn Write, &Tabular) -> std::io::Result<()>) -> Vec<u8> {
        let (columns, meta, rows) = demo();
        let row = |i: usize| rows[i].clone();
        let t = Tabular {
            columns: &columns,
            meta: &meta,
            len: rows.len(),
            row: &row,
        };
        let mut out = Vec::new();
        writer(&mut out, &t).unwrap();
        out
    }

    #[test]
    fn ecsv_round_trips_through_its_reader() {
        let (columns, meta, _) = demo();
        let text = String::from_utf8(render(write_ecsv)).unwrap();
        assert!(
            text.starts_with("# %ECSV 1.0\n# ---\n# datatype:\n"),
            "{text}"
        );
        assert!(text.contains("# meta: !!omap\n"), "{text}");
        assert!(text.contains("\"tolerance\": 1.0e-10"), "{text}");
        let back = read_ecsv(&text).unwrap();
        assert_eq!(back.columns, columns);
        assert_eq!(back.meta, meta);
        assert_eq!(
            back.rows,
            vec![
                vec![
                    "1.9884098706980498e33".to_string(),
                    "True".into(),
                    "a, b".into()
                ],
                vec![String::new(), "False".into(), "say \"hi\"".into()],
            ]
        );
        assert_eq!(
            back.rows[0][0].parse::<f64>().unwrap(),
            1.9884098706980498e33
        );
    }

    #[test]
    fn ecsv_reader_refuses_what_the_standard_does_not_allow() {
        let good = String::from_utf8(render(write_ecsv)).unwrap();
        for (from, to) in [
            ("# %ECSV 1.0", "# %ECSV 9.9"),
            ("# ---", "# ..."),
            ("\"datatype\": \"bool\"", "\"datatype\": \"boolean\""),
            ("{\"name\": \"ok\", ", "{"),
            (", \"datatype\": \"string\"", ""),
            ("mass_g,ok,note", "mass_g,note,ok"),
            ("# delimiter: ','\n", ""),
        ] {
            let bad = good.replacen(from, to, 1);
            assert_ne!(bad, good, "{from}");
            assert!(read_ecsv(&bad).is_err(), "accepted with {from} -> {to}");
        }
    }

    /// A record as the csv crate writes it with its default settings, field by field (how the
    /// rows were written before `CsvLine`): the reference for the quoting rules.
    fn csv_crate_record(cells: &[Cell]) -> Vec<u8> {
        let mut csv = csv::Writer::from_writer(Vec::new());
        for cell in cells {
            match cell {
                Cell::Text(text) => csv.write_field(text),
                Cell::Number(v) => csv.write_field(ryu::Buffer::new().format(*v)),
                Cell::Count(n) => csv.write_field(n.to_string()),
                Cell::Flag(b) => csv.write_field(if *b { "True" } else { "False" }),
                Cell::Empty => csv.write_field(""),
            }
            .unwrap();
        }
        csv.write_record(None::<&[u8]>).unwrap();
        csv.into_inner().unwrap()
    }

    /// `CsvLine` writes every record as the csv crate does: texts that need quotes (delimiter,
    /// quote, line ends), every ASCII character, empty fields alone and in company, numbers,
    /// counts and flags, one record after another in the same buffer.
    #[test]
    fn csv_records_are_the_csv_crates() {
        let mut texts: Vec<String> = [
            "",
            "plain",
            "a, b",
            "say \"hi\"",
            "\"",
            "\"\"",
            "line\nbreak",
            "carriage\rreturn",
            "crlf\r\n",
            "tab\there",
            "#hash",
            " spaced ",
            "'single'",
            "back\\slash",
            "é ünïcode ☉",
        ]
        .map(String::from)
        .to_vec();
        texts.extend((0u8..128).map(|b| char::from(b).to_string()));
        let others = [
            Cell::Empty,
            Cell::number(-1.5080116840627478e17),
            Cell::number(0.000010119107603725222),
            Cell::Count(0),
            Cell::Count(u64::MAX),
            Cell::Flag(true),
            Cell::Flag(false),
        ];
        let mut records: Vec<Vec<Cell>> = vec![vec![], vec![Cell::Empty, Cell::Empty]];
        for text in &texts {
            records.push(vec![Cell::Text(text.clone())]);
            for other in &others {
                records.push(vec![Cell::Text(text.clone()), other.clone()]);
                records.push(vec![other.clone(), Cell::Text(text.clone())]);
            }
        }
        for other in &others {
            records.push(vec![other.clone()]);
        }
        let mut line = CsvLine::default();
        for cells in &records {
            for cell in cells {
                line.cell(cell, "True", "False");
            }
            assert_eq!(
                String::from_utf8_lossy(line.end()),
                String::from_utf8_lossy(&csv_crate_record(cells)),
                "{cells:?}"
            );
        }
    }

    /// A row serialised from its cells is the JSON text of the row's values (how the rows
    /// were written before), for every kind of cell.
    #[test]
    fn json_rows_are_their_values_text() {
        let cells = vec![
            Cell::Text("say \"hi\",\n\u{1} é".into()),
            Cell::number(1.5080116840627478e17),
            Cell::number(-4.307129710230769e-14),
            Cell::number(-0.0),
            Cell::number(3.0),
            Cell::number(f64::NAN),
            Cell::Count(u64::MAX),
            Cell::Flag(true),
            Cell::Flag(false),
            Cell::Empty,
        ];
        let values: Vec<Value> = cells.iter().map(Cell::json).collect();
        assert_eq!(
            serde_json::to_string(&cells).unwrap(),
            serde_json::to_string(&values).unwrap()
        );
    }

    #[test]
    fn json_tables_are_row_major_with_units() {
        let v: Value = serde_json::from_slice(&render(write_json)).unwrap();
        assert_eq!(v["columns"], serde_json::json!(["mass_g", "ok", "note"]));
        assert_eq!(v["units"]["mass_g"], "g");
        assert_eq!(v["rows"][0][0].as_f64(), Some(1.9884098706980498e33));
        assert_eq!(v["rows"][1][0], Value::Null);
        assert_eq!(v["meta"]["x"], 0.7);
    }
}

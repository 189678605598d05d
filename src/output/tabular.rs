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
//! Numbers are written in the shortest form that reads back to the same double (`ryu`).

use super::columns::{Column, DataType};
use super::meta::Meta;
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

/// The shortest decimal text that reads back to `v` (finite).
pub fn format_number(v: f64) -> String {
    ryu::Buffer::new().format(v).to_string()
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
    let mut csv = csv::Writer::from_writer(w);
    csv.write_record(t.columns.iter().map(|c| c.name.as_str()))?;
    for i in 0..t.len {
        write_cells(&mut csv, &(t.row)(i), "true", "false")?;
    }
    csv.flush()
}

/// One CSV record of `cells`, each field written from a borrowed buffer (no String per cell:
/// a 5 000-row profile writes 170 000 numbers), numbers as [`format_number`] writes them and
/// flags as `yes`/`no` (CSV `true`/`false`, ECSV `True`/`False`).
fn write_cells<W: Write>(
    csv: &mut csv::Writer<W>,
    cells: &[Cell],
    yes: &str,
    no: &str,
) -> std::io::Result<()> {
    let mut numbers = ryu::Buffer::new();
    for cell in cells {
        match cell {
            Cell::Text(text) => csv.write_field(text)?,
            Cell::Number(v) => csv.write_field(numbers.format(*v))?,
            Cell::Count(n) => csv.write_field(n.to_string())?,
            Cell::Flag(b) => csv.write_field(if *b { yes } else { no })?,
            Cell::Empty => csv.write_field("")?,
        }
    }
    csv.write_record(None::<&[u8]>)?;
    Ok(())
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
    let mut csv = csv::Writer::from_writer(w);
    csv.write_record(t.columns.iter().map(|c| c.name.as_str()))?;
    for i in 0..t.len {
        write_cells(&mut csv, &(t.row)(i), "True", "False")?;
    }
    csv.flush()
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
    for i in 0..t.len {
        if i > 0 {
            w.write_all(b",")?;
        }
        let cells: Vec<Value> = (t.row)(i).iter().map(Cell::json).collect();
        w.write_all(b"\n")?;
        serde_json::to_writer(&mut *w, &cells)?;
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

//! Shared helpers for the reference checks: reading the vector tables that
//! `tests/scripts/gen_vectors.py` writes from scipy / mpmath / numpy.

use std::path::PathBuf;

/// A table of reference values: named columns of `f64`.
#[derive(Debug, Clone)]
pub struct Table {
    /// Column names from the header line.
    pub columns: Vec<String>,
    /// Rows of values.
    pub rows: Vec<Vec<f64>>,
}

impl Table {
    /// Index of a column by name; panics (in tests) if absent.
    pub fn idx(&self, name: &str) -> usize {
        self.columns
            .iter()
            .position(|c| c == name)
            .unwrap_or_else(|| panic!("column {name} not in {:?}", self.columns))
    }

    /// Iterates rows as a closure-friendly accessor: `row.get("name")`.
    pub fn iter(&self) -> impl Iterator<Item = Row<'_>> {
        self.rows.iter().map(move |r| Row {
            table: self,
            values: r,
        })
    }
}

/// One row of a [`Table`].
pub struct Row<'a> {
    table: &'a Table,
    values: &'a [f64],
}

impl Row<'_> {
    /// The value in column `name`.
    pub fn get(&self, name: &str) -> f64 {
        self.values[self.table.idx(name)]
    }
}

/// Path of the vectors folder.
pub fn vectors_dir() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("vectors")
}

/// Loads `tests/vectors/<name>.txt`.
pub fn load(name: &str) -> Table {
    let path = vectors_dir().join(format!("{name}.txt"));
    let text = std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    let mut lines = text
        .lines()
        .filter(|l| !l.starts_with('#') && !l.trim().is_empty());
    let header = lines.next().expect("header line");
    let columns: Vec<String> = header.split_whitespace().map(str::to_owned).collect();
    let rows: Vec<Vec<f64>> = lines
        .map(|l| {
            let r: Vec<f64> = l
                .split_whitespace()
                .map(|v| {
                    v.parse::<f64>()
                        .unwrap_or_else(|e| panic!("{name}: {v}: {e}"))
                })
                .collect();
            assert_eq!(r.len(), columns.len(), "{name}: row length");
            r
        })
        .collect();
    assert!(!rows.is_empty(), "{name}: no rows");
    Table { columns, rows }
}

/// Relative-or-absolute closeness: |a − b| ≤ max(rtol·|b|, atol).
pub fn close(a: f64, b: f64, rtol: f64, atol: f64) -> bool {
    (a - b).abs() <= (rtol * b.abs()).max(atol)
}

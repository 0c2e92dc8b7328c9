//! A plain table shared by the text and CSV presenters.

/// Column alignment in text output.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Align {
    /// Words.
    Left,
    /// Numbers.
    Right,
}

/// Headers and rows of strings.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Table {
    /// Column headers.
    pub headers: Vec<String>,
    /// Alignment per column.
    pub align: Vec<Align>,
    /// Cells.
    pub rows: Vec<Vec<String>>,
}

impl Table {
    /// A table whose columns are given as `(header, alignment)`.
    pub fn new(columns: &[(&str, Align)]) -> Self {
        Table {
            headers: columns.iter().map(|c| c.0.to_string()).collect(),
            align: columns.iter().map(|c| c.1).collect(),
            rows: Vec::new(),
        }
    }

    /// Append a row.
    pub fn push(&mut self, row: Vec<String>) {
        self.rows.push(row);
    }

    /// Add columns on the right, `cells[i]` continuing row i (rows without cells get
    /// empty ones, so every row stays as wide as the headers).
    pub fn extend_columns(&mut self, columns: &[(&str, Align)], cells: Vec<Vec<String>>) {
        self.headers.extend(columns.iter().map(|c| c.0.to_string()));
        self.align.extend(columns.iter().map(|c| c.1));
        let mut more = cells.into_iter();
        for row in &mut self.rows {
            let add = more
                .next()
                .unwrap_or_else(|| vec![String::new(); columns.len()]);
            row.extend(add);
        }
    }
}

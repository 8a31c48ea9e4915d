//! The tables of a staged plan's box: the stage table of a double or
//! multiple plan, and the item table of an item-by-item plan. Numbers
//! centred in columns as wide as their widest head or cell, every other
//! row tinted, acceptance numbers in green and rejection numbers in red.

use crate::print::canvas::Canvas;
use crate::print::draw::{Colour, Face, grey, rgb};
use crate::print::geometry::{MM_PER_PT, Rect};
use crate::print::palette::{ACCEPT, REJECT};
use crate::print::wording::sheet;

/// One cell of a plan table.
pub struct Cell {
    /// What it says.
    pub text: String,
    /// In which face.
    pub face: Face,
    /// In which colour.
    pub color: Colour,
}

impl Cell {
    /// A number or a run of units, in black.
    pub fn plain(text: String) -> Self {
        Cell {
            text,
            face: Face::Regular,
            color: grey(0.0),
        }
    }

    /// An acceptance number in bold green, or the dash of a stage that
    /// cannot accept.
    pub fn accept(number: Option<u64>) -> Self {
        Cell {
            text: number.map_or(sheet::CANNOT_ACCEPT.to_string(), |a| a.to_string()),
            face: Face::Bold,
            color: ACCEPT,
        }
    }

    /// A rejection number in bold red.
    pub fn reject(number: u64) -> Self {
        Cell {
            text: number.to_string(),
            face: Face::Bold,
            color: REJECT,
        }
    }
}

/// Size of the two-line heads of a plan table.
const HEAD_SIZE: f64 = 6.5;

/// The type of a plan table's rows: the size of the numbers and the row
/// pitch (mm).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RowType {
    /// The numbers' size, points.
    pub size: f64,
    /// The row pitch, mm.
    pub pitch: f64,
}

/// Row types from the largest, which a short stage table takes when the
/// procedure beside it makes the box tall anyway, to the smallest.
pub const ROW_TYPES: [RowType; 3] = [
    RowType {
        size: 9.5,
        pitch: 5.4,
    },
    RowType {
        size: 8.5,
        pitch: 4.6,
    },
    RowType {
        size: 7.5,
        pitch: 3.9,
    },
];

/// The row types of item tables, which are long: the smallest stage
/// table type, then a tighter one for a table that would not fit.
pub const ITEM_ROWS: [RowType; 2] = [
    ROW_TYPES[2],
    RowType {
        size: 7.0,
        pitch: 3.5,
    },
];

/// Top of a plan table's first row below its top edge: two head lines and
/// the rule under them.
pub const TABLE_HEAD_H: f64 = 7.0;

/// Column widths of a plan table: the widest head line or cell, plus room.
pub fn column_widths<const K: usize>(
    c: &Canvas,
    heads: &[[&str; 2]; K],
    rows: &[[Cell; K]],
    size: f64,
) -> [f64; K] {
    let mut widths = [0.0; K];
    for (j, w) in widths.iter_mut().enumerate() {
        let head = heads[j]
            .iter()
            .map(|h| c.width(h, Face::Bold, HEAD_SIZE))
            .fold(0.0, f64::max);
        let cells = rows
            .iter()
            .map(|r| c.width(&r[j].text, r[j].face, size))
            .fold(0.0, f64::max);
        *w = head.max(cells) + 3.5;
    }
    widths
}

/// What a plan table shows: its name (as messages give it), its two-line
/// column heads and its rows.
#[derive(Clone, Copy)]
pub struct Table<'a, const K: usize> {
    /// The table's name.
    pub name: &'a str,
    /// The column heads, two lines each.
    pub heads: &'a [[&'a str; 2]; K],
    /// The rows.
    pub rows: &'a [[Cell; K]],
}

/// `table` from the top-left corner `(x, top)` in columns `widths` wide:
/// two-line heads, a rule, then one row per entry in the type `rows_in`,
/// every other row tinted; each cell centred in its column. Returns the
/// height used.
pub fn plan_table<const K: usize>(
    c: &mut Canvas,
    table: &Table<K>,
    (x, top): (f64, f64),
    widths: &[f64; K],
    rows_in: RowType,
) -> f64 {
    let Table { name, heads, rows } = *table;
    let RowType { size, pitch } = rows_in;
    let total: f64 = widths.iter().sum();
    let mut cx = x;
    for (head, w) in heads.iter().zip(widths) {
        for (k, line) in head.iter().enumerate() {
            let lw = c.width(line, Face::Bold, HEAD_SIZE);
            let y = top - 2.6 - 2.7 * k as f64;
            c.text(
                cx + (w - lw) / 2.0,
                y,
                line,
                Face::Bold,
                HEAD_SIZE,
                grey(0.25),
            );
        }
        cx += w;
    }
    let rule = top - TABLE_HEAD_H + 0.6;
    c.line(&[(x, rule), (x + total, rule)], 0.5, grey(0.2), None);
    let first = top - TABLE_HEAD_H;
    for (i, row) in rows.iter().enumerate() {
        let row_top = first - pitch * i as f64;
        if i % 2 == 1 {
            c.rect_fill(
                Rect::new(x, row_top - pitch, total, pitch),
                rgb(0.85, 0.89, 0.95),
            );
        }
        let y = row_top - pitch * 0.5 - size * MM_PER_PT * 0.36;
        let mut cx = x;
        for (cell, w) in row.iter().zip(widths) {
            let tw = c.width(&cell.text, cell.face, size);
            if tw > w - 1.0 {
                c.fault(format!("{name}: '{}' is wider than its column", cell.text));
            }
            c.text(
                cx + (w - tw) / 2.0,
                y,
                &cell.text,
                cell.face,
                size,
                cell.color,
            );
            cx += w;
        }
    }
    TABLE_HEAD_H + pitch * rows.len() as f64
}

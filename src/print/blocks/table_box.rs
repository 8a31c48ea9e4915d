//! The plan box of a staged plan: its table on the left (the stage table
//! of a double or multiple plan, the item table of an item-by-item plan,
//! in one or two columns), a note under it, and the procedure on the
//! right. Both tables are set by the same rules: every way of setting the
//! box (row type, columns, procedure size) is measured, and the one
//! chosen leaves the charts below their comfortable height where it can.

use super::plan_box::plan_frame;
use super::plan_table::{
    Cell, ITEM_ROWS, ROW_TYPES, RowType, TABLE_HEAD_H, Table, column_widths, plan_table,
};
use super::procedure::{PROCEDURE_SIZES, procedure_column, steps_height};
use crate::plan::SequentialLines;
use crate::print::agreement::Agreement;
use crate::print::canvas::Canvas;
use crate::print::draw::Face;
use crate::print::facts::Facts;
use crate::print::geometry::Rect;
use crate::print::text::Shrink;
use crate::print::wording::sheet;

/// Room above a plan table for the box's heading, and below it for the
/// note and the box's edge (a stage table's note is short).
const TABLE_TOP: f64 = 9.5;
const TABLE_BOTTOM: f64 = 7.0;

/// Extra chart height a plan box leaves when it can: below it, the
/// procedure goes down a size rather than squeeze the charts.
const CHART_COMFORT: f64 = 12.0;

/// The most columns an item table is split into. Three columns of about
/// 47 mm would leave the procedure beside them under its least width on
/// either paper, and a procedure below them would cost more height than
/// the third column saves, for any table the page can hold.
const MAX_ITEM_COLUMNS: usize = 2;

/// The narrowest the procedure may be beside an item table.
const MIN_PROCEDURE_W: f64 = 58.0;

/// The gap between the columns of a table split in two, mm.
const GUTTER: f64 = 4.0;

/// A table to set in a plan box, with its heading and the note under it.
struct BoxedTable<'a, const K: usize> {
    table: Table<'a, K>,
    heading: String,
    note: String,
    /// The note's name, as messages give it.
    note_name: &'a str,
}

/// How a table may be split and how its note is given room.
#[derive(Clone, Copy)]
struct Splits {
    /// The most columns.
    columns: usize,
    /// The narrowest procedure beside the table, if any.
    min_procedure: Option<f64>,
    /// Whether the note's room is measured (else [`TABLE_BOTTOM`]).
    measured_note: bool,
}

/// One way to set the box: the table's row type, column widths and rows
/// per column, and the width of the box's left column.
#[derive(Clone, Copy)]
struct Setting<const K: usize> {
    rows_in: RowType,
    widths: [f64; K],
    per: usize,
    col: f64,
}

/// A setting with its procedure size and box height.
type Candidate<const K: usize> = (f64, f64, Setting<K>);

/// Every way of setting `t` in a box `width` wide in the row type
/// `rows_in`, at every procedure size: `(size, box height, setting)`.
fn candidates<const K: usize>(
    c: &Canvas,
    steps: &[String],
    t: &BoxedTable<K>,
    width: f64,
    rows_in: RowType,
    splits: Splits,
) -> Vec<Candidate<K>> {
    let rows = t.table.rows;
    let widths = column_widths(c, t.table.heads, rows, rows_in.size);
    let one: f64 = widths.iter().sum();
    let mut out = Vec::new();
    for k in 1..=splits.columns.min(rows.len()) {
        let per = rows.len().div_ceil(k);
        let table_w =
            (one * k as f64 + GUTTER * (k as f64 - 1.0)).max(c.width(&t.heading, Face::Bold, 7.0));
        let col = table_w + 8.0;
        let proc_w = width - col - 8.0;
        if splits.min_procedure.is_some_and(|least| proc_w < least) {
            continue;
        }
        let table = TABLE_TOP + TABLE_HEAD_H + rows_in.pitch * per as f64;
        let need = if splits.measured_note {
            let note_h = c
                .fit(
                    &t.note,
                    Face::Regular,
                    col - 6.0,
                    f64::INFINITY,
                    Shrink::fixed(6.5),
                )
                .height;
            table + 2.0 + note_h + 2.0
        } else {
            table + TABLE_BOTTOM
        };
        for size in PROCEDURE_SIZES {
            let h = steps_height(c, steps, proc_w, size).max(need);
            out.push((
                size,
                h,
                Setting {
                    rows_in,
                    widths,
                    per,
                    col,
                },
            ));
        }
    }
    out
}

/// Of the candidate boxes `(size, height, setting)`, the one that leaves
/// the charts [`CHART_COMFORT`] above their least height, else the one
/// that stays within `plan_max`; among those the largest procedure size,
/// then the lowest box. When none stays within `plan_max`, the lowest box
/// and a fault naming `what`.
fn choose_box<T: Copy>(
    c: &mut Canvas,
    what: &str,
    options: &[(f64, f64, T)],
    plan_max: f64,
) -> Option<(f64, f64, T)> {
    for budget in [plan_max - CHART_COMFORT, plan_max] {
        let best = options
            .iter()
            .filter(|o| o.1 <= budget)
            .max_by(|a, b| a.0.total_cmp(&b.0).then(b.1.total_cmp(&a.1)));
        if let Some(&o) = best {
            return Some(o);
        }
    }
    let lowest = options.iter().min_by(|a, b| a.1.total_cmp(&b.1)).copied();
    if let Some((_, h, _)) = lowest {
        c.fault(format!(
            "{what} need {h:.0} mm and the page leaves {plan_max:.0} mm"
        ));
    }
    lowest
}

/// Draws the box of `t` hanging from the top edge `at` as `chosen` sets
/// it: the frame, the heading, the table in its columns, the note under
/// it, the procedure beside it. Returns the box height.
fn draw_box<const K: usize>(
    c: &mut Canvas,
    steps: &[String],
    t: &BoxedTable<K>,
    at: Rect,
    (size, plan_h, s): Candidate<K>,
) -> f64 {
    let (left, top) = (at.x, at.top());
    let plan = Rect::from_top(left, top, at.w, plan_h);
    plan_frame(c, plan);
    c.heading(left + 4.0, top - 7.0, &t.heading);
    let one: f64 = s.widths.iter().sum();
    let mut used: f64 = 0.0;
    for (j, chunk) in t.table.rows.chunks(s.per).enumerate() {
        let x = left + 4.0 + (one + GUTTER) * j as f64;
        let part = Table {
            rows: chunk,
            ..t.table
        };
        used = used.max(plan_table(
            c,
            &part,
            (x, top - TABLE_TOP),
            &s.widths,
            s.rows_in,
        ));
    }
    c.paragraph(
        t.note_name,
        Rect::from_top(
            left + 4.0,
            top - TABLE_TOP - used - 1.0,
            s.col - 6.0,
            plan_h - TABLE_TOP - used - 2.0,
        ),
        &t.note,
        Face::Regular,
        Shrink::new(6.5, 5.5),
    );
    procedure_column(c, steps, plan, s.col, size);
    plan_h
}

/// The double or multiple plan's box, hanging from the top edge `at`: the
/// stage table on the left, the procedure on the right; the procedure
/// size by [`choose_box`] in the smallest row type, then the largest row
/// type that keeps that size and the box height. Returns the box height.
pub fn stage_plan_box(c: &mut Canvas, f: &Facts, at: Rect, plan_max: f64) -> f64 {
    let stages = f.plan.stages();
    let mut drawn = 0;
    let rows: Vec<[Cell; 5]> = stages
        .iter()
        .enumerate()
        .map(|(i, s)| {
            let row = [
                Cell::plain((i + 1).to_string()),
                Cell::plain((s.n - drawn).to_string()),
                Cell::plain(s.n.to_string()),
                Cell::accept(s.accept),
                Cell::reject(s.reject),
            ];
            drawn = s.n;
            row
        })
        .collect();
    let form = match &f.common.agreement {
        Agreement::Rectifying { request, .. } => request.scheme(),
        Agreement::Points { .. } => f.common.source.scheme,
    };
    let t = BoxedTable {
        table: Table {
            name: "stage table",
            heads: &sheet::STAGE_HEADS,
            rows: &rows,
        },
        heading: sheet::stages_heading(form.name(), stages.len(), f.plan.max_sample()),
        note: sheet::stage_note(stages.iter().any(|s| s.accept.is_none())).to_string(),
        note_name: "stage table note",
    };
    let steps = f.steps();
    let splits = Splits {
        columns: 1,
        min_procedure: None,
        measured_note: false,
    };
    let set = |c: &Canvas, rows_in| candidates(c, &steps, &t, at.w, rows_in, splits);
    let smallest = set(c, ROW_TYPES[ROW_TYPES.len() - 1]);
    let what = format!(
        "the stage table ({} stages) and the procedure",
        stages.len()
    );
    let Some(plain) = choose_box(c, &what, &smallest, plan_max) else {
        return 0.0;
    };
    // A larger type where it costs the procedure no size and the box no
    // height.
    let chosen = ROW_TYPES
        .iter()
        .find_map(|&rows_in| {
            set(c, rows_in)
                .into_iter()
                .find(|o| o.0 == plain.0 && o.1 <= plain.1 + 1e-9)
        })
        .unwrap_or(plain);
    draw_box(c, &steps, &t, at, chosen)
}

/// The item-by-item plan's box, hanging from the top edge `at`: the item
/// table (in one or two columns) and the lines it comes from on the left,
/// the procedure on the right; the split and the procedure size by
/// [`choose_box`], in the tighter row type only when the first fits
/// nowhere. When no split fits, a fault: the table is never cut short.
/// Returns the box height.
pub fn item_plan_box(
    c: &mut Canvas,
    f: &Facts,
    lines: &SequentialLines,
    at: Rect,
    plan_max: f64,
) -> f64 {
    let runs = lines.runs();
    let rows: Vec<[Cell; 3]> = runs
        .iter()
        .map(|r| {
            [
                Cell::plain(sheet::units(r.first, r.last)),
                Cell::accept(r.accept),
                Cell::reject(r.reject),
            ]
        })
        .collect();
    let t = BoxedTable {
        table: Table {
            name: "item table",
            heads: &sheet::ITEM_HEADS,
            rows: &rows,
        },
        heading: sheet::items_heading(lines.truncation),
        note: sheet::item_note(lines.h_accept, lines.h_reject, lines.slope),
        note_name: "item table note",
    };
    let steps = f.steps();
    let splits = Splits {
        columns: MAX_ITEM_COLUMNS,
        min_procedure: Some(MIN_PROCEDURE_W),
        measured_note: true,
    };
    let mut options = candidates(c, &steps, &t, at.w, ITEM_ROWS[0], splits);
    if options.iter().all(|o| o.1 > plan_max) {
        options.extend(candidates(c, &steps, &t, at.w, ITEM_ROWS[1], splits));
    }
    let what = format!(
        "the item table ({} rows, in up to {MAX_ITEM_COLUMNS} columns) and the procedure",
        runs.len()
    );
    let Some(chosen) = choose_box(c, &what, &options, plan_max) else {
        c.fault(format!(
            "the item table ({} rows) leaves the procedure no room",
            runs.len()
        ));
        return 0.0;
    };
    draw_box(c, &steps, &t, at, chosen)
}

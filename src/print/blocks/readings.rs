//! The readings table of a variables sheet: numbered rows to write each
//! measurement in, in up to four columns, as tall as the OC chart under
//! it leaves; or, for a sample larger than the sheet holds, the note that
//! the readings go on a separate log.

use super::fields::field;
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey, rgb};
use crate::print::facts::{MAX_SHEET_READINGS, VariablesFacts};
use crate::print::geometry::{MM_PER_PT, Rect};
use crate::print::page::{GAP, MIN_CHART_H};
use crate::print::text::Shrink;
use crate::print::wording::variables;

/// The most columns of the readings table.
const READING_COLUMNS: u64 = 4;

/// Row pitch of the readings table: the least, the one a table takes when
/// the chart keeps its comfortable height, and the most.
const MIN_PITCH: f64 = 4.8;
const COMFORT_PITCH: f64 = 6.0;
const MAX_PITCH: f64 = 7.0;

/// The OC chart height a readings table leaves when it can; else the
/// height it leaves while its rows keep the balanced pitch.
const CHART_COMFORT_H: f64 = 70.0;
const CHART_BALANCED_H: f64 = 60.0;
const BALANCED_PITCH: f64 = 5.0;

/// Top of the readings table's first row below the block's top: heading
/// line, column heads and the rule.
const READINGS_HEAD_H: f64 = 9.0;

/// The readings block at the top of `band`, the room the readings table
/// and the OC chart under it share: heading with the lot and gauge
/// fields, then either
/// the numbered table (columns and pitch by [`readings_grid`]) or, for a
/// sample beyond [`MAX_SHEET_READINGS`], the note that the readings go on
/// a separate log. Returns the height.
pub fn readings_block(c: &mut Canvas, f: &VariablesFacts, band: Rect) -> f64 {
    let (x, top, w, band_h) = (band.x, band.top(), band.w, band.h);
    let n = f.plan.n();
    let heading = variables::readings_heading(f.unit);
    let heading_y = top - 3.5;
    c.heading(x, heading_y, &heading);
    // Lot and gauge, to write in, on the heading's line.
    let fields_x = x + c.width(&heading, Face::Bold, 7.0) + 5.0;
    let split = fields_x + (x + w - fields_x) * 0.45;
    field(
        c,
        fields_x,
        split - 3.0,
        heading_y,
        variables::LOT_NUMBER,
        false,
    );
    field(c, split, x + w, heading_y, variables::GAUGE, false);
    if f.on_log() {
        let note = if n > MAX_SHEET_READINGS {
            variables::readings_elsewhere(n, MAX_SHEET_READINGS)
        } else {
            variables::readings_displaced(n)
        };
        let note_h = c
            .fit(
                &note,
                Face::Regular,
                w - 4.0,
                f64::INFINITY,
                Shrink::fixed(7.5),
            )
            .height;
        let h = 6.0 + note_h + 3.0;
        c.claim("readings", Rect::new(x, top - h, w, h));
        c.rect_fill(Rect::new(x, top - h, w, h - 5.5), rgb(0.97, 0.95, 0.88));
        c.paragraph(
            "readings note",
            Rect::from_top(x + 2.0, top - 7.0, w - 4.0, note_h + 0.5),
            &note,
            Face::Regular,
            Shrink::fixed(7.5),
        );
        return h;
    }
    let (cols, rows, pitch) = readings_grid(c, n, band_h);
    let h = READINGS_HEAD_H + rows as f64 * pitch;
    c.claim("readings", Rect::new(x, top - h, w, h));
    let gutter = 3.0;
    let group_w = ((w - gutter * (cols as f64 - 1.0)) / cols as f64).min(40.0);
    let number_w = 8.0;
    let first = top - READINGS_HEAD_H;
    let size = if pitch >= 5.5 { 7.5 } else { 7.0 };
    for j in 0..cols {
        let gx = x + (group_w + gutter) * j as f64;
        let head_y = top - 8.3;
        c.text_right(
            gx + number_w - 1.5,
            head_y,
            variables::READING_HEADS[0],
            Face::Bold,
            6.5,
            grey(0.25),
        );
        c.text(
            gx + number_w + 1.5,
            head_y,
            variables::READING_HEADS[1],
            Face::Bold,
            6.5,
            grey(0.25),
        );
        for i in 0..rows {
            let index = j * rows + i + 1;
            if index > n {
                break;
            }
            let row_top = first - pitch * i as f64;
            if i % 2 == 1 {
                c.rect_fill(
                    Rect::new(gx, row_top - pitch, group_w, pitch),
                    rgb(0.92, 0.94, 0.97),
                );
            }
            c.text_right(
                gx + number_w - 1.5,
                row_top - pitch * 0.5 - size * MM_PER_PT * 0.36,
                &index.to_string(),
                Face::Regular,
                size,
                grey(0.3),
            );
        }
        let filled = (n - j * rows).min(rows) as f64;
        // The grid: a rule under every row, the number column's edge.
        c.line(
            &[(gx, first + 0.6), (gx + group_w, first + 0.6)],
            0.5,
            grey(0.2),
            None,
        );
        for i in 1..=filled as u64 {
            let y = first - pitch * i as f64;
            c.line(&[(gx, y), (gx + group_w, y)], 0.3, grey(0.55), None);
        }
        c.line(
            &[
                (gx + number_w, first + 0.6),
                (gx + number_w, first - pitch * filled),
            ],
            0.3,
            grey(0.55),
            None,
        );
    }
    h
}

/// The columns, rows and row pitch of the readings table of `n` readings
/// in a band `band_h` tall: the fewest columns that leave the chart its
/// comfortable height at the comfortable pitch (rows as tall as that
/// leaves, up to the most); else all the columns, at the pitch that leaves
/// the chart a balanced height if the rows keep a balanced pitch, else the
/// pitch that leaves the chart its least height, and a fault below the
/// least pitch.
fn readings_grid(c: &mut Canvas, n: u64, band_h: f64) -> (u64, u64, f64) {
    let room = |chart: f64| band_h - GAP - chart - READINGS_HEAD_H;
    for cols in 1..=READING_COLUMNS.min(n) {
        let rows = n.div_ceil(cols);
        if room(CHART_COMFORT_H) >= rows as f64 * COMFORT_PITCH {
            let pitch = (room(CHART_COMFORT_H) / rows as f64).min(MAX_PITCH);
            return (cols, rows, pitch);
        }
    }
    let cols = READING_COLUMNS.min(n);
    let rows = n.div_ceil(cols);
    // Between the two: the chart a little above its least height while
    // the rows stay easy to write in.
    let balanced = room(CHART_BALANCED_H) / rows as f64;
    if balanced >= BALANCED_PITCH {
        return (cols, rows, balanced.min(COMFORT_PITCH));
    }
    let pitch = (room(MIN_CHART_H) / rows as f64).min(COMFORT_PITCH);
    if pitch < MIN_PITCH - 1e-9 {
        c.fault(format!(
            "the readings table ({n} rows) needs {:.0} mm and the page leaves {:.0} mm",
            rows as f64 * MIN_PITCH + READINGS_HEAD_H,
            room(MIN_CHART_H) + READINGS_HEAD_H
        ));
    }
    (cols, rows, pitch.max(MIN_PITCH))
}

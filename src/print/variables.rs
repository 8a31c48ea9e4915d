//! The page of a variables plan: the inspector measures `n` units and
//! decides by a statistic of their mean and spread, so the sheet carries
//! the numbers of the rule and the blanks to work it out in.
//!
//! Layout, from the top: the title block; the plan box (n, k or M, sigma,
//! the limits and the attributes plan for the same points, beside the
//! procedure); the risk table; then two columns: on the left the readings
//! table over the OC chart (under the notice of a plan printed as
//! recorded, if any), on the right the decision rule, the result lines and
//! the signatures; the footer. The title block, risk table,
//! signatures, footer and risk-point marks are the attribute sheets' own.
//!
//! # How many readings the sheet holds
//!
//! At most [`MAX_SHEET_READINGS`] = 48: four columns of twelve rows at the
//! least row pitch (4.8 mm, tight but still a line to write a reading on)
//! are what Letter leaves above an OC chart of its least height, beside the
//! right column of a two-limit plan, whose rule takes the most room
//! (checked for every kind of plan on both papers by tests/sheet.rs). A4 would hold more, but a sheet says the same on either
//! paper. A larger sample is written on a separate readings log; the sheet
//! says so and keeps the result lines.

use super::canvas::Canvas;
use super::chart::{self, Axes, LegendEntry, Plot, nice_ceiling};
use super::draw::{Face, grey, rgb};
use super::geometry::{MM_PER_PT, Rect};
use super::text::Shrink;
use super::wording::variables::{self as words, RuleLine};
use super::{
    Common, Frame, GAP, MIN_CHART_H, PROCEDURE_SIZES, accept_colour, notice_block, plan_frame,
    quality_tick, reject_colour, risk_marks, risk_table, sheet_words, signatures, steps_block,
    steps_height, title_block,
};
use crate::design::{SingleDesign, design_single};
use crate::error::Error;
use crate::model::Model;
use crate::numeric::{NumericalError, Quantity, Short, check};
use crate::plan::{VariablesPlan, measures, quality_at_pa};
use crate::report::words::CAUTION;
use crate::source::{PlanSource, variables_risks};

/// The most readings the sheet's table holds (see the module docs).
pub const MAX_SHEET_READINGS: u64 = 48;

/// The most columns of the readings table.
const READING_COLUMNS: u64 = 4;

/// Row pitch of the readings table: the least, the one a table takes when
/// the chart keeps its comfortable height, and the most.
const MIN_PITCH: f64 = 4.8;
const COMFORT_PITCH: f64 = 6.0;
const MAX_PITCH: f64 = 7.0;

/// The OC chart height a readings table leaves when it can; else the
/// height it leaves while its rows keep the balanced pitch; and the most
/// the chart takes.
const CHART_COMFORT_H: f64 = 70.0;
const CHART_BALANCED_H: f64 = 60.0;
const BALANCED_PITCH: f64 = 5.0;
const CHART_MAX_H: f64 = 100.0;

/// The most lines of the notice of a plan printed as recorded, in the
/// left column.
const NOTICE_LINES: usize = 7;

/// Widths: the right column, and the plan box's left column.
const RIGHT_W: f64 = 72.0;
const PLAN_COL: f64 = 60.0;

/// The plan box's height when the procedure is short.
const PLAN_MIN_H: f64 = 40.0;

/// Heights of the title block (a little lower than the staged sheets'),
/// the risk table and the signatures.
const TITLE_H: f64 = 30.0;
const RISK_H: f64 = 20.0;
const SIGNATURES_H: f64 = 40.0;

/// Top of the readings table's first row below the block's top: heading
/// line, column heads and the rule.
const READINGS_HEAD_H: f64 = 9.0;

/// Pitch of the result lines.
const RESULT_PITCH: f64 = 5.5;

/// What the blocks of a variables sheet print from, gathered once.
pub(super) struct Facts<'a> {
    pub(super) common: Common<'a>,
    plan: VariablesPlan,
    model: Model,
    unit: Option<&'a str>,
    /// The attributes single plan for the same points, if one exists
    /// within the caps.
    attributes: Option<SingleDesign>,
    /// Whether the readings go on a separate log because the notice of an
    /// unconfirmed plan leaves their table no room.
    pub(super) displaced: bool,
}

impl<'a> Facts<'a> {
    /// The facts of a variables `source` (parsed from `text`).
    ///
    /// # Errors
    /// [`Error`] for an invalid specification or a missing or invalid plan.
    pub(super) fn gather(
        source: &'a PlanSource,
        text: &str,
        file_name: &'a str,
    ) -> Result<Self, Error> {
        let request = source.variables_request()?;
        let plan = source.recorded_variables_plan(&request)?;
        let scheme = words::scheme(request.spec().sigma_kind());
        let agreement = super::Agreement::Points {
            risks: *request.risks(),
            achieved: variables_risks(&plan, request.risks()),
        };
        let common =
            super::Common::new(source, text, file_name, agreement, request.model(), scheme)?;
        Ok(Facts {
            common,
            plan,
            model: *request.model(),
            unit: source.variables.as_ref().and_then(|v| v.unit.as_deref()),
            attributes: design_single(request.model(), request.risks()).ok(),
            displaced: false,
        })
    }

    /// Whether the readings go on a separate log.
    pub(super) fn on_log(&self) -> bool {
        self.plan.n() > MAX_SHEET_READINGS || self.displaced
    }
}

/// Lays out the variables page from `top` down; a block that does not fit
/// is a fault on the canvas.
///
/// # Errors
/// [`NumericalError`] when a point of the OC curves is not a probability.
pub(super) fn layout(
    c: &mut Canvas,
    f: &Facts,
    frame: Frame,
    mut top: f64,
) -> Result<(), NumericalError> {
    let Frame {
        left,
        right,
        width,
        margin,
    } = frame;
    let title_h = title_block(c, &f.common, left, top, width, TITLE_H);
    top -= title_h + GAP;
    let plan_h = plan_box(c, f, left, top, width);
    top -= plan_h + GAP;
    risk_table(c, &f.common, left, top, width, RISK_H);
    top -= RISK_H + GAP;

    let caution = format!(
        "{CAUTION} {}",
        words::assumption(f.plan.spec().sigma_kind())
    );
    let foot_h = footer_height(c, &caution, width);
    let band_bottom = margin + foot_h + GAP;
    // The right column: rule, results, then the signatures at the bottom.
    let right_x = right - RIGHT_W;
    let rule_h = rule_block(c, f, right_x, top, RIGHT_W);
    let results_top = top - rule_h - GAP;
    let results_h = results_block(c, f, right_x, results_top, RIGHT_W);
    let room = results_top - results_h - GAP - band_bottom;
    let sig_h = room.min(SIGNATURES_H + 8.0);
    if room < SIGNATURES_H {
        c.fault(format!(
            "the decision rule and the results leave the signatures {room:.0} mm of the {SIGNATURES_H:.0} they need"
        ));
    }
    signatures(
        c,
        &f.common,
        right_x,
        band_bottom + sig_h,
        RIGHT_W,
        sig_h.max(0.0),
    );

    // The left column: the notice of a plan printed as recorded, the
    // readings, the chart. The right column has no room to spare for the
    // notice (a two-limit rule fills it on Letter), the left one does when
    // the readings go on a log.
    let left_w = width - RIGHT_W - 4.0;
    top -= notice_block(c, &f.common, left, top, left_w, NOTICE_LINES);
    let band_h = top - band_bottom;
    let readings_h = readings_block(c, f, left, top, left_w, band_h);
    let chart_h = (band_h - readings_h - GAP).min(CHART_MAX_H);
    if chart_h < MIN_CHART_H - 1e-9 {
        c.fault("the page is too short for its blocks".to_string());
    }
    oc_chart(
        c,
        f,
        left,
        top - readings_h - GAP - chart_h,
        left_w,
        chart_h.max(20.0),
    )?;
    let judge = words::judge_command(f.common.file_name);
    super::footer(c, &f.common, frame, foot_h, &caution, &judge);
    Ok(())
}

/// The footer's height for `caution` (at 7 points across the page) and
/// the provenance line with the judge command (three lines at 6 points).
fn footer_height(c: &Canvas, caution: &str, width: f64) -> f64 {
    let caution_h = c
        .fit(
            caution,
            Face::Regular,
            width,
            f64::INFINITY,
            Shrink::fixed(7.0),
        )
        .height;
    1.5 + caution_h + 1.5 + 3.0 * 6.0 * MM_PER_PT * 1.25 + 0.5
}

/// The plan box: heading, n and the constant large, sigma, the limits and
/// the attributes plan on the left; the procedure on the right. Returns
/// the box height.
fn plan_box(c: &mut Canvas, f: &Facts, left: f64, top: f64, width: f64) -> f64 {
    let spec = f.plan.spec();
    let steps = words::procedure(&f.plan, f.unit, f.on_log());
    let proc_w = width - PLAN_COL - 8.0;
    // The largest procedure size that keeps the box low, else the
    // smallest.
    let size = PROCEDURE_SIZES
        .iter()
        .copied()
        .find(|&s| steps_height(c, &steps, proc_w, s) <= PLAN_MIN_H + 2.0)
        .unwrap_or(PROCEDURE_SIZES[PROCEDURE_SIZES.len() - 1]);
    let small = [
        words::sigma_line(spec, f.unit),
        words::limits_line(spec, f.unit),
        words::comparison(f.attributes.as_ref(), f.plan.n()),
    ];
    let col_w = PLAN_COL - 6.0;
    let small_h: f64 = small
        .iter()
        .map(|t| {
            c.fit(t, Face::Regular, col_w, f64::INFINITY, Shrink::fixed(7.0))
                .height
                + 0.6
        })
        .sum();
    let n_line = format!("n = {}", f.plan.n());
    let constant = words::constant(&f.plan);
    let n_w = c.width(&n_line, Face::Bold, 18.0);
    let k_w = c.width(&constant, Face::Bold, 14.0);
    // n and the constant on one line when they fit, else one under the
    // other; then the small lines.
    let one_line = n_w + 6.0 + k_w <= col_w;
    let small_top = if one_line { 17.5 } else { 23.0 };
    let left_need = small_top + small_h + 1.5;
    let plan_h = left_need
        .max(steps_height(c, &steps, proc_w, size))
        .max(PLAN_MIN_H);
    plan_frame(c, left, top, width, plan_h);
    let x = left + 4.0;
    c.heading(x, top - 7.0, words::plan_heading(spec));
    let blue = rgb(0.05, 0.25, 0.55);
    if one_line {
        c.text(x, top - 14.0, &n_line, Face::Bold, 18.0, blue);
        c.text(x + n_w + 6.0, top - 14.0, &constant, Face::Bold, 14.0, blue);
    } else {
        for (line, y, size) in [(&n_line, top - 14.0, 18.0), (&constant, top - 20.5, 14.0)] {
            if c.width(line, Face::Bold, size) > col_w {
                c.overflow(format!("plan box: '{line}'"));
            }
            c.text(x, y, line, Face::Bold, size, blue);
        }
    }
    let mut y = top - small_top;
    for t in &small {
        let used = c.paragraph(
            "plan box",
            Rect::from_top(x, y, col_w, y - (top - plan_h + 1.5)),
            t,
            Face::Regular,
            Shrink::new(7.0, 6.0),
        );
        y -= used + 0.6;
    }
    steps_block(
        c,
        &steps,
        left + PLAN_COL + 4.0,
        top,
        proc_w,
        top - plan_h + 2.0,
        size,
    );
    c.line(
        &[
            (left + PLAN_COL, top - 3.0),
            (left + PLAN_COL, top - plan_h + 3.0),
        ],
        0.4,
        grey(0.6),
        None,
    );
    plan_h
}

/// The formula size, from which a formula too wide for its block steps
/// down.
const FORMULA_SIZES: [f64; 4] = [8.5, 8.0, 7.5, 7.0];

/// The decision rule in a thin frame: the formulas with the plan's
/// numbers, the accept and reject conditions, the notes. Returns the
/// block's height.
fn rule_block(c: &mut Canvas, f: &Facts, x: f64, top: f64, w: f64) -> f64 {
    let lines = words::rule(&f.plan);
    let inner = w - 4.0;
    let pair_gap = 4.0;
    let face = |l: &RuleLine| match l {
        RuleLine::Accept(_) | RuleLine::Reject(_) => Face::Bold,
        _ => Face::Regular,
    };
    // One size for all the formulas of the block: the largest at which
    // each fits (a pair one under the other, if need be).
    let widest = |size: f64| {
        lines
            .iter()
            .map(|l| match l {
                RuleLine::Formula(t) | RuleLine::Accept(t) | RuleLine::Reject(t) => {
                    c.formula_width(t, face(l), size)
                }
                RuleLine::Pair(a, b) => c
                    .formula_width(a, Face::Regular, size)
                    .max(c.formula_width(b, Face::Regular, size)),
                RuleLine::Note(_) => 0.0,
            })
            .fold(0.0, f64::max)
    };
    let size = FORMULA_SIZES
        .iter()
        .copied()
        .find(|&s| widest(s) <= inner)
        .unwrap_or(FORMULA_SIZES[FORMULA_SIZES.len() - 1]);
    if widest(size) > inner {
        c.overflow("decision rule: a formula is wider than its block".to_string());
    }
    let side_by_side = |c: &Canvas, a: &str, b: &str| {
        c.formula_width(a, Face::Regular, size) + pair_gap + c.formula_width(b, Face::Regular, size)
            <= inner
    };
    let lead = size * MM_PER_PT * 1.4;
    let note_size = 6.0;
    let heights: Vec<f64> = lines
        .iter()
        .map(|l| match l {
            RuleLine::Note(t) => {
                c.fit(
                    t,
                    Face::Regular,
                    inner,
                    f64::INFINITY,
                    Shrink::fixed(note_size),
                )
                .height
                    + 1.2
            }
            RuleLine::Pair(a, b) if !side_by_side(c, a, b) => 2.0 * lead,
            _ => lead,
        })
        .collect();
    let h = 7.5 + heights.iter().sum::<f64>() + 1.0;
    c.claim("decision rule", Rect::new(x, top - h, w, h));
    c.rect_stroke(Rect::new(x, top - h, w, h), 0.8, rgb(0.05, 0.25, 0.55));
    c.heading(x + 2.0, top - 4.0, words::RULE_HEADING);
    c.text_right(
        x + w - 2.0,
        top - 4.0,
        words::JUDGE_TOO,
        Face::Regular,
        6.0,
        grey(0.35),
    );
    let mut y = top - 6.5;
    for (line, lh) in lines.iter().zip(&heights) {
        let base = y - lead + 1.2;
        match line {
            RuleLine::Formula(t) => c.formula(x + 2.0, base, t, Face::Regular, size, grey(0.0)),
            RuleLine::Pair(a, b) => {
                c.formula(x + 2.0, base, a, Face::Regular, size, grey(0.0));
                let (bx, by) = if side_by_side(c, a, b) {
                    (
                        x + 2.0 + c.formula_width(a, Face::Regular, size) + pair_gap,
                        base,
                    )
                } else {
                    (x + 2.0, base - lead)
                };
                c.formula(bx, by, b, Face::Regular, size, grey(0.0));
            }
            RuleLine::Accept(t) => c.formula(x + 2.0, base, t, Face::Bold, size, accept_colour()),
            RuleLine::Reject(t) => c.formula(x + 2.0, base, t, Face::Bold, size, reject_colour()),
            RuleLine::Note(t) => {
                c.paragraph(
                    "decision rule note",
                    Rect::from_top(x + 2.0, y - 0.6, inner, lh + 0.5),
                    t,
                    Face::Regular,
                    Shrink::fixed(note_size),
                );
            }
        }
        y -= lh;
    }
    h
}

/// A blank field: its label (formula markup) and `=` at `(x, y)`, then a
/// writing line to `x_end`.
pub(super) fn field(c: &mut Canvas, x: f64, x_end: f64, y: f64, label: &str, equals: bool) {
    let size = 7.5;
    let label = if equals {
        format!("{label} =")
    } else {
        label.to_string()
    };
    c.formula(x, y, &label, Face::Regular, size, grey(0.1));
    let start = x + c.formula_width(&label, Face::Regular, size) + 1.0;
    if x_end - start < 10.0 {
        c.fault(format!("results: '{label}' leaves no room to write"));
    }
    c.line(&[(start, y - 0.8), (x_end, y - 0.8)], 0.4, grey(0.35), None);
}

/// The result lines: the sums and statistics to write in, the decision
/// boxes, and who inspected the lot and when. Returns the height.
fn results_block(c: &mut Canvas, f: &Facts, x: f64, top: f64, w: f64) -> f64 {
    let rows = words::result_rows(&f.plan);
    let h = 5.5 + RESULT_PITCH * (rows.len() + 2) as f64;
    c.claim("results", Rect::new(x, top - h, w, h));
    c.heading(x, top - 3.5, words::RESULTS_HEADING);
    let row_y = |i: usize| top - 5.5 - RESULT_PITCH * (i as f64 + 1.0) + 1.5;
    let gutter = 3.0;
    for (i, row) in rows.iter().enumerate() {
        let cell = (w - gutter * (row.len() as f64 - 1.0)) / row.len() as f64;
        for (j, label) in row.iter().enumerate() {
            let cx = x + (cell + gutter) * j as f64;
            field(c, cx, cx + cell, row_y(i), label, true);
        }
    }
    decision_row(c, x, row_y(rows.len()));
    let y = row_y(rows.len() + 1);
    let split = x + w * 0.62;
    field(c, x, split - gutter, y, words::INSPECTED_BY, false);
    field(c, split, x + w, y, words::INSPECTED_ON, false);
    h
}

/// The decision with its baseline at `(x, y)`: two boxes to tick, accept
/// and reject.
pub(super) fn decision_row(c: &mut Canvas, x: f64, y: f64) {
    c.text(x, y, words::DECISION, Face::Bold, 7.5, grey(0.1));
    let mut bx = x + c.width(words::DECISION, Face::Bold, 7.5) + 4.0;
    for (label, color) in [
        (words::ACCEPT_BOX, accept_colour()),
        (words::REJECT_BOX, reject_colour()),
    ] {
        c.rect_stroke(Rect::new(bx, y - 0.8, 3.6, 3.6), 0.6, color);
        c.text(bx + 5.0, y, label, Face::Bold, 7.5, color);
        bx += 5.0 + c.width(label, Face::Bold, 7.5) + 6.0;
    }
}

/// The readings block: heading with the lot and gauge fields, then either
/// the numbered table (columns and pitch by [`readings_grid`]) or, for a
/// sample beyond [`MAX_SHEET_READINGS`], the note that the readings go on
/// a separate log. Returns the height.
fn readings_block(c: &mut Canvas, f: &Facts, x: f64, top: f64, w: f64, band_h: f64) -> f64 {
    let n = f.plan.n();
    let heading = words::readings_heading(f.unit);
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
        words::LOT_NUMBER,
        false,
    );
    field(c, split, x + w, heading_y, words::GAUGE, false);
    if f.on_log() {
        let note = if n > MAX_SHEET_READINGS {
            words::readings_elsewhere(n, MAX_SHEET_READINGS)
        } else {
            words::readings_displaced(n)
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
            words::READING_HEADS[0],
            Face::Bold,
            6.5,
            grey(0.25),
        );
        c.text(
            gx + number_w + 1.5,
            head_y,
            words::READING_HEADS[1],
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

/// Points on each curve against quality.
const CURVE_POINTS: usize = 240;

/// The centred configuration costs a quadrature per point: fewer points,
/// which its smooth curve does not need more of.
const CENTRED_POINTS: usize = 80;

/// The quality in `(lo, 1/2]` at which a falling OC `pa` reaches `target`,
/// by bisection (1/2 when it is still above there).
fn quality_where(pa: impl Fn(f64) -> f64, lo: f64, target: f64) -> f64 {
    let (mut a, mut b) = (lo, 0.5);
    if pa(b) >= target {
        return b;
    }
    // To 2^-30 of the range: far finer than the axis, rounded up to a
    // nice number, needs.
    for _ in 0..30 {
        let m = 0.5 * (a + b);
        if pa(m) > target {
            a = m;
        } else {
            b = m;
        }
    }
    0.5 * (a + b)
}

/// The OC chart: the variables plan (both configurations for two limits
/// with sigma estimated), the attributes plan for comparison, the risk
/// points, the legend; for two limits with sigma known, the qualities the
/// process cannot reach shaded.
fn oc_chart(
    c: &mut Canvas,
    f: &Facts,
    x: f64,
    y: f64,
    w: f64,
    h: f64,
) -> Result<(), NumericalError> {
    let plan = &f.plan;
    let upper = f.common.agreement.qualities().1;
    let lowest = plan.spec().lowest_quality();
    let start = lowest.max(1e-6);
    let centred = plan.pa_centred(0.5).is_some();
    let attributes = f.attributes.as_ref().map(|a| &a.plan);
    // The axis from the one-sided curve: the centred one, which costs a
    // quadrature a point, runs close beside it.
    let mut reach = quality_where(|p| plan.pa(p), start, 0.02).max(upper * 1.2);
    if let Some(a) = attributes {
        reach = reach.max(quality_at_pa(a, &f.model, 0.02));
    }
    let x_max = nice_ceiling(reach);
    let along = |count: usize| {
        (0..=count)
            .map(move |i| start + (x_max - start) * i as f64 / count as f64)
            .collect::<Vec<f64>>()
    };
    let variables: Vec<(f64, f64)> = along(CURVE_POINTS)
        .into_iter()
        .map(|p| (p, plan.pa(p)))
        .collect();
    let centred_curve: Vec<(f64, f64)> = if centred {
        along(CENTRED_POINTS)
            .into_iter()
            .map(|p| (p, plan.pa_centred(p).unwrap_or(0.0)))
            .collect()
    } else {
        Vec::new()
    };
    let attributes_curve: Vec<(f64, f64)> = attributes.map_or_else(Vec::new, |a| {
        (0..=CURVE_POINTS)
            .map(|i| (x_max * i as f64 / CURVE_POINTS as f64).max(x_max * 1e-6))
            .map(|p| (p, measures(a, &f.model, p).pa))
            .collect()
    });
    // A point out of its range stops the sheet rather than bend a curve.
    for (name, curve) in [
        ("variables OC", &variables),
        ("variables OC, mean centred", &centred_curve),
        ("attributes OC", &attributes_curve),
    ] {
        for &(p, pa) in curve.iter() {
            check(
                Quantity::Probability,
                format_args!("Pa at quality {} on the {name} curve", Short(p)),
                pa,
            )?;
        }
    }
    let axis = quality_tick(false);
    let prob = |v: f64, step: f64| chart::tick_label(v, step, 1.0, "");
    // A little room above Pa = 1 for the producer's point's label, which
    // near the top of two close curves has no room below the axis's end.
    let y_max = 1.15;
    let plot = Plot::new(x, y, w, h, x_max, y_max);
    chart::frame(
        c,
        "OC chart",
        &plot,
        &Axes {
            title: sheet_words::oc_title(c, w),
            x_label: sheet_words::quality_axis(false),
            y_label: sheet_words::OC_AXIS,
            x_max,
            y_max,
            x_tick: &axis,
            y_tick: &prob,
            x_step: None,
            y_step: Some(0.2),
        },
    );
    let unreachable = grey(0.82);
    // The qualities below the centred process's, shaded where the shade
    // is wide enough to see.
    let shade = plot.sx(lowest) - plot.sx(0.0) >= 0.8;
    if shade {
        chart::zone(
            c,
            &plot,
            &[(0.0, 0.0), (lowest, 0.0), (lowest, y_max), (0.0, y_max)],
            unreachable,
        );
    }
    let attributes_colour = rgb(0.62, 0.38, 0.08);
    let centred_colour = rgb(0.0, 0.5, 0.45);
    let mut entries = Vec::new();
    if centred {
        entries.push(LegendEntry {
            label: words::ONE_SIDED_CURVE.to_string(),
            color: chart::curve_colour(),
            thickness: 1.3,
            dash: None,
            block: false,
        });
        entries.push(LegendEntry {
            label: words::CENTRED_CURVE.to_string(),
            color: centred_colour,
            thickness: 1.3,
            dash: Some(0.9),
            block: false,
        });
    } else {
        entries.push(LegendEntry {
            label: words::variables_curve(plan),
            color: chart::curve_colour(),
            thickness: 1.3,
            dash: None,
            block: false,
        });
    }
    if let Some(a) = &f.attributes {
        entries.push(LegendEntry {
            label: words::attributes_curve(a),
            color: attributes_colour,
            thickness: 0.9,
            dash: Some(2.2),
            block: false,
        });
    }
    if let (true, Some(sigma)) = (shade, plan.spec().sigma()) {
        entries.push(LegendEntry {
            label: words::unreachable_zone(lowest, sigma),
            color: unreachable,
            thickness: 0.0,
            dash: None,
            block: true,
        });
    }
    if !attributes_curve.is_empty() {
        chart::curve(
            c,
            &plot,
            &attributes_curve,
            0.9,
            attributes_colour,
            Some(2.2),
        );
    }
    chart::curve(c, &plot, &variables, 1.3, chart::curve_colour(), None);
    // Over the one-sided curve, which it runs close to: its dots show on it.
    if centred {
        chart::curve(c, &plot, &centred_curve, 1.3, centred_colour, Some(0.9));
    }
    let curves: Vec<&[(f64, f64)]> = [&variables, &centred_curve, &attributes_curve]
        .into_iter()
        .filter(|v| !v.is_empty())
        .map(|v| v.as_slice())
        .collect();
    let legend = chart::legend(c, &plot, "OC chart", &entries, &curves);
    // The labels keep 0.45 mm clear of every curve, above and below: with
    // two or three curves close together a label that only just misses
    // one reads as if it sat on it.
    let clearance = 0.45 / (plot.top - plot.bottom) * y_max;
    let shifted: Vec<Vec<(f64, f64)>> = curves
        .iter()
        .flat_map(|pts| {
            [clearance, -clearance]
                .map(|d| pts.iter().map(|&(p, pa)| (p, (pa + d).max(0.0))).collect())
        })
        .collect();
    let mut avoid: Vec<&[(f64, f64)]> = curves.clone();
    avoid.extend(shifted.iter().map(|v| v.as_slice()));
    let marks = risk_marks(&f.common);
    chart::marks(c, &plot, &marks, None, None, &avoid, &[legend]);
    Ok(())
}

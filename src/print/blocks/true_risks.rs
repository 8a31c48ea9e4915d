//! The true-risk table of a standard-indexed plan: for each class, the
//! table plan in force: its sample, its producer's risk at the AQL, the
//! qualities at which it accepts 95, 50 and 10 percent of lots and, given
//! a consumer's point, its Pa there and the plan the two-point designer
//! gives for the same points (its n against the table plan's), with one
//! line under the table naming the point. What no table booklet prints.

use super::plan_table::{Cell, ROW_TYPES, TABLE_HEAD_H, Table, column_widths, plan_table};
use crate::print::canvas::Canvas;
use crate::print::draw::Face;
use crate::print::geometry::Rect;
use crate::print::palette::{ACCEPT, REJECT};
use crate::print::standard_facts::{StandardClassFacts, StandardFacts};
use crate::print::text::Shrink;
use crate::print::wording::sheet::{NOT_GIVEN, quality};
use crate::print::wording::standard as words;
use crate::standard::{ConsumerRisk, TrueRisks};

/// The table's columns without a consumer's point, and with one.
const PLAIN: usize = 6;
const WITH_RQL: usize = 8;

/// Room above the table for the heading, mm; the rows' type.
const TOP: f64 = 5.5;
const ROWS: usize = 2;

/// The size of the line naming the consumer's point, points.
const CAPTION_SIZE: f64 = 6.5;

/// The cells of one row: a class's plan in force.
fn row(f: &StandardFacts, cl: &StandardClassFacts, risks: Option<&TrueRisks>) -> Vec<Cell> {
    let q = |v: f64| quality(v, cl.per_unit());
    let mut cells = vec![Cell::plain(cl.name.clone())];
    match risks {
        Some(r) => {
            let n = cl
                .at(f.severity)
                .and_then(|a| a.plan())
                .map_or(0, |p| p.sample_size());
            cells.push(Cell::plain(n.to_string()));
            cells.push(Cell::plain(words::risk(r.producer_risk)));
            cells.push(Cell::plain(q(r.quality_at_pa_95)));
            cells.push(Cell::plain(q(r.quality_at_pa_50)));
            cells.push(Cell::plain(q(r.quality_at_pa_10)));
            if let Some(k) = &r.consumer {
                let (sign, colour) = if k.meets_beta {
                    ("≤", ACCEPT)
                } else {
                    (">", REJECT)
                };
                cells.push(Cell {
                    text: format!("{}  {sign} β", words::risk(k.consumer_risk)),
                    face: Face::Bold,
                    color: colour,
                });
                cells.push(Cell::plain(words::two_point(k)));
            }
        }
        None => {
            cells.push(Cell::plain(words::EVERY_UNIT_SHORT.to_string()));
            for _ in 0..4 {
                cells.push(Cell::plain(NOT_GIVEN.to_string()));
            }
        }
    }
    cells
}

/// Every row: each class at the severity in force, filled out to `width`
/// cells.
fn rows(f: &StandardFacts, width: usize) -> Vec<Vec<Cell>> {
    f.classes
        .iter()
        .map(|cl| {
            let mut cells = row(f, cl, cl.risks.as_ref());
            while cells.len() < width {
                cells.push(Cell::plain(NOT_GIVEN.to_string()));
            }
            cells
        })
        .collect()
}

/// The consumer's point and what a class's plan in force gives there.
fn consumer(cl: &StandardClassFacts) -> Option<&ConsumerRisk> {
    cl.risks.as_ref().and_then(|r| r.consumer.as_ref())
}

/// The line naming the consumer's point, when one is given.
fn caption(f: &StandardFacts) -> Option<String> {
    let per_unit = f.classes.iter().any(StandardClassFacts::per_unit);
    f.classes
        .iter()
        .find_map(consumer)
        .map(|k| words::consumer_caption(&k.point, per_unit))
}

/// The table's rows and heads, with a consumer's point or without.
enum Laid {
    Plain(Vec<Vec<Cell>>, [[&'static str; 2]; PLAIN]),
    WithRql(Vec<Vec<Cell>>, [[&'static str; 2]; WITH_RQL]),
}

impl Laid {
    /// The table of `f`.
    fn of(f: &StandardFacts) -> Laid {
        let per_unit = f.classes.iter().any(StandardClassFacts::per_unit);
        if f.classes.iter().any(|cl| consumer(cl).is_some()) {
            Laid::WithRql(rows(f, WITH_RQL), words::risk_heads_rql(per_unit))
        } else {
            Laid::Plain(rows(f, PLAIN), words::risk_heads(per_unit))
        }
    }

    /// The column widths, widened to share `room` mm.
    fn widths(&self, c: &Canvas, room: f64) -> Vec<f64> {
        match self {
            Laid::Plain(t, heads) => widths::<PLAIN>(c, &cells::<PLAIN>(t), heads, room).to_vec(),
            Laid::WithRql(t, heads) => {
                widths::<WITH_RQL>(c, &cells::<WITH_RQL>(t), heads, room).to_vec()
            }
        }
    }

    /// The number of rows.
    fn len(&self) -> usize {
        match self {
            Laid::Plain(t, _) | Laid::WithRql(t, _) => t.len(),
        }
    }
}

/// The rows `t` as arrays of `K` cells.
fn cells<const K: usize>(t: &[Vec<Cell>]) -> Vec<[Cell; K]> {
    t.iter()
        .map(|r| {
            std::array::from_fn(|j| Cell {
                text: r[j].text.clone(),
                face: r[j].face,
                color: r[j].color,
            })
        })
        .collect()
}

/// The widths of the columns of `rows` under `heads`, widened to share up
/// to `room` mm (at most 6 mm more each).
fn widths<const K: usize>(
    c: &Canvas,
    rows: &[[Cell; K]],
    heads: &[[&str; 2]; K],
    room: f64,
) -> [f64; K] {
    let mut widths = column_widths(c, heads, rows, ROW_TYPES[ROWS].size);
    let need: f64 = widths.iter().sum();
    let spare = ((room - need) / K as f64).clamp(0.0, 6.0);
    for w in &mut widths {
        *w += spare;
    }
    widths
}

/// The caption's height `w` mm wide, with the gap above it; 0 without a
/// consumer's point.
fn caption_height(c: &Canvas, f: &StandardFacts, w: f64) -> f64 {
    caption(f).map_or(0.0, |t| {
        c.fit(
            &t,
            Face::Regular,
            w,
            f64::INFINITY,
            Shrink::fixed(CAPTION_SIZE),
        )
        .height
            + 1.0
    })
}

/// The height of the block `w` mm wide: the table's, and the caption's
/// under it when a consumer's point is given.
pub fn true_risks_height(c: &Canvas, f: &StandardFacts, w: f64) -> f64 {
    let laid = Laid::of(f);
    TOP + TABLE_HEAD_H + ROW_TYPES[ROWS].pitch * laid.len() as f64 + 1.0 + caption_height(c, f, w)
}

/// The true-risk table in `area`, with the line naming the consumer's
/// point under it when one is given.
pub fn true_risks_block(c: &mut Canvas, f: &StandardFacts, area: Rect) {
    let laid = Laid::of(f);
    let model = f.classes[0].model.kind().name().to_uppercase();
    c.claim("true risks", area);
    c.heading(
        area.x,
        area.top() - 3.5,
        &words::true_risks_heading(f.severity, &model),
    );
    let at = (area.x, area.top() - TOP);
    let widths = laid.widths(c, area.w);
    let need: f64 = laid.widths(c, 0.0).iter().sum();
    if need > area.w + 1e-6 {
        c.fault(format!(
            "true-risk table: {need:.0} mm wide, the page leaves {:.0} mm",
            area.w
        ));
    }
    let kind = ROW_TYPES[ROWS];
    let table_h = match &laid {
        Laid::Plain(t, heads) => {
            let rows = cells::<PLAIN>(t);
            let w: [f64; PLAIN] = std::array::from_fn(|j| widths[j]);
            plan_table(c, &table_of("true-risk table", heads, &rows), at, &w, kind)
        }
        Laid::WithRql(t, heads) => {
            let rows = cells::<WITH_RQL>(t);
            let w: [f64; WITH_RQL] = std::array::from_fn(|j| widths[j]);
            plan_table(c, &table_of("true-risk table", heads, &rows), at, &w, kind)
        }
    };
    if let Some(text) = caption(f) {
        let top = area.top() - TOP - table_h - 1.0;
        c.paragraph(
            "true-risk table",
            Rect::new(area.x, area.y, area.w, top - area.y),
            &text,
            Face::Regular,
            Shrink::fixed(CAPTION_SIZE),
        );
    }
}

/// A plan table of `rows` under `heads`.
fn table_of<'a, const K: usize>(
    name: &'a str,
    heads: &'a [[&'a str; 2]; K],
    rows: &'a [[Cell; K]],
) -> Table<'a, K> {
    Table { name, heads, rows }
}

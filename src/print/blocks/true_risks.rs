//! The true-risk table of a standard-indexed plan: for each class, the
//! table plan in force: its sample, its producer's risk at the AQL, the
//! qualities at which it accepts 95, 50 and 10 percent of lots and, given
//! a consumer's point, its Pa there; beside it, when that point is given,
//! the plan the two-point designer gives for the same points, with its n
//! against the table plan's. What no table booklet prints.

use super::plan_table::{Cell, ROW_TYPES, TABLE_HEAD_H, Table, column_widths, plan_table};
use crate::numeric::format_significant;
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::palette::{ACCEPT, REJECT};
use crate::print::standard_facts::{StandardClassFacts, StandardFacts};
use crate::print::text::Shrink;
use crate::print::wording::sheet::{NOT_GIVEN, quality};
use crate::print::wording::standard as words;
use crate::standard::{ConsumerRisk, Severity, TrueRisks};

/// The table's columns without a consumer's point, and with one.
const PLAIN: usize = 7;
const WITH_RQL: usize = 8;

/// Room above the table for the heading, mm; the rows' type.
const TOP: f64 = 5.5;
const ROWS: usize = 2;

/// The narrowest the two-point design beside the table may be, mm.
const MIN_DESIGN_W: f64 = 40.0;

/// The cells of one row: a class at one severity.
fn row(cl: &StandardClassFacts, s: Severity, risks: Option<&TrueRisks>) -> Vec<Cell> {
    let q = |v: f64| quality(v, cl.per_unit());
    let mut cells = vec![
        Cell::plain(cl.name.clone()),
        Cell::plain(s.name().to_string()),
    ];
    match risks {
        Some(r) => {
            let n = cl
                .at(s)
                .and_then(|a| a.plan())
                .map_or(0, |p| p.sample_size());
            cells.push(Cell::plain(n.to_string()));
            cells.push(Cell::plain(format_significant(r.producer_risk, 3)));
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
                    text: format!("{} {sign} β", format_significant(k.consumer_risk, 3)),
                    face: Face::Bold,
                    color: colour,
                });
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

/// Every row: each class at the severity in force.
fn rows(f: &StandardFacts, width: usize) -> Vec<Vec<Cell>> {
    f.classes
        .iter()
        .map(|cl| {
            let mut cells = row(cl, f.severity, cl.risks.as_ref());
            while cells.len() < width {
                cells.push(Cell::plain(NOT_GIVEN.to_string()));
            }
            cells
        })
        .collect()
}

/// The consumer's point of a class and what its plan in force gives
/// there.
fn consumer(cl: &StandardClassFacts) -> Option<&ConsumerRisk> {
    cl.risks.as_ref().and_then(|r| r.consumer.as_ref())
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

    /// The room the table may take in a block `w` mm wide: all of it, or
    /// what the two-point design beside it leaves.
    fn room(&self, w: f64) -> f64 {
        match self {
            Laid::Plain(..) => w,
            Laid::WithRql(..) => w - MIN_DESIGN_W - 4.0,
        }
    }

    /// The column widths in `room` mm.
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

/// The two-point design's texts, one per class with a consumer's point.
fn designs(f: &StandardFacts) -> Vec<String> {
    f.classes
        .iter()
        .filter_map(|cl| {
            let k = consumer(cl)?;
            Some(words::two_point(cl, k, f.severity))
        })
        .collect()
}

/// The design column's height `w` mm wide.
fn designs_height(c: &Canvas, f: &StandardFacts, w: f64) -> f64 {
    9.0 + designs(f)
        .iter()
        .map(|t| {
            c.fit(t, Face::Regular, w, f64::INFINITY, Shrink::fixed(6.5))
                .height
                + 0.8
        })
        .sum::<f64>()
}

/// The height of the block `w` mm wide: the table's, or the two-point
/// design's beside it where that is taller.
pub fn true_risks_height(c: &Canvas, f: &StandardFacts, w: f64) -> f64 {
    let laid = Laid::of(f);
    let table = TOP + TABLE_HEAD_H + ROW_TYPES[ROWS].pitch * laid.len() as f64 + 1.0;
    match laid {
        Laid::Plain(..) => table,
        Laid::WithRql(..) => {
            let used: f64 = laid.widths(c, laid.room(w)).iter().sum();
            table.max(designs_height(c, f, w - used - 4.0) + 1.0)
        }
    }
}

/// The true-risk table in `area`, and the two-point design beside it
/// when a consumer's point is given.
pub fn true_risks_block(c: &mut Canvas, f: &StandardFacts, area: Rect) {
    let laid = Laid::of(f);
    let model = f.classes[0].model.kind().name().to_uppercase();
    c.claim("true risks", area);
    c.heading(area.x, area.top() - 3.5, &words::true_risks_heading(&model));
    let at = (area.x, area.top() - TOP);
    let room = laid.room(area.w);
    let widths = laid.widths(c, room);
    let used: f64 = widths.iter().sum();
    let need: f64 = laid.widths(c, 0.0).iter().sum();
    if need > room + 1e-6 {
        c.fault(format!(
            "true-risk table: {need:.0} mm wide, the page leaves {room:.0} mm"
        ));
    }
    let kind = ROW_TYPES[ROWS];
    match &laid {
        Laid::Plain(t, heads) => {
            let rows = cells::<PLAIN>(t);
            let w: [f64; PLAIN] = std::array::from_fn(|j| widths[j]);
            plan_table(c, &table_of("true-risk table", heads, &rows), at, &w, kind);
        }
        Laid::WithRql(t, heads) => {
            let rows = cells::<WITH_RQL>(t);
            let w: [f64; WITH_RQL] = std::array::from_fn(|j| widths[j]);
            plan_table(c, &table_of("true-risk table", heads, &rows), at, &w, kind);
            let x = area.x + used + 4.0;
            design_column(c, f, Rect::new(x, area.y, area.right() - x, area.h));
        }
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

/// The two-point design for each class's points, in the column `area`.
fn design_column(c: &mut Canvas, f: &StandardFacts, area: Rect) {
    let (x, top, w) = (area.x, area.top(), area.w);
    c.line(
        &[(x - 2.0, top - 4.5), (x - 2.0, area.y)],
        0.3,
        grey(0.6),
        None,
    );
    c.text(
        x,
        top - 7.5,
        words::TWO_POINT_HEADING,
        Face::Bold,
        6.5,
        grey(0.3),
    );
    let mut y = top - 9.0;
    for text in designs(f) {
        y -= c.paragraph(
            "two-point design",
            Rect::new(x, area.y, w, y - area.y),
            &text,
            Face::Regular,
            Shrink::fixed(6.5),
        ) + 0.8;
    }
}

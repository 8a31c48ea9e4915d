//! The measures table: what the plan does at other qualities, the
//! probability of acceptance, AOQ, ATI and ASN at eight qualities that
//! bracket the two of the agreement.

use crate::numeric::format_short;
use crate::plan::{Evaluation, Measures};
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, Font, grey};
use crate::print::facts::Facts;
use crate::print::geometry::Rect;
use crate::print::wording::sheet;

/// Height of the measures table of `evaluation`.
pub fn measures_height(evaluation: &Evaluation, pitch: f64) -> f64 {
    8.0 + pitch * (evaluation.points.len() as f64 + 1.0)
}

/// One column of the measures table: its head and its cells.
struct MeasureColumn {
    head: &'static str,
    cells: Vec<String>,
}

/// The columns of the measures table of `evaluation`: the quality asked
/// (for nonconformities per unit, per unit and per 100 units); under the
/// hypergeometric model the lot's `D` and `D / N`, at which every measure
/// is computed; then Pa, AOQ (per unit and per 100 units for
/// nonconformities), ATI and ASN.
fn measure_columns(f: &Facts, evaluation: &Evaluation) -> Vec<MeasureColumn> {
    let per_unit = f.common.per_unit;
    let points = &evaluation.points;
    let column = |head: &'static str, cell: &dyn Fn(&Measures) -> String| MeasureColumn {
        head,
        cells: points.iter().map(cell).collect(),
    };
    let short = |v: f64| format_short(v, 4);
    let percent = |v: f64| format!("{:.4}%", v * 100.0);
    let mut columns = Vec::new();
    if per_unit {
        columns.push(column(sheet::PER_UNIT, &|m| short(m.quality)));
        columns.push(column(sheet::PER_100_UNITS, &|m| short(100.0 * m.quality)));
    } else {
        columns.push(column(sheet::MEASURE_HEADS[0], &|m| f.common.q(m.quality)));
    }
    if points.iter().any(|m| m.lot_nonconforming.is_some()) {
        columns.push(column(sheet::LOT_D, &|m| {
            m.lot_nonconforming
                .map_or(sheet::NOT_GIVEN.to_string(), |d| d.to_string())
        }));
        columns.push(column(sheet::LOT_QUALITY, &|m| {
            m.lot_quality
                .map_or(sheet::NOT_GIVEN.to_string(), |q| f.common.q(q))
        }));
    }
    columns.push(column(sheet::MEASURE_HEADS[1], &|m| format!("{:.4}", m.pa)));
    if per_unit {
        columns.push(column(sheet::AOQ_PER_UNIT, &|m| short(m.aoq)));
        columns.push(column(sheet::AOQ_PER_100_UNITS, &|m| short(100.0 * m.aoq)));
    } else {
        columns.push(column(sheet::MEASURE_HEADS[2], &|m| percent(m.aoq)));
    }
    columns.push(column(sheet::MEASURE_HEADS[3], &|m| {
        m.ati
            .map_or(sheet::NOT_GIVEN.to_string(), |v| format!("{v:.0}"))
    }));
    let single = f.plan.as_single().is_some();
    columns.push(column(sheet::MEASURE_HEADS[4], &|m| {
        if single {
            format!("{:.0}", m.asn)
        } else {
            format!("{:.1}", m.asn)
        }
    }));
    columns
}

/// The measures table: Pa, AOQ, ATI and ASN at the default qualities, in
/// the columns of [`measure_columns`]. The first column is left-aligned,
/// the others right-aligned; each is as wide as its widest text, and the
/// room left over in `area` is shared between the gaps.
pub fn measures_table(c: &mut Canvas, f: &Facts, evaluation: &Evaluation, area: Rect) {
    const SIZE: f64 = 7.0;
    let (left, top, table_w, table_h) = (area.x, area.top(), area.w, area.h);
    let black = || grey(0.0);
    c.claim("measures", area);
    c.heading(left, top - 3.5, sheet::MEASURES);
    let columns = measure_columns(f, evaluation);
    let widths: Vec<f64> = columns
        .iter()
        .map(|col| {
            col.cells
                .iter()
                .map(|t| c.width(t, Face::Regular, SIZE))
                .fold(c.width(col.head, Face::Bold, SIZE), f64::max)
        })
        .collect();
    // The rule ends 10 mm short of the table's width, as the rows do.
    let inner = table_w - 11.0;
    let gap = ((inner - widths.iter().sum::<f64>()) / (columns.len() - 1) as f64).min(8.0);
    let pitch = (table_h - 8.0) / (evaluation.points.len() as f64 + 1.0);
    let ty = |i: usize| top - 8.0 - pitch * i as f64;
    let mut x = left + 1.0;
    for (k, (col, &w)) in columns.iter().zip(&widths).enumerate() {
        // The first column left-aligned, the others right-aligned.
        let cell = |c: &mut Canvas, y: f64, text: &str, face: Face| {
            let font = Font { face, size: SIZE };
            if k == 0 {
                c.cell("measures table", (x, y), w, text, font, black());
            } else {
                c.cell_right("measures table", (x + w, y), w, text, font, black());
            }
        };
        cell(c, ty(0), col.head, Face::Bold);
        for (i, text) in col.cells.iter().enumerate() {
            cell(c, ty(i + 1), text, Face::Regular);
        }
        x += w + gap;
    }
    if x - gap > left + 1.0 + inner + 1e-6 {
        c.fault("measures table: its columns are wider than the table".to_string());
    }
    c.line(
        &[(left, ty(0) - 1.3), (left + table_w - 10.0, ty(0) - 1.3)],
        0.4,
        black(),
        None,
    );
}

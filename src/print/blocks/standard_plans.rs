//! The plan box of a standard-indexed plan: the code letter and how it
//! was found, then one table of every class's plans side by side at
//! normal, tightened and reduced inspection (the letter of the row each
//! was read at, the sample, Ac and Re, a stage per line for double and
//! multiple plans), the severity in force shaded, and the marks that the
//! notes explain.

use super::plan_box::plan_frame;
use crate::print::canvas::Canvas;
use crate::print::draw::{Colour, Face, Font, grey, rgb};
use crate::print::geometry::{MM_PER_PT, Rect};
use crate::print::palette::{ACCEPT, PLAN, REJECT};
use crate::print::standard_facts::{StandardClassFacts, StandardFacts};
use crate::print::text::Shrink;
use crate::print::wording::sheet::CANNOT_ACCEPT;
use crate::print::wording::standard as words;
use crate::standard::{Severity, StandardAnswer, StandardPlan};

/// One cell: its text, face and colour.
struct Cell {
    text: String,
    face: Face,
    colour: Colour,
}

impl Cell {
    fn new(text: impl Into<String>, face: Face, colour: Colour) -> Self {
        Cell {
            text: text.into(),
            face,
            colour,
        }
    }

    fn plain(text: impl Into<String>) -> Self {
        Cell::new(text, Face::Regular, grey(0.0))
    }
}

/// The columns of one severity: letter, n, Ac, Re and the marks.
const GROUP_COLUMNS: usize = 5;

/// What one severity shows for one class: a cell per column and stage,
/// or every unit.
enum GroupCells {
    Plan(Vec<[Cell; GROUP_COLUMNS]>),
    EveryUnit(String),
}

/// The marks of a table plan: from memory, and a single or double plan
/// used for a mark of the table.
fn marks(p: &StandardPlan) -> String {
    let mut m = String::new();
    if p.table_scheme != p.scheme {
        m.push_str(if p.table_scheme == crate::design::Scheme::Single {
            words::SINGLE_MARK
        } else {
            words::DOUBLE_MARK
        });
    }
    if p.from_memory {
        m.push_str(words::MEMORY_MARK);
    }
    m
}

/// The cells of `answer` for a lot of code letter `k`'s row.
fn group_cells(f: &StandardFacts, answer: &StandardAnswer) -> GroupCells {
    let p = answer.table_plan();
    if answer.plan().is_none() {
        return GroupCells::EveryUnit(marks(p));
    }
    let k = f.code_letter;
    let arrow = match p.plan_letter.cmp(&k) {
        std::cmp::Ordering::Greater => "↓",
        std::cmp::Ordering::Less => "↑",
        std::cmp::Ordering::Equal => "",
    };
    let rows = p
        .table_numbers
        .iter()
        .enumerate()
        .map(|(i, s)| {
            let (letter, mark) = if i == 0 {
                (format!("{arrow}{}", p.plan_letter), marks(p))
            } else {
                (String::new(), String::new())
            };
            [
                Cell::plain(letter),
                Cell::plain(s.n.to_string()),
                Cell::new(
                    s.accept
                        .map_or(CANNOT_ACCEPT.to_string(), |a| a.to_string()),
                    Face::Bold,
                    ACCEPT,
                ),
                Cell::new(s.reject.to_string(), Face::Bold, REJECT),
                Cell::new(mark, Face::Bold, grey(0.2)),
            ]
        })
        .collect();
    GroupCells::Plan(rows)
}

/// A class's cells: per severity of `shown`, its group.
fn class_cells(f: &StandardFacts, c: &StandardClassFacts, shown: &[Severity]) -> Vec<GroupCells> {
    shown
        .iter()
        .copied()
        .filter_map(|s| c.at(s).map(|a| group_cells(f, a)))
        .collect()
}

/// The lines a class takes: its most stages at any severity.
fn class_lines(groups: &[GroupCells]) -> usize {
    groups
        .iter()
        .map(|g| match g {
            GroupCells::Plan(rows) => rows.len(),
            GroupCells::EveryUnit(_) => 1,
        })
        .max()
        .unwrap_or(1)
}

/// The type of the table's numbers and its row pitch, by its lines: the
/// fewer, the larger.
fn row_type(lines: usize) -> (f64, f64) {
    match lines {
        0..=4 => (8.5, 4.6),
        5..=12 => (7.5, 3.9),
        _ => (7.0, 3.4),
    }
}

/// Heights: the box's heading and letter line above the table, the
/// severity heads, the column heads.
const HEAD_H: f64 = 16.5;
const GROUP_HEAD_H: f64 = 4.2;
const COLUMN_HEAD_H: f64 = 4.0;

/// Size of the heads and of the "inspect every unit" cells.
const HEAD_SIZE: f64 = 6.5;
const EVERY_SIZE: f64 = 7.0;

/// The plan box hanging from the top edge `at`: heading, code letter,
/// the table of the plans at the `severities` shown and its note.
/// Returns its height.
pub fn standard_plan_box(
    c: &mut Canvas,
    f: &StandardFacts,
    at: Rect,
    severities: &[Severity],
) -> f64 {
    let (left, top, width) = (at.x, at.top(), at.w);
    let all: Vec<Vec<GroupCells>> = f
        .classes
        .iter()
        .map(|cl| class_cells(f, cl, severities))
        .collect();
    let lines: Vec<usize> = all.iter().map(|g| class_lines(g)).collect();
    let total_lines: usize = lines.iter().sum();
    let (size, pitch) = row_type(total_lines);
    let staged = all
        .iter()
        .flatten()
        .any(|g| matches!(g, GroupCells::Plan(r) if r.len() > 1));
    let gap = severities.contains(&Severity::Reduced)
        && f.classes.iter().any(|cl| {
            cl.at(Severity::Reduced).is_some_and(|p| {
                p.plan()
                    .and_then(|p| p.table_numbers.last().copied())
                    .is_some_and(|s| s.accept.is_some_and(|a| a + 1 < s.reject))
            })
        });
    let note = words::table_note(staged, gap);
    let inner = width - 8.0;
    let note_h = c
        .fit(
            &note,
            Face::Regular,
            inner,
            f64::INFINITY,
            Shrink::fixed(6.5),
        )
        .height;
    let table_h = GROUP_HEAD_H + COLUMN_HEAD_H + pitch * total_lines as f64;
    let h = HEAD_H + table_h + 1.5 + note_h + 2.5;
    let frame = Rect::from_top(left, top, width, h);
    plan_frame(c, frame);
    c.heading(left + 4.0, top - 4.5, words::PLANS_HEADING);
    let x = left + 4.0;
    let base = top - 12.5;
    c.text(x, base, words::CODE_LETTER, Face::Bold, 8.0, grey(0.2));
    let lx = x + c.width(words::CODE_LETTER, Face::Bold, 8.0) + 2.0;
    let letter = f.code_letter.to_string();
    c.text(lx, base, &letter, Face::Bold, 16.0, PLAN);
    let fx = lx + c.width(&letter, Face::Bold, 16.0) + 3.0;
    let found = words::letter_found(f.lot_size, f.level.name(), f.scheme.name());
    if fx + c.width(&found, Face::Regular, 8.0) > left + width - 4.0 {
        c.overflow(format!("plan box: '{found}'"));
    }
    c.text(fx, base, &found, Face::Regular, 8.0, grey(0.0));

    // Column widths: each as wide as its widest head or cell, plus room.
    let width_of = |c: &Canvas, cell: &Cell| c.width(&cell.text, cell.face, size);
    let class_w = f
        .classes
        .iter()
        .map(|cl| c.width(&cl.name, Face::Regular, size))
        .fold(c.width(words::CLASS_HEAD, Face::Bold, HEAD_SIZE), f64::max)
        + 3.0;
    let aql_w = f
        .classes
        .iter()
        .map(|cl| c.width(cl.aql.label(), Face::Regular, size))
        .fold(c.width(words::AQL_HEAD, Face::Bold, HEAD_SIZE), f64::max)
        + 3.0;
    let mut col = [0.0_f64; GROUP_COLUMNS];
    for (j, w) in col.iter_mut().enumerate() {
        let head = words::GROUP_HEADS
            .get(j)
            .map_or(0.0, |h| c.width(h, Face::Bold, HEAD_SIZE));
        let cells = all
            .iter()
            .flatten()
            .filter_map(|g| match g {
                GroupCells::Plan(rows) => Some(rows),
                GroupCells::EveryUnit(_) => None,
            })
            .flatten()
            .map(|row| width_of(c, &row[j]))
            .fold(head, f64::max);
        *w = cells + if j + 1 == GROUP_COLUMNS { 1.0 } else { 3.0 };
    }
    let every_w = c.width(words::EVERY_UNIT, Face::Bold, EVERY_SIZE) + 1.0;
    let marks_w = all
        .iter()
        .flatten()
        .filter_map(|g| match g {
            GroupCells::EveryUnit(m) => Some(c.width(m, Face::Bold, size)),
            GroupCells::Plan(_) => None,
        })
        .fold(0.0, f64::max);
    // A group holds "inspect every unit" where a class has it.
    let numbers_w: f64 = col[..GROUP_COLUMNS - 1].iter().sum();
    if every_w > numbers_w {
        col[1] += every_w - numbers_w;
    }
    col[GROUP_COLUMNS - 1] = col[GROUP_COLUMNS - 1].max(marks_w + 1.0);
    let group_w: f64 = col.iter().sum();
    let groups = severities.len() as f64;
    let need = class_w + aql_w + group_w * groups;
    if need > inner + 1e-6 {
        c.fault(format!(
            "plan table: {need:.0} mm wide, the page leaves {inner:.0} mm; shorten the class names"
        ));
    }
    // The room left over widens the numbers' columns, up to 3 mm each.
    let spare = ((inner - need) / (groups * 4.0)).clamp(0.0, 3.0);
    for w in col.iter_mut().take(GROUP_COLUMNS - 1) {
        *w += spare;
    }
    let group_w: f64 = col.iter().sum();
    let table_top = top - HEAD_H;
    let rows_top = table_top - GROUP_HEAD_H - COLUMN_HEAD_H;
    let table_bottom = rows_top - pitch * total_lines as f64;
    let group_x = |g: usize| x + class_w + aql_w + group_w * g as f64;

    // The severity in force, shaded over its heads and rows.
    if let Some(g) = severities.iter().position(|&s| s == f.severity) {
        c.rect_fill(
            Rect::new(group_x(g), table_bottom, group_w, table_top - table_bottom),
            rgb(0.82, 0.88, 0.97),
        );
    }
    for (g, &s) in severities.iter().enumerate() {
        let head = if s == f.severity {
            format!("{} · {}", words::severity_head(s), words::IN_FORCE)
        } else {
            words::severity_head(s).to_string()
        };
        let colour = if s == f.severity { PLAN } else { grey(0.25) };
        let hw = c.width(&head, Face::Bold, 7.0);
        if hw > group_w {
            c.fault(format!("plan table: '{head}' is wider than its columns"));
        }
        c.text(
            group_x(g) + (group_w - hw) / 2.0,
            table_top - 3.2,
            &head,
            Face::Bold,
            7.0,
            colour,
        );
        if g > 0 {
            c.line(
                &[(group_x(g), table_top), (group_x(g), table_bottom)],
                0.3,
                grey(0.6),
                None,
            );
        }
    }
    let head_y = table_top - GROUP_HEAD_H - 2.8;
    c.text(
        x + 0.5,
        head_y,
        words::CLASS_HEAD,
        Face::Bold,
        HEAD_SIZE,
        grey(0.25),
    );
    centred(
        c,
        (x + class_w, aql_w),
        head_y,
        words::AQL_HEAD,
        Font {
            face: Face::Bold,
            size: HEAD_SIZE,
        },
        grey(0.25),
    );
    for g in 0..severities.len() {
        let mut cx = group_x(g);
        for (j, head) in words::GROUP_HEADS.iter().enumerate() {
            centred(
                c,
                (cx, col[j]),
                head_y,
                head,
                Font {
                    face: Face::Bold,
                    size: HEAD_SIZE,
                },
                grey(0.25),
            );
            cx += col[j];
        }
    }
    let rule = rows_top + 0.5;
    c.line(
        &[
            (x, rule),
            (x + need.max(class_w + aql_w + group_w * groups), rule),
        ],
        0.5,
        grey(0.2),
        None,
    );

    // The rows: a class's name and AQL on its first line, a stage a line.
    let mut line = 0;
    for (k, (cl, groups_of)) in f.classes.iter().zip(&all).enumerate() {
        let row_top = rows_top - pitch * line as f64;
        let y = |i: usize| row_top - pitch * i as f64 - pitch * 0.5 - size * MM_PER_PT * 0.36;
        if k > 0 {
            c.line(
                &[
                    (x, row_top),
                    (x + class_w + aql_w + group_w * groups, row_top),
                ],
                0.3,
                grey(0.7),
                None,
            );
        }
        if c.width(&cl.name, Face::Regular, size) > class_w {
            c.overflow(format!("plan table: '{}'", cl.name));
        }
        c.text(x + 0.5, y(0), &cl.name, Face::Regular, size, grey(0.0));
        centred(
            c,
            (x + class_w, aql_w),
            y(0),
            cl.aql.label(),
            Font {
                face: Face::Regular,
                size,
            },
            grey(0.0),
        );
        for (g, group) in groups_of.iter().enumerate() {
            let gx = group_x(g);
            match group {
                GroupCells::EveryUnit(mark) => {
                    let numbers: f64 = col[..GROUP_COLUMNS - 1].iter().sum();
                    centred(
                        c,
                        (gx, numbers),
                        y(0),
                        words::EVERY_UNIT,
                        Font {
                            face: Face::Bold,
                            size: EVERY_SIZE,
                        },
                        REJECT,
                    );
                    c.text(gx + numbers, y(0), mark, Face::Bold, size, grey(0.2));
                }
                GroupCells::Plan(rows) => {
                    for (i, row) in rows.iter().enumerate() {
                        let mut cx = gx;
                        for (j, cell) in row.iter().enumerate() {
                            if j + 1 == GROUP_COLUMNS {
                                c.text(cx, y(i), &cell.text, cell.face, size, cell.colour);
                            } else {
                                centred(
                                    c,
                                    (cx, col[j]),
                                    y(i),
                                    &cell.text,
                                    Font {
                                        face: cell.face,
                                        size,
                                    },
                                    cell.colour,
                                );
                            }
                            cx += col[j];
                        }
                    }
                }
            }
        }
        line += lines[k];
    }
    c.paragraph(
        "plan table note",
        Rect::from_top(x, table_bottom - 1.5, inner, note_h + 0.5),
        &note,
        Face::Regular,
        Shrink::fixed(6.5),
    );
    h
}

/// `text` centred in the column from `x`, `w` mm wide, on the baseline
/// `y`.
fn centred(c: &mut Canvas, (x, w): (f64, f64), y: f64, text: &str, font: Font, colour: Colour) {
    let tw = c.width(text, font.face, font.size);
    c.text(x + (w - tw) / 2.0, y, text, font.face, font.size, colour);
}

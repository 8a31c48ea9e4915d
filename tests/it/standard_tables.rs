//! The structure of the built-in MIL-STD-105E tables (issue 16): what the
//! standard's design of its tables makes true of every cell, checked on
//! every cell. A transcription slip that breaks the pattern fails here.
//!
//! Source of the properties: MIL-STD-105E (1989), Table I and Tables II-A
//! to IV-C with their footnotes; each test names the property it relies
//! on. Properties known only from memory of the printed tables say so.

use std::collections::HashMap;

use lotsman::{
    Aql, CodeLetter, InspectionLevel, Scheme, Severity, StandardError, TableCell, Tables,
};

fn tables() -> &'static Tables {
    Tables::builtin().unwrap()
}

/// The letters a lot can have (Table I gives A to R; S is reached only
/// through an arrow of the tightened tables).
fn lot_letters() -> impl Iterator<Item = CodeLetter> {
    CodeLetter::all().filter(|l| l.letter() != 'S')
}

const SCHEMES: [Scheme; 3] = [Scheme::Single, Scheme::Double, Scheme::Multiple];

/// Table I (MIL-STD-105E, read in three excerpts that agree cell for
/// cell): the lot ranges follow each other from 2 units without gap or
/// overlap, the last is open, and the letter never falls with a larger lot
/// or a more discriminating level (S-1 to S-4, then I, II, III).
#[test]
fn table_i_ranges_are_contiguous_and_its_letters_never_fall() {
    let ranges = tables().code_letters().ranges();
    assert_eq!(ranges.len(), 15);
    assert_eq!(ranges[0].lot_min, 2);
    for w in ranges.windows(2) {
        assert_eq!(w[0].lot_max.unwrap() + 1, w[1].lot_min);
        for k in 0..7 {
            assert!(w[0].letters[k] <= w[1].letters[k], "{w:?}");
        }
    }
    assert_eq!(ranges[14].lot_min, 500_001);
    assert_eq!(ranges[14].lot_max, None);
    for r in ranges {
        assert!(r.letters.windows(2).all(|l| l[0] <= l[1]), "{r:?}");
    }
    // The corners: 2 to 8 units at S-1 is A, 500,001 and over at III is R.
    assert_eq!(ranges[0].letters[0].to_string(), "A");
    assert_eq!(ranges[14].letters[6].to_string(), "R");
}

/// Tables II to IV: a plan (with its Ac and Re) moves one AQL column to
/// the left per code letter down the table, so each plan cell's partner
/// one row up and one column right holds the same plan; the exceptions
/// are a partner not transcribed ('?') and a partner row without sample
/// sizes for the scheme (rows A to C of the double and multiple tables,
/// which print '*' or '++' there). One more: in Table II-B the 0 1
/// diagonal begins at row B, and row A holds ↓ where it would continue
/// (read in an excerpt of the tightened table, AQL 0.65 to 15).
#[test]
fn every_plan_shifts_one_aql_column_per_code_letter() {
    let mut top_row_arrows = Vec::new();
    for severity in Severity::ALL {
        for scheme in SCHEMES {
            let table = tables().master(severity, scheme).unwrap();
            let letters: Vec<CodeLetter> = table.letters().collect();
            let mut shifted = 0;
            for w in letters.windows(2) {
                let (above, row) = (w[0], w[1]);
                for column in 0..25 {
                    let here = table.cell(row, Aql::from_column(column).unwrap()).unwrap();
                    let partner = table
                        .cell(above, Aql::from_column(column + 1).unwrap())
                        .unwrap();
                    if !matches!(here, TableCell::Plan(_)) {
                        continue;
                    }
                    let ok = match partner {
                        TableCell::Plan(_) => {
                            shifted += 1;
                            plan_numbers(here) == plan_numbers(partner)
                        }
                        TableCell::NotTranscribed => true,
                        TableCell::Down if above.row() == 0 => {
                            top_row_arrows.push(format!(
                                "{} {above} {}",
                                table.name(),
                                Aql::from_column(column + 1).unwrap()
                            ));
                            true
                        }
                        _ => table.sample_sizes(above).unwrap().is_empty(),
                    };
                    assert!(
                        ok,
                        "{}: {row} at {} is {} but {above} at {} is {}",
                        table.name(),
                        Aql::from_column(column).unwrap(),
                        here.text(),
                        Aql::from_column(column + 1).unwrap(),
                        partner.text()
                    );
                }
            }
            let expect_shifts = !(severity == Severity::Reduced && scheme == Scheme::Multiple);
            assert_eq!(shifted > 0, expect_shifts, "{}", table.name());
        }
    }
    assert_eq!(
        top_row_arrows,
        ["Table II-B (single sampling, tightened inspection) A 10"]
    );
}

/// The acceptance and rejection numbers of a plan cell, without the
/// sample sizes (which change with the row).
fn plan_numbers(cell: &TableCell) -> Vec<(Option<u64>, u64)> {
    match cell {
        TableCell::Plan(stages) => stages.iter().map(|s| (s.accept, s.reject)).collect(),
        _ => Vec::new(),
    }
}

/// Tables II to IV and their footnotes: every arrow leads, in its
/// direction, to a plan; the plan's sample sizes are those of the row it
/// stands on; '*' and '++' lead to the single or double plan. A lookup at
/// any code letter A to R and any AQL ends in a plan or in a refusal of a
/// cell not transcribed, never anywhere else. The refusals per table are
/// counted: the untranscribed cells listed in the data folder's README
/// (II-C rows A and B above AQL 10, IV-B the plan matching single 8 9,
/// IV-C every plan) and the arrows leading into them.
#[test]
fn every_lookup_ends_in_a_plan_or_an_untranscribed_cell() {
    let mut refused: HashMap<String, usize> = HashMap::new();
    for severity in Severity::ALL {
        for scheme in SCHEMES {
            let table = tables().master(severity, scheme).unwrap();
            for letter in lot_letters() {
                for aql in Aql::all() {
                    let cell = table.cell(letter, aql).unwrap();
                    match tables().lookup(letter, aql, severity, scheme) {
                        Ok(plan) => {
                            let from = tables().master(severity, plan.table_scheme).unwrap();
                            assert_eq!(
                                from.sample_sizes(plan.plan_letter).unwrap(),
                                plan.table_numbers.iter().map(|s| s.n).collect::<Vec<_>>(),
                                "{} {letter} {aql}",
                                table.name()
                            );
                            match cell {
                                TableCell::Down => assert!(plan.plan_letter > letter),
                                TableCell::Up => assert!(plan.plan_letter < letter),
                                TableCell::Plan(_) => {
                                    assert_eq!(plan.plan_letter, letter);
                                    assert_eq!(plan.table_scheme, scheme);
                                }
                                TableCell::UseSingle => {
                                    assert_eq!(plan.table_scheme, Scheme::Single)
                                }
                                TableCell::UseDouble => {
                                    assert_ne!(plan.table_scheme, Scheme::Multiple)
                                }
                                other => panic!("{} {letter} {aql}: {other:?}", table.name()),
                            }
                        }
                        Err(StandardError::NotTranscribed { .. }) => {
                            *refused.entry(table.name().to_string()).or_default() += 1;
                        }
                        Err(e) => panic!("{} {letter} {aql}: {e}", table.name()),
                    }
                }
            }
        }
    }
    let count = |name: &str| refused.get(name).copied().unwrap_or(0);
    // II-C: 19 cells '?', plus the arrows into them: A at 15 and C to R at
    // 1000 (15 arrows).
    assert_eq!(
        count("Table II-C (single sampling, reduced inspection)"),
        34
    );
    assert_eq!(count("Table II-A (single sampling, normal inspection)"), 0);
    assert_eq!(
        count("Table II-B (single sampling, tightened inspection)"),
        0
    );
    assert_eq!(count("Table III-A (double sampling, normal inspection)"), 0);
    assert_eq!(
        count("Table IV-A (multiple sampling, normal inspection)"),
        0
    );
    // III-C mirrors II-C's unknown cells.
    assert_eq!(
        count("Table III-C (double sampling, reduced inspection)"),
        34
    );
    // IV-B: the 13 cells of the plan matching single 8 9 ('?').
    assert_eq!(
        count("Table IV-B (multiple sampling, tightened inspection)"),
        13
    );
    let iv_c = count("Table IV-C (multiple sampling, reduced inspection)");
    assert!(iv_c > 100, "{iv_c}");
}

/// The single, double and multiple tables of one severity correspond cell
/// by cell (MIL-STD-105E, Tables II to IV; the standard matched each
/// double and multiple plan to a single plan of nearly the same OC):
/// - the same arrows, and '?' where the single table has '?';
/// - one fixed correspondence from each single plan to a double plan and
///   to a multiple plan, the same in every cell of the table;
/// - '*' only where the single plan is 0 1 or the row has no sample size
///   of the scheme; '++' only where the row has no multiple sample size
///   or no multiple plan matches that single plan.
#[test]
fn single_double_and_multiple_plans_correspond_in_every_cell() {
    for severity in Severity::ALL {
        let single = tables().master(severity, Scheme::Single).unwrap();
        for scheme in [Scheme::Double, Scheme::Multiple] {
            let staged = tables().master(severity, scheme).unwrap();
            let mut map: HashMap<Vec<(Option<u64>, u64)>, TableCell> = HashMap::new();
            for letter in single.letters() {
                let row_has_sizes = !staged.sample_sizes(letter).unwrap().is_empty();
                for aql in Aql::all() {
                    let s = single.cell(letter, aql).unwrap();
                    let d = staged.cell(letter, aql).unwrap();
                    let at = format!(
                        "{} {letter} {aql}: {} vs {}",
                        staged.name(),
                        s.text(),
                        d.text()
                    );
                    match s {
                        TableCell::Plan(_) => {}
                        other => {
                            assert_eq!(d, other, "{at}");
                            continue;
                        }
                    }
                    let key = plan_numbers(s);
                    if key == [(Some(0), 1)] {
                        assert_eq!(*d, TableCell::UseSingle, "{at}");
                        continue;
                    }
                    if !row_has_sizes {
                        assert!(
                            matches!(d, TableCell::UseSingle | TableCell::UseDouble),
                            "{at}"
                        );
                        continue;
                    }
                    let image = match d {
                        TableCell::Plan(_) => TableCell::Plan(
                            plan_numbers(d)
                                .into_iter()
                                .map(|(accept, reject)| lotsman::Stage {
                                    n: 1,
                                    accept,
                                    reject,
                                })
                                .collect(),
                        ),
                        TableCell::UseDouble | TableCell::NotTranscribed => d.clone(),
                        _ => panic!("{at}"),
                    };
                    let first = map.entry(key).or_insert_with(|| image.clone());
                    assert_eq!(
                        *first, image,
                        "{at}: another cell maps the same single plan elsewhere"
                    );
                }
            }
            assert!(
                map.len() >= 8,
                "{}: {} single plans",
                staged.name(),
                map.len()
            );
        }
    }
}

/// The double and multiple sample sizes (from memory of the printed
/// tables): a double plan draws two equal samples, each the single sample
/// size of the letter above; a multiple plan draws seven equal samples,
/// each the single sample size three letters above. The single sizes
/// (Table II-A, read in an excerpt) are 2, 3, 5, 8, 13, 20, ... 2000.
#[test]
fn staged_sample_sizes_follow_the_single_sizes() {
    let normal = [
        2, 3, 5, 8, 13, 20, 32, 50, 80, 125, 200, 315, 500, 800, 1250, 2000,
    ];
    for severity in Severity::ALL {
        let single = tables().master(severity, Scheme::Single).unwrap();
        let size = |l: CodeLetter| single.sample_sizes(l).unwrap()[0];
        let letters: Vec<CodeLetter> = single.letters().collect();
        if severity == Severity::Normal {
            let sizes: Vec<u64> = letters.iter().map(|&l| size(l)).collect();
            assert_eq!(sizes, normal);
        }
        for (scheme, back, stages) in [(Scheme::Double, 1, 2), (Scheme::Multiple, 3, 7)] {
            let staged = tables().master(severity, scheme).unwrap();
            for (i, &l) in letters.iter().enumerate() {
                let sizes = staged.sample_sizes(l).unwrap();
                if sizes.is_empty() {
                    continue;
                }
                let unit = size(letters[i - back]);
                let expected: Vec<u64> = (1..=stages).map(|k| k * unit).collect();
                assert_eq!(sizes, expected, "{} {l}", staged.name());
            }
        }
    }
}

/// The code letter of every lot size at every level is a row of every
/// master table, and Table I's spot values (MIL-STD-105E Table I, read in
/// excerpts): lot 1,500 at level II is K; 1,000 at II is J; 2 at S-1 is A.
#[test]
fn table_i_spot_values() {
    let t = tables();
    let letter = |lot, level| t.code_letter(lot, level).unwrap().to_string();
    assert_eq!(letter(1500, InspectionLevel::II), "K");
    assert_eq!(letter(1000, InspectionLevel::II), "J");
    assert_eq!(letter(2, InspectionLevel::S1), "A");
    assert_eq!(letter(1201, InspectionLevel::II), "K");
    assert_eq!(letter(1200, InspectionLevel::II), "J");
    assert_eq!(letter(10_000_000, InspectionLevel::III), "R");
    assert_eq!(letter(35_000, InspectionLevel::S4), "H");
}

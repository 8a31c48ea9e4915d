//! Standard-indexed plans (issue 16): spot values of the MIL-STD-105E
//! tables, '*' and '++', the reduced gap, the 100 percent rule, refusals
//! and user tables. The tables' structure is checked cell by cell in
//! standard_tables.rs, the true risks in standard_risks.rs, several
//! classes in standard_classes.rs.
//!
//! Sources, named per check: issue 16's own example; the notes on the
//! standard (values read in excerpts of the legible 105E copy and a
//! level-II derived table); 'from memory' where a value is remembered from
//! the printed tables and was not read in this work; scipy.stats for the
//! OC figures.

use lotsman::{
    Aql, CodeLetter, InspectionLevel, LimitNumber, Model, ModelKind, Scheme, Severity,
    StandardAnswer, StandardError, StandardPlan, Tables, load_user_table, true_risks,
};

pub(crate) fn tables() -> &'static Tables {
    Tables::builtin().unwrap()
}

pub(crate) fn aql(text: &str) -> Aql {
    text.parse().unwrap()
}

pub(crate) fn letter(text: &str) -> CodeLetter {
    text.parse().unwrap()
}

pub(crate) fn plan(l: &str, a: &str, severity: Severity, scheme: Scheme) -> StandardPlan {
    tables()
        .lookup(letter(l), aql(a), severity, scheme)
        .unwrap()
}

/// `(n, Ac, Re)` of each stage as the table prints it.
pub(crate) fn numbers(p: &StandardPlan) -> Vec<(u64, Option<u64>, u64)> {
    p.table_numbers
        .iter()
        .map(|s| (s.n, s.accept, s.reject))
        .collect()
}

pub(crate) fn model(kind: ModelKind, lot: Option<u64>) -> Model {
    Model::new(kind, lot).unwrap()
}

/// Issue 16's example: lot 1,500 at level II is K, n = 125; at AQL 1.0
/// normal Ac 3 Re 4, tightened Ac 2 Re 3, double 80/80 with Ac 1, 4 and
/// Re 4, 5 (the double plan also from memory).
#[test]
fn the_issue_example() {
    let t = tables();
    let a = t
        .plan_for_lot(
            1500,
            InspectionLevel::II,
            aql("1.0"),
            Severity::Normal,
            Scheme::Single,
        )
        .unwrap();
    let p = a.plan().unwrap();
    assert_eq!(p.code_letter, letter("K"));
    assert_eq!(numbers(p), [(125, Some(3), 4)]);
    assert!(!p.from_memory, "{}", p.basis);
    assert_eq!(
        numbers(&plan("K", "1.0", Severity::Tightened, Scheme::Single)),
        [(125, Some(2), 3)]
    );
    let double = plan("K", "1.0", Severity::Normal, Scheme::Double);
    assert_eq!(numbers(&double), [(80, Some(1), 4), (160, Some(4), 5)]);
    assert!(double.from_memory);
    assert!(double.notes.iter().any(|n| n.contains("from memory")));
}

/// Values read in excerpts of the standard (the notes on MIL-STD-105E):
/// Table II-A at J, K, L for AQL 1.0 and J at 2.5; F at 1.0 is an up
/// arrow to E (n = 13, Ac 0 Re 1); Table II-B at K for 4.0 is Ac 8 Re 9.
#[test]
fn spot_values_read_in_excerpts() {
    let n = Severity::Normal;
    let single = |l, a| numbers(&plan(l, a, n, Scheme::Single));
    assert_eq!(single("J", "1.0"), [(80, Some(2), 3)]);
    assert_eq!(single("L", "1.0"), [(200, Some(5), 6)]);
    assert_eq!(single("J", "2.5"), [(80, Some(5), 6)]);
    let f = plan("F", "1.0", n, Scheme::Single);
    assert_eq!((f.code_letter, f.plan_letter), (letter("F"), letter("E")));
    assert_eq!(numbers(&f), [(13, Some(0), 1)]);
    assert!(
        f.notes[0].contains("↑ at code letter F, AQL 1.0"),
        "{:?}",
        f.notes
    );
    assert_eq!(
        numbers(&plan("K", "4.0", Severity::Tightened, Scheme::Single)),
        [(125, Some(8), 9)]
    );
}

/// Values from memory of the printed tables (REPORT of the transcription,
/// some also stated by a third-party page): normal R at 0.015 leads up to
/// P (800) 0 1; tightened Q at 0.025 leads down to the extra row S (3150)
/// 1 2; reduced G at 1.0 leads down to H (20) 0 2; reduced R at 0.015 up
/// to P (315) 0 1; reduced K at 1.0 is n = 50, Ac 1 Re 4; the normal
/// multiple plan at K, 1.0, seven stages of 32.
#[test]
fn spot_values_from_memory() {
    let check = |l, a, s, at, expected: &[(u64, Option<u64>, u64)]| {
        let p = plan(l, a, s, Scheme::Single);
        assert_eq!(p.plan_letter, letter(at), "{l} {a} {s}");
        assert_eq!(numbers(&p), expected, "{l} {a} {s}");
    };
    check("R", "0.015", Severity::Normal, "P", &[(800, Some(0), 1)]);
    check(
        "Q",
        "0.025",
        Severity::Tightened,
        "S",
        &[(3150, Some(1), 2)],
    );
    check("G", "1.0", Severity::Reduced, "H", &[(20, Some(0), 2)]);
    check("R", "0.015", Severity::Reduced, "P", &[(315, Some(0), 1)]);
    check("K", "1.0", Severity::Reduced, "K", &[(50, Some(1), 4)]);
    let m = plan("K", "1.0", Severity::Normal, Scheme::Multiple);
    let expected = [
        (None, 3),
        (Some(0), 3),
        (Some(1), 4),
        (Some(2), 5),
        (Some(3), 6),
        (Some(4), 6),
        (Some(6), 7),
    ];
    for (i, (s, (a, r))) in m.table_numbers.iter().zip(expected).enumerate() {
        assert_eq!((s.n, s.accept, s.reject), (32 * (i as u64 + 1), a, r));
    }
}

/// '*' in a double table means the single plan (the tables' footnote):
/// Table III-A at K for 0.10 is '*', so the plan is II-A's 0 1 at n = 125,
/// and the result says so.
#[test]
fn a_star_uses_the_single_plan_and_says_so() {
    let p = plan("K", "0.10", Severity::Normal, Scheme::Double);
    assert_eq!(p.scheme, Scheme::Double);
    assert_eq!(p.table_scheme, Scheme::Single);
    assert_eq!(numbers(&p), [(125, Some(0), 1)]);
    assert!(
        p.notes
            .iter()
            .any(|n| n.contains("has '*' at code letter K")),
        "{:?}",
        p.notes
    );
    // '++' in a multiple table means the double plan: IV-A at B for 15.
    let p = plan("B", "15", Severity::Normal, Scheme::Multiple);
    assert_eq!(p.table_scheme, Scheme::Double);
    assert_eq!(numbers(&p), [(2, Some(0), 2), (4, Some(1), 2)]);
}

/// Reduced inspection (105E, 4.10.1.4): the plan that decides the lot
/// accepts up to Re - 1; a count between Ac and Re accepts the lot and
/// sends the next lot to normal inspection.
#[test]
fn the_reduced_gap_accepts_and_reinstates_normal() {
    let p = plan("K", "1.0", Severity::Reduced, Scheme::Single);
    assert_eq!(p.stages.as_single(), Some((50, 3)));
    assert!(!p.reinstates_normal(1, 1));
    assert!(p.reinstates_normal(1, 2));
    assert!(p.reinstates_normal(1, 3));
    assert!(!p.reinstates_normal(1, 4));
    assert!(p.notes.iter().any(|n| n.contains("4.10.1.4")));
    let normal = plan("K", "1.0", Severity::Normal, Scheme::Single);
    assert!(!normal.reinstates_normal(1, 3));
}

/// The standard's 100 percent rule (footnote of its master tables): when
/// the sample equals or exceeds the lot, every unit is inspected. Lot 10
/// at II is B; at AQL 1.0 the arrow leads to E with n = 13 > 10. Lot 13
/// also gives E (n = 13 = 13). Lot 16 gives C, whose arrow leads to E with
/// n = 13 < 16: a plan.
#[test]
fn a_sample_reaching_the_lot_means_inspect_every_unit() {
    let t = tables();
    let answer = |lot| {
        t.plan_for_lot(
            lot,
            InspectionLevel::II,
            aql("1.0"),
            Severity::Normal,
            Scheme::Single,
        )
        .unwrap()
    };
    for lot in [10, 13] {
        let StandardAnswer::InspectAll(all) = answer(lot) else {
            panic!("lot {lot}");
        };
        assert_eq!(all.plan.sample_size(), 13);
        assert!(
            all.reason().contains("inspect every unit"),
            "{}",
            all.reason()
        );
    }
    assert!(matches!(answer(16), StandardAnswer::Sample(_)));
    // Double and multiple plans compare their last cumulative sample:
    // every lot size of the K row either samples below it or inspects all.
    for lot in 2..=1300 {
        for scheme in [Scheme::Double, Scheme::Multiple] {
            let a = t
                .plan_for_lot(
                    lot,
                    InspectionLevel::II,
                    aql("2.5"),
                    Severity::Normal,
                    scheme,
                )
                .unwrap();
            match a {
                StandardAnswer::Sample(p) => assert!(p.sample_size() < lot),
                StandardAnswer::InspectAll(a) => assert!(a.plan.sample_size() >= lot),
            }
        }
    }
}

/// Refusals: a '?' cell reached directly or through an arrow, with the
/// table, letter and AQL and the fix; a level or an AQL that is not the
/// standard's; an AQL above 10 with a model of the fraction nonconforming;
/// a scheme the tables do not hold.
#[test]
fn refusals_say_what_and_how_to_fix() {
    let t = tables();
    let e = t
        .lookup(letter("A"), aql("25"), Severity::Reduced, Scheme::Single)
        .unwrap_err();
    let text = e.to_string();
    for part in [
        "Table II-C (single sampling, reduced inspection)",
        "has no transcribed plan at code letter A, AQL 25:",
        "marked '?'",
        "give your own copy of the table (lotsman standard --table SEVERITY=FILE.csv), leave reduced inspection out (--no-reduced) when the cell is on reduced inspection, or choose another scheme",
    ] {
        assert!(text.contains(part), "{text}");
    }
    let e = t
        .lookup(letter("C"), aql("1000"), Severity::Reduced, Scheme::Single)
        .unwrap_err()
        .to_string();
    assert!(
        e.contains("at code letter B, AQL 1000, where the lookup for code letter C leads:"),
        "{e}"
    );
    let e = t
        .lookup(letter("K"), aql("1.0"), Severity::Reduced, Scheme::Multiple)
        .unwrap_err()
        .to_string();
    assert!(e.contains("Table IV-C"), "{e}");

    let e = InspectionLevel::parse("IV").unwrap_err().to_string();
    assert!(
        e.contains("'IV' is not one of the standard's levels"),
        "{e}"
    );
    let e = Aql::parse("1.2").unwrap_err().to_string();
    assert!(
        e.contains("AQL '1.2' is not one of the standard's values"),
        "{e}"
    );

    let p = plan("K", "15", Severity::Normal, Scheme::Single);
    for kind in [ModelKind::Binomial, ModelKind::Hypergeometric] {
        let e = true_risks(&p, &model(kind, Some(1500)), &[0.1], None).unwrap_err();
        assert!(matches!(e, StandardError::AqlNeedsPoisson { .. }), "{e}");
    }
    assert!(true_risks(&p, &model(ModelKind::Poisson, None), &[0.1], None).is_ok());

    let e = t
        .lookup(
            letter("K"),
            aql("1.0"),
            Severity::Normal,
            Scheme::Sequential,
        )
        .unwrap_err()
        .to_string();
    assert!(
        e.contains("single, double and multiple plans, not sequential"),
        "{e}"
    );
    let e = t
        .plan_for_lot(
            0,
            InspectionLevel::II,
            aql("1.0"),
            Severity::Normal,
            Scheme::Single,
        )
        .unwrap_err()
        .to_string();
    assert!(e.contains("lot size = 0"), "{e}");
}

/// The built-in reduced single table, as a user would start from it.
fn reduced_single_text() -> String {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/data/standard/mil-std-105e/table-2c-single-reduced.csv"
    );
    std::fs::read_to_string(path).unwrap()
}

/// A user's own table fills the cells the built-in data leave '?', and a
/// plan read from it names the file and its SHA-256; a faulty file is
/// refused with its file, line and column.
#[test]
fn a_user_table_replaces_the_built_in_one() {
    let text = reduced_single_text().replace(
        "A,2,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,0 1,↓,↓,?,?,?,?,?,?,?,?,?",
        "A,2,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,↓,0 1,↓,↓,1 2,2 3,3 4,5 6,7 8,10 11,14 15,21 22,30 31",
    );
    let user = load_user_table("mine.csv", &text, Severity::Reduced).unwrap();
    assert_eq!(user.sha256.len(), 64);
    let t = tables().with_user_table(&user);
    let p = t
        .lookup(letter("A"), aql("25"), Severity::Reduced, Scheme::Single)
        .unwrap();
    assert_eq!(numbers(&p), [(2, Some(1), 2)]);
    assert_eq!(
        p.table,
        "the user table mine.csv (single sampling, reduced inspection)"
    );
    assert!(p.basis.contains(&user.sha256), "{}", p.basis);
    assert_eq!(t.user_tables().len(), 1);
    // The built-in set is left as it was.
    assert!(
        tables()
            .lookup(letter("A"), aql("25"), Severity::Reduced, Scheme::Single)
            .is_err()
    );

    // Row K is line 19 of the file.
    let bad = reduced_single_text().replacen(
        "K,50,↓,↓,↓,↓,↓,0 1,↑,↓,0 2,1 3,1 4",
        "K,50,↓,↓,↓,↓,↓,0 1,↑,↓,0 2,1 3,4",
        1,
    );
    let e = load_user_table("mine.csv", &bad, Severity::Reduced).unwrap_err();
    assert!(
        e.to_string()
            .starts_with("mine.csv, line 19, column '1.0': '4' is not a cell"),
        "{e}"
    );
    let bad = reduced_single_text().replace(",↑\n", ",↓\n");
    let e = load_user_table("mine.csv", &bad, Severity::Reduced)
        .unwrap_err()
        .to_string();
    assert!(
        e.contains("runs off the table") || e.contains("reversed arrow"),
        "{e}"
    );
    // Sample sizes beyond any plan, and cumulative sizes that do not add
    // up, are refused with their line.
    let double = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/data/standard/mil-std-105e/table-3a-double-normal.csv"
    ))
    .unwrap();
    let huge = double.replace("K,second,80,160,", "K,second,18446744073709551615,160,");
    let e = load_user_table("mine.csv", &huge, Severity::Normal)
        .unwrap_err()
        .to_string();
    assert!(
        e.contains("column 'sample_size': '18446744073709551615' is not a sample size"),
        "{e}"
    );
    let sum = double.replace("K,second,80,160,", "K,second,80,161,");
    let e = load_user_table("mine.csv", &sum, Severity::Normal)
        .unwrap_err()
        .to_string();
    assert!(e.contains("'161' is not the cumulative sample size: it must be the sum of the sample sizes so far, 160"), "{e}");
    // A gap between Ac and Re outside reduced inspection is refused.
    let e = load_user_table("mine.csv", &reduced_single_text(), Severity::Normal)
        .unwrap_err()
        .to_string();
    assert!(e.contains("the last stage must decide every count"), "{e}");
}

/// Table VIII (entered from memory only, unverified): the limit number
/// for 200 to 319 sample units at AQL 2.5 is 2; 10 units are too few.
#[test]
fn limit_numbers_from_memory() {
    let t = tables();
    assert_eq!(t.limit_number(250, aql("2.5")), LimitNumber::Number(2));
    assert_eq!(t.limit_number(250, aql("0.65")), LimitNumber::TooFewUnits);
    assert_eq!(t.limit_number(10, aql("1.0")), LimitNumber::TooFewUnits);
    assert!(t.limit_numbers().source().contains("Table VIII"));
}

/// A '?' reached through '++' names the table where the lookup started:
/// a user's multiple table for reduced inspection that says '++' (use the
/// double plan) in row B leads into Table III-C, whose row B above AQL 10
/// is not transcribed.
#[test]
fn an_untranscribed_cell_names_where_the_lookup_started() {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/data/standard/mil-std-105e/table-4c-multiple-reduced.csv"
    );
    let text: String = std::fs::read_to_string(path)
        .unwrap()
        .lines()
        .map(|l| {
            if l.starts_with("B,") {
                format!("{}\n", l.replace(",?", ",++"))
            } else {
                format!("{l}\n")
            }
        })
        .collect();
    let user = load_user_table("mine.csv", &text, Severity::Reduced).unwrap();
    let e = tables()
        .with_user_table(&user)
        .lookup(letter("B"), aql("25"), Severity::Reduced, Scheme::Multiple)
        .unwrap_err()
        .to_string();
    assert!(
        e.starts_with(
            "Table III-C (double sampling, reduced inspection) has no transcribed plan at code letter B, AQL 25, where the lookup for code letter B in the user table mine.csv (multiple sampling, reduced inspection) leads:"
        ),
        "{e}"
    );
}

proptest::proptest! {
    #![proptest_config(proptest::prelude::ProptestConfig { cases: 128, ..Default::default() })]

    /// Any text given as a user table, the parsers of levels, AQLs and
    /// classes, and a built-in table with one field replaced by anything:
    /// a value or an error that says something, never a panic.
    #[test]
    fn user_text_never_panics(
        text in "\\PC{0,120}|[A-S0-9,# ↓↑*+?\\n]{0,200}",
        field in proptest::prop_oneof![
            "\\PC{0,6}|[0-9 #↓↑*+?]{0,5}",
            proptest::strategy::Just("18446744073709551615".to_string()),
            proptest::strategy::Just("18446744073709551615 18446744073709551615".to_string()),
        ],
        at in 0usize..4000,
    ) {
        for severity in Severity::ALL {
            if let Err(e) = load_user_table("mine.csv", &text, severity) {
                proptest::prop_assert!(!e.to_string().trim().is_empty());
            }
        }
        let _ = InspectionLevel::parse(&text);
        let _ = Aql::parse(&text);
        let _ = lotsman::parse_classes(&[text.as_str(), "major=1.0"]);
        let base = reduced_single_text();
        let cuts: Vec<usize> = base.match_indices(',').map(|(i, _)| i).collect();
        let i = cuts[at % cuts.len()];
        let end = base[i + 1..].find([',', '\n']).map_or(base.len(), |j| i + 1 + j);
        let mutated = format!("{}{field}{}", &base[..=i], &base[end..]);
        if let Ok(user) = load_user_table("mine.csv", &mutated, Severity::Reduced) {
            let t = tables().with_user_table(&user);
            for l in CodeLetter::all() {
                for a in Aql::all() {
                    let _ = t.lookup(l, a, Severity::Reduced, Scheme::Single);
                }
            }
        }
    }
}

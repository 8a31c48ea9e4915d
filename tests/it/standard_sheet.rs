//! The sheet of a standard-indexed plan (MIL-STD-105E): what its SVG
//! says (code letter, each class's plans, the cautions, the switching
//! rules, the true risks against scipy), and which lots, classes,
//! schemes and consumer's points it lays out on A4 and Letter; where it
//! cannot, it refuses in plain words rather than clip or overlap.

use lotsman::{
    ClassRule, ClassScheme, ConsumerPoint, InspectionLevel, Model, Paper, Scheme, Severity,
    SheetDocument, StandardFacts, StandardIndex, StandardRequest, Tables, assess, parse_classes,
    render_standard_sheet, render_standard_sheet_svg,
};
use roxmltree::Document;

/// The facts of a lot of 1500 at level II with `aqls`, `scheme`,
/// reduced inspection or not, and a consumer's point at `rql` (beta
/// 0.10, alpha 0.05) when given.
fn facts(aqls: &[&str], scheme: Scheme, reduced: bool, rql: Option<f64>) -> StandardFacts {
    let classes = parse_classes(aqls).unwrap();
    let kind = StandardRequest::default_model(&classes);
    let model = Model::new(kind, None).unwrap();
    let index = StandardIndex {
        lot_size: 1500,
        level: InspectionLevel::II,
        classes,
        severity: Severity::Normal,
        scheme,
        reduced,
        rule: ClassRule::OwnPlans,
    };
    let request = StandardRequest::new(index, model).unwrap();
    let tables = Tables::builtin().unwrap();
    let consumer = rql.map(|rql| ConsumerPoint {
        rql,
        beta: 0.10,
        alpha: 0.05,
    });
    let a = assess(&request, tables, None, consumer).unwrap();
    let document = SheetDocument {
        title: "Hinge brackets, visual".into(),
        item: Some("Hinge bracket HB-31".into()),
        id: Some("IQ-207".into()),
        revision: Some("A".into()),
        date: Some("2024-03-11".into()),
        prepared_by: Some("Maren Oduya".into()),
        approved_by: Some("Pell Strand".into()),
        file_name: "hinge.yaml".into(),
        source_sha256: "c3".repeat(32),
        regenerate: "lotsman sheet hinge.yaml --force".into(),
        ..SheetDocument::default()
    };
    StandardFacts::from_assessment(document, &a, tables).unwrap()
}

/// The texts of the SVG's `<text>` elements, in order.
fn texts(svg: &str) -> Vec<String> {
    let doc = Document::parse(svg).unwrap();
    doc.descendants()
        .filter(|n| n.has_tag_name("text"))
        .map(|n| n.text().unwrap_or("").to_string())
        .collect()
}

/// Whether `run` appears in `all` as consecutive texts.
fn has_run(all: &[String], run: &[&str]) -> bool {
    all.windows(run.len())
        .any(|w| w.iter().zip(run).all(|(a, b)| a == b))
}

#[test]
fn the_svg_says_the_letter_the_plans_the_cautions_and_the_rules() {
    let f = facts(&["major=1.0", "minor=4.0"], Scheme::Single, true, None);
    let t = texts(&render_standard_sheet_svg(&f, Paper::A4).unwrap());
    let all = t.join(" ");
    // MIL-STD-105E Table I: 1201 to 3200 units at level II is letter K.
    assert!(has_run(&t, &["Code letter", "K"]));
    // Table II-A, II-B, II-C at K: n 125 normal and tightened, 50 reduced;
    // AQL 1.0: Ac 3 Re 4, Ac 2 Re 3, Ac 1 Re 4; AQL 4.0: 10 11, 8 9, 5 8.
    let major = [
        "major", "1.0", "K", "125", "3", "4", "", "K", "125", "2", "3", "", "K", "50", "1", "4",
    ];
    let minor = [
        "minor", "4.0", "K", "125", "10", "11", "", "K", "125", "8", "9", "", "K", "50", "5", "8",
    ];
    assert!(has_run(&t, &major), "{t:?}");
    assert!(has_run(&t, &minor), "{t:?}");
    assert!(all.contains("Sampling does not guarantee the quality of a lot"));
    assert!(all.contains("Critical and safety characteristics follow the applicable contract"));
    for rule in [
        "Normal → tightened (4.7.1):",
        "Tightened → normal (4.7.2):",
        "Normal → reduced (4.7.3):",
        "Reduced → normal (4.7.4):",
        "Discontinue (4.8):",
    ] {
        assert!(t.iter().any(|x| x == rule), "{rule}");
    }
    assert!(all.contains("switching scheme, long run"));
}

#[test]
fn the_true_risks_are_scipys() {
    let f = facts(
        &["major=1.0", "minor=4.0"],
        Scheme::Single,
        true,
        Some(0.05),
    );
    let t = texts(&render_standard_sheet_svg(&f, Paper::A4).unwrap());
    // scipy 1.x: 1 - binom.cdf(3, 125, 0.01) = 0.037449;
    // 1 - binom.cdf(10, 125, 0.04) = 0.011909 (producer's risks at the AQL).
    assert!(has_run(&t, &["major", "125", "0.0374"]), "{t:?}");
    assert!(has_run(&t, &["minor", "125", "0.0119"]), "{t:?}");
    // scipy: binom.cdf(3, 125, 0.05) = 0.12378; binom.cdf(10, 125, 0.05)
    // = 0.95078 (consumer's risks at the RQL, both above beta 0.10).
    assert!(
        t.iter()
            .any(|x| x.starts_with("0.124") && x.ends_with("> β"))
    );
    assert!(
        t.iter()
            .any(|x| x.starts_with("0.951") && x.ends_with("> β"))
    );
    assert!(
        t.iter()
            .any(|x| x.starts_with("Consumer's point: RQL 5.000% at β 0.1"))
    );
}

#[test]
fn a_consumers_risk_below_a_thousandth_reads_so() {
    // n 125 Ac 3 at 40% nonconforming: scipy binom.cdf(3, 125, 0.4) is
    // about 3e-24, far below 0.001.
    let f = facts(&["1.0"], Scheme::Single, true, Some(0.4));
    let t = texts(&render_standard_sheet_svg(&f, Paper::Letter).unwrap());
    assert!(
        t.iter()
            .any(|x| x.starts_with("< 0.001") && x.ends_with("≤ β")),
        "{t:?}"
    );
    assert!(!t.iter().any(|x| x.contains("e-")), "{t:?}");
}

/// The lots the sheet must lay out, as `(classes, scheme, reduced)`:
/// one, two and three classes of single, double and multiple plans
/// (the built-in multiple tables lack reduced plans at K, and minor 4.0
/// at K tightened, so those use 2.5 without reduced inspection).
fn combinations() -> Vec<(Vec<&'static str>, Scheme, bool)> {
    let mut out = Vec::new();
    for scheme in [Scheme::Single, Scheme::Double] {
        out.push((vec!["1.0"], scheme, true));
        out.push((vec!["major=1.0", "minor=4.0"], scheme, true));
        out.push((
            vec!["critical=0.065", "major=1.0", "minor=4.0"],
            scheme,
            true,
        ));
    }
    out.push((vec!["1.0"], Scheme::Multiple, false));
    out.push((vec!["major=1.0", "minor=2.5"], Scheme::Multiple, false));
    out.push((
        vec!["critical=0.065", "major=1.0", "minor=2.5"],
        Scheme::Multiple,
        false,
    ));
    out
}

/// Whether the sheet of `classes` classes fits one page: the floor a
/// change of layout must keep (the rest take two).
fn one_page(classes: usize, scheme: Scheme, rql: bool, paper: Paper) -> bool {
    matches!(
        (classes, scheme, rql, paper),
        (1, Scheme::Single, _, _)
            | (2, Scheme::Single, false, _)
            | (2, Scheme::Single, true, Paper::A4)
            | (3, Scheme::Single, false, Paper::A4)
            | (1, Scheme::Double, false, Paper::Letter)
            | (1, Scheme::Multiple, _, Paper::A4)
    )
}

/// The pages of a PDF, as lopdf reads them.
fn pages(pdf: &[u8]) -> usize {
    lopdf::Document::load_mem(pdf).unwrap().get_pages().len()
}

#[test]
fn every_combination_is_laid_out_on_one_page_or_two() {
    for (aqls, scheme, reduced) in combinations() {
        for rql in [None, Some(0.05)] {
            let f = facts(&aqls, scheme, reduced, rql);
            for paper in [Paper::A4, Paper::Letter] {
                let name = format!("{aqls:?} {} rql {rql:?} {paper:?}", scheme.name());
                let sheet =
                    render_standard_sheet(&f, paper).unwrap_or_else(|e| panic!("{name}: {e}"));
                assert!(sheet.pdf.starts_with(b"%PDF"), "{name}");
                let n = pages(&sheet.pdf);
                assert!(n == 1 || n == 2, "{name}: {n} pages");
                if one_page(aqls.len(), scheme, rql.is_some(), paper) {
                    assert_eq!(n, 1, "{name}");
                }
                // The blocks of both pages (page 2's a page lower) are
                // clear of each other.
                for (i, a) in sheet.regions.iter().enumerate() {
                    for b in &sheet.regions[i + 1..] {
                        assert!(!a.overlaps(b), "{name}: {} and {}", a.name, b.name);
                    }
                }
                let t = texts(&render_standard_sheet_svg(&f, paper).unwrap());
                let all = t.join(" ");
                if n == 2 {
                    assert!(all.contains("Page 1 of 2."), "{name}");
                    assert!(all.contains("Page 2 of 2."), "{name}");
                } else {
                    assert!(!all.contains("Page 1 of"), "{name}");
                }
            }
        }
    }
}

#[test]
fn the_rule_to_reduced_counts_the_lots_the_scheme_counts() {
    let f = facts(
        &["critical=0.065", "major=1.0", "minor=4.0"],
        Scheme::Single,
        true,
        None,
    );
    let tables = Tables::builtin().unwrap();
    let normal = f.classes[0].at(Severity::Normal).unwrap().plan().unwrap();
    let w = ClassScheme::limit_window(tables, normal).unwrap();
    // MIL-STD-105E Table VIII (built in from memory): at AQL 0.065 ten lots
    // of 200 (2000 units) are too few (`*`); 3200 to 4999 units give 0, so
    // the rule counts 16 lots, as the scheme does.
    assert_eq!((w.lots(), w.limit()), (16, 0));
    let all = texts(&render_standard_sheet_svg(&f, Paper::A4).unwrap()).join(" ");
    assert!(
        all.contains("critical 0† at 3200 units over 16 lots"),
        "{all}"
    );
    assert!(all.contains("major 7† at 1250 units and"), "{all}");
}

#[test]
fn classes_of_different_samples_are_drawn_in_nested_parts() {
    // Lot 1500, level II: code letter K (n = 125) for major 1.0 and minor
    // 4.0; the arrow of AQL 0.065 leads to letter L (n = 200) for
    // critical (MIL-STD-105E Tables I and II-A). One nested draw of 125
    // and 75 more, not "the first units" of one list of 200.
    let f = facts(
        &["critical=0.065", "major=1.0", "minor=4.0"],
        Scheme::Single,
        false,
        None,
    );
    let all = texts(&render_standard_sheet_svg(&f, Paper::A4).unwrap()).join(" ");
    for words in [
        "Draw the sample in 2 parts, each at random from the units of the lot not",
        "units 1 to 125 for every class; units 126",
        "to 200 for critical only.",
    ] {
        assert!(all.contains(words), "{words}\n{all}");
    }
    assert!(!all.contains("the first units drawn"), "{all}");
}

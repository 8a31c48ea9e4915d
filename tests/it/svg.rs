//! The charts of a plan and the whole sheet as SVG: every document the
//! demo plans give parses as XML (roxmltree) into an `<svg>` with a
//! `viewBox`, holds the plan's curve and its axis labels as text, and no
//! coordinate that is not a finite number inside the page.

use std::path::Path;

use lotsman::{
    ChartKind, DEMO_PLANS, Model, Paper, PlanSource, RiskPair, StagedPlan, chart_svg,
    render_sheet_svg,
};
use roxmltree::{Document, Node};

/// The colour of the plan's curves (the sheet's blue), as the SVG writes it.
const CURVE: &str = "#0d408c";

/// The demo's attributes plans designed from two risk points: name,
/// plan, model and risk points (the standard-indexed one has its own
/// sheet, tested in `standard_sheet`).
fn demo_plans() -> Vec<(String, StagedPlan, Model, RiskPair)> {
    DEMO_PLANS
        .iter()
        .filter_map(|(name, text)| {
            let source = PlanSource::from_yaml(text, Path::new(name)).unwrap();
            if source.is_variables() || source.is_standard() {
                return None;
            }
            let request = source.request().unwrap();
            let plan = source.recorded_plan(&request.model).unwrap();
            Some((name.to_string(), plan, request.model, request.risks))
        })
        .collect()
}

/// The width and height of the root's `viewBox`, checked to start at 0 0.
fn view_box(doc: &Document) -> (f64, f64) {
    let root = doc.root_element();
    assert_eq!(root.tag_name().name(), "svg");
    assert_eq!(
        root.tag_name().namespace(),
        Some("http://www.w3.org/2000/svg")
    );
    let numbers: Vec<f64> = root
        .attribute("viewBox")
        .expect("a viewBox")
        .split_whitespace()
        .map(|v| v.parse().unwrap())
        .collect();
    assert_eq!(numbers.len(), 4);
    assert_eq!((numbers[0], numbers[1]), (0.0, 0.0));
    (numbers[2], numbers[3])
}

/// Every number in the coordinates and sizes of the elements inside
/// `node` (the root's size is in mm), as `(attribute, text)`.
fn numbers<'a>(node: Node<'a, 'a>) -> Vec<(&'static str, String)> {
    let mut out = Vec::new();
    for n in node.descendants().skip(1).filter(|n| n.is_element()) {
        for attr in ["x", "y", "width", "height", "font-size", "stroke-width"] {
            if let Some(v) = n.attribute(attr) {
                out.push((attr, v.to_string()));
            }
        }
        if let Some(points) = n.attribute("points") {
            for pair in points.split_whitespace() {
                for v in pair.split(',') {
                    out.push(("points", v.to_string()));
                }
            }
        }
        if let Some(d) = n.attribute("d") {
            for v in d.split(|ch: char| ch.is_ascii_alphabetic() || ch == ' ') {
                if !v.is_empty() {
                    out.push(("d", v.to_string()));
                }
            }
        }
    }
    out
}

/// No coordinate is NaN or infinite, and every one lies on the page.
fn assert_on_page(doc: &Document, (w, h): (f64, f64), what: &str) {
    let text = doc.input_text();
    for bad in ["NaN", "inf"] {
        assert!(!text.contains(bad), "{what}: '{bad}' in the document");
    }
    for (attr, v) in numbers(doc.root_element()) {
        let v: f64 = v
            .parse()
            .unwrap_or_else(|_| panic!("{what}: {attr} '{v}' is no number"));
        assert!(v.is_finite(), "{what}: {attr} {v}");
        assert!(
            (-0.01..=w.max(h) + 0.01).contains(&v),
            "{what}: {attr} {v} leaves the {w} x {h} page"
        );
    }
}

/// The texts of the document, in order.
fn texts(doc: &Document) -> Vec<String> {
    doc.descendants()
        .filter(|n| n.has_tag_name("text"))
        .map(|n| n.text().unwrap_or("").replace('\u{a0}', " "))
        .collect()
}

/// The longest polyline in the plan's colour: the curve.
fn curve_points(doc: &Document) -> usize {
    doc.descendants()
        .filter(|n| n.has_tag_name("polyline") && n.attribute("stroke") == Some(CURVE))
        .map(|n| n.attribute("points").unwrap().split_whitespace().count())
        .max()
        .unwrap_or(0)
}

#[test]
fn every_chart_of_every_demo_plan_is_a_valid_svg_with_its_curve_and_labels() {
    let mut drawn = 0;
    for (name, plan, model, risks) in demo_plans() {
        let per_unit = model.kind() == lotsman::ModelKind::Poisson;
        let quality_axis = if per_unit {
            "Lot quality (nonconformities per unit)"
        } else {
            "Lot quality (% nonconforming)"
        };
        for (kind, y_axis) in [
            (ChartKind::Oc, "Probability of acceptance Pa"),
            (ChartKind::Aoq, "AOQ"),
            (ChartKind::Asn, "Units inspected per lot, on average"),
        ] {
            let what = format!("{name} {kind:?}");
            let svg = chart_svg(kind, &plan, &model, &risks, (120.0, 80.0))
                .unwrap_or_else(|e| panic!("{what}: {e}"));
            let doc = Document::parse(&svg).unwrap_or_else(|e| panic!("{what}: {e}"));
            assert_eq!(view_box(&doc), (120.0, 80.0), "{what}");
            assert_on_page(&doc, (120.0, 80.0), &what);
            let texts = texts(&doc);
            assert!(texts.iter().any(|t| t == quality_axis), "{what}: {texts:?}");
            assert!(texts.iter().any(|t| t == y_axis), "{what}: {texts:?}");
            // The curve: one evaluation per point, 241 of them.
            assert_eq!(curve_points(&doc), 241, "{what}");
            let title = doc.descendants().find(|n| n.has_tag_name("title")).unwrap();
            assert_eq!(title.text(), Some(kind.name()), "{what}");
            drawn += 1;
        }
    }
    assert_eq!(drawn, 6 * 3);
}

#[test]
fn the_decision_chart_of_the_item_by_item_demo_plan_shows_its_zones_and_lines() {
    let (name, plan, model, risks) = demo_plans()
        .into_iter()
        .find(|(_, plan, _, _)| plan.sequential_lines().is_some())
        .unwrap();
    let svg = chart_svg(ChartKind::Decision, &plan, &model, &risks, (150.0, 90.0)).unwrap();
    let doc = Document::parse(&svg).unwrap();
    assert_eq!(view_box(&doc), (150.0, 90.0));
    assert_on_page(&doc, (150.0, 90.0), &name);
    let texts = texts(&doc);
    for label in [
        "Decision chart",
        "Units inspected n",
        "Running count d of nonconforming units",
        "REJECT",
        "ACCEPT",
    ] {
        assert!(texts.iter().any(|t| t == label), "{label}: {texts:?}");
    }
    // The zones are filled paths; the two lines of the test dashed.
    let fills = doc
        .descendants()
        .filter(|n| n.has_tag_name("path") && n.attribute("fill").is_some_and(|f| f != "none"))
        .count();
    assert!(fills >= 3, "{fills} filled zones");
    let dashed = doc
        .descendants()
        .filter(|n| n.has_tag_name("polyline") && n.attribute("stroke-dasharray").is_some())
        .count();
    assert_eq!(dashed, 2);
}

#[test]
fn a_decision_chart_of_a_plan_with_stages_and_a_chart_without_room_are_refused() {
    let plans = demo_plans();
    let (_, plan, model, risks) = plans
        .iter()
        .find(|(_, plan, _, _)| plan.as_single().is_some())
        .unwrap();
    let e = chart_svg(ChartKind::Decision, plan, model, risks, (120.0, 80.0)).unwrap_err();
    assert!(
        e.to_string()
            .contains("item-by-item (sequential) plan, and this is a single plan"),
        "{e}"
    );
    for size in [(10.0, 80.0), (120.0, f64::NAN), (120.0, 5000.0)] {
        let e = chart_svg(ChartKind::Oc, plan, model, risks, size).unwrap_err();
        assert!(e.to_string().contains("50 to 1000"), "{size:?}: {e}");
    }
    // Wide enough for the rules, too narrow for the title.
    let e = chart_svg(ChartKind::Aoq, plan, model, risks, (55.0, 60.0)).unwrap_err();
    assert!(
        e.to_string().contains("cannot be drawn at 55 x 60 mm"),
        "{e}"
    );
}

#[test]
fn every_demo_sheet_is_a_valid_svg_page_on_either_paper() {
    for (name, text) in DEMO_PLANS {
        let source = PlanSource::from_yaml(text, Path::new(name)).unwrap();
        for (paper, size) in [(Paper::A4, (210.0, 297.0)), (Paper::Letter, (215.9, 279.4))] {
            let what = format!("{name} on {}", paper.name());
            let svg = render_sheet_svg(text, &source, name, paper)
                .unwrap_or_else(|e| panic!("{what}: {e}"));
            let doc = Document::parse(&svg).unwrap_or_else(|e| panic!("{what}: {e}"));
            // A standard-indexed sheet that needs two pages stacks them,
            // 8 mm apart (src/print/svg.rs); every other sheet is one page.
            let two = (size.0, 2.0 * size.1 + 8.0);
            let shown = view_box(&doc);
            if source.is_standard() && shown == two {
                assert_on_page(&doc, two, &what);
            } else {
                assert_eq!(shown, size, "{what}");
                assert_on_page(&doc, size, &what);
            }
            let texts = texts(&doc);
            assert!(
                texts.iter().any(|t| t == "INCOMING INSPECTION PLAN"),
                "{what}"
            );
            assert!(
                texts
                    .iter()
                    .any(|t| t.contains(&format!("lotsman sheet {name}"))),
                "{what}: the provenance line"
            );
        }
    }
}

//! The trade-off map as SVG (for the web page): the same page as the PDF,
//! drawn by the same layout, parsed as XML (roxmltree), with the agreed
//! risk points ringed and named in the key only when given.

use lotsman::{
    Criterion, Model, ModelKind, Paper, RiskGrid, Scheme, TradeoffGrid, TradeoffRequest,
    render_tradeoff_map, render_tradeoff_map_svg, tradeoff,
};
use roxmltree::Document;

/// A 7 x 7 grid around AQL 1%, RQL 6%, lot of 2000, with a cost of 2 per
/// unit at a process average of 1%.
fn grid() -> TradeoffGrid {
    let axis = |x: f64| (0..7).map(|i| x / 2.0 + x * 0.25 * i as f64).collect();
    let request = TradeoffRequest::new(
        RiskGrid {
            aql: axis(0.01),
            rql: axis(0.06),
            alpha: 0.05,
            beta: 0.10,
        },
        Model::new(ModelKind::Hypergeometric, Some(2000)).unwrap(),
        Scheme::Single,
        Criterion::AsnAql,
        Some((2.0, 0.01)),
    )
    .unwrap();
    tradeoff(&request, &|| {})
}

/// The texts of an SVG document, in order.
fn texts(svg: &str) -> Vec<String> {
    let doc = Document::parse(svg).unwrap();
    assert_eq!(doc.root_element().tag_name().name(), "svg");
    doc.descendants()
        .filter(|n| n.has_tag_name("text"))
        .map(|n| n.text().unwrap_or("").to_string())
        .collect()
}

#[test]
fn the_svg_map_is_the_pdf_page_with_the_agreed_points_ringed_when_given() {
    let grid = grid();
    let plain =
        render_tradeoff_map_svg(&grid, "Cover fit", Some("lotsman x"), Paper::A4, None).unwrap();
    let ringed = render_tradeoff_map_svg(
        &grid,
        "Cover fit",
        Some("lotsman x"),
        Paper::A4,
        Some((0.06, 0.01)),
    )
    .unwrap();
    let (plain_texts, ringed_texts) = (texts(&plain), texts(&ringed));
    // Both panels, the title and the command, as on the PDF page.
    let pdf = render_tradeoff_map(&grid, "Cover fit", Some("lotsman x"), Paper::A4).unwrap();
    assert_eq!(pdf.panels.len(), 2);
    for text in ["Cover fit", "cost"] {
        assert!(plain_texts.iter().any(|t| t == text), "{text}");
    }
    assert!(plain_texts.iter().any(|t| t.contains("lotsman x")));
    // The ring's entry in the key, only when the points are given.
    let key = "The agreed risk points (AQL, RQL)";
    assert!(!plain_texts.iter().any(|t| t == key));
    assert!(ringed_texts.iter().any(|t| t == key));
    // The ring, casing and line, on each panel and in the key: six more
    // stroked paths.
    let strokes = |svg: &str| svg.matches("fill=\"none\" stroke=").count();
    assert_eq!(strokes(&ringed), strokes(&plain) + 2 * 3);
    // The page is A4 turned.
    assert!(
        plain.contains("viewBox=\"0 0 297 210\""),
        "{}",
        &plain[..300]
    );
}

//! The trade-off map: page, text, determinism, layout, cells without a
//! plan, the cost panel, grid sizes, and the contours against a brute-force
//! design.

use crate::common;
use common::{page_sizes, pdf_text};

use lotsman::{
    Criterion, MapQuantity, Model, ModelKind, Paper, RiskGrid, Scheme, TradeoffGrid, TradeoffMap,
    TradeoffRequest, render_tradeoff_map, tool_version, tradeoff,
};

/// `count` evenly spaced values from `lo` to `hi`.
fn range(lo: f64, hi: f64, count: usize) -> Vec<f64> {
    (0..count)
        .map(|i| lo + (hi - lo) * i as f64 / (count - 1) as f64)
        .collect()
}

/// The solved grid of the binomial single plans (alpha 0.05, beta 0.10).
fn grid(kind: ModelKind, lot: Option<u64>, aql: Vec<f64>, rql: Vec<f64>) -> TradeoffGrid {
    grid_with(kind, lot, aql, rql, Scheme::Single, None)
}

fn grid_with(
    kind: ModelKind,
    lot: Option<u64>,
    aql: Vec<f64>,
    rql: Vec<f64>,
    scheme: Scheme,
    cost: Option<(f64, f64)>,
) -> TradeoffGrid {
    let model = Model::new(kind, lot).unwrap();
    let request = TradeoffRequest::new(
        RiskGrid {
            aql,
            rql,
            alpha: 0.05,
            beta: 0.10,
        },
        model,
        scheme,
        Criterion::AsnAql,
        cost,
    )
    .unwrap();
    tradeoff(&request, &|| {})
}

/// The grid at a quarter of its resolution: p1 0.2% to 2%, p2 3%
/// to 12%.
fn negotiation_grid() -> TradeoffGrid {
    grid(
        ModelKind::Binomial,
        None,
        range(0.002, 0.02, 25),
        range(0.03, 0.12, 25),
    )
}

/// A grid whose AQL range overlaps its RQL range, under a lot of 300: it
/// has cells with the AQL not below the RQL and cells where the lot is too
/// small to tell the points apart.
fn gaps_grid() -> TradeoffGrid {
    grid(
        ModelKind::Hypergeometric,
        Some(300),
        range(0.005, 0.06, 12),
        range(0.01, 0.08, 15),
    )
}

fn render(grid: &TradeoffGrid) -> TradeoffMap {
    render_tradeoff_map(grid, "Seal rings from TPW", Some(COMMAND), Paper::A4).unwrap()
}

const COMMAND: &str = "lotsman tradeoff --aql 0.2%:2%:25 --rql 3%:12%:25 --format pdf";

/// The page's blocks keep apart, and every contour label stays inside its
/// plot, apart from the other labels.
fn assert_laid_out(map: &TradeoffMap) {
    for (i, a) in map.regions.iter().enumerate() {
        for b in &map.regions[i + 1..] {
            assert!(!a.overlaps(b), "{} overlaps {}", a.name, b.name);
        }
    }
    for panel in &map.panels {
        let plot = &panel.plot;
        let boxes: Vec<_> = panel
            .contours
            .iter()
            .flat_map(|c| c.labels.iter().map(|l| &l.page))
            .collect();
        for (i, a) in boxes.iter().enumerate() {
            assert!(
                a.x >= plot.x && a.x + a.w <= plot.x + plot.w,
                "{} leaves the plot sideways",
                a.name
            );
            assert!(
                a.y >= plot.y && a.y + a.h <= plot.y + plot.h,
                "{} leaves the plot vertically",
                a.name
            );
            for b in &boxes[i + 1..] {
                assert!(!a.overlaps(b), "{} overlaps {}", a.name, b.name);
            }
        }
    }
}

#[test]
fn one_landscape_page_of_either_paper() {
    let g = negotiation_grid();
    let a4 = render_tradeoff_map(&g, "Seal rings", None, Paper::A4).unwrap();
    let sizes = page_sizes(&a4.pdf);
    assert_eq!(sizes.len(), 1);
    assert!(
        (sizes[0].0 - 841.89).abs() < 0.5 && (sizes[0].1 - 595.28).abs() < 0.5,
        "{sizes:?}"
    );
    let letter = render_tradeoff_map(&g, "Seal rings", None, Paper::Letter).unwrap();
    let sizes = page_sizes(&letter.pdf);
    assert_eq!(sizes.len(), 1);
    assert!(
        (sizes[0].0 - 792.0).abs() < 0.5 && (sizes[0].1 - 612.0).abs() < 0.5,
        "{sizes:?}"
    );
    assert_laid_out(&letter);
}

#[test]
fn the_text_holds_the_title_axes_request_contour_labels_key_and_cautions() {
    let map = render(&negotiation_grid());
    let text = pdf_text(&map.pdf);
    let labels: Vec<&str> = map.panels[0]
        .contours
        .iter()
        .filter(|c| !c.labels.is_empty())
        .map(|c| c.label.as_str())
        .collect();
    assert!(labels.len() >= 4, "{labels:?}");
    for needle in [
        "Seal rings from TPW",
        "Sample size n of the single plan",
        "Consumer's quality, RQL (% nonconforming)",
        "Producer's quality, AQL (% nonconforming)",
        "α = 0.05 at the AQL, β = 0.1 at the RQL",
        "0.2% to 2%, 25 values",
        "3% to 12%, 25 values",
        "binomial, fraction nonconforming",
        "Line of equal value",
        "negotiation aid, not a plan",
        "--output FILE.yaml",
        "Sampling does not guarantee the quality of a lot",
        "Critical and safety characteristics",
        COMMAND,
        &tool_version(),
        &map.inputs_sha256,
    ]
    .into_iter()
    .chain(labels.iter().copied())
    {
        assert!(text.contains(needle), "missing '{needle}' in:\n{text}");
    }
    // The levels are the 1-2-5 series inside the range of n.
    let (lo, hi) = map.panels[0].range.unwrap();
    let levels: Vec<f64> = map.panels[0].contours.iter().map(|c| c.level).collect();
    let series: Vec<f64> = [
        10.0, 20.0, 50.0, 100.0, 200.0, 500.0, 1000.0, 2000.0, 5000.0,
    ]
    .into_iter()
    .filter(|&l| l > lo && l < hi)
    .collect();
    assert_eq!(levels, series);
}

#[test]
fn nonconformities_per_unit_label_the_axes_of_a_poisson_map() {
    let g = grid(
        ModelKind::Poisson,
        None,
        range(0.005, 0.02, 6),
        range(0.04, 0.1, 7),
    );
    let map = render_tradeoff_map(&g, "Paint finish", None, Paper::A4).unwrap();
    let text = pdf_text(&map.pdf);
    assert!(
        text.contains("Consumer's quality, RQL (nonconformities per unit)"),
        "{text}"
    );
    // Issue 14, item 1: nonconformities per unit and per 100 units.
    assert!(
        text.contains("0.005 (0.5 per 100) to 0.02 (2 per 100), 6 values"),
        "{text}"
    );
    assert!(!text.contains('%'), "{text}");
}

#[test]
fn the_same_grid_gives_the_same_bytes_in_parallel_and_a_new_title_new_ones() {
    let g = negotiation_grid();
    let first = render(&g);
    let again: Vec<Vec<u8>> = std::thread::scope(|s| {
        let handles: Vec<_> = (0..3).map(|_| s.spawn(|| render(&g).pdf)).collect();
        handles.into_iter().map(|h| h.join().unwrap()).collect()
    });
    for pdf in &again {
        assert!(pdf == &first.pdf, "a second rendering differs");
    }
    let other =
        render_tradeoff_map(&g, "Seal rings, second round", Some(COMMAND), Paper::A4).unwrap();
    assert_ne!(other.inputs_sha256, first.inputs_sha256);
    let id = |pdf: &[u8]| {
        let doc = lopdf::Document::load_mem(pdf).unwrap();
        format!("{:?}", doc.trailer.get(b"ID").unwrap())
    };
    assert_eq!(id(&again[0]), id(&first.pdf));
    assert_ne!(id(&other.pdf), id(&first.pdf));
    assert!(id(&first.pdf).contains(&first.inputs_sha256[..32]));
}

#[test]
fn cells_without_a_plan_are_keyed_by_reason_and_no_contour_enters_them() {
    let g = gaps_grid();
    let map = render(&g);
    assert_laid_out(&map);
    let text = pdf_text(&map.pdf);
    assert!(
        text.contains("No plan: the AQL is not below the RQL"),
        "{text}"
    );
    assert!(
        text.contains("No plan meets both points (for example, the lot is too small)"),
        "{text}"
    );
    // Every point of every contour lies in a square of the lattice the
    // contours are traced on (the cell centres, bordered by the plot's
    // edges, which repeat the outer cells) whose four corners have a plan.
    let (aql, rql) = (g.request.aql(), g.request.rql());
    let bordered = |v: &[f64]| {
        let mut e = vec![v[0] - (v[1] - v[0]) / 2.0];
        e.extend_from_slice(v);
        e.push(v[v.len() - 1] + (v[v.len() - 1] - v[v.len() - 2]) / 2.0);
        e
    };
    let (ys, xs) = (bordered(aql), bordered(rql));
    // The squares whose span holds `v`, as lattice indices.
    let holding = |e: &[f64], v: f64| -> Vec<usize> {
        (0..e.len() - 1)
            .filter(|&k| v >= e[k] - 1e-12 && v <= e[k + 1] + 1e-12)
            .collect()
    };
    // The cell at a lattice index: the border repeats the outer cell.
    let cell = |k: usize, n: usize| k.saturating_sub(1).min(n - 1);
    let planned = |i: usize, j: usize| {
        g.cell(cell(i, aql.len()), cell(j, rql.len()))
            .outcome
            .is_ok()
    };
    let contours = &map.panels[0].contours;
    assert!(!contours.is_empty());
    for contour in contours {
        for &(x, y) in contour.paths.iter().flatten() {
            let inside = holding(&ys, y).iter().any(|&i| {
                holding(&xs, x).iter().any(|&j| {
                    planned(i, j) && planned(i + 1, j) && planned(i, j + 1) && planned(i + 1, j + 1)
                })
            });
            assert!(inside, "level {} at ({x}, {y})", contour.level);
        }
    }
    // A grid with a plan in every cell has no such key.
    let full = pdf_text(&render(&negotiation_grid()).pdf);
    assert!(!full.contains("No plan"), "{full}");
}

#[test]
fn the_cost_panel_is_drawn_only_for_a_grid_with_a_cost() {
    let aql = range(0.002, 0.02, 15);
    let rql = range(0.03, 0.12, 15);
    let plain = grid(
        ModelKind::Hypergeometric,
        Some(5000),
        aql.clone(),
        rql.clone(),
    );
    let costed = grid_with(
        ModelKind::Hypergeometric,
        Some(5000),
        aql,
        rql,
        Scheme::Single,
        Some((2.5, 0.008)),
    );
    let without = render(&plain);
    let with = render(&costed);
    assert_eq!(without.panels.len(), 1);
    assert_eq!(with.panels.len(), 2);
    assert_eq!(with.panels[1].quantity, MapQuantity::CostPerLot);
    assert_laid_out(&with);
    let (lo, hi) = with.panels[1].range.unwrap();
    let costs: Vec<f64> = costed
        .cells
        .iter()
        .map(|c| c.outcome.as_ref().unwrap().cost.unwrap().cost)
        .collect();
    assert_eq!(lo, costs.iter().copied().fold(f64::INFINITY, f64::min));
    assert_eq!(hi, costs.iter().copied().fold(0.0, f64::max));
    let cost_text = pdf_text(&with.pdf);
    for needle in [
        "Expected inspection cost per lot at p̄ = 0.8%",
        "2.5 per unit inspected × ATI at p̄ = 0.8%",
        "COST PER UNIT INSPECTED",
    ] {
        assert!(cost_text.contains(needle), "missing '{needle}'");
    }
    for c in with.panels[1]
        .contours
        .iter()
        .filter(|c| !c.labels.is_empty())
    {
        assert!(cost_text.contains(&c.label), "missing label {}", c.label);
    }
    assert!(with.panels[1].contours.iter().any(|c| !c.labels.is_empty()));
    let plain_text = pdf_text(&without.pdf);
    assert!(
        !plain_text.contains("Expected inspection cost"),
        "{plain_text}"
    );
    assert!(!plain_text.contains("p̄"), "{plain_text}");
}

#[test]
fn a_double_map_shows_the_asn_at_the_aql_and_says_so() {
    let g = grid_with(
        ModelKind::Binomial,
        None,
        vec![0.005, 0.01],
        vec![0.05, 0.08],
        Scheme::Double,
        None,
    );
    let map = render(&g);
    assert_eq!(map.panels[0].quantity, MapQuantity::AsnAtAql);
    let asn: Vec<f64> = g
        .cells
        .iter()
        .map(|c| c.outcome.as_ref().unwrap().asn_at_aql)
        .collect();
    let (lo, hi) = map.panels[0].range.unwrap();
    assert_eq!(lo, asn.iter().copied().fold(f64::INFINITY, f64::min));
    assert_eq!(hi, asn.iter().copied().fold(0.0, f64::max));
    let text = pdf_text(&map.pdf);
    for needle in [
        "Average sample number (ASN) at the AQL of the double plan",
        "Double plans: the colour is the ASN at the AQL",
        "double sampling, least ASN at the AQL",
    ] {
        assert!(text.contains(needle), "missing '{needle}' in:\n{text}");
    }
}

#[test]
fn a_two_by_two_and_a_three_hundred_square_grid_both_render() {
    let small = grid(
        ModelKind::Binomial,
        None,
        vec![0.005, 0.01],
        vec![0.04, 0.06],
    );
    let map = render(&small);
    assert_eq!(page_sizes(&map.pdf).len(), 1);
    assert_laid_out(&map);
    let big = grid(
        ModelKind::Binomial,
        None,
        range(0.002, 0.02, 300),
        range(0.03, 0.12, 300),
    );
    let map = render(&big);
    assert_eq!(page_sizes(&map.pdf).len(), 1);
    assert_laid_out(&map);
    // Drawn a block of cells at a time, the page stays small.
    assert!(map.pdf.len() < 400_000, "{} bytes", map.pdf.len());
    assert!(map.panels[0].contours.iter().any(|c| !c.labels.is_empty()));
}

#[test]
fn an_axis_of_one_value_or_a_title_that_cannot_fit_is_refused() {
    let row = grid(
        ModelKind::Binomial,
        None,
        vec![0.01],
        vec![0.04, 0.05, 0.06],
    );
    let err = render_tradeoff_map(&row, "One row", None, Paper::A4)
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("number of AQL values") && err.contains("at least 2"),
        "{err}"
    );
    let long = "A very long title that goes on and on ".repeat(12);
    let err = render_tradeoff_map(&negotiation_grid(), &long, None, Paper::A4)
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("cannot be laid out") && err.contains("title"),
        "{err}"
    );
}

/// `P(X <= c)` for `X ~ Binomial(n, p)`, summed from the pmf's recurrence
/// (independent of the library's incomplete beta).
fn binomial_cdf(c: u64, n: u64, p: f64) -> f64 {
    let mut pmf = (1.0 - p).powi(n as i32);
    let mut sum = pmf;
    for k in 0..c {
        pmf *= (n - k) as f64 / (k + 1) as f64 * p / (1.0 - p);
        sum += pmf;
    }
    sum
}

/// The smallest `n` of a single plan meeting both points, by trying every
/// `n` from 1 and, for each, the largest `c` that meets the consumer's
/// point.
fn brute_force_n(p1: f64, p2: f64, alpha: f64, beta: f64) -> u64 {
    (1..5000)
        .find(|&n| {
            let c = (0..=n)
                .take_while(|&c| binomial_cdf(c, n, p2) <= beta)
                .last();
            c.is_some_and(|c| binomial_cdf(c, n, p1) >= 1.0 - alpha)
        })
        .expect("a plan under 5000 units")
}

#[test]
fn each_contour_crosses_a_row_between_the_cells_a_brute_force_design_puts_it() {
    let (aql, rql) = (range(0.003, 0.012, 8), range(0.04, 0.12, 30));
    let g = grid(ModelKind::Binomial, None, aql.clone(), rql.clone());
    let map = render(&g);
    let contours = &map.panels[0].contours;
    assert!(contours.iter().filter(|c| !c.labels.is_empty()).count() >= 3);
    for (i, &p1) in aql.iter().enumerate() {
        let n: Vec<u64> = rql
            .iter()
            .map(|&p2| brute_force_n(p1, p2, 0.05, 0.10))
            .collect();
        for contour in contours.iter().filter(|c| !c.labels.is_empty()) {
            // n falls along the row: the level is crossed once, after the
            // last cell whose n reaches it.
            let Some(j) = (0..rql.len() - 1)
                .find(|&j| n[j] as f64 >= contour.level && (n[j + 1] as f64) < contour.level)
            else {
                assert!(
                    n.iter().all(|&v| v as f64 >= contour.level)
                        || n.iter().all(|&v| (v as f64) < contour.level),
                    "row {i}: {n:?}"
                );
                continue;
            };
            let crossings: Vec<f64> = contour
                .paths
                .iter()
                .flatten()
                .filter(|p| (p.1 - p1).abs() < 1e-12)
                .map(|p| p.0)
                .collect();
            assert!(
                !crossings.is_empty(),
                "level {} misses row {i}",
                contour.level
            );
            for x in crossings {
                assert!(
                    x >= rql[j] - 1e-12 && x <= rql[j + 1] + 1e-12,
                    "level {} crosses row {i} at {x}, not between {} (n = {}) and {} (n = {})",
                    contour.level,
                    rql[j],
                    n[j],
                    rql[j + 1],
                    n[j + 1]
                );
            }
        }
    }
    // Each label sits on its line: the cells around its centre hold values
    // on both sides of its level.
    for contour in contours {
        for label in &contour.labels {
            let (x, y) = label.at;
            let j = rql.partition_point(|&v| v < x).clamp(1, rql.len() - 1);
            let i = aql.partition_point(|&v| v < y).clamp(1, aql.len() - 1);
            let around: Vec<f64> = [(i - 1, j - 1), (i - 1, j), (i, j - 1), (i, j)]
                .iter()
                .map(|&(a, b)| g.cell(a, b).outcome.as_ref().unwrap().n() as f64)
                .collect();
            let lo = around.iter().copied().fold(f64::INFINITY, f64::min);
            let hi = around.iter().copied().fold(0.0, f64::max);
            assert!(
                lo < contour.level && contour.level <= hi,
                "label {} at ({x}, {y}) among {around:?}",
                contour.label
            );
        }
    }
}

//! Every demo sheet, on both papers, and a trade-off map, read by poppler:
//! it renders them without a complaint, and its text holds the same words
//! as the lopdf reader of the cargo suite (tests/common/pdf.rs) finds, so
//! that the cargo suite's text checks read what a PDF viewer shows.

use std::path::Path;

use lotsman::{
    Criterion, Model, ModelKind, Paper, PlanSource, RiskGrid, Scheme, TradeoffRequest,
    render_sheet, render_tradeoff_map, tradeoff,
};

use crate::common;
use crate::poppler;

/// The demo sheets on A4 and Letter and a 6 x 6 trade-off map: a name for
/// each, and its PDF.
fn pages() -> Vec<(String, Vec<u8>)> {
    let mut pages = Vec::new();
    for (name, text) in lotsman::DEMO_PLANS {
        let source = PlanSource::from_yaml(text, Path::new(name)).unwrap();
        for paper in [Paper::A4, Paper::Letter] {
            let sheet = render_sheet(text, &source, name, paper).unwrap();
            pages.push((format!("{name} {paper:?}"), sheet.pdf));
        }
    }
    let step = |lo: f64, hi: f64| (0..6).map(|i| lo + (hi - lo) * i as f64 / 5.0).collect();
    let model = Model::new(ModelKind::Binomial, None).unwrap();
    let points = RiskGrid {
        aql: step(0.002, 0.02),
        rql: step(0.03, 0.12),
        alpha: 0.05,
        beta: 0.10,
    };
    let request =
        TradeoffRequest::new(points, model, Scheme::Single, Criterion::AsnAql, None).unwrap();
    let map = render_tradeoff_map(&tradeoff(&request, &|| {}), "Seal rings", None, Paper::A4);
    pages.push(("trade-off map".into(), map.unwrap().pdf));
    pages
}

/// The words of `text`, sorted.
fn words(text: &str) -> Vec<String> {
    let mut words: Vec<String> = text.split_whitespace().map(str::to_string).collect();
    words.sort();
    words
}

/// The words of `a` (sorted) that `b` (sorted) lacks, counted with their
/// repeats.
fn lacking(a: &[String], b: &[String]) -> Vec<String> {
    let mut rest = b.to_vec();
    a.iter()
        .filter(|w| match rest.binary_search(w) {
            Ok(i) => {
                rest.remove(i);
                false
            }
            Err(_) => true,
        })
        .cloned()
        .collect()
}

#[test]
#[ignore = "system suite: needs poppler-utils; run by .ci/run"]
fn poppler_renders_every_demo_sheet_and_the_map_without_a_complaint() {
    for (name, pdf) in pages() {
        let (pngs, said) = poppler::render(&pdf);
        // One page, or two for a standard-indexed sheet whose classes do
        // not fit one (the inspector's page and the engineer's).
        let most = if name.contains("seal-face-classes") {
            2
        } else {
            1
        };
        assert!(
            (1..=most).contains(&pngs.len()),
            "{name}: {} pages",
            pngs.len()
        );
        assert!(said.trim().is_empty(), "{name}: poppler said {said}");
        // A blank 40 dpi page compresses to well under a kilobyte.
        for png in &pngs {
            assert!(png.len() > 4000, "{name}: {} bytes", png.len());
        }
    }
}

/// Takes out of `unread` the words of `sequence` (in drawing order) that
/// poppler read as the one word `joined`, if they are there: poppler counts
/// a narrow space (the sheet font's space is a third of an em) as no break
/// between words, so it reads `s = 1.9` drawn as one string as `s=` and
/// `1.9`. Whether it did.
fn joined_by_poppler(joined: &str, sequence: &[&str], unread: &mut Vec<String>) -> bool {
    for i in 0..sequence.len() {
        let mut acc = String::new();
        for (j, word) in sequence.iter().enumerate().skip(i) {
            acc.push_str(word);
            if !joined.starts_with(&acc) {
                break;
            }
            if acc == joined && j > i {
                let mut rest = unread.clone();
                let all_unread = sequence[i..=j].iter().all(|w| {
                    rest.iter()
                        .position(|u| u == w)
                        .map(|at| rest.remove(at))
                        .is_some()
                });
                if all_unread {
                    *unread = rest;
                    return true;
                }
            }
        }
    }
    false
}

#[test]
#[ignore = "system suite: needs poppler-utils; run by .ci/run"]
fn the_lopdf_reader_finds_the_words_poppler_finds() {
    for (name, pdf) in pages() {
        let text = common::pdf_text(&pdf);
        let ours = words(&text);
        let theirs = words(&poppler::pdf_text(&pdf));
        assert!(!ours.is_empty(), "{name}: no text");
        let mut only_ours = lacking(&ours, &theirs);
        let mut only_theirs = lacking(&theirs, &ours);
        let sequence: Vec<&str> = text.split_whitespace().collect();
        only_theirs.retain(|joined| !joined_by_poppler(joined, &sequence, &mut only_ours));
        assert!(
            only_ours.is_empty() && only_theirs.is_empty(),
            "{name}: only lopdf reads {only_ours:?}; only poppler reads {only_theirs:?}"
        );
    }
}

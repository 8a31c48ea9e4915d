//! Speed of the plan sheet (issue figures: one sheet <= 50 ms; 1,000
//! sheets from 1,000 sources <= 20 s, in parallel over the cores), of one
//! sequential sheet, whose curves walk 165 item stages per point, and of
//! one variables sheet (sigma estimated, one limit), whose OC takes a
//! noncentral t tail per point.

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;
use std::path::Path;

use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{
    LimitKind, Model, ModelKind, Paper, PlanSource, SigmaKind, Specification, VariablesRequest,
    render_sheet, solve_variables,
};
use rayon::prelude::*;

mod common;

/// The variables source of the bench: sigma estimated, upper limit 12.05
/// mm, points 1% and 6% (n = 42, k = 1.901), as its YAML text.
fn variables_source() -> (String, PlanSource) {
    let model = Model::new(ModelKind::Binomial, None).unwrap();
    let spec = Specification::new(
        SigmaKind::Unknown,
        None,
        LimitKind::Upper,
        None,
        Some(12.05),
    )
    .unwrap();
    let request = VariablesRequest::new(spec, common::pair(&model, 0.01, 0.06), model).unwrap();
    let mut source =
        PlanSource::new_variables("Bearing seat diameter", &request, Some("mm".into()));
    source.record_variables(&solve_variables(&request).unwrap());
    let text = source.to_yaml();
    let source = PlanSource::from_yaml(&text, Path::new("v.yaml")).unwrap();
    (text, source)
}

fn benches(c: &mut Criterion) {
    let text = std::fs::read_to_string("plans/tpw-seal-visual.yaml").unwrap();
    let source = PlanSource::from_yaml(&text, Path::new("s.yaml")).unwrap();
    c.bench_function("one sheet (A4)", |b| {
        b.iter(|| black_box(render_sheet(&text, &source, "s.yaml", Paper::A4).unwrap()))
    });
    let seq_text = std::fs::read_to_string("plans/tpw-sleeve-hardness.yaml").unwrap();
    let seq = PlanSource::from_yaml(&seq_text, Path::new("s.yaml")).unwrap();
    c.bench_function("one sequential sheet (A4)", |b| {
        b.iter(|| black_box(render_sheet(&seq_text, &seq, "s.yaml", Paper::A4).unwrap()))
    });
    let (var_text, var) = variables_source();
    c.bench_function("one variables sheet (A4)", |b| {
        b.iter(|| black_box(render_sheet(&var_text, &var, "v.yaml", Paper::A4).unwrap()))
    });
    // 1,000 distinct sources: the title differs, so each is hashed and laid
    // out anew.
    let sources: Vec<(String, PlanSource)> = (0..1000)
        .map(|i| {
            let t = text.replace("visual", &format!("visual, lot {i}"));
            let s = PlanSource::from_yaml(&t, Path::new("s.yaml")).unwrap();
            (t, s)
        })
        .collect();
    let mut group = c.benchmark_group("batch");
    group.sample_size(10);
    group.bench_function("1000 sheets in parallel", |b| {
        b.iter(|| {
            let total: usize = sources
                .par_iter()
                .map(|(t, s)| render_sheet(t, s, "s.yaml", Paper::A4).unwrap().pdf.len())
                .sum();
            black_box(total)
        })
    });
    group.finish();
}

criterion_group!(sheet, benches);
criterion_main!(sheet);

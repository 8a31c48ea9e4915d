//! Speed of the plan sheet (issue figures: one sheet <= 50 ms; 1,000
//! sheets from 1,000 sources <= 20 s, in parallel over the cores), and of
//! one sequential sheet, whose curves walk 165 item stages per point.

use std::hint::black_box;
use std::path::Path;

use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{Paper, PlanSource, render_sheet};
use rayon::prelude::*;

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

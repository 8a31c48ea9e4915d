//! Several defect classes on one sample (issue 16): each class's plan on
//! the row of the lot's code letter, the two rules for classes whose
//! arrows lead to different sample sizes, and the lot decided per class
//! and overall.

use super::standard::{letter, numbers, tables};
use lotsman::{
    ClassPlans, ClassRule, Decision, InspectionLevel, ModelKind, Scheme, Severity, judge_classes,
    parse_classes,
};

/// Several classes on one sample (issue 16's example classes, lot 1,500,
/// level II, code letter K): critical 0.065 leads down to L (n = 200,
/// Ac 0), major 1.0 is K's 3 4, minor 4.0 is K's 10 11. By default each
/// class keeps its plan; with the largest sample's letter for all, major
/// and minor are read at L: 5 6 and 14 15 (Table II-A, the excerpt's row
/// L).
#[test]
fn several_classes_on_one_sample() {
    let t = tables();
    let classes = parse_classes(&["critical=0.065", "major=1.0", "minor=4.0"]).unwrap();
    let own = t
        .classes_for_lot(
            1500,
            InspectionLevel::II,
            &classes,
            Severity::Normal,
            Scheme::Single,
            ClassRule::OwnPlans,
        )
        .unwrap();
    let singles = |p: &ClassPlans| -> Vec<Option<(u64, u64)>> {
        p.classes
            .iter()
            .map(|c| c.answer.plan().unwrap().stages.as_single())
            .collect()
    };
    assert_eq!(
        singles(&own),
        [Some((200, 0)), Some((125, 3)), Some((125, 10))]
    );
    assert_eq!(own.sample_size(), 200);
    let largest = t
        .classes_for_lot(
            1500,
            InspectionLevel::II,
            &classes,
            Severity::Normal,
            Scheme::Single,
            ClassRule::LargestSample,
        )
        .unwrap();
    assert_eq!(
        singles(&largest),
        [Some((200, 0)), Some((200, 5)), Some((200, 14))]
    );
    assert_eq!(
        largest.classes[1].answer.plan().unwrap().code_letter,
        letter("K")
    );

    // The lot: accepted only when every class accepts.
    let verdict = |found: &[&[u64]]| {
        let found: Vec<Vec<u64>> = found.iter().map(|f| f.to_vec()).collect();
        judge_classes(&own, ModelKind::Binomial, &found)
            .unwrap()
            .decision
    };
    assert_eq!(verdict(&[&[0], &[3], &[10]]), Decision::Accept);
    assert_eq!(verdict(&[&[1], &[0], &[0]]), Decision::Reject);
    assert_eq!(verdict(&[&[0], &[3], &[11]]), Decision::Reject);
    assert!(judge_classes(&own, ModelKind::Binomial, &[vec![0]]).is_err());
}

/// Double sampling with classes: go on while any class is undecided and
/// none has rejected (K at 1.0 double: 80, Ac 1 Re 4; K at 4.0 double:
/// 80, Ac 5 Re 9, then 160, Ac 12 Re 13, from memory).
#[test]
fn double_sampling_classes_go_on_while_one_is_undecided() {
    let t = tables();
    let classes = parse_classes(&["major=1.0", "minor=4.0"]).unwrap();
    let plans = t
        .classes_for_lot(
            1500,
            InspectionLevel::II,
            &classes,
            Severity::Normal,
            Scheme::Double,
            ClassRule::OwnPlans,
        )
        .unwrap();
    let minor = plans.classes[1].answer.plan().unwrap();
    assert_eq!(numbers(minor), [(80, Some(5), 9), (160, Some(12), 13)]);
    let judge = |found: Vec<Vec<u64>>| judge_classes(&plans, ModelKind::Binomial, &found).unwrap();
    let v = judge(vec![vec![0], vec![6]]);
    assert_eq!(v.decision, Decision::Continue);
    assert_eq!(v.classes[0].judgement.decision, Decision::Accept);
    assert_eq!(judge(vec![vec![0], vec![6, 6]]).decision, Decision::Accept);
    assert_eq!(judge(vec![vec![4], vec![6]]).decision, Decision::Reject);
    // Reduced inspection: a count in the gap accepts and reinstates normal.
    let reduced = t
        .classes_for_lot(
            1500,
            InspectionLevel::II,
            &classes,
            Severity::Reduced,
            Scheme::Single,
            ClassRule::OwnPlans,
        )
        .unwrap();
    let v = judge_classes(&reduced, ModelKind::Binomial, &[vec![2], vec![0]]).unwrap();
    assert_eq!(v.decision, Decision::Accept);
    assert!(v.classes[0].reinstates_normal);
    assert!(!v.classes[1].reinstates_normal);
}

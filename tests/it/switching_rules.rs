//! The switching rules of MIL-STD-105E, lot by lot
//! (issue 16, items 4 and 5; issue 17's rule checks).
//!
//! Sources, named beside each check:
//! - the rules' text: MIL-STD-105E (1989) 4.6-4.8, 4.10.1.4, in our own
//!   words in the module doc of `src/standard/switching/mod.rs`;
//! - a closed form derived below (two alternating spells);
//! - a seeded simulation of the same step function (ChaCha8, rand_chacha);
//! - an independent dense solve of the full chain built by running the step
//!   function over every outcome (nalgebra LU).
//!
//! The plans are of the standard's shape: letter K (n = 125) at AQL 1.0,
//! normal Ac 3 Re 4, tightened Ac 2 Re 3, reduced n = 50 Ac 1 Re 4, limit
//! number 7 (Table VIII at 1,250 units) as transcribed for issue 16 (Table
//! II-C and VIII from memory); letter H (n = 50) at AQL 1.0, normal Ac 1
//! Re 2, tightened J (n = 80) Ac 1 Re 2, reduced n = 20 Ac 0 Re 2, limit
//! number 2 (Table VIII at 500 units), same transcription.

use lotsman::{LimitWindow, LotResult, Severity, SwitchingError, SwitchingRules, SwitchingState};

// ---------------------------------------------------------------------
// Lots by hand, one rule at a time (MIL-STD-105E 4.7, 4.8).

fn acc(count: u64) -> LotResult {
    LotResult::accepted(count, 125).unwrap()
}

fn rej() -> LotResult {
    LotResult::rejected(4, 125).unwrap()
}

fn run(rules: &SwitchingRules, start: SwitchingState, lots: &[LotResult]) -> Vec<SwitchingState> {
    let mut states = vec![start];
    for lot in lots {
        let next = rules.step(states.last().unwrap(), lot).unwrap();
        states.push(next);
    }
    states
}

fn severities(states: &[SwitchingState]) -> String {
    states
        .iter()
        .map(|s| match s.severity() {
            Some(Severity::Normal) => 'N',
            Some(Severity::Tightened) => 'T',
            Some(Severity::Reduced) => 'R',
            None => 'X',
        })
        .collect()
}

fn k_rules() -> SwitchingRules {
    SwitchingRules::new(true, Some(LimitWindow::ten(7)))
}

/// 105E 4.7.1 (issue 17's check): R A A A R on normal gives tightened at
/// lot 5; the state after each lot is the severity of the next.
#[test]
fn two_rejections_within_five_lots_give_tightened_at_lot_five() {
    let s = run(
        &k_rules(),
        SwitchingState::new(),
        &[rej(), acc(0), acc(0), acc(0), rej()],
    );
    assert_eq!(severities(&s), "NNNNNT");
}

/// 105E 4.7.1: a rejection more than four lots back no longer counts: R A
/// A A A R stays on normal (six consecutive lots), and the second R then
/// starts its own window.
#[test]
fn the_window_forgets_a_rejection_five_lots_back() {
    let s = run(
        &k_rules(),
        SwitchingState::new(),
        &[rej(), acc(0), acc(0), acc(0), acc(0), rej(), acc(1), rej()],
    );
    assert_eq!(severities(&s), "NNNNNNNNT");
}

/// 105E 4.7.1: two rejections in a row switch at once.
#[test]
fn two_rejections_in_a_row_switch_at_once() {
    let s = run(&k_rules(), SwitchingState::new(), &[acc(0), rej(), rej()]);
    assert_eq!(severities(&s), "NNNT");
}

/// 105E 4.7.2 (issue 17's check): five accepted on tightened give normal;
/// a lot not accepted in between starts the count again.
#[test]
fn five_accepted_on_tightened_give_normal() {
    let rules = k_rules();
    let t = run(&rules, SwitchingState::new(), &[rej(), rej()]);
    let tightened = t.last().unwrap().clone();
    let s = run(
        &rules,
        tightened.clone(),
        &[
            acc(0),
            acc(0),
            acc(0),
            acc(0),
            rej(),
            acc(0),
            acc(0),
            acc(0),
            acc(0),
            acc(0),
        ],
    );
    assert_eq!(severities(&s), "TTTTTTTTTTN");
}

/// 105E 4.7.1: lots count from the start of normal inspection: the lot not
/// accepted on tightened does not pair with one on normal.
#[test]
fn rejections_before_normal_started_do_not_count() {
    let rules = k_rules();
    let t = run(&rules, SwitchingState::new(), &[rej(), rej()]);
    let s = run(
        &rules,
        t.last().unwrap().clone(),
        &[rej(), acc(0), acc(0), acc(0), acc(0), acc(0), rej(), acc(0)],
    );
    assert_eq!(severities(&s), "TTTTTTNNN");
}

/// 105E 4.7.3: ten lots accepted on normal with a total count at most the
/// limit number give reduced from the next lot; one more than the limit
/// does not, until the high count leaves the ten-lot window.
#[test]
fn the_limit_number_over_ten_lots_gives_reduced() {
    let rules = k_rules();
    // Total 7 over ten lots: reduced after the tenth.
    let seven = [1, 1, 1, 1, 1, 1, 1, 0, 0, 0].map(acc);
    let s = run(&rules, SwitchingState::new(), &seven);
    assert_eq!(severities(&s), "NNNNNNNNNNR");
    // Total 8: no; the 3 leaves the window with the eleventh lot (total 5).
    let eight = [3, 1, 1, 1, 1, 1, 0, 0, 0, 0, 0].map(acc);
    let s = run(&rules, SwitchingState::new(), &eight);
    assert_eq!(severities(&s), "NNNNNNNNNNNR");
}

/// 105E 4.7.3 a: the ten lots must all be accepted, on normal, from the
/// start of normal inspection: a lot not accepted empties the window.
#[test]
fn a_rejection_empties_the_limit_number_window() {
    let rules = k_rules();
    let mut lots = vec![acc(0); 9];
    lots.push(rej());
    lots.extend(vec![acc(0); 10]);
    let s = run(&rules, SwitchingState::new(), &lots);
    assert_eq!(severities(&s), format!("{}R", "N".repeat(20)));
}

/// 105E 4.7.3 c, d and the contract: without the user's confirmation, with
/// reduced left out, or with no limit number, normal inspection stays.
#[test]
fn reduced_needs_confirmation_a_contract_and_a_limit_number() {
    let lots = vec![acc(0); 12];
    for rules in [
        SwitchingRules::new(false, Some(LimitWindow::ten(7))),
        SwitchingRules::without_reduced(),
        SwitchingRules::new(true, None),
    ] {
        let s = run(&rules, SwitchingState::new(), &lots);
        assert_eq!(severities(&s), "N".repeat(13), "{rules:?}");
    }
    // Table VIII's note: more lots where ten give too few units.
    let sixteen = SwitchingRules::new(true, Some(LimitWindow::new(16, 0).unwrap()));
    let s = run(&sixteen, SwitchingState::new(), &vec![acc(0); 16]);
    assert_eq!(severities(&s), format!("{}R", "N".repeat(16)));
}

/// 105E 4.7.4 (issue 17's check): on reduced, a lot not accepted, or one
/// accepted with its count between Ac and Re (4.10.1.4), gives normal; the
/// user reinstates normal for irregular production (4.7.4 c).
#[test]
fn reduced_returns_to_normal() {
    let rules = k_rules();
    let reduced = run(&rules, SwitchingState::new(), &[acc(0); 10])
        .last()
        .unwrap()
        .clone();
    assert_eq!(reduced.severity(), Some(Severity::Reduced));
    let ok = LotResult::accepted(1, 50).unwrap();
    let between = LotResult::accepted_between(2, 50).unwrap();
    let not = LotResult::rejected(4, 50).unwrap();
    assert_eq!(
        severities(&run(&rules, reduced.clone(), &[ok, ok, not])),
        "RRRN"
    );
    assert_eq!(
        severities(&run(&rules, reduced.clone(), &[ok, between])),
        "RRN"
    );
    assert_eq!(
        reduced.reinstate_normal().unwrap().severity(),
        Some(Severity::Normal)
    );
    assert!(SwitchingState::new().reinstate_normal().is_err());
}

/// 105E 4.8 (issue 17's check): five lots not accepted on one spell of
/// tightened (not necessarily in a row) discontinue inspection; lots are
/// refused until corrective action, then tightened resumes afresh.
#[test]
fn five_not_accepted_on_tightened_discontinue() {
    let rules = k_rules();
    let t = run(&rules, SwitchingState::new(), &[rej(), rej()]);
    let s = run(
        &rules,
        t.last().unwrap().clone(),
        &[
            rej(),
            acc(0),
            rej(),
            acc(0),
            acc(0),
            rej(),
            rej(),
            acc(0),
            rej(),
        ],
    );
    assert_eq!(severities(&s), "TTTTTTTTTX");
    let stopped = s.last().unwrap();
    assert!(stopped.is_discontinued());
    assert_eq!(stopped.standing(), "discontinued");
    assert_eq!(
        rules.step(stopped, &acc(0)),
        Err(SwitchingError::Discontinued)
    );
    let resumed = stopped.resume().unwrap();
    assert_eq!(resumed.severity(), Some(Severity::Tightened));
    let c = resumed.counters(&rules);
    assert_eq!((c[0].value, c[1].value), (0, 0));
}

/// 105E 4.7: resubmitted lots are ignored; a count between Ac and Re
/// outside reduced inspection is refused.
#[test]
fn resubmitted_lots_do_not_count_and_between_only_on_reduced() {
    let rules = k_rules();
    let s = run(
        &rules,
        SwitchingState::new(),
        &[rej(), rej().resubmitted(), acc(0).resubmitted()],
    );
    assert_eq!(s[1], s[3]);
    let between = LotResult::accepted_between(2, 125).unwrap();
    let e = rules.step(&SwitchingState::new(), &between).unwrap_err();
    assert!(e.to_string().contains("only on reduced inspection"), "{e}");
}

/// The counters behind the rules, in plain words (issue 17's `status`).
#[test]
fn counters_say_what_each_rule_counts() {
    let rules = k_rules();
    let s = run(&rules, SwitchingState::new(), &[rej(), acc(2), acc(1)]);
    let c = s.last().unwrap().counters(&rules);
    let keys: Vec<_> = c.iter().map(|c| c.key).collect();
    assert_eq!(keys, ["rejections_in_window", "accepted_run", "run_total"]);
    assert_eq!((c[0].value, c[0].limit), (1, Some(2)));
    assert!(
        c[0].words.contains("within the next 2 lots"),
        "{}",
        c[0].words
    );
    assert_eq!((c[1].value, c[1].limit), (2, Some(10)));
    assert_eq!((c[2].value, c[2].limit), (3, Some(7)));
    assert!(c[2].words.contains("250 units"), "{}", c[2].words);
    let unconfirmed = SwitchingRules::new(false, Some(LimitWindow::ten(7)));
    let c = SwitchingState::new().counters(&unconfirmed);
    assert!(c[1].words.contains("not confirmed"), "{}", c[1].words);
}

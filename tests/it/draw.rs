//! The random draw of units to inspect (`lotsman draw`, issue 17): the
//! positions are reproducible from the recorded seed, distinct, within the
//! lot and sorted; they are uniform (a seeded chi-square test); a carton
//! draw shares the sample by largest remainders and keeps each unit in its
//! carton; impossible requests are refused in words. A draw in stages
//! (`--n` once per stage) keeps stage 1 as the single draw and draws each
//! later stage uniformly from the units left; an item-by-item draw
//! (`--items`) lists distinct units in a reproducible order.
//!
//! The golden positions below were computed once by this implementation
//! (ChaCha20, Lemire's bounded integers, Floyd's sample) and pinned: a
//! change to any step changes them, and an auditor's replay of an old draw
//! would then fail. They are not from an outside source; the generator
//! itself is checked against RFC 8439's test vector (src/draw/generator.rs)
//! and the seed against coreutils' sha256sum (src/draw/seed.rs).

use lotsman::{DrawRequest, SeedSource, carton_shares, draw};
use serde_json::json;

use crate::common::{json_of, lotsman};

fn request(n: u64, k: u64, cartons: Option<u64>, seed: u64) -> DrawRequest {
    DrawRequest::new("L-1", n, k, cartons, seed, SeedSource::Given).unwrap()
}

#[test]
fn a_fixed_seed_gives_the_pinned_positions() {
    assert_eq!(draw(&request(1000, 10, None, 42)).positions, GOLDEN_PLAIN);
    assert_eq!(
        draw(&request(1000, 10, Some(4), 42)).positions,
        GOLDEN_CARTONS
    );
}

const GOLDEN_PLAIN: [u64; 10] = [150, 159, 360, 374, 414, 697, 702, 755, 843, 976];
// 4 cartons of 250: shares 3, 3, 2, 2 (2.5 each; the two units left go
// to cartons 1 and 2 on the tie).
const GOLDEN_CARTONS: [u64; 10] = [104, 176, 250, 288, 344, 461, 540, 690, 840, 994];

/// The seed printed by one draw draws the same units again, through the
/// command line: an auditor's replay from the ledger.
#[test]
fn the_recorded_seed_reproduces_the_draw() {
    let first = json_of(&[
        "draw",
        "--lot",
        "L-2031",
        "--lot-size",
        "1200",
        "--n",
        "8",
        "--format",
        "json",
    ]);
    assert_eq!(first["seed_from"], "lot");
    // Pinned, as above.
    assert_eq!(
        first["positions"],
        json!([122, 419, 471, 601, 646, 718, 979, 1126])
    );
    let seed = first["seed"].as_u64().unwrap().to_string();
    let again = json_of(&[
        "draw",
        "--lot",
        "another",
        "--lot-size",
        "1200",
        "--n",
        "8",
        "--seed",
        &seed,
        "--format",
        "json",
    ]);
    assert_eq!(again["positions"], first["positions"]);
    assert_eq!(again["seed_from"], "given");
}

#[test]
fn positions_are_distinct_within_the_lot_and_sorted() {
    for seed in 0..200u64 {
        let n = 1 + seed * 37 % 500;
        let k = 1 + seed * 11 % n;
        let cartons = (seed % 3 == 0).then_some(1 + seed % n);
        let d = draw(&request(n, k, cartons, seed));
        assert_eq!(d.positions.len() as u64, k, "seed {seed}");
        assert!(d.positions.windows(2).all(|w| w[0] < w[1]), "seed {seed}");
        assert!(
            d.positions.iter().all(|&p| (1..=n).contains(&p)),
            "seed {seed}"
        );
    }
}

/// Each of 20 positions should be drawn in 5 of 20 units, so 20 000 draws
/// of 5 expect 5 000 per position. Pearson's statistic over the 20 counts
/// has 19 degrees of freedom (the counts' total is fixed); it must stay
/// below chi2.ppf(0.999, 19) = 43.82 (scipy.stats). With these fixed seeds
/// the test is deterministic; a biased sampler (say, one that favoured the
/// ends) would pass the bound by far.
#[test]
fn positions_are_uniform_by_a_seeded_chi_square() {
    let (n, k, draws) = (20u64, 5u64, 20_000u64);
    let mut counts = [0u64; 20];
    for seed in 0..draws {
        for p in draw(&request(n, k, None, seed)).positions {
            counts[(p - 1) as usize] += 1;
        }
    }
    let expected = (draws * k) as f64 / n as f64;
    let chi2: f64 = counts
        .iter()
        .map(|&c| (c as f64 - expected).powi(2) / expected)
        .sum();
    assert!(chi2 < 43.82, "chi-square {chi2} over {counts:?}");
}

/// Within a carton too: a lot of 30 in 3 cartons of 10, 6 drawn (2 per
/// carton); each of the 10 places of carton 2 expects 2 000 of 10 000
/// draws; 9 degrees of freedom, bound chi2.ppf(0.999, 9) = 27.88
/// (scipy.stats).
#[test]
fn places_in_a_carton_are_uniform() {
    let draws = 10_000u64;
    let mut counts = [0u64; 10];
    for seed in 0..draws {
        for u in draw(&request(30, 6, Some(3), seed)).units() {
            if u.carton == Some(2) {
                counts[(u.in_carton.unwrap() - 1) as usize] += 1;
            }
        }
    }
    let expected = (draws * 2) as f64 / 10.0;
    let chi2: f64 = counts
        .iter()
        .map(|&c| (c as f64 - expected).powi(2) / expected)
        .sum();
    assert!(chi2 < 27.88, "chi-square {chi2} over {counts:?}");
}

#[test]
fn a_carton_draw_keeps_each_carton_s_share_and_bounds() {
    for (n, k, c) in [
        (1200u64, 80u64, 7u64),
        (10, 10, 3),
        (999, 1, 10),
        (50, 13, 50),
    ] {
        let d = draw(&request(n, k, Some(c), 9));
        let shares = carton_shares(n, c, k);
        assert_eq!(d.shares, shares);
        assert_eq!(shares.iter().map(|s| s.sample).sum::<u64>(), k);
        for s in &shares {
            let inside: Vec<_> = d.units().filter(|u| u.carton == Some(s.carton)).collect();
            assert_eq!(inside.len() as u64, s.sample, "carton {}", s.carton);
            for u in inside {
                assert!((s.first..=s.last()).contains(&u.position));
                assert_eq!(u.in_carton, Some(u.position - s.first + 1));
            }
        }
    }
}

/// The refusals, each in one line of plain words (exit code 2).
#[test]
fn impossible_draws_are_refused_in_words() {
    for (args, words) in [
        (
            vec!["--lot-size", "10", "--n", "11"],
            "inspect every unit of the lot",
        ),
        (
            vec!["--lot-size", "10", "--n", "0"],
            "sample size (--n) = 0 is out of range",
        ),
        (
            vec!["--lot-size", "10", "--n", "3", "--cartons", "11"],
            "give at most 10 cartons",
        ),
        (
            vec!["--lot-size", "10", "--n", "3", "--cartons", "0"],
            "cartons (--cartons) = 0",
        ),
        (
            vec!["--lot-size", "1000000000000", "--n", "100000000"],
            "beyond the work budget",
        ),
        (
            vec![
                "--lot-size",
                "10",
                "--n",
                "3",
                "--seed",
                "1",
                "--plan",
                "plans/tpw-cover-fit.yaml",
            ],
            "give one of them",
        ),
    ] {
        let out = lotsman()
            .args(["draw", "--lot", "L-7"])
            .args(&args)
            .output()
            .unwrap();
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        let err = String::from_utf8(out.stderr).unwrap();
        assert!(err.contains(words), "{args:?}: {err}");
        assert_eq!(err.lines().count(), 1, "{err}");
    }
}

/// With a plan source the seed is SHA-256(plan hash, 0x00, lot ID), and
/// the JSON records the plan's hash.
#[test]
fn the_plan_source_joins_the_seed() {
    let v = json_of(&[
        "draw",
        "--lot",
        "L-1",
        "--lot-size",
        "100",
        "--n",
        "3",
        "--plan",
        "plans/tpw-cover-fit.yaml",
        "--format",
        "json",
    ]);
    assert_eq!(v["seed_from"], "plan_and_lot");
    let hash = v["plan_sha256"].as_str().unwrap();
    assert_eq!(
        v["seed"].as_u64().unwrap(),
        lotsman::draw_seed(Some(hash), "L-1")
    );
    assert_ne!(v["seed"].as_u64().unwrap(), lotsman::draw_seed(None, "L-1"));
}

fn staged(n: u64, sizes: &[u64], seed: u64) -> DrawRequest {
    DrawRequest::staged("L-1", n, sizes, None, seed, SeedSource::Given).unwrap()
}

fn items(n: u64, k: u64, seed: u64) -> DrawRequest {
    DrawRequest::items("L-1", n, k, seed, SeedSource::Given).unwrap()
}

/// Stage 1 of a draw in stages is the single draw of its size, pinned
/// above; stage 2 and the items are pinned too (computed once by this
/// implementation), so that a replay of a recorded staged draw cannot
/// change.
#[test]
fn a_fixed_seed_gives_the_pinned_stages_and_items() {
    let d = draw(&staged(1000, &[10, 10], 42));
    assert_eq!(d.stages[0], GOLDEN_PLAIN);
    assert_eq!(
        d.stages[1],
        [112, 123, 382, 454, 513, 555, 603, 660, 870, 964]
    );
    assert_eq!(
        draw(&items(1000, 10, 42)).stages.concat(),
        [418, 708, 701, 150, 848, 375, 160, 757, 978, 359]
    );
}

/// Stage 1 equals the single draw of its size; the stages are disjoint,
/// within the lot, and together the sorted positions of the total.
#[test]
fn stages_extend_the_single_draw_with_other_units() {
    for seed in 0..200u64 {
        let n = 2 + seed * 37 % 500;
        let n1 = 1 + seed * 11 % (n / 2);
        let n2 = 1 + seed * 7 % (n - n1);
        let rest = n - n1 - n2;
        let mut sizes = vec![n1, n2];
        if rest > 0 {
            sizes.push(1 + seed % rest);
        }
        let d = draw(&staged(n, &sizes, seed));
        assert_eq!(d.stages[0], draw(&request(n, n1, None, seed)).positions);
        let total: u64 = sizes.iter().sum();
        let mut all: Vec<u64> = d.stages.concat();
        for (stage, size) in d.stages.iter().zip(&sizes) {
            assert_eq!(stage.len() as u64, *size, "seed {seed}");
            assert!(stage.windows(2).all(|w| w[0] < w[1]), "seed {seed}");
            assert!(stage.iter().all(|p| (1..=n).contains(p)), "seed {seed}");
        }
        assert!(
            d.stages[1].iter().all(|p| !d.stages[0].contains(p)),
            "seed {seed}"
        );
        all.sort_unstable();
        all.dedup();
        assert_eq!(all.len() as u64, total, "seed {seed}: a unit drawn twice");
        assert_eq!(all, d.positions);
        // The first stages of a longer draw are the draw of those alone.
        assert_eq!(draw(&staged(n, &sizes[..2], seed)).stages, d.stages[..2]);
    }
}

/// An item-by-item draw: the same list from the same seed, every item a
/// different unit of the lot, the first item the single draw of one unit,
/// a longer list beginning with the shorter one, and the whole the same
/// as stages of one unit each.
#[test]
fn items_are_distinct_and_reproducible_in_order() {
    for seed in 0..50u64 {
        let n = 1 + seed * 53 % 400;
        let k = 1 + seed * 13 % n;
        let order = draw(&items(n, k, seed)).stages.concat();
        assert_eq!(order, draw(&items(n, k, seed)).stages.concat());
        assert_eq!(order.len() as u64, k);
        let mut sorted = order.clone();
        sorted.sort_unstable();
        sorted.dedup();
        assert_eq!(sorted.len() as u64, k, "seed {seed}: an item repeated");
        assert!(order.iter().all(|p| (1..=n).contains(p)));
        assert_eq!(order[0], draw(&request(n, 1, None, seed)).positions[0]);
        let longer = draw(&items(n, n, seed)).stages.concat();
        assert_eq!(longer[..order.len()], order);
        let ones = vec![1; k as usize];
        assert_eq!(draw(&staged(n, &ones, seed)).stages.concat(), order);
    }
}

/// Stage 2 is uniform over the units stage 1 left: a lot of 10, stage 1
/// of 3 and stage 2 of 2, over the seeds 0 to 1999. Each of the 7 units
/// left (counted by their rank among the units left) is in stage 2 with
/// probability 2/7, 571.4 of 2000 draws; Pearson's statistic over the 7
/// ranks has 6 degrees of freedom and must stay below chi2.ppf(0.999, 6)
/// = 22.46 (scipy.stats). And each position of the lot is in stage 2 with
/// probability 7/10 x 2/7 = 1/5, 400 of 2000: 9 degrees of freedom, bound
/// chi2.ppf(0.999, 9) = 27.88 (scipy.stats). The seeds are fixed, so the
/// test is deterministic; a stage 2 that favoured the first or the last
/// units left would pass the bounds by far.
#[test]
fn stage_two_is_uniform_over_the_units_left() {
    let draws = 2000u64;
    let (mut by_rank, mut by_position) = ([0u64; 7], [0u64; 10]);
    for seed in 0..draws {
        let d = draw(&staged(10, &[3, 2], seed));
        let left: Vec<u64> = (1..=10).filter(|p| !d.stages[0].contains(p)).collect();
        for p in &d.stages[1] {
            let rank = left.iter().position(|q| q == p).expect("a unit left");
            by_rank[rank] += 1;
            by_position[(p - 1) as usize] += 1;
        }
    }
    let chi2 = |counts: &[u64], expected: f64| -> f64 {
        counts
            .iter()
            .map(|&c| (c as f64 - expected).powi(2) / expected)
            .sum()
    };
    let ranks = chi2(&by_rank, draws as f64 * 2.0 / 7.0);
    assert!(ranks < 22.46, "chi-square {ranks} over {by_rank:?}");
    let positions = chi2(&by_position, draws as f64 / 5.0);
    assert!(
        positions < 27.88,
        "chi-square {positions} over {by_position:?}"
    );
}

/// The command line: `--n` twice gives the single draw's JSON positions
/// as stage 1, `stages` and `positions` agree, and the CSV has a stage
/// column; `--items` lists the items in order, in the JSON and the CSV.
#[test]
fn stages_and_items_through_the_command_line() {
    let base = ["draw", "--lot", "L-2031", "--lot-size", "1200"];
    let run = |more: &[&str]| json_of(&[&base[..], more, &["--format", "json"]].concat());
    let single = run(&["--n", "8"]);
    let two = run(&["--n", "8", "--n", "5"]);
    assert_eq!(two["sample"], 13);
    assert_eq!(two["stages"][0]["positions"], single["positions"]);
    assert_eq!(two["stages"][1]["stage"], 2);
    assert_eq!(two["stages"][1]["sample"], 5);
    assert_eq!(two["positions"].as_array().unwrap().len(), 13);
    assert_eq!(two["items"], serde_json::Value::Null);
    assert_eq!(single["stages"][0]["positions"], single["positions"]);
    let listed = run(&["--items", "6"]);
    let order = listed["items"].as_array().unwrap();
    assert_eq!(order.len(), 6);
    assert_eq!(listed["stages"][5]["positions"], json!([order[5]]));

    let out = lotsman()
        .args(base)
        .args(["--n", "2", "--n", "1", "--format", "csv"])
        .output()
        .unwrap();
    let csv = String::from_utf8(out.stdout).unwrap();
    let rows: Vec<&str> = csv.lines().collect();
    assert_eq!(rows[0], "stage,position");
    assert_eq!(rows.len(), 4);
    assert!(rows[1].starts_with("1,") && rows[2].starts_with("1,") && rows[3].starts_with("2,"));
    let out = lotsman()
        .args(base)
        .args(["--items", "3", "--format", "csv"])
        .output()
        .unwrap();
    let csv = String::from_utf8(out.stdout).unwrap();
    let expected: Vec<String> = (1..=3).map(|i| format!("{i},{}", order[i - 1])).collect();
    assert_eq!(csv, format!("item,position\n{}\n", expected.join("\n")));
}

/// The refusals of staged and item-by-item draws, each in one line of
/// plain words (exit code 2).
#[test]
fn impossible_staged_draws_are_refused_in_words() {
    for (args, words) in [
        (
            vec!["--lot-size", "50", "--n", "32", "--n", "32"],
            "the 2 stages draw 64 units in all (--n 32 --n 32), more than the lot (--lot-size 50)",
        ),
        (
            vec![
                "--lot-size",
                "100",
                "--n",
                "8",
                "--n",
                "8",
                "--cartons",
                "4",
            ],
            "--cartons shares one sample among cartons; for a plan of several stages",
        ),
        (
            vec!["--lot-size", "100", "--n", "8", "--n", "0"],
            "stage 2's sample size (--n) = 0 is out of range",
        ),
        (
            vec!["--lot-size", "10", "--items", "11"],
            "--items 11 is more units than the lot (--lot-size 10) holds",
        ),
        (
            vec!["--lot-size", "10", "--items", "0"],
            "items to draw (--items) = 0 is out of range",
        ),
        (
            vec!["--lot-size", "1000000000", "--items", "150000"],
            "beyond the work budget of 10 s; draw fewer items",
        ),
        (
            vec!["--lot-size", "100", "--n", "8", "--items", "8"],
            "'--n <K>' cannot be used with '--items <K>'",
        ),
        (
            vec!["--lot-size", "100", "--items", "8", "--cartons", "2"],
            "cannot be used with",
        ),
    ] {
        let out = lotsman()
            .args(["draw", "--lot", "L-7"])
            .args(&args)
            .output()
            .unwrap();
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        let err = String::from_utf8(out.stderr).unwrap();
        assert!(err.contains(words), "{args:?}: {err}");
        assert_eq!(err.lines().count(), 1, "{err}");
    }
}

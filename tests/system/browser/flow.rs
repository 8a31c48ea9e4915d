//! One walk through the screens as a quality engineer takes it: design a
//! plan and save it, find it among the plans and open its sheet, inspect
//! and record three lots of a standard-indexed plan until the switching
//! rules put the next lot on tightened inspection, the supplier's
//! history, a comparison of two plans, and the audit of the ledger and
//! the sources; with the time the design screen takes to update after a
//! change.
//!
//! The standard-indexed source is MIL-STD-105E's plan for a lot of 1500
//! at level II, AQL 1.0: code letter K, normal n = 125, Ac 3, Re 4,
//! tightened Ac 2, Re 3 (Tables I, II-A, II-B); two lots not accepted
//! within five put the next lot on tightened inspection (4.7.1). The
//! designed plan for 1%/6% at alpha 0.05, beta 0.10 (binomial) is n =
//! 110, c = 3 (the cargo suite checks it against scipy.stats.binom).

use std::path::Path;
use std::process::Command;

use super::{BIN, Walk};

/// `lotsman ARGS` in `dir`, which must succeed.
fn lotsman(dir: &Path, args: &[&str]) {
    let out = Command::new(BIN)
        .current_dir(dir)
        .args(args)
        .output()
        .unwrap();
    assert!(out.status.success(), "{out:?}");
}

/// The standard-indexed source `s.yaml`.
fn standard_source(dir: &Path) {
    lotsman(
        dir,
        &[
            "standard",
            "--lot-size",
            "1500",
            "--level",
            "II",
            "--aql",
            "1.0",
            "--output",
            "s.yaml",
        ],
    );
}

#[tokio::test]
#[ignore = "needs chromium and chromium-driver (.ci/run installs them)"]
async fn the_screens_in_a_browser() {
    let walk = Walk::start(standard_source).await;
    design_and_save(&walk).await;
    negotiate_updates_in_time(&walk).await;
    plans_and_the_sheet(&walk).await;
    inspect_three_lots(&walk).await;
    history(&walk).await;
    compare_two(&walk).await;
    audit(&walk).await;
    walk.end().await;
}

async fn design_and_save(walk: &Walk) {
    walk.open("/").await;
    walk.wait_text("main", "Design and negotiate").await;
    walk.shot("home").await;
    walk.click("nav a[href=\"/design\"]").await;
    walk.fill("form.design", "aql", "1%").await;
    walk.fill("form.design", "rql", "6%").await;
    walk.click("form.design button[type=submit]").await;
    walk.wait_text("#result h2", "n = 110, c = 3").await;
    walk.shot("design").await;
    walk.fill("form.save", "title", "Cover fit, incoming").await;
    walk.fill("form.save", "prepared_by", "R. Okafor, incoming inspection")
        .await;
    walk.fill("form.save", "approved_by", "H. Lindqvist, quality manager")
        .await;
    walk.fill("form.save", "id", "IQ-0412").await;
    walk.fill("form.save", "item", "Pump cover PC-88, drawing rev. C")
        .await;
    walk.fill(
        "form.save",
        "characteristic",
        "Fit of the cover on gauge G-12",
    )
    .await;
    walk.fill("form.save", "file", "cover-fit.yaml").await;
    walk.click("form.save button[type=submit]").await;
    walk.wait_text("main", "cover-fit.yaml").await;
    walk.shot("saved").await;
    let saved = std::fs::read_to_string(walk.workspace.path().join("cover-fit.yaml")).unwrap();
    assert!(saved.contains("Cover fit, incoming"));
    lotsman(walk.workspace.path(), &["verify", "cover-fit.yaml"]);
}

/// The negotiation screen (a lot of 2000, a cost per unit, the 7 x 7
/// trade-off map) redrawn after the RQL changes, timed in the page from
/// the change event to the new plan shown and to the new map drawn (it
/// loads after the plan).
async fn negotiate_updates_in_time(walk: &Walk) {
    walk.open("/design?aql=1%25&rql=6%25&lot_size=2000&cost=2")
        .await;
    walk.wait_text("#result h2", "n = 108").await;
    walk.wait_text("#map", "").await;
    let mut times = Vec::new();
    for rql in ["7%", "5%", "8%", "6%", "4%"] {
        let taken = walk
            .client
            .execute_async(
                r#"
                const [rql, done] = arguments;
                const before = document.querySelector('#result h2').textContent;
                const oldMap = document.querySelector('#map');
                const input = document.querySelector('form.design [name=rql]');
                const started = performance.now();
                let plan = null;
                const check = () => {
                    const h = document.querySelector('#result h2');
                    if (plan === null && h && h.textContent !== before) {
                        plan = performance.now() - started;
                    }
                    const m = document.querySelector('#map');
                    if (plan !== null && m && m !== oldMap && !m.hasAttribute('hx-trigger')
                        && m.querySelector('svg')) {
                        watch.disconnect();
                        done([plan, performance.now() - started]);
                    }
                };
                const watch = new MutationObserver(check);
                watch.observe(document.querySelector('main'), {childList: true, subtree: true, characterData: true});
                input.value = rql;
                input.dispatchEvent(new Event('change', {bubbles: true}));
                "#,
                vec![serde_json::json!(rql)],
            )
            .await
            .unwrap();
        let pair = taken.as_array().unwrap();
        times.push((pair[0].as_f64().unwrap(), pair[1].as_f64().unwrap()));
    }
    eprintln!("negotiation screen after a change, ms to the plan and to the map: {times:?}");
    walk.shot("design-updated").await;
    // Every change shows its plan within 100 ms; the map, a second
    // request after it, within 100 ms at the median of the five (a debug
    // build on a shared machine: one slow run is the machine's, not the
    // page's).
    for (plan, _) in &times {
        assert!(
            *plan <= 100.0,
            "an update took {plan:.0} ms to the plan: {times:?}"
        );
    }
    let mut maps: Vec<f64> = times.iter().map(|t| t.1).collect();
    maps.sort_by(f64::total_cmp);
    assert!(
        maps[2] <= 100.0,
        "the map took {:.0} ms at the median: {times:?}",
        maps[2]
    );
}

async fn inspect_three_lots(walk: &Walk) {
    walk.open("/inspect").await;
    walk.choose("form.dock", "plan", "s.yaml").await;
    walk.fill("form.dock", "lot", "L-101").await;
    walk.fill("form.dock", "lot_size", "1500").await;
    walk.click("form.dock button[type=submit]").await;
    walk.wait_text(".severity", "normal").await;
    walk.shot("inspect").await;
    for (i, (lot, found, answer)) in [
        ("L-101", "0", "ACCEPT"),
        ("L-102", "4", "REJECT"),
        ("L-103", "5", "REJECT"),
    ]
    .into_iter()
    .enumerate()
    {
        if i > 0 {
            walk.fill("#decision form.dock", "lot", lot).await;
            walk.click("#decision form.dock button[type=submit]").await;
            walk.wait_url(&format!("lot={lot}")).await;
            walk.wait_text(".inforce h2", "").await;
        }
        walk.fill("form.counts", "class_1", found).await;
        walk.click("form.counts button[type=submit]").await;
        walk.wait_text("#decision .answer", answer).await;
        if i == 0 {
            walk.shot("inspect-decided").await;
        }
        walk.click("form[action=\"/inspect/record\"] button[type=submit]")
            .await;
        walk.wait_text(".done", &format!("Recorded as seq {}", i + 1))
            .await;
    }
    walk.wait_text("#decision .severity", "tightened inspection")
        .await;
    walk.shot("inspect-tightened").await;
    lotsman(
        walk.workspace.path(),
        &["verify", "s-ledger.csv", "--plan", "s.yaml"],
    );
}

async fn history(walk: &Walk) {
    walk.click("a[href^=\"/history?ledger=\"]").await;
    walk.wait_text(".severity", "tightened").await;
    walk.shot("history").await;
}

async fn compare_two(walk: &Walk) {
    walk.open("/compare").await;
    walk.click("input[name=source][value=\"cover-fit.yaml\"]")
        .await;
    walk.click("input[name=source][value=\"s.yaml\"]").await;
    walk.click("form.compare button[type=submit]").await;
    walk.wait_text("#result h2", "Comparison of 2 plans").await;
    walk.shot("compare").await;
}

/// The saved plan in the list, verified; its page; and its sheet, the
/// bytes `lotsman sheet` writes, drawn by poppler into the screenshots.
async fn plans_and_the_sheet(walk: &Walk) {
    walk.open("/").await;
    walk.click("nav a[href=\"/plans\"]").await;
    walk.wait_text("main", "cover-fit.yaml").await;
    walk.shot("plans").await;
    walk.click("a[href=\"/plans/view?file=cover-fit.yaml\"]")
        .await;
    walk.wait_text("main", "Cover fit, incoming").await;
    walk.shot("plan").await;
    walk.open("/plans").await;
    let link = walk
        .client
        .find(fantoccini::Locator::Css(
            "a[href=\"/plans/sheet?file=cover-fit.yaml\"]",
        ))
        .await
        .expect("a sheet link for the saved plan");
    let href = link.attr("href").await.unwrap().unwrap();
    let url = format!("{}{}", walk.url, href.trim_start_matches('/'));
    let pdf = ureq::get(&url)
        .call()
        .unwrap()
        .body_mut()
        .read_to_vec()
        .unwrap();
    let dir = walk.workspace.path();
    lotsman(dir, &["sheet", "cover-fit.yaml", "--output", "printed.pdf"]);
    assert_eq!(pdf, std::fs::read(dir.join("printed.pdf")).unwrap());
    let shots = walk.shots_dir();
    let out = Command::new("pdftoppm")
        .args(["-png", "-r", "80", "-singlefile"])
        .arg(dir.join("printed.pdf"))
        .arg(shots.join("sheet"))
        .output()
        .expect("pdftoppm (poppler-utils)");
    assert!(out.status.success(), "{out:?}");
}

/// The ledger's chain and decisions, and every source of the workspace,
/// verified on the audit page.
async fn audit(walk: &Walk) {
    walk.click("nav a[href=\"/audit\"]").await;
    walk.choose("form.audit", "ledger", "s-ledger.csv").await;
    walk.click("form.audit:nth-of-type(2) button[type=submit]")
        .await;
    walk.wait_text("#audit-result", "Everything holds").await;
    walk.shot("audit").await;
    walk.click("form.audit:nth-of-type(1) button[type=submit]")
        .await;
    walk.wait_text("#audit-result", "Everything holds").await;
}

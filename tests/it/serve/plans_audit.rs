//! The plans and audit screens over HTTP, on the demo's files: each
//! source's verification in `lotsman verify`'s words (a tampered source
//! names the field and both values as the command does), the sheet
//! download byte for byte as `lotsman sheet` writes it, a tampered
//! ledger's broken row named as `lotsman verify LEDGER --plan PLAN`
//! names it, and names that leave the workspace refused.

use std::path::Path;
use std::process::Command;
use std::time::Duration;

use super::{BIN, Server, escaped};

const FIT: &str = "tpw-cover-fit.yaml";
const SEAL: &str = "tpw-seal-visual.yaml";
const LEDGER: &str = "tpw-seal-face-ledger.csv";
const CLASSES: &str = "tpw-seal-face-classes.yaml";

/// A server over a workspace holding the demo's files.
fn demo_server() -> Server {
    let server = Server::start(&[]);
    let out = Command::new(BIN)
        .args(["demo", "--output-dir"])
        .arg(server.workspace.path())
        .output()
        .unwrap();
    assert!(out.status.success(), "{out:?}");
    server
}

/// Replaces `from` by `to` in the workspace's file `name`, once.
fn tamper(server: &Server, name: &str, from: &str, to: &str) {
    let path = server.path(name);
    let text = std::fs::read_to_string(&path).unwrap();
    assert!(text.contains(from), "{name} holds no {from:?}");
    std::fs::write(&path, text.replacen(from, to, 1)).unwrap();
}

/// `lotsman ARGS` run in the workspace folder: its stdout.
fn cli(workspace: &Path, args: &[&str]) -> String {
    let out = Command::new(BIN)
        .args(args)
        .current_dir(workspace)
        .output()
        .unwrap();
    String::from_utf8(out.stdout).unwrap()
}

#[test]
fn the_list_shows_a_confirmed_and_a_tampered_source_in_verifys_words() {
    let server = demo_server();
    tamper(&server, FIT, "  - n: 62\n", "  - n: 63\n");
    let page = server.get("/plans", None);
    assert_eq!(page.status, 200, "{}", page.body);
    let json = cli(
        server.workspace.path(),
        &["verify", FIT, "--format", "json"],
    );
    let report: serde_json::Value = serde_json::from_str(&json).unwrap();
    let entry = &report["results"][0];
    assert_eq!(entry["status"], "mismatch");
    let differences = entry["differences"].as_array().unwrap();
    assert!(!differences.is_empty());
    for d in differences {
        let line = format!(
            "{}: recorded {}, re-solved {}",
            d["field"].as_str().unwrap(),
            d["recorded"].as_str().unwrap(),
            d["resolved"].as_str().unwrap()
        );
        assert!(
            page.body.contains(&escaped(&line)),
            "{line} not in the list"
        );
    }
    let row = |name: &str| {
        let at = page.body.find(&format!(">{name}</a>")).unwrap();
        page.body[at..].split("</tr>").next().unwrap().to_string()
    };
    assert!(row(FIT).contains(">mismatch</span>"), "{}", row(FIT));
    assert!(row(SEAL).contains(">match</span>"), "{}", row(SEAL));
    // A mismatched source offers no sheet: the command would refuse it.
    assert!(!row(FIT).contains("/plans/sheet"), "{}", row(FIT));
    assert!(row(SEAL).contains(&format!("/plans/sheet?file={SEAL}")));
}

#[test]
fn a_plan_page_shows_its_chart_and_the_risks_its_sheet_prints() {
    let server = demo_server();
    let page = server.get(&format!("/plans/view?file={FIT}"), None);
    assert_eq!(page.status, 200, "{}", page.body);
    assert!(page.body.contains("<svg"), "no chart");
    assert!(page.body.contains("<strong>match</strong>"));
    // n = 62, c = 2 from a lot of 400 at 1% and 8% (scipy.stats:
    // 1 - hypergeom.cdf(2, 400, 4, 62) = 0.012697,
    // hypergeom.cdf(2, 400, 32, 62) = 0.097895).
    assert!(page.body.contains("<td>0.01270</td>"), "{}", page.body);
    assert!(page.body.contains("<td>0.09789</td>"), "{}", page.body);
    let standard = server.get(&format!("/plans/view?file={CLASSES}"), None);
    assert_eq!(standard.status, 200, "{}", standard.body);
    assert!(standard.body.contains("<svg"), "no chart for the classes");
    // The critical class, n = 200, c = 0 at AQL 0.065 (scipy.stats:
    // 1 - binom.cdf(0, 200, 0.00065) = 0.12194).
    assert!(
        standard.body.contains("<td>0.1219</td>"),
        "{}",
        standard.body
    );
}

#[test]
fn the_sheet_download_is_the_file_lotsman_sheet_writes() {
    let server = demo_server();
    let out = tempfile::tempdir().unwrap();
    let written = out.path().join("seal.pdf");
    let status = Command::new(BIN)
        .args(["sheet"])
        .arg(server.path(SEAL))
        .arg("--output")
        .arg(&written)
        .output()
        .unwrap();
    assert!(status.status.success(), "{status:?}");
    let agent: ureq::Agent = ureq::Agent::config_builder()
        .http_status_as_error(false)
        .proxy(None)
        .timeout_global(Some(Duration::from_secs(60)))
        .build()
        .into();
    let mut answer = agent
        .get(format!("{}plans/sheet?file={SEAL}", server.url))
        .call()
        .unwrap();
    assert_eq!(answer.status().as_u16(), 200);
    let header = |name: &str| answer.headers()[name].to_str().unwrap().to_string();
    assert_eq!(header("content-type"), "application/pdf");
    assert!(
        header("content-disposition").starts_with("attachment; filename=\"tpw-seal-visual.pdf\""),
        "{}",
        header("content-disposition")
    );
    let bytes = answer.body_mut().read_to_vec().unwrap();
    assert!(
        bytes == std::fs::read(&written).unwrap(),
        "the bytes differ"
    );
}

#[test]
fn a_tampered_ledger_is_named_by_its_row_as_verify_names_it() {
    let server = demo_server();
    // The fifth lot's decision, changed after it was recorded.
    let text = std::fs::read_to_string(server.path(LEDGER)).unwrap();
    let row = text
        .lines()
        .find(|l| l.contains(",5,2026-"))
        .unwrap()
        .to_string();
    tamper(
        &server,
        LEDGER,
        &row,
        &row.replacen(",accept,", ",reject,", 1),
    );
    let expected = cli(
        server.workspace.path(),
        &["verify", LEDGER, "--plan", CLASSES],
    );
    assert!(expected.contains("(seq 5)"), "{expected}");
    let page = server.get(&format!("/audit?check=ledger&ledger={LEDGER}"), None);
    assert_eq!(page.status, 200, "{}", page.body);
    assert!(
        page.body.contains(&escaped(expected.trim_end())),
        "{}",
        page.body
    );
    assert!(page.body.contains(&format!(
        "<pre class=\"commands\">lotsman verify {LEDGER} --plan {CLASSES}</pre>"
    )));
    assert!(page.body.contains("Discrepancies found"));
}

#[test]
fn a_folder_and_a_sheet_are_audited_as_verify_audits_them() {
    let server = demo_server();
    tamper(&server, FIT, "  - n: 62\n", "  - n: 63\n");
    let page = server.get("/audit?check=sources&folder=", None);
    assert_eq!(page.status, 200, "{}", page.body);
    assert!(page.body.contains("lotsman verify . --list"));
    assert!(page.body.contains("1 mismatch"), "{}", page.body);
    // A sheet checked against another source's text.
    let sheet = server.get(
        &format!("/audit?check=sheet&source={SEAL}&sheet=tpw-cover-fit.pdf"),
        None,
    );
    assert_eq!(sheet.status, 200, "{}", sheet.body);
    let expected = cli(
        server.workspace.path(),
        &["verify", SEAL, "--sheet", "tpw-cover-fit.pdf", "--list"],
    );
    assert!(expected.contains("mismatch"), "{expected}");
    assert!(
        sheet.body.contains(&escaped(expected.trim_end())),
        "{}",
        sheet.body
    );
    let genuine = server.get(
        &format!("/audit?check=sheet&source={SEAL}&sheet=tpw-seal-visual.pdf"),
        None,
    );
    assert!(
        genuine.body.contains("Everything holds."),
        "{}",
        genuine.body
    );
}

#[test]
fn names_that_leave_the_workspace_are_refused() {
    let server = demo_server();
    for path in [
        "/plans/view?file=../x.yaml",
        "/plans/sheet?file=../x.yaml",
        "/plans/sheet?file=%2Fetc%2Fpasswd",
        "/audit?check=ledger&ledger=../x.csv",
        "/audit?check=sources&folder=..",
        "/audit?check=sheet&source=tpw-seal-visual.yaml&sheet=../x.pdf",
    ] {
        let page = server.get(path, None);
        assert_eq!(page.status, 400, "{path}: {}", page.body);
        assert!(
            page.body.contains("give a name inside the workspace"),
            "{path}: {}",
            page.body
        );
    }
}

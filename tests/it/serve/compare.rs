//! The comparison screen over HTTP: its CSV is, byte for byte, what
//! `lotsman compare --format csv` prints for the same plans in the
//! workspace (whose numbers tests/it/compare.rs checks against `lotsman
//! evaluate` and scipy.stats.binom.cdf), the page shows every plan's row
//! and the page of charts inline, and the refusals are the command's.

use std::path::Path;
use std::process::{Command, Output};

use super::{BIN, Server, escaped};

/// Runs `lotsman ARGS` in `dir`.
fn lotsman(dir: &Path, args: &[&str]) -> Output {
    Command::new(BIN)
        .current_dir(dir)
        .args(args)
        .output()
        .unwrap()
}

/// A designed source `a.yaml` (1%/6%) and a standard-indexed `s.yaml`
/// (lot 1500, level II, AQL 1.0) in the server's workspace.
fn two_sources(server: &Server) {
    let dir = server.workspace.path();
    for args in [
        &["design", "--aql", "1%", "--rql", "6%", "--output", "a.yaml"][..],
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
        ][..],
    ] {
        let out = lotsman(dir, args);
        assert!(out.status.success(), "{out:?}");
    }
}

const QUERY: &str = "source=a.yaml&source=s.yaml&stages=50%3A1%3A4%2B100%3A4%3A5";

#[test]
fn the_csv_is_the_commands_own() {
    let server = Server::start(&[]);
    two_sources(&server);
    let answer = server.get(&format!("/compare.csv?{QUERY}"), None);
    assert_eq!(answer.status, 200, "{}", answer.body);
    assert!(answer.content_type.starts_with("text/csv"));
    let cli = lotsman(
        server.workspace.path(),
        &[
            "compare",
            "a.yaml",
            "s.yaml",
            "--stage",
            "50:1:4+100:4:5",
            "--format",
            "csv",
        ],
    );
    assert!(cli.status.success(), "{cli:?}");
    assert_eq!(answer.body, String::from_utf8(cli.stdout).unwrap());
}

#[test]
fn the_page_shows_every_plan_and_the_charts() {
    let server = Server::start(&[]);
    two_sources(&server);
    let page = server.get(&format!("/compare?{QUERY}"), None);
    assert_eq!(page.status, 200, "{}", page.body);
    let body = &page.body;
    // The points are the first source's, 1% and 6%.
    assert!(body.contains("Comparison of 3 plans at AQL 1.000% and RQL 6.000%"));
    // The designed plan n = 110, c = 3; the standard's normal plan of
    // code letter K, n = 125, Ac 3, Re 4; and the typed double plan.
    for stages in ["110:3:4", "125:3:4", "50:1:4 + 100:4:5"] {
        assert!(body.contains(stages), "{stages} missing");
    }
    assert!(body.contains("<svg"));
    assert!(body.contains("/compare.csv?source=a.yaml"));
    // Each ticked source stays ticked, by its name in the workspace.
    assert!(body.contains("value=\"a.yaml\" checked"));
    assert!(!body.contains(&server.workspace.path().display().to_string()));
}

#[test]
fn refusals_are_the_commands_words() {
    let server = Server::start(&[]);
    two_sources(&server);
    // One plan is not a comparison.
    let page = server.get("/compare?source=a.yaml", None);
    assert_eq!(page.status, 400);
    let cli = lotsman(server.workspace.path(), &["compare", "a.yaml"]);
    assert_eq!(cli.status.code(), Some(2));
    let stderr = String::from_utf8(cli.stderr).unwrap();
    let words = stderr
        .lines()
        .find_map(|l| l.split_once("error: "))
        .unwrap()
        .1;
    assert!(
        page.body.contains(&escaped(words)),
        "{words}\n{}",
        page.body
    );
    // A stage the command cannot read.
    let page = server.get("/compare?source=a.yaml&stages=50%3A4%3A3", None);
    assert_eq!(page.status, 400);
    assert!(page.body.contains("class=\"refusal\""));
    // A name leading out of the workspace.
    let page = server.get("/compare?source=..%2Fa.yaml&source=a.yaml", None);
    assert_eq!(page.status, 400);
    assert!(page.body.contains("inside the workspace"));
}

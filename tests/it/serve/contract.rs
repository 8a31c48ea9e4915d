//! The contract the later screens and checks build on: the home page, the
//! design page with the numbers of `lotsman design`, its refusals in the
//! command's words, a clean stop, and the web stack kept out of the
//! library.

use std::path::Path;
use std::process::Command;
use std::time::Duration;

use super::{BIN, DESIGN, Server, cli_refusal, escaped};

#[test]
fn the_home_page_links_the_screens_and_gives_the_caution() {
    let server = Server::start(&[]);
    let home = server.get("/", None);
    assert_eq!(home.status, 200);
    assert!(
        home.content_type.starts_with("text/html"),
        "{}",
        home.content_type
    );
    assert!(home.body.contains("href=\"/design\""));
    assert!(
        home.body
            .contains("Sampling does not guarantee the quality of a lot")
    );
    assert!(home.body.contains("licensed practice"));
    // Nothing is loaded from elsewhere: the script and the stylesheet are
    // the server's own, and both are served.
    for attribute in ["src=\"http", "href=\"http", "src=\"//", "href=\"//"] {
        assert!(!home.body.contains(attribute), "{attribute}");
    }
    let htmx = server.get("/assets/htmx.min.js", None);
    assert_eq!(htmx.status, 200);
    assert!(htmx.content_type.starts_with("text/javascript"));
    assert!(htmx.body.starts_with("var htmx="));
    assert_eq!(server.get("/assets/style.css", None).status, 200);
    let missing = server.get("/no-such-page", None);
    assert_eq!(missing.status, 404);
    assert!(missing.body.contains("there is no page at this address"));
}

#[test]
fn the_design_page_shows_the_plan_of_lotsman_design_with_its_oc_chart() {
    let server = Server::start(&[]);
    let page = server.get(&format!("/design?{DESIGN}"), None);
    assert_eq!(page.status, 200, "{}", page.body);
    // The plan line of `lotsman design` for the same flags (the same
    // engine; the reference numbers are the command's own).
    let out = Command::new(BIN)
        .args(["design", "--aql", "1%", "--rql", "6%", "--alpha", "0.05"])
        .args(["--beta", "0.10", "--model", "binomial"])
        .output()
        .unwrap();
    let report = String::from_utf8(out.stdout).unwrap();
    let plan = report
        .lines()
        .find_map(|l| l.trim().strip_prefix("PLAN  "))
        .unwrap();
    assert_eq!(plan, "n = 110, c = 3 (reject at 4)");
    assert!(
        page.body
            .contains(&format!("<span class=\"plan\">{plan}</span>"))
    );
    assert!(
        page.body
            .contains("<td>110</td><td>110</td><td>3</td><td>4</td>")
    );
    let svg_at = page.body.find("<svg").expect("an inline OC chart");
    assert!(page.body[svg_at..].contains("Probability of acceptance"));
    assert!(!page.body.contains("<?xml"));
    // The whole report, as the command prints it.
    assert!(page.body.contains(&escaped(report.lines().nth(4).unwrap())));
    // With JavaScript off the form still works: a plain GET form.
    assert!(
        page.body
            .contains("<form method=\"get\" action=\"/design\"")
    );
    // An empty form is a page, not an error.
    let empty = server.get("/design", None);
    assert_eq!(empty.status, 200);
    assert!(!empty.body.contains("<svg"));
}

#[test]
fn a_refused_design_says_what_the_command_says_on_a_400_page() {
    let server = Server::start(&[]);
    for (query, args) in [
        ("aql=abc&rql=6%25", vec!["--aql", "abc", "--rql", "6%"]),
        ("aql=6%25&rql=1%25", vec!["--aql", "6%", "--rql", "1%"]),
        (
            "aql=1%25&rql=6%25&lot_size=-3",
            vec!["--aql", "1%", "--rql", "6%", "--lot-size", "-3"],
        ),
        // Beyond the work budget (the single plan at 1% against 1.01%
        // runs in milliseconds since its nearby plans are a window, and the
        // binomial sequential plan at 1% against 1.1% in about 9 s).
        (
            "aql=1%25&rql=1.1%25&scheme=sequential&lot_size=1000000",
            vec![
                "--aql",
                "1%",
                "--rql",
                "1.1%",
                "--scheme",
                "sequential",
                "--lot-size",
                "1000000",
            ],
        ),
    ] {
        let started = std::time::Instant::now();
        let page = server.get(&format!("/design?{query}"), None);
        let words = cli_refusal(&args);
        assert_eq!(page.status, 400, "{query}: {}", page.body);
        assert!(page.content_type.starts_with("text/html"));
        assert!(
            page.body.contains(&escaped(&words)),
            "{query}: {words}\n{}",
            page.body
        );
        assert!(!page.body.contains("panicked") && !page.body.contains("Error {"));
        assert!(
            started.elapsed() < Duration::from_secs(20),
            "{query}: refused late"
        );
    }
    let budget = cli_refusal(&["--aql", "1%", "--rql", "1.01%", "--nearby", "all"]);
    assert!(budget.contains("beyond the work budget"), "{budget}");
}

#[cfg(unix)]
#[test]
fn ctrl_c_stops_the_server_cleanly() {
    let mut server = Server::start(&[]);
    assert_eq!(server.get("/", None).status, 200);
    let pid = server.child.id().to_string();
    let killed = Command::new("kill").args(["-INT", &pid]).status().unwrap();
    assert!(killed.success());
    let status = server.child.wait().unwrap();
    assert_eq!(status.code(), Some(0));
}

/// The web stack stays in the binary: no file of the library names it.
#[test]
fn the_library_never_uses_the_web_stack() {
    fn walk(dir: &Path, found: &mut Vec<String>) {
        for entry in std::fs::read_dir(dir).unwrap() {
            let path = entry.unwrap().path();
            if path.ends_with("src/bin") {
                continue;
            }
            if path.is_dir() {
                walk(&path, found);
            } else if path.extension().is_some_and(|e| e == "rs") {
                let text = std::fs::read_to_string(&path).unwrap();
                for name in ["axum", "tokio", "askama", "getrandom"] {
                    if text.contains(&format!("{name}::")) || text.contains(&format!("use {name}"))
                    {
                        found.push(format!("{} uses {name}", path.display()));
                    }
                }
            }
        }
    }
    let mut found = Vec::new();
    walk(Path::new("src"), &mut found);
    assert!(found.is_empty(), "{found:?}");
}

#[test]
fn a_saved_source_carries_the_sheets_document_fields() {
    let server = Server::start(&[]);
    let (cookie, csrf) = server.session();
    // The form offers today's date and revision A.
    let page = server.get(&format!("/design?{DESIGN}"), Some(&cookie));
    let today = lotsman::LotDate::today().unwrap().to_string();
    assert!(
        page.body
            .contains(&format!("name=\"date\" value=\"{today}\""))
    );
    assert!(page.body.contains("name=\"revision\" value=\"A\""));
    let mut form = super::save_form(&csrf, "fit.yaml");
    form.extend([
        ("id", "IQ-311"),
        ("revision", "B"),
        ("date", "2026-11-30"),
        ("approved_by", "L. Marsh, quality manager"),
    ]);
    let saved = server.post("/plans", Some(&cookie), &form);
    assert_eq!(saved.status, 200, "{}", saved.body);
    let text = std::fs::read_to_string(server.path("fit.yaml")).unwrap();
    for line in [
        "id: IQ-311",
        "revision: B",
        "date: 2026-11-30",
        "approved_by: L. Marsh, quality manager",
    ] {
        assert!(text.contains(line), "{line}\n{text}");
    }
    // A date not in the calendar is refused in the command's words.
    let mut form = super::save_form(&csrf, "bad.yaml");
    form.push(("date", "2026-13-40"));
    let refused = server.post("/plans", Some(&cookie), &form);
    assert_eq!(refused.status, 400);
    let words = cli_refusal(&["--aql", "1%", "--rql", "6%", "--date", "2026-13-40"]);
    assert!(refused.body.contains(&escaped(&words)), "{words}");
    assert!(!server.path("bad.yaml").exists());
}

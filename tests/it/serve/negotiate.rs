//! The design screen as a negotiation aid, over HTTP: the nearby plans
//! and the sensitivity rows of `lotsman design`, the inspection cost at
//! the process quality, the trade-off map's cells of `lotsman tradeoff
//! --format json`, the refusals in the commands' words, and the pages as
//! plain GET forms and links (no JavaScript).

use std::process::Command;

use super::{BIN, Server, escaped};

/// The negotiation: AQL 1%, RQL 6%, a lot of 2000, 2 per unit
/// inspected (the process quality is then the AQL).
const NEGOTIATION: &str = "aql=1%25&rql=6%25&lot_size=2000&cost=2";

/// What `lotsman ARGS` prints on stdout.
fn stdout(args: &[&str]) -> String {
    let out = Command::new(BIN).args(args).output().unwrap();
    assert!(out.status.success(), "{args:?}");
    String::from_utf8(out.stdout).unwrap()
}

/// What `lotsman tradeoff ARGS` refuses, the words after `error: `.
fn tradeoff_refusal(args: &[&str]) -> String {
    let out = Command::new(BIN)
        .arg("tradeoff")
        .args(args)
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2), "{args:?}");
    let text = String::from_utf8(out.stderr).unwrap();
    let line = text.lines().find(|l| l.contains("error: ")).unwrap();
    line.split_once("error: ").unwrap().1.to_string()
}

/// The cells of a terminal table's row: the runs between two or more
/// spaces.
fn cells(line: &str) -> Vec<String> {
    line.split("  ")
        .map(str::trim)
        .filter(|c| !c.is_empty())
        .map(str::to_string)
        .collect()
}

/// A table row of the page with these cells.
fn html_row(cells: &[String]) -> String {
    cells
        .iter()
        .map(|c| format!("<td>{}</td>", escaped(c)))
        .collect()
}

#[test]
fn the_page_shows_the_nearby_plans_and_the_sensitivity_of_lotsman_design() {
    let server = Server::start(&[]);
    let page = server.get(&format!("/design?{NEGOTIATION}"), None);
    assert_eq!(page.status, 200, "{}", page.body);
    let report = stdout(&["design", "--aql", "1%", "--rql", "6%", "--lot-size", "2000"]);
    let json: serde_json::Value = serde_json::from_str(&stdout(&[
        "design",
        "--aql",
        "1%",
        "--rql",
        "6%",
        "--lot-size",
        "2000",
        "--format",
        "json",
    ]))
    .unwrap();
    // The nearby plans: each row of the command's table, the chosen one
    // marked, with the sample sizes of its JSON.
    let alternatives = json["alternatives"].as_array().unwrap();
    let mut rows = 0;
    for line in report.lines() {
        let row = cells(line);
        let Some(c) = row
            .first()
            .and_then(|c| c.trim_end_matches(" *").parse::<u64>().ok())
        else {
            continue;
        };
        let a = alternatives.iter().find(|a| a["c"] == c).unwrap();
        assert_eq!(row[1], a["n_min"].to_string(), "{line}");
        assert_eq!(row[2], a["n_max"].to_string(), "{line}");
        let mut shown = row.clone();
        shown[0] = shown[0].replace(" *", " (chosen)");
        assert!(
            page.body.contains(&html_row(&shown)),
            "{line}\n{}",
            page.body
        );
        rows += 1;
    }
    assert_eq!(rows, 7);
    assert!(
        page.body
            .contains("<tr class=\"chosen\"><td>3 (chosen)</td>")
    );
    // The sensitivity: each input's row as the command prints it, with
    // the sample sizes of its JSON.
    let sensitivity = json["sensitivity"].as_array().unwrap();
    for (label, s) in ["AQL (p1)", "alpha", "RQL (p2)", "beta"]
        .iter()
        .zip(sensitivity)
    {
        let line = report
            .lines()
            .find(|l| l.trim_start().starts_with(label))
            .unwrap();
        let row = cells(line);
        assert_eq!(row.len(), 7, "{line}");
        assert!(
            row[4].starts_with(&s["conceded"]["n"].to_string()),
            "{line}"
        );
        assert!(
            row[6].starts_with(&s["tightened"]["n"].to_string()),
            "{line}"
        );
        assert!(page.body.contains(&html_row(&row)), "{line}");
    }
    // At the process quality (the AQL): Pa, ATI and 2 x ATI of the plan
    // n = 108, c = 3 in a lot of 2000 with 20 nonconforming units. From
    // scipy: hypergeom.cdf(3, 2000, 20, 108) = 0.98008, ATI = 108 +
    // (1 - Pa) 1892 = 145.69, cost 291.38.
    for figure in [
        "<td>0.9801</td>",
        "<td>145.7</td>",
        "<td>291.38</td>",
        "At the process quality 1.000% (the AQL)",
    ] {
        assert!(page.body.contains(figure), "{figure}");
    }
}

#[test]
fn the_map_cells_are_those_of_lotsman_tradeoff_with_the_chosen_plan_marked() {
    let server = Server::start(&[]);
    let page = server.get(&format!("/design/map?{NEGOTIATION}"), None);
    assert_eq!(page.status, 200, "{}", page.body);
    // The grid around the points, hand computed: AQL from 0.5% to 2% and
    // RQL from 3% to 12% (half to twice), 7 values each; the process
    // quality is the AQL.
    let grid = [
        "--aql",
        "0.5%:2%:7",
        "--rql",
        "3%:12%:7",
        "--lot-size",
        "2000",
        "--cost-per-unit",
        "2",
        "--process-average",
        "1%",
    ];
    assert!(page.body.contains(&escaped(&format!(
        "lotsman tradeoff --aql {} --rql {}",
        grid[1], grid[3]
    ))));
    let mut args = vec!["tradeoff"];
    args.extend(grid);
    args.extend(["--format", "json"]);
    let json: serde_json::Value = serde_json::from_str(&stdout(&args)).unwrap();
    let expected: Vec<String> = json["cells"]
        .as_array()
        .unwrap()
        .iter()
        .map(|c| format!("{}/{}{:.2}", c["n"], c["c"], c["cost"].as_f64().unwrap()))
        .collect();
    assert_eq!(expected.len(), 49);
    let table = page.body.split("<table class=\"cells\">").nth(1).unwrap();
    let table = table.split("</table>").next().unwrap();
    let shown: Vec<String> = table
        .split("<td")
        .skip(1)
        .map(|td| {
            let inner = &td[td.find('>').unwrap() + 1..td.find("</td>").unwrap()];
            let mut text = String::new();
            let mut in_tag = false;
            for ch in inner.chars() {
                match ch {
                    '<' => in_tag = true,
                    '>' => in_tag = false,
                    _ if !in_tag => text.push(ch),
                    _ => {}
                }
            }
            text
        })
        .collect();
    assert_eq!(shown, expected);
    // The chosen plan (n = 108, c = 3) is the cell at AQL 1%, RQL 6%
    // (row 3, column 3), and marked.
    let chosen: Vec<&str> = table.split("<td class=\"chosen\">").skip(1).collect();
    assert!(!chosen.is_empty());
    assert!(chosen.iter().all(|c| c.starts_with("108/3")), "{chosen:?}");
    assert_eq!(expected[2 * 7 + 2], "108/3291.38");
    // The map itself, inline, with the agreed points ringed.
    let svg_at = page.body.find("<svg").expect("an inline map");
    assert!(page.body[svg_at..].contains("The agreed risk points (AQL, RQL)"));
    assert!(!page.body.contains("<?xml"));
}

#[test]
fn a_bad_cost_or_a_map_too_large_is_refused_in_the_command_words() {
    let server = Server::start(&[]);
    for (query, words) in [
        (
            "/design?aql=1%25&rql=6%25&lot_size=2000&cost=-2",
            tradeoff_refusal(&[
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--lot-size",
                "2000",
                "--cost-per-unit",
                "-2",
                "--process-average",
                "1%",
            ]),
        ),
        (
            "/design?aql=1%25&rql=6%25&lot_size=2000&cost=two",
            tradeoff_refusal(&[
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--lot-size",
                "2000",
                "--cost-per-unit",
                "two",
                "--process-average",
                "1%",
            ]),
        ),
        (
            "/design/map?aql=1%25&rql=6%25&map=600",
            tradeoff_refusal(&["--aql", "0.5%:2%:600", "--rql", "3%:12%:600"]),
        ),
    ] {
        let page = server.get(query, None);
        assert_eq!(page.status, 400, "{query}: {}", page.body);
        assert!(
            page.body.contains(&escaped(&words)),
            "{query}: {words}\n{}",
            page.body
        );
    }
}

#[test]
fn the_negotiation_works_as_plain_get_forms_and_links() {
    let server = Server::start(&[]);
    let page = server.get(&format!("/design?{NEGOTIATION}"), None);
    assert_eq!(page.status, 200);
    assert!(
        page.body
            .contains("<form method=\"get\" action=\"/design\"")
    );
    for field in ["name=\"cost\"", "name=\"process\"", "name=\"map\""] {
        assert!(page.body.contains(field), "{field}");
    }
    // Without JavaScript the map is a link to its own page.
    // The template writes each & of the address as &#38;.
    let link = "<a href=\"/design/map?aql=1%25&#38;rql=6%25&#38;alpha=0.05&#38;beta=0.10&#38;lot_size=2000&#38;scheme=single&#38;cost=2&#38;map=7\">";
    assert!(page.body.contains(link), "{}", page.body);
    let map = server.get(
        "/design/map?aql=1%25&rql=6%25&alpha=0.05&beta=0.10&lot_size=2000&scheme=single&cost=2&map=7",
        None,
    );
    assert_eq!(map.status, 200);
    assert!(map.body.contains("<svg"));
    // A cost without a lot size: the plan, and what is missing in words.
    let no_lot = server.get("/design?aql=1%25&rql=6%25&cost=2", None);
    assert_eq!(no_lot.status, 200);
    assert!(no_lot.body.contains("need a lot size"), "{}", no_lot.body);
    // A multiple plan's map is of single plans, and says so.
    let multiple = server.get("/design/map?aql=1%25&rql=6%25&scheme=multiple", None);
    assert_eq!(multiple.status, 200, "{}", multiple.body);
    assert!(multiple.body.contains("The map is of single plans"));
}

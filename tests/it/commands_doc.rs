//! docs/commands.md, the command reference, is the tool's own help: this
//! test runs `lotsman --help` and `lotsman COMMAND --help` for every
//! command the help lists, puts them together as the page (a heading per
//! command, its help in a `text` block), and fails when the page differs.
//! `LOTSMAN_DOCS=overwrite cargo test --test it commands_doc` writes the
//! page anew (the switch of tests/it/docs.rs).
//!
//! Trailing spaces, which clap leaves on the blank lines of a long help,
//! are taken off, so that an editor that strips them changes nothing.

use std::process::Command;

/// Where the page lives, from the repository root.
const PAGE: &str = "docs/commands.md";

/// What `lotsman ARGS --help` prints, each line's trailing spaces taken
/// off.
fn help(args: &[&str]) -> String {
    let out = Command::new(env!("CARGO_BIN_EXE_lotsman"))
        .args(args)
        .arg("--help")
        .output()
        .unwrap();
    assert!(out.status.success(), "lotsman {args:?} --help failed");
    let text = String::from_utf8(out.stdout).unwrap();
    text.lines()
        .map(|l| l.trim_end().to_string() + "\n")
        .collect()
}

/// The commands the top-level help lists under `Commands:`, in its order,
/// without clap's own `help`.
fn commands(top: &str) -> Vec<String> {
    top.lines()
        .skip_while(|l| *l != "Commands:")
        .skip(1)
        .take_while(|l| !l.is_empty())
        .filter_map(|l| l.split_whitespace().next())
        .filter(|name| *name != "help")
        .map(str::to_string)
        .collect()
}

/// The page: a short introduction, an index, then each help in turn.
fn page() -> String {
    let top = help(&[]);
    let names = commands(&top);
    let mut page = String::from(
        "# Command reference\n\
         \n\
         Every command's help, as `lotsman COMMAND --help` prints it in this\n\
         version. The page is made from the tool itself by\n\
         `tests/it/commands_doc.rs`, which fails when the two differ; after a\n\
         change of a flag, `LOTSMAN_DOCS=overwrite cargo test --test it\n\
         commands_doc` writes it anew. The commands at a glance, how\n\
         qualities and models are read and what the exit codes mean are in\n\
         [Commands, inputs and exit codes](usage.md).\n\
         \n\
         Back to the [README](../README.md); the other pages are listed there.\n\
         \n",
    );
    page.push_str("- [lotsman](#lotsman)\n");
    for name in &names {
        page.push_str(&format!("- [{name}](#lotsman-{name})\n"));
    }
    let mut section = |title: &str, text: &str| {
        page.push_str(&format!("\n## {title}\n\n```text\n{text}```\n"));
    };
    section("lotsman", &top);
    for name in &names {
        section(&format!("lotsman {name}"), &help(&[name]));
    }
    page
}

#[test]
fn the_command_reference_is_the_help_the_tool_prints() {
    let now = page();
    let shown = std::fs::read_to_string(PAGE).unwrap_or_default();
    if std::env::var("LOTSMAN_DOCS").is_ok_and(|v| v == "overwrite") {
        if shown != now {
            std::fs::write(PAGE, &now).unwrap();
        }
        return;
    }
    assert!(
        shown == now,
        "{PAGE} differs from the help the tool prints; if the change of the help is meant, \
         write the page anew with: LOTSMAN_DOCS=overwrite cargo test --test it commands_doc\n\n{}",
        first_difference(&shown, &now)
    );
}

#[test]
fn every_command_of_the_help_is_found() {
    let names = commands(&help(&[]));
    assert_eq!(
        names,
        [
            "design", "evaluate", "compare", "verify", "judge", "sheet", "tradeoff", "new", "demo",
            "rectify", "standard", "draw", "status", "history", "serve"
        ]
    );
}

/// The first line at which `shown` and `now` differ, both ways.
fn first_difference(shown: &str, now: &str) -> String {
    let (a, b): (Vec<&str>, Vec<&str>) = (shown.lines().collect(), now.lines().collect());
    let at = a
        .iter()
        .zip(&b)
        .position(|(x, y)| x != y)
        .unwrap_or(a.len().min(b.len()));
    format!(
        "line {}:\n  the page: {:?}\n  the tool: {:?}",
        at + 1,
        a.get(at).unwrap_or(&"(end of page)"),
        b.get(at).unwrap_or(&"(end of help)")
    )
}

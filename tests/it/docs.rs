//! The docs cannot drift: every command example in README.md and docs/*.md
//! is run, and what it prints is compared with what the page shows.
//!
//! An example is a fenced block whose info string is `console`:
//!
//! ````text
//! ```console
//! $ lotsman verify plans
//! 7 match, 0 mismatch, 0 invalid
//! ```
//! ````
//!
//! - A line starting with `$ ` is a command, run by `sh -c` (so `>`, `|`
//!   and `#` comments work) with this build's `lotsman` first on the PATH;
//!   a command line ending in `\` goes on on the next line, as in a shell.
//! - The lines after it, up to the next command or the end of the block,
//!   are what it prints: stdout and stderr together, in the order written.
//!   Trailing spaces and trailing blank lines are not compared.
//! - A line `? CODE` right after a command gives its exit code (`? 2`);
//!   without one the command must succeed (exit code 0).
//! - A long output may be cut: `...` alone on a line stands for any lines,
//!   `[..]` inside a line for any characters (trycmd's and snapbox's
//!   marks, compared with snapbox).
//! - Each page runs in a fresh temporary folder holding a copy of `plans/`,
//!   its blocks in page order, so a file one example writes is there for
//!   the next (`lotsman new binomial > cover.yaml`, then
//!   `lotsman design cover.yaml --in-place`). A block inside an HTML
//!   comment (`<!-- ... -->`) runs too but is not shown: it makes the files
//!   an example needs without cluttering the page.
//!
//! A table whose header has an `Example` column and a `Message` column
//! (the refusals page) is run too: each row's example, one inline code
//! span, is run as `lotsman EXAMPLE` after the page's console blocks, must
//! fail (exit code 2, or 1 when the row says `exit 1`), and must print the
//! row's message, one inline code span, as a whole line (after
//! `lotsman: error: ` when it is an error), where `(...)` stands for any
//! characters. A row without an example shows `—` in its place.
//!
//! Any other fenced block that shows a `lotsman` command fails the test, so
//! no example can escape it. To bring a page up to date after a change of
//! output, run `LOTSMAN_DOCS=overwrite cargo test --test it docs`: each
//! example that differs gets the output printed now in place of its own
//! (its cuts are lost: put them back where the page should stay short).
//! A new page in docs/ is picked up by itself.

use std::path::{Path, PathBuf};
use std::process::Command;

use snapbox::IntoData;

/// One command of an example: where it stands, what it runs, the exit
/// code it must give and the lines (0-based, end excluded) of the page
/// that hold its output.
struct Example {
    line: usize,
    command: String,
    code: i32,
    output: std::ops::Range<usize>,
}

/// The examples of a page, in order; panics on a fenced block that shows
/// a lotsman command without being a `console` block.
fn examples(page: &str, lines: &[&str]) -> Vec<Example> {
    let mut examples: Vec<Example> = Vec::new();
    let mut fence: Option<String> = None;
    let mut i = 0;
    while i < lines.len() {
        let line = lines[i];
        let trimmed = line.trim_start();
        if let Some(info) = trimmed.strip_prefix("```") {
            fence = match fence {
                None => Some(info.trim().to_string()),
                Some(_) => None,
            };
            i += 1;
            continue;
        }
        match fence.as_deref() {
            Some("console") => {}
            Some(_) => {
                assert!(
                    !(trimmed.starts_with("$ lotsman") || trimmed.starts_with("lotsman ")),
                    "{page}:{}: a lotsman command outside a console block, so never run: {line}",
                    i + 1
                );
                i += 1;
                continue;
            }
            None => {
                i += 1;
                continue;
            }
        }
        if let Some(first) = line.strip_prefix("$ ") {
            let start = i;
            let mut command = first.to_string();
            while command.ends_with('\\') && i + 1 < lines.len() {
                i += 1;
                command.push('\n');
                command.push_str(lines[i]);
            }
            i += 1;
            let mut code = 0;
            if let Some(c) = lines.get(i).and_then(|l| l.strip_prefix("? ")) {
                code = c
                    .trim()
                    .parse()
                    .unwrap_or_else(|_| panic!("{page}:{}: '? {c}' is no exit code", i + 1));
                i += 1;
            }
            examples.push(Example {
                line: start + 1,
                command,
                code,
                output: i..i,
            });
            continue;
        }
        if let Some(last) = examples.last_mut()
            && last.output.end == i
        {
            last.output.end = i + 1;
        } else {
            panic!(
                "{page}:{}: output before any command in a console block: {line}",
                i + 1
            );
        }
        i += 1;
    }
    examples
}

/// One row of a refusals table: where it stands, the arguments after
/// `lotsman`, the exit code and the message it must print.
struct Refusal {
    line: usize,
    example: String,
    code: i32,
    message: String,
}

/// The cells of a table row, split at the `|` that are not escaped.
fn cells(line: &str) -> Vec<String> {
    let inner = line.trim().trim_start_matches('|').trim_end_matches('|');
    let mut cells = vec![String::new()];
    let mut chars = inner.chars().peekable();
    while let Some(ch) = chars.next() {
        match ch {
            '\\' if chars.peek() == Some(&'|') => {
                cells.last_mut().unwrap().push('|');
                chars.next();
            }
            '|' => cells.push(String::new()),
            _ => cells.last_mut().unwrap().push(ch),
        }
    }
    cells.iter().map(|c| c.trim().to_string()).collect()
}

/// The text of a cell that is exactly one inline code span.
fn code_span(cell: &str) -> Option<&str> {
    let inner = cell.strip_prefix('`')?.strip_suffix('`')?;
    (!inner.contains('`')).then_some(inner)
}

/// The rows of the page's tables headed `Example` and `Message ...`;
/// panics on a row whose example or message is not one code span.
fn refusal_rows(page: &str, lines: &[&str]) -> Vec<Refusal> {
    let mut rows = Vec::new();
    let mut columns: Option<(usize, usize)> = None;
    for (i, line) in lines.iter().enumerate() {
        if !line.starts_with('|') {
            columns = None;
            continue;
        }
        let row = cells(line);
        if columns.is_none() {
            let example = row.iter().position(|c| c == "Example");
            let message = row.iter().position(|c| c.starts_with("Message"));
            if let (Some(e), Some(m)) = (example, message) {
                columns = Some((e, m));
            }
            continue;
        }
        let Some((e, m)) = columns else { continue };
        if row[e].starts_with("---") || row[e] == "—" {
            continue;
        }
        let (Some(example), Some(message)) = (code_span(&row[e]), code_span(&row[m])) else {
            panic!(
                "{page}:{}: a refusal row needs its example and its message as one code span each: {line}",
                i + 1
            );
        };
        rows.push(Refusal {
            line: i + 1,
            example: example.to_string(),
            code: if line.contains("exit 1") { 1 } else { 2 },
            message: message.to_string(),
        });
    }
    rows
}

/// Whether the printed `line` says `message`, after `lotsman: error: ` or
/// on its own, with `(...)` in the message standing for any characters.
fn says(line: &str, message: &str) -> bool {
    let line = line.strip_prefix("lotsman: error: ").unwrap_or(line);
    let parts: Vec<&str> = message.split("(...)").collect();
    let (first, last) = (parts[0], parts[parts.len() - 1]);
    if parts.len() == 1 {
        return line == message;
    }
    if !line.starts_with(first) || !line[first.len()..].ends_with(last) {
        return false;
    }
    let mut rest = &line[first.len()..line.len() - last.len()];
    for part in &parts[1..parts.len() - 1] {
        match rest.find(part) {
            Some(at) => rest = &rest[at + part.len()..],
            None => return false,
        }
    }
    true
}

/// `text` with the trailing spaces of each line and the trailing blank
/// lines taken off.
fn trimmed(text: &str) -> String {
    let lines: Vec<&str> = text.lines().map(str::trim_end).collect();
    let end = lines
        .iter()
        .rposition(|l| !l.is_empty())
        .map_or(0, |at| at + 1);
    lines[..end].join("\n")
}

/// Copies the folder `from` into `to`, files only.
fn copy_folder(from: &Path, to: &Path) {
    std::fs::create_dir_all(to).unwrap();
    for entry in std::fs::read_dir(from).unwrap() {
        let entry = entry.unwrap();
        if entry.file_type().unwrap().is_file() {
            std::fs::copy(entry.path(), to.join(entry.file_name())).unwrap();
        }
    }
}

/// Runs the examples of the page at `path` (from the repository root);
/// returns the failures, each with the page's line, and rewrites the page
/// when `LOTSMAN_DOCS=overwrite`.
fn run_page(path: &Path) -> Vec<String> {
    let page = path.display().to_string();
    let text = std::fs::read_to_string(path).unwrap();
    let lines: Vec<&str> = text.lines().collect();
    let examples = examples(&page, &lines);
    let dir = tempfile::tempdir().unwrap();
    copy_folder(Path::new("plans"), &dir.path().join("plans"));
    let binary = PathBuf::from(env!("CARGO_BIN_EXE_lotsman"));
    let path_var = std::env::join_paths(
        std::iter::once(binary.parent().unwrap().to_path_buf()).chain(std::env::split_paths(
            &std::env::var_os("PATH").unwrap_or_default(),
        )),
    )
    .unwrap();
    let overwrite = std::env::var("LOTSMAN_DOCS").is_ok_and(|v| v == "overwrite");
    let mut failures = Vec::new();
    let mut replacements: Vec<(std::ops::Range<usize>, String)> = Vec::new();
    let run = |command: &str| {
        let out = Command::new("bash")
            .arg("-c")
            .arg(format!("exec 2>&1\n{command}"))
            .current_dir(dir.path())
            .env("PATH", &path_var)
            .env("LC_ALL", "C.UTF-8")
            .output()
            .unwrap();
        let printed = trimmed(&String::from_utf8_lossy(&out.stdout));
        (out.status.code().unwrap_or(-1), printed)
    };
    for example in &examples {
        let (code, printed) = run(&example.command);
        let shown = trimmed(&lines[example.output.clone()].join("\n"));
        let where_ = format!("{page}:{}: $ {}", example.line, example.command);
        if code != example.code {
            failures.push(format!(
                "{where_}\nexit code {code}, the page says {} (add '? {code}' after the command if that is right); it printed:\n{printed}",
                example.code
            ));
            continue;
        }
        let compared = snapbox::Assert::new().normalize_paths(false).try_eq(
            Some(&where_),
            printed.clone().into_data(),
            shown.into_data(),
        );
        if let Err(diff) = compared {
            failures.push(format!("{where_}\n{diff}"));
            replacements.push((example.output.clone(), printed));
        }
    }
    for row in refusal_rows(&page, &lines) {
        let (code, printed) = run(&format!("lotsman {}", row.example));
        let where_ = format!("{page}:{}: lotsman {}", row.line, row.example);
        if code != row.code {
            failures.push(format!(
                "{where_}\nexit code {code}, the row says {}; it printed:\n{printed}",
                row.code
            ));
        } else if !printed.lines().any(|l| says(l, &row.message)) {
            failures.push(format!(
                "{where_}\nno line says the row's message\n  {}\nit printed:\n{printed}",
                row.message
            ));
        }
    }
    if overwrite && !replacements.is_empty() {
        let mut new: Vec<String> = lines.iter().map(|l| l.to_string()).collect();
        for (range, printed) in replacements.into_iter().rev() {
            let with: Vec<String> = if printed.is_empty() {
                Vec::new()
            } else {
                printed.lines().map(str::to_string).collect()
            };
            new.splice(range, with);
        }
        std::fs::write(path, new.join("\n") + "\n").unwrap();
    }
    failures
}

/// The pages whose examples run: README.md and every docs/*.md.
fn pages() -> Vec<PathBuf> {
    let mut pages: Vec<PathBuf> = std::fs::read_dir("docs")
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|x| x == "md"))
        .collect();
    pages.sort();
    pages.insert(0, PathBuf::from("README.md"));
    pages
}

#[test]
fn every_command_example_in_the_docs_prints_what_the_page_shows() {
    let mut failures = Vec::new();
    let mut count = 0;
    for page in pages() {
        let text = std::fs::read_to_string(&page).unwrap();
        let lines: Vec<&str> = text.lines().collect();
        count += examples(&page.display().to_string(), &lines).len();
        count += refusal_rows(&page.display().to_string(), &lines).len();
        failures.extend(run_page(&page));
    }
    assert!(count > 0, "no examples found");
    assert!(
        failures.is_empty(),
        "{} of {count} doc examples differ from what the tool prints:\n\n{}",
        failures.len(),
        failures.join("\n\n")
    );
}

#[test]
fn the_runner_reads_commands_codes_and_outputs() {
    let page = "\
```console
$ lotsman verify plans
? 1
...
7 match
$ lotsman design --aql 1% \\
      --rql 6%
```
```text
not run
```
";
    let lines: Vec<&str> = page.lines().collect();
    let found = examples("page", &lines);
    assert_eq!(found.len(), 2);
    assert_eq!(found[0].command, "lotsman verify plans");
    assert_eq!(found[0].code, 1);
    assert_eq!(found[0].output, 3..5);
    assert_eq!(
        found[1].command,
        "lotsman design --aql 1% \\\n      --rql 6%"
    );
    assert_eq!(found[1].code, 0);
    assert_eq!(found[1].output, 7..7);
}

#[test]
#[should_panic(expected = "outside a console block")]
fn a_lotsman_command_outside_a_console_block_is_refused() {
    let page = "```text\n$ lotsman verify plans\n```\n";
    let lines: Vec<&str> = page.lines().collect();
    examples("page", &lines);
}

#[test]
fn a_cut_matches_any_lines_and_nothing_else_passes() {
    let assert = snapbox::Assert::new().normalize_paths(false);
    let printed = "a\nb\nc 12 d\ne";
    assert!(
        assert
            .try_eq(None, printed.into_data(), "a\n...\nc [..] d\ne".into_data())
            .is_ok()
    );
    assert!(
        assert
            .try_eq(None, printed.into_data(), "a\nc 12 d\ne".into_data())
            .is_err()
    );
}

#[test]
fn a_refusal_row_is_read_and_its_message_matched_with_cuts() {
    let page = "\
| Input | Example | Message (after `lotsman: error: `) |
| --- | --- | --- |
| Crossed points | `design --aql 6% --rql 1%` | `the AQL 0.06 (...) RQL 0.01` |
| A forged sheet (exit 1) | `verify s.yaml --sheet f.pdf` | `mismatch  s.yaml: f.pdf` |
| A numerical failure | — | `numerical failure` |
";
    let lines: Vec<&str> = page.lines().collect();
    let rows = refusal_rows("page", &lines);
    assert_eq!(rows.len(), 2);
    assert_eq!(rows[0].example, "design --aql 6% --rql 1%");
    assert_eq!((rows[0].code, rows[1].code), (2, 1));
    assert!(says(
        "lotsman: error: the AQL 0.06 must be below the RQL 0.01",
        &rows[0].message
    ));
    assert!(!says(
        "lotsman: error: the AQL 0.06 must be below the RQL 0.02",
        &rows[0].message
    ));
    assert!(says("mismatch  s.yaml: f.pdf", &rows[1].message));
    assert!(!says("mismatch  s.yaml: f.pdf and more", &rows[1].message));
}

/// Every picture and every link to another page of the docs leads to a
/// file of the repository (a screenshot renamed, a page moved, would
/// leave a hole in the guide).
#[test]
fn every_picture_and_page_link_leads_to_a_file() {
    let mut checked = 0;
    for page in pages() {
        let text = std::fs::read_to_string(&page).unwrap();
        let folder = page.parent().unwrap();
        for (at, _) in text.match_indices("](") {
            let rest = &text[at + 2..];
            let Some(end) = rest.find(')') else { continue };
            let target = rest[..end].split('#').next().unwrap();
            if target.is_empty() || target.contains("://") || target.contains(' ') {
                continue;
            }
            assert!(
                folder.join(target).exists(),
                "{}: {target} does not exist",
                page.display()
            );
            checked += 1;
        }
    }
    assert!(checked > 20, "only {checked} links read");
}

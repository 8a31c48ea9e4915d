//! Batch work from the command line: `verify`, `sheet` and `evaluate` over
//! folders and many files; exit codes, summaries, one entry per source,
//! stable order, sheets in mirrored folders, and a quiet stderr off a
//! terminal.

use crate::common;
use common::lotsman;

use std::path::{Path, PathBuf};

use predicates::prelude::*;
use serde_json::Value;

fn put(root: &Path, name: &str, text: &str) -> PathBuf {
    let path = root.join(name);
    std::fs::create_dir_all(path.parent().unwrap()).unwrap();
    std::fs::write(&path, text).unwrap();
    path
}

fn demo(name: &str) -> String {
    std::fs::read_to_string(format!("plans/{name}")).unwrap()
}

/// A folder of plan sources:
///
/// ```text
/// cover.yaml                 good (hypergeometric single)
/// east/seal.yaml             good
/// east/deeper/impeller.yml   good (double)
/// east/edited.yaml           the seal plan with n hand-edited: mismatch
/// west/broken.yaml           a misspelt field: invalid
/// west/.draft.yaml           hidden: skipped
/// west/notes.txt             not a source: skipped
/// ```
fn plan_folder() -> tempfile::TempDir {
    let dir = tempfile::tempdir().unwrap();
    let root = dir.path();
    put(root, "cover.yaml", &demo("tpw-cover-fit.yaml"));
    put(root, "east/seal.yaml", &demo("tpw-seal-visual.yaml"));
    put(
        root,
        "east/deeper/impeller.yml",
        &demo("tpw-impeller-porosity.yaml"),
    );
    put(
        root,
        "east/edited.yaml",
        &demo("tpw-seal-visual.yaml").replace("n: 166", "n: 150"),
    );
    put(
        root,
        "west/broken.yaml",
        &demo("tpw-cover-fit.yaml").replace("lot_size: 400", "lotsize: 400"),
    );
    put(root, "west/.draft.yaml", "not even YAML: [");
    put(root, "west/notes.txt", "not a source");
    dir
}

/// The paths of a folder's sources in the order the batch gives them.
fn expected_order(root: &Path) -> Vec<String> {
    [
        "cover.yaml",
        "east/deeper/impeller.yml",
        "east/edited.yaml",
        "east/seal.yaml",
        "west/broken.yaml",
    ]
    .iter()
    .map(|name| root.join(name).display().to_string())
    .collect()
}

fn stdout_of(args: &[&str], code: i32) -> String {
    let out = lotsman()
        .args(args)
        .assert()
        .code(code)
        .get_output()
        .clone();
    String::from_utf8(out.stdout).unwrap()
}

#[test]
fn verify_of_a_folder_counts_every_outcome_and_gives_one_line_per_failure() {
    let dir = plan_folder();
    let root = dir.path();
    let out = stdout_of(&["verify", root.to_str().unwrap()], 2);
    let lines: Vec<&str> = out.lines().collect();
    assert_eq!(lines.len(), 3, "{out}");
    assert_eq!(
        lines[0],
        format!(
            "mismatch  {}: stage 1 n: recorded 150, re-solved 166",
            root.join("east/edited.yaml").display()
        )
    );
    assert!(
        lines[1].starts_with(&format!(
            "invalid   {}: line 15: 'lotsize' is not a key of a plan source; did you mean lot_size?",
            root.join("west/broken.yaml").display()
        )),
        "{}",
        lines[1]
    );
    assert!(
        lines[1].contains("line 15"),
        "the parser's place: {}",
        lines[1]
    );
    assert_eq!(lines[2], "3 match, 1 mismatch, 1 invalid");
}

#[test]
fn the_exit_code_is_the_worst_outcome() {
    let dir = plan_folder();
    let root = dir.path();
    let good = root.join("east/seal.yaml");
    let edited = root.join("east/edited.yaml");
    let broken = root.join("west/broken.yaml");
    let path = |p: &PathBuf| p.to_str().unwrap().to_string();
    lotsman()
        .args([
            "verify",
            &path(&good),
            &root.join("cover.yaml").display().to_string(),
        ])
        .assert()
        .code(0)
        .stdout("2 match, 0 mismatch, 0 invalid\n");
    lotsman()
        .args(["verify", &path(&edited), &path(&good)])
        .assert()
        .code(1);
    // The invalid file comes first and still does not stop the others.
    lotsman()
        .args(["verify", &path(&broken), &path(&edited), &path(&good)])
        .assert()
        .code(2)
        .stdout(predicate::str::ends_with(
            "1 match, 1 mismatch, 1 invalid\n",
        ));
}

#[test]
fn missing_paths_and_empty_folders_are_invalid_entries_and_the_rest_is_verified() {
    let dir = plan_folder();
    let root = dir.path();
    std::fs::create_dir(root.join("empty")).unwrap();
    put(root, "text-only/readme.txt", "no sources here");
    let out = stdout_of(
        &[
            "verify",
            root.join("no-such.yaml").to_str().unwrap(),
            root.join("empty").to_str().unwrap(),
            root.join("text-only").to_str().unwrap(),
            root.join("east/seal.yaml").to_str().unwrap(),
        ],
        2,
    );
    let lines: Vec<&str> = out.lines().collect();
    assert_eq!(lines.len(), 4, "{out}");
    assert!(lines[0].starts_with(&format!(
        "invalid   {}: does not exist; give a plan source (FILE.yaml) or a folder that holds some",
        root.join("no-such.yaml").display()
    )));
    for (line, folder) in lines[1..3].iter().zip(["empty", "text-only"]) {
        assert!(
            line.starts_with(&format!(
                "invalid   {}: the folder holds no plan sources",
                root.join(folder).display()
            )),
            "{line}"
        );
    }
    assert_eq!(lines[3], "1 match, 0 mismatch, 3 invalid");
}

#[test]
fn list_shows_every_source_in_order() {
    let dir = plan_folder();
    let out = stdout_of(&["verify", dir.path().to_str().unwrap(), "--list"], 2);
    let rows: Vec<&str> = out
        .lines()
        .filter(|l| l.starts_with(' ') && !l.starts_with(" Source"))
        .collect();
    let paths: Vec<&str> = rows
        .iter()
        .map(|r| r.split_whitespace().next().unwrap())
        .collect();
    assert_eq!(paths, expected_order(dir.path()));
    let results: Vec<&str> = rows
        .iter()
        .map(|r| r.split_whitespace().nth(1).unwrap())
        .collect();
    assert_eq!(results, ["match", "match", "mismatch", "match", "invalid"]);
    assert!(out.ends_with("3 match, 1 mismatch, 1 invalid\n"));
}

#[test]
fn json_and_csv_give_one_entry_per_source_in_a_stable_order_and_the_summary_on_stderr() {
    let dir = plan_folder();
    let root = dir.path().to_str().unwrap();
    let run = |format: &str| {
        let out = lotsman()
            .args(["verify", root, "--format", format])
            .assert()
            .code(2)
            .stderr(predicate::str::ends_with(
                "3 match, 1 mismatch, 1 invalid\n",
            ))
            .get_output()
            .clone();
        String::from_utf8(out.stdout).unwrap()
    };
    let json = run("json");
    assert_eq!(json, run("json"), "two runs print the same bytes");
    let v: Value = serde_json::from_str(&json).unwrap();
    let results = v["results"].as_array().unwrap();
    let paths: Vec<&str> = results
        .iter()
        .map(|r| r["path"].as_str().unwrap())
        .collect();
    assert_eq!(paths, expected_order(dir.path()));
    let statuses: Vec<&str> = results
        .iter()
        .map(|r| r["status"].as_str().unwrap())
        .collect();
    assert_eq!(statuses, ["match", "match", "mismatch", "match", "invalid"]);
    assert_eq!(results[2]["differences"][0]["field"], "stage 1 n");
    let csv = run("csv");
    let rows: Vec<&str> = csv.lines().skip(1).collect();
    assert_eq!(
        rows.len(),
        5,
        "no source differs in more than one field: {csv}"
    );
    for (row, path) in rows.iter().zip(expected_order(dir.path())) {
        assert!(row.starts_with(&format!("{path},")), "{row}");
    }
}

#[test]
fn a_file_reached_twice_is_verified_once() {
    let dir = plan_folder();
    let root = dir.path();
    let seal = root.join("east/seal.yaml");
    let again = root.join("east/../east/seal.yaml");
    let out = stdout_of(
        &[
            "verify",
            seal.to_str().unwrap(),
            root.join("east").to_str().unwrap(),
            again.to_str().unwrap(),
            "--format",
            "json",
        ],
        1,
    );
    let v: Value = serde_json::from_str(&out).unwrap();
    let paths: Vec<&str> = v["results"]
        .as_array()
        .unwrap()
        .iter()
        .map(|r| r["path"].as_str().unwrap())
        .collect();
    assert_eq!(
        paths,
        [
            seal.display().to_string(),
            root.join("east/deeper/impeller.yml").display().to_string(),
            root.join("east/edited.yaml").display().to_string(),
        ]
    );
}

#[test]
fn verify_sheet_refuses_a_folder_and_a_source_named_twice() {
    let dir = plan_folder();
    let root = dir.path();
    let seal = root.join("east/seal.yaml");
    lotsman()
        .args([
            "verify",
            root.join("east").to_str().unwrap(),
            "--sheet",
            "x.pdf",
        ])
        .assert()
        .code(2)
        .stdout("")
        .stderr(predicate::str::contains(format!(
            "{} is a folder; name its sources one by one",
            root.join("east").display()
        )));
    lotsman()
        .args([
            "verify",
            seal.to_str().unwrap(),
            seal.to_str().unwrap(),
            "--sheet",
            "a.pdf",
            "--sheet",
            "b.pdf",
        ])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("a source is named twice"));
}

#[test]
fn verify_sheet_still_pairs_each_named_source_with_its_sheet() {
    let dir = plan_folder();
    let root = dir.path();
    let seal = root.join("east/seal.yaml");
    let cover = root.join("cover.yaml");
    let out = root.join("out");
    lotsman()
        .args([
            "sheet",
            seal.to_str().unwrap(),
            cover.to_str().unwrap(),
            "--output-dir",
            out.to_str().unwrap(),
        ])
        .assert()
        .success();
    let (seal_pdf, cover_pdf) = (out.join("seal.pdf"), out.join("cover.pdf"));
    let args = |first: &Path, second: &Path| {
        vec![
            "verify".to_string(),
            seal.display().to_string(),
            cover.display().to_string(),
            "--sheet".to_string(),
            first.display().to_string(),
            "--sheet".to_string(),
            second.display().to_string(),
        ]
    };
    lotsman().args(args(&seal_pdf, &cover_pdf)).assert().code(0);
    lotsman()
        .args(args(&cover_pdf, &seal_pdf))
        .assert()
        .code(1)
        .stdout(predicate::str::contains("source SHA-256"));
}

#[test]
fn sheet_of_a_folder_mirrors_its_subfolders_and_refuses_a_second_sheet_of_one_name() {
    let dir = tempfile::tempdir().unwrap();
    let root = dir.path().join("in");
    put(&root, "a.yaml", &demo("tpw-seal-visual.yaml"));
    put(&root, "a.yml", &demo("tpw-cover-fit.yaml"));
    put(&root, "east/a.yaml", &demo("tpw-cover-fit.yaml"));
    put(&root, "west/a.yaml", &demo("tpw-housing-finish.yaml"));
    put(
        &root,
        "west/unsolved.yaml",
        &demo("tpw-cover-fit.yaml")[..demo("tpw-cover-fit.yaml").find("plan:").unwrap()],
    );
    let out = dir.path().join("out/sheets");
    let printed = stdout_of(
        &[
            "sheet",
            root.to_str().unwrap(),
            "--output-dir",
            out.to_str().unwrap(),
        ],
        2,
    );
    let lines: Vec<&str> = printed.lines().collect();
    assert_eq!(lines.len(), 3, "{printed}");
    assert!(lines[0].starts_with(&format!(
        "invalid   {}: its sheet {} is already the sheet of {}",
        root.join("a.yml").display(),
        out.join("a.pdf").display(),
        root.join("a.yaml").display()
    )));
    assert!(
        lines[1].starts_with(&format!(
            "invalid   {}: ",
            root.join("west/unsolved.yaml").display()
        )) && lines[1].contains("records no plan"),
        "{}",
        lines[1]
    );
    assert_eq!(lines[2], "3 written, 2 invalid");
    // Each written sheet is the sheet of its own source: a.pdf of a.yaml,
    // not of a.yml.
    for (pdf, source) in [
        ("a.pdf", "a.yaml"),
        ("east/a.pdf", "east/a.yaml"),
        ("west/a.pdf", "west/a.yaml"),
    ] {
        lotsman()
            .args([
                "verify",
                root.join(source).to_str().unwrap(),
                "--sheet",
                out.join(pdf).to_str().unwrap(),
            ])
            .assert()
            .code(0);
    }
    assert!(!out.join("west/unsolved.pdf").exists());
    let mut pdfs: Vec<PathBuf> = Vec::new();
    for sub in ["", "east", "west"] {
        for e in std::fs::read_dir(out.join(sub)).unwrap() {
            let p = e.unwrap().path();
            if p.is_file() {
                pdfs.push(p);
            }
        }
    }
    assert_eq!(pdfs.len(), 3, "{pdfs:?}");
}

#[test]
fn sheet_of_a_folder_without_an_output_folder_writes_beside_each_source() {
    let dir = plan_folder();
    let root = dir.path();
    let printed = stdout_of(&["sheet", root.join("east").to_str().unwrap()], 2);
    // edited.yaml is a valid source whose plan a re-solve does not
    // confirm: refused, and the others are printed.
    let lines: Vec<&str> = printed.lines().collect();
    assert_eq!(lines.len(), 2, "{printed}");
    assert!(
        lines[0].starts_with(&format!(
            "invalid   {}: recorded plan differs from a re-solve: stage 1 n: recorded 150, re-solved 166",
            root.join("east/edited.yaml").display()
        )),
        "{printed}"
    );
    assert_eq!(lines[1], "2 written, 1 invalid");
    for name in ["seal", "deeper/impeller"] {
        assert!(root.join(format!("east/{name}.pdf")).exists(), "{name}");
    }
    assert!(!root.join("east/edited.pdf").exists());
}

#[test]
fn sheet_output_names_one_pdf_and_is_refused_with_a_folder() {
    let dir = plan_folder();
    lotsman()
        .args([
            "sheet",
            dir.path().join("east").to_str().unwrap(),
            "--output",
            dir.path().join("x.pdf").to_str().unwrap(),
        ])
        .assert()
        .code(2)
        .stderr(predicate::str::contains(
            "--output names one PDF; for several sources or a folder use --output-dir DIR",
        ));
    assert!(!dir.path().join("x.pdf").exists());
}

#[test]
fn evaluate_of_a_folder_gives_each_source_under_its_path_then_the_summary() {
    let dir = plan_folder();
    let root = dir.path();
    put(
        root,
        "vars/thickness.yaml",
        &demo("tpw-cover-thickness.yaml"),
    );
    let out = stdout_of(&["evaluate", root.to_str().unwrap(), "--at", "1%,6%"], 2);
    let mut order = expected_order(root);
    // vars/ sorts between east/ and west/.
    order.insert(4, root.join("vars/thickness.yaml").display().to_string());
    let headers: Vec<String> = out
        .lines()
        .filter_map(|l| l.strip_prefix("Source ").map(str::to_string))
        .collect();
    assert_eq!(headers, order);
    assert!(out.contains("Plan 62:2:3 (N:AC:RE), hypergeometric model, lot of 400 units"));
    assert!(out.contains("Plan n = 42, k = 1.901"), "the variables plan");
    // The edited plan is refused as the audit finds it (issue 14, item 7),
    // as sheet refuses it; --accept-recorded evaluates it as recorded.
    assert!(!out.contains("Plan 150:3:4"), "the edited plan is refused");
    assert!(out.contains("invalid: "));
    let lines: Vec<&str> = out.lines().collect();
    assert!(lines[lines.len() - 3].starts_with(&format!(
        "invalid   {}: recorded plan differs from a re-solve: ",
        root.join("east/edited.yaml").display()
    )));
    assert!(lines[lines.len() - 2].starts_with(&format!(
        "invalid   {}: line 15: 'lotsize' is not a key of a plan source; did you mean lot_size?",
        root.join("west/broken.yaml").display()
    )));
    assert_eq!(lines[lines.len() - 1], "4 evaluated, 2 invalid");
    let root_s = root.to_str().unwrap();
    let accepted = stdout_of(
        &["evaluate", root_s, "--at", "1%,6%", "--accept-recorded"],
        2,
    );
    assert!(accepted.contains("Plan 150:3:4"), "evaluated as recorded");
    assert!(accepted.ends_with("5 evaluated, 1 invalid\n"), "{accepted}");
}

#[test]
fn evaluate_json_and_csv_over_many_sources_have_one_entry_each() {
    let dir = plan_folder();
    let root = dir.path();
    let broken = root.join("west/broken.yaml");
    let missing = root.join("missing.yaml");
    let args = |format: &'static str| {
        vec![
            "evaluate".to_string(),
            "plans/tpw-cover-fit.yaml".to_string(),
            broken.display().to_string(),
            "plans/tpw-cover-thickness.yaml".to_string(),
            missing.display().to_string(),
            "--at".to_string(),
            "1%,6%".to_string(),
            "--format".to_string(),
            format.to_string(),
        ]
    };
    let out = lotsman()
        .args(args("json"))
        .assert()
        .code(2)
        .stderr(predicate::str::ends_with("2 evaluated, 2 invalid\n"))
        .get_output()
        .clone();
    let v: Value = serde_json::from_slice(&out.stdout).unwrap();
    let results = v["results"].as_array().unwrap();
    assert_eq!(results.len(), 4);
    let alone: Value = serde_json::from_slice(
        &lotsman()
            .args([
                "evaluate",
                "plans/tpw-cover-fit.yaml",
                "--at",
                "1%,6%",
                "--format",
                "json",
            ])
            .assert()
            .success()
            .get_output()
            .stdout,
    )
    .unwrap();
    assert_eq!(results[0]["path"], "plans/tpw-cover-fit.yaml");
    assert_eq!(results[0]["status"], "ok");
    assert_eq!(results[0]["evaluation"], alone, "the same object as alone");
    assert!(results[0].get("message").is_none());
    assert_eq!(results[1]["status"], "invalid");
    assert!(results[1]["message"].as_str().unwrap().contains("lotsize"));
    assert!(results[1].get("evaluation").is_none());
    assert_eq!(results[2]["evaluation"]["variables"]["n"], 42);
    assert_eq!(results[3]["path"], missing.display().to_string());
    assert_eq!(results[3]["status"], "invalid");

    let out = lotsman()
        .args(args("csv"))
        .assert()
        .code(2)
        .get_output()
        .clone();
    let csv = String::from_utf8(out.stdout).unwrap();
    let lines: Vec<&str> = csv.lines().collect();
    assert_eq!(
        lines[0],
        "source,status,quality,quality_unit,lot_nonconforming,lot_quality,pa,pa_centred,aoq,ati,asn,asn_curtailed,message"
    );
    let sources: Vec<&str> = lines[1..]
        .iter()
        .map(|l| l.split(',').next().unwrap())
        .collect();
    let (b, m) = (broken.display().to_string(), missing.display().to_string());
    assert_eq!(
        sources,
        [
            "plans/tpw-cover-fit.yaml",
            "plans/tpw-cover-fit.yaml",
            b.as_str(),
            "plans/tpw-cover-thickness.yaml",
            "plans/tpw-cover-thickness.yaml",
            m.as_str(),
        ]
    );
    let thickness: Vec<&str> = lines[4].split(',').collect();
    assert_eq!(thickness[1], "ok");
    assert_eq!(thickness[10], "42", "a variables plan's ASN is n");
}

#[test]
fn evaluate_of_one_source_keeps_its_own_output() {
    let out = stdout_of(&["evaluate", "plans/tpw-cover-fit.yaml", "--at", "1%"], 0);
    assert!(out.starts_with("Plan 62:2:3"), "{out}");
    assert!(!out.contains("Source ") && !out.contains("evaluated"));
    lotsman()
        .args(["evaluate", "plans/no-such-plan.yaml"])
        .assert()
        .code(2)
        .stdout("")
        .stderr(predicate::str::starts_with(
            "lotsman: error: plans/no-such-plan.yaml does not exist",
        ));
}

#[test]
fn a_batch_off_a_terminal_writes_nothing_on_stderr() {
    // Enough sources that a progress display would have something to say.
    let dir = tempfile::tempdir().unwrap();
    for i in 0..120 {
        put(
            dir.path(),
            &format!("lot{}/p{i}.yaml", i % 7),
            &demo("tpw-seal-visual.yaml"),
        );
    }
    let root = dir.path().to_str().unwrap();
    for args in [
        vec!["verify", root],
        vec!["verify", root, "--list"],
        vec!["evaluate", root, "--at", "1%"],
    ] {
        lotsman().args(&args).assert().success().stderr("");
    }
    let few = plan_folder();
    lotsman()
        .args([
            "sheet",
            few.path().join("east/seal.yaml").to_str().unwrap(),
            few.path().join("east/deeper").to_str().unwrap(),
        ])
        .assert()
        .success()
        .stderr("");
}

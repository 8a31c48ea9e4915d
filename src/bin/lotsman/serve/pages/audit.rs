//! The audit screen (`GET /audit`): the checks of `lotsman verify` on
//! the workspace's files, chosen from its lists, with every discrepancy
//! in the command's words and the command line that repeats the check:
//!
//! - a folder's plan sources (or the whole workspace's), each re-solved
//!   and compared: `lotsman verify FOLDER --list`;
//! - a ledger: its hash chain, and every row replayed against the plan
//!   sources its rows name: `lotsman verify LEDGER.csv --plan PLAN.yaml`;
//! - a sheet against its source: `lotsman verify FILE.yaml --sheet
//!   FILE.pdf --list`.
//!
//! It reads and writes nothing else: every check is a GET form.

use std::collections::{BTreeSet, HashMap};
use std::path::Path;

use askama::Template;
use axum::extract::rejection::QueryRejection;
use axum::extract::{Query, State};
use axum::http::StatusCode;
use axum::response::{IntoResponse, Response};
use lotsman::{
    Error, Format, InputError, KnownPlan, Ledger, LedgerVerifyReport, VerificationReport,
    check_sheet, check_sheet_entry, check_sheet_text, plans_beside, replay, shell_word,
};

use super::plans::SOURCES;
use super::verified::{VerifyRow, relative, verify_named};
use crate::commands::verify::is_ledger;
use crate::out::report_bytes;
use crate::serve::guard::{field, queried};
use crate::serve::page::{off_thread, render};
use crate::serve::state::AppState;
use crate::serve::workspace::Workspace;

/// A file or folder of the workspace, for a choice.
struct Choice {
    value: String,
    label: String,
    selected: bool,
}

/// One break of a ledger, as `verify` names it.
struct FindingRow {
    line: u64,
    seq: String,
    field: &'static str,
    message: String,
}

/// What a check found.
struct Found {
    /// The check in a few words.
    what: String,
    /// Whether everything holds.
    holds: bool,
    /// The command line that repeats it, run in the workspace folder.
    command: String,
    /// What the command prints.
    report: String,
    /// The sources checked (a folder, a sheet).
    rows: Vec<VerifyRow>,
    /// The ledger's breaks.
    findings: Vec<FindingRow>,
    /// Why the rows were not checked against plan sources, if so.
    note: Option<String>,
}

/// The form's fields, as typed.
#[derive(Clone)]
struct Fields {
    check: String,
    folder: String,
    ledger: String,
    plan: String,
    source: String,
    sheet: String,
}

#[derive(Template)]
#[template(path = "serve/audit.html")]
struct AuditPage {
    title: &'static str,
    folders: Vec<Choice>,
    ledgers: Vec<Choice>,
    plans: Vec<Choice>,
    sources: Vec<Choice>,
    sheets: Vec<Choice>,
    error: Option<String>,
    found: Option<Found>,
}

/// `GET /audit`: the forms, and the check asked for.
pub async fn show(
    State(state): State<AppState>,
    query: Result<Query<HashMap<String, String>>, QueryRejection>,
) -> Response {
    let fields = match queried(query) {
        Ok(f) => f,
        Err(r) => return r.into_response(),
    };
    let text = |key: &str| field(&fields, key);
    let f = Fields {
        check: text("check"),
        folder: text("folder"),
        ledger: text("ledger"),
        plan: text("plan"),
        source: text("source"),
        sheet: text("sheet"),
    };
    let (worker, asked) = (state.clone(), f.clone());
    let outcome = off_thread("the check", move || {
        let ws = worker.workspace();
        match asked.check.as_str() {
            "" => Ok(None),
            "sources" => audit_folder(ws, &asked.folder).map(Some),
            "ledger" => audit_ledger(ws, &asked.ledger, &asked.plan).map(Some),
            "sheet" => audit_sheet(ws, &asked.source, &asked.sheet).map(Some),
            other => Err(InputError::Inconsistent(format!(
                "there is no check '{}' here: choose one of the forms of the page",
                lotsman::escape_controls(other)
            ))
            .into()),
        }
    })
    .await;
    let (status, found, error) = match outcome {
        Ok(found) => (StatusCode::OK, found, None),
        Err(r) => (
            r.status(),
            None,
            Some(state.workspace().relative_words(r.message())),
        ),
    };
    let ws = state.workspace();
    let sources = ws.files(SOURCES);
    let choices = |values: Vec<String>, chosen: &str| -> Vec<Choice> {
        values
            .into_iter()
            .map(|value| Choice {
                selected: value == chosen,
                label: value.clone(),
                value,
            })
            .collect()
    };
    let mut folders = vec![Choice {
        value: String::new(),
        label: "(the whole workspace)".to_string(),
        selected: f.folder.is_empty(),
    }];
    folders.extend(choices(folders_of(&sources), &f.folder));
    let ledgers = ws
        .files(&["csv"])
        .into_iter()
        .filter(|name| ws.file(name).is_ok_and(|p| is_ledger(&p)))
        .collect();
    let mut plans = vec![Choice {
        value: String::new(),
        label: "(those beside the ledger that its rows name)".to_string(),
        selected: f.plan.is_empty(),
    }];
    plans.extend(choices(sources.clone(), &f.plan));
    let page = AuditPage {
        title: "Audit",
        folders,
        ledgers: choices(ledgers, &f.ledger),
        plans,
        sheets: choices(ws.files(&["pdf"]), &f.sheet),
        sources: choices(sources, &f.source),
        error,
        found,
    };
    render(status, &page)
}

/// The folders that hold plan sources, each once, sorted.
fn folders_of(sources: &[String]) -> Vec<String> {
    let mut folders = BTreeSet::new();
    for name in sources {
        let mut folder = Path::new(name).parent();
        while let Some(f) = folder.filter(|f| !f.as_os_str().is_empty()) {
            folders.insert(f.to_string_lossy().into_owned());
            folder = f.parent();
        }
    }
    folders.into_iter().collect()
}

/// The plan sources of `folder` (the whole workspace when empty),
/// verified as `lotsman verify FOLDER --list` verifies them.
fn audit_folder(ws: &Workspace, folder: &str) -> Result<Found, Error> {
    let (names, shown) = if folder.is_empty() {
        (ws.files(SOURCES), ".".to_string())
    } else {
        let shown = ws.shown(&ws.file(folder)?);
        let prefix = format!("{shown}/");
        let names = ws
            .files(SOURCES)
            .into_iter()
            .filter(|n| n.starts_with(&prefix))
            .collect();
        (names, shown)
    };
    if names.is_empty() {
        return Err(InputError::Inconsistent(format!(
            "the folder {shown} holds no plan source (*.yaml or *.yml): choose another folder"
        ))
        .into());
    }
    let checked = verify_named(ws, &names)?;
    let rows = checked
        .iter()
        .map(|c| VerifyRow::of(&c.name, &c.entry))
        .collect();
    let report = VerificationReport {
        results: checked.into_iter().map(|c| c.entry).collect(),
        every_source: true,
    };
    Ok(Found {
        what: format!("The plan sources of {shown}, each re-solved and compared"),
        holds: report.summary().worst() == lotsman::Outcome::Ok,
        command: format!("lotsman verify {} --list", shell_word(&shown)),
        report: ws.relative_words(&String::from_utf8_lossy(&report_bytes(
            &report,
            Format::Table,
        )?)),
        rows,
        findings: Vec::new(),
        note: None,
    })
}

/// The ledger `name` replayed as `lotsman verify LEDGER.csv --plan
/// PLAN.yaml` replays it: with the source `plan`, or without one, the
/// sources beside the ledger that its rows name (the chain alone when
/// there is none).
fn audit_ledger(ws: &Workspace, name: &str, plan: &str) -> Result<Found, Error> {
    if name.is_empty() {
        return Err(InputError::Inconsistent("choose the ledger to check".to_string()).into());
    }
    let path = ws.file(name)?;
    let shown = ws.shown(&path);
    let ledger = Ledger::read(&path)?;
    let (plans, note) = if plan.is_empty() {
        match plans_beside(&ledger) {
            Ok(plans) => (plans, None),
            Err(e) => (Vec::new(), Some(ws.relative_words(&e.to_string()))),
        }
    } else {
        (vec![KnownPlan::load(&ws.file(plan)?)?], None)
    };
    let mut command = format!("lotsman verify {}", shell_word(&shown));
    for p in &plans {
        command.push_str(&format!(" --plan {}", shell_word(&ws.shown(&p.path))));
    }
    let report = LedgerVerifyReport {
        ledger: path,
        replay: replay(&ledger, &plans),
    };
    let findings = report
        .replay
        .findings
        .iter()
        .map(|f| FindingRow {
            line: f.line,
            seq: f.seq.map_or("-".to_string(), |s| s.to_string()),
            field: f.field,
            message: ws.relative_words(&lotsman::escape_controls(&f.message)),
        })
        .collect();
    Ok(Found {
        what: format!("The ledger {shown}: its hash chain, and every row replayed"),
        holds: report.holds(),
        command,
        report: ws.relative_words(&String::from_utf8_lossy(&report_bytes(
            &report,
            Format::Table,
        )?)),
        rows: Vec::new(),
        findings,
        note,
    })
}

/// The sheet `sheet` checked against the source `source`, as `lotsman
/// verify SOURCE --sheet SHEET --list` checks it: the source re-solved,
/// and the sheet's recorded SHA-256 compared with the source's.
fn audit_sheet(ws: &Workspace, source: &str, sheet: &str) -> Result<Found, Error> {
    if source.is_empty() || sheet.is_empty() {
        return Err(InputError::Inconsistent(
            "choose both the plan source and its sheet (a PDF of the workspace)".to_string(),
        )
        .into());
    }
    let source_path = ws.file(source)?;
    let pdf = ws.file(sheet)?;
    let (source_shown, pdf_shown) = (ws.shown(&source_path), ws.shown(&pdf));
    let mut checked = verify_named(ws, std::slice::from_ref(&source_shown))?;
    let Some(mut c) = checked.pop() else {
        return Err(InputError::Inconsistent(format!("{source_shown} was not verified")).into());
    };
    let verdict = match &c.read {
        Some(read) => check_sheet_text(read, &pdf),
        None => check_sheet(&source_path, &pdf),
    };
    check_sheet_entry(&mut c.entry, &pdf, verdict);
    let entry = relative(ws, c.entry);
    let rows = vec![VerifyRow::of(&c.name, &entry)];
    let report = VerificationReport {
        results: vec![entry],
        every_source: true,
    };
    Ok(Found {
        what: format!("The sheet {pdf_shown} against its source {source_shown}"),
        holds: report.summary().worst() == lotsman::Outcome::Ok,
        command: format!(
            "lotsman verify {} --sheet {} --list",
            shell_word(&source_shown),
            shell_word(&pdf_shown)
        ),
        report: ws.relative_words(&String::from_utf8_lossy(&report_bytes(
            &report,
            Format::Table,
        )?)),
        rows,
        findings: Vec::new(),
        note: None,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_folder_on_the_way_is_listed_once() {
        let sources = [
            "a.yaml",
            "plans/b.yaml",
            "plans/east/c.yaml",
            "plans/d.yaml",
        ]
        .map(String::from);
        assert_eq!(folders_of(&sources), ["plans", "plans/east"]);
    }
}

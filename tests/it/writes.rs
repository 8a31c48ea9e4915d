//! Nothing lost: every file goes through the one atomic writer, no command
//! replaces a file unless `--force` says so (and never the source it
//! read), a batch killed part-way leaves only complete sheets beside the
//! files that were there, and a write that fails keeps the existing file.

use crate::common;
use common::lotsman;

use std::collections::BTreeMap;
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

use lotsman::{sheet_source_hash, source_hash};
use predicates::prelude::*;

const SEAL: &str = "plans/tpw-seal-visual.yaml";
const COVER: &str = "plans/tpw-cover-fit.yaml";

/// Every file below `dir` (relative name to bytes), hidden ones included.
fn snapshot(dir: &Path) -> BTreeMap<PathBuf, Vec<u8>> {
    let mut files = BTreeMap::new();
    let mut folders = vec![dir.to_path_buf()];
    while let Some(folder) = folders.pop() {
        for entry in std::fs::read_dir(&folder).unwrap() {
            let path = entry.unwrap().path();
            if path.is_dir() {
                folders.push(path);
            } else {
                let bytes = std::fs::read(&path).unwrap();
                files.insert(path.strip_prefix(dir).unwrap().to_path_buf(), bytes);
            }
        }
    }
    files
}

/// The calls that open a file for writing, create one, or move one into
/// place. Only `src/fs/atomic.rs` may make them, and `src/fs/append.rs`
/// for the ledger, which is appended to under a lock.
const WRITING_CALLS: &[&str] = &[
    "fs::write",
    "File::create",
    "File::options",
    "OpenOptions",
    "create_new",
    "tempfile",
    "persist",
    "fs::copy",
    "fs::rename",
    "hard_link",
    ".save(",
];

/// The lines of a source file's code, before its unit tests and without
/// its comments and doc comments (whose examples may write files).
fn code_lines(text: &str) -> impl Iterator<Item = (usize, &str)> {
    let code = text.split("#[cfg(test)]").next().unwrap_or("");
    code.lines()
        .enumerate()
        .filter(|(_, l)| !l.trim_start().starts_with("//"))
}

/// The writing calls in the code of `text`, as `line: call`.
fn writing_calls(text: &str) -> Vec<String> {
    code_lines(text)
        .flat_map(|(i, line)| {
            WRITING_CALLS
                .iter()
                .filter(move |call| line.contains(*call))
                .map(move |call| format!("{}: {call}", i + 1))
        })
        .collect()
}

#[test]
fn only_the_atomic_writer_opens_files_for_writing() {
    let mut found = Vec::new();
    let mut folders = vec![PathBuf::from("src")];
    let mut scanned = 0;
    while let Some(folder) = folders.pop() {
        for entry in std::fs::read_dir(&folder).unwrap() {
            let path = entry.unwrap().path();
            if path.is_dir() {
                folders.push(path);
            } else if path.extension().is_some_and(|e| e == "rs")
                && path != Path::new("src/fs/atomic.rs")
                && path != Path::new("src/fs/append.rs")
            {
                scanned += 1;
                let text = std::fs::read_to_string(&path).unwrap();
                found.extend(
                    writing_calls(&text)
                        .into_iter()
                        .map(|hit| format!("{}:{hit}", path.display())),
                );
            }
        }
    }
    assert!(scanned > 50, "only {scanned} source files found");
    assert!(
        found.is_empty(),
        "files written outside src/fs/atomic.rs and src/fs/append.rs:\n{}",
        found.join("\n")
    );
    // The scan sees the writer's own calls, so it would see them elsewhere.
    let atomic = std::fs::read_to_string("src/fs/atomic.rs").unwrap();
    let own = writing_calls(&atomic);
    for call in ["tempfile", "persist"] {
        assert!(own.iter().any(|hit| hit.ends_with(call)), "{own:?}");
    }
}

#[test]
fn design_output_never_replaces_its_source_and_replaces_another_file_only_with_force() {
    let dir = tempfile::tempdir().unwrap();
    let source = dir.path().join("seal.yaml");
    std::fs::copy(SEAL, &source).unwrap();
    let s = source.to_str().unwrap();
    for force in [false, true] {
        let mut args = vec!["design", s, "--output", s];
        if force {
            args.push("--force");
        }
        lotsman()
            .args(&args)
            .assert()
            .code(2)
            .stderr(predicate::str::contains("is the plan source being read"));
    }
    // Another name for the same file is the same file.
    let link = dir.path().join("link.yaml");
    std::fs::hard_link(&source, &link).unwrap();
    lotsman()
        .args(["design", s, "--output", link.to_str().unwrap(), "--force"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("is the plan source being read"));
    assert_eq!(
        std::fs::read(&source).unwrap(),
        std::fs::read(SEAL).unwrap()
    );

    let other = dir.path().join("other.yaml");
    std::fs::write(&other, "kept: true\n").unwrap();
    let o = other.to_str().unwrap();
    for args in [
        vec!["design", s, "--output", o],
        vec!["design", "--aql", "1%", "--rql", "6%", "--output", o],
    ] {
        lotsman().args(&args).assert().code(2).stderr(format!(
            "lotsman: error: {o} already exists; give --force to replace it (nothing was written)\n"
        ));
        assert_eq!(std::fs::read(&other).unwrap(), b"kept: true\n");
    }
    lotsman()
        .args(["design", s, "--output", o, "--force"])
        .assert()
        .success();
    assert_eq!(std::fs::read(&other).unwrap(), std::fs::read(SEAL).unwrap());
}

#[test]
fn sheet_replaces_an_existing_pdf_only_with_force_and_never_its_source() {
    let dir = tempfile::tempdir().unwrap();
    let source = dir.path().join("seal.yaml");
    std::fs::copy(SEAL, &source).unwrap();
    let s = source.to_str().unwrap();
    let out = dir.path().join("out");
    std::fs::create_dir(&out).unwrap();
    let beside = dir.path().join("seal.pdf");
    let named = dir.path().join("named.pdf");
    let in_folder = out.join("seal.pdf");
    for pdf in [&beside, &named, &in_folder] {
        std::fs::write(pdf, b"the previous sheet").unwrap();
    }
    let cases: [(Vec<&str>, &PathBuf); 3] = [
        (vec!["sheet", s], &beside),
        (
            vec!["sheet", s, "--output", named.to_str().unwrap()],
            &named,
        ),
        (
            vec!["sheet", s, "--output-dir", out.to_str().unwrap()],
            &in_folder,
        ),
    ];
    for (args, pdf) in &cases {
        lotsman().args(args).assert().code(2).stderr(format!(
            "lotsman: error: {} already exists; give --force to replace it (nothing was written)\n",
            pdf.display()
        ));
        assert_eq!(std::fs::read(pdf).unwrap(), b"the previous sheet");
    }
    for (args, pdf) in &cases {
        let mut args = args.clone();
        args.push("--force");
        lotsman().args(&args).assert().success();
        let bytes = std::fs::read(pdf).unwrap();
        assert_eq!(
            sheet_source_hash(&bytes).unwrap(),
            Some(source_hash(&std::fs::read_to_string(SEAL).unwrap()))
        );
    }
    lotsman()
        .args(["sheet", s, "--output", s, "--force"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("is the plan source being read"));
    assert_eq!(
        std::fs::read(&source).unwrap(),
        std::fs::read(SEAL).unwrap()
    );
}

#[test]
fn tradeoff_output_replaces_an_existing_file_only_with_force() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("grid.csv");
    std::fs::write(&out, b"last week's grid").unwrap();
    let o = out.to_str().unwrap();
    let args = [
        "tradeoff", "--aql", "1%,2%", "--rql", "6%,8%", "--format", "csv", "--output", o,
    ];
    lotsman()
        .args(args)
        .assert()
        .code(2)
        .stderr(predicate::str::contains(format!(
            "{o} already exists; give --force to replace it"
        )));
    assert_eq!(std::fs::read(&out).unwrap(), b"last week's grid");
    lotsman().args(args).arg("--force").assert().success();
    let text = std::fs::read_to_string(&out).unwrap();
    assert!(text.starts_with("aql,rql,n,c,"), "{text}");
}

#[test]
fn demo_writes_nothing_over_existing_files_without_force() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("demo");
    let o = out.to_str().unwrap();
    lotsman()
        .args(["demo", "--output-dir", o])
        .assert()
        .success();
    let first = snapshot(&out);
    assert!(first.len() >= 20, "{:?}", first.keys());
    // One file edited by hand since: a second run without --force keeps
    // it, and writes nothing at all.
    let edited = out.join("tpw-seal-visual.yaml");
    std::fs::write(&edited, "edited by hand\n").unwrap();
    let before = snapshot(&out);
    lotsman()
        .args(["demo", "--output-dir", o])
        .assert()
        .code(2)
        .stderr(predicate::str::contains(
            "already exists; give --force to replace it (nothing was written)",
        ));
    assert_eq!(snapshot(&out), before);
    lotsman()
        .args(["demo", "--output-dir", o, "--force"])
        .assert()
        .success();
    assert_eq!(snapshot(&out), first);
}

#[test]
fn a_batch_sheet_refuses_only_the_sources_whose_pdf_exists() {
    let dir = tempfile::tempdir().unwrap();
    let root = dir.path().join("in");
    std::fs::create_dir(&root).unwrap();
    for (name, from) in [("a.yaml", SEAL), ("b.yaml", COVER), ("c.yaml", SEAL)] {
        std::fs::copy(from, root.join(name)).unwrap();
    }
    std::fs::write(root.join("b.pdf"), b"the filed sheet of b").unwrap();
    let r = root.to_str().unwrap();
    let out = lotsman().args(["sheet", r]).assert().code(2);
    let printed = String::from_utf8(out.get_output().stdout.clone()).unwrap();
    assert_eq!(
        printed,
        format!(
            "invalid   {b}: {pdf} already exists; give --force to replace it (nothing was written)\n2 written, 1 invalid\n",
            b = root.join("b.yaml").display(),
            pdf = root.join("b.pdf").display()
        )
    );
    assert_eq!(
        std::fs::read(root.join("b.pdf")).unwrap(),
        b"the filed sheet of b"
    );
    for name in ["a.pdf", "c.pdf"] {
        assert!(root.join(name).is_file(), "{name}");
    }
    lotsman()
        .args(["sheet", r, "--force"])
        .assert()
        .success()
        .stdout("3 written, 0 invalid\n");
    let b = std::fs::read(root.join("b.pdf")).unwrap();
    assert_eq!(
        sheet_source_hash(&b).unwrap(),
        Some(source_hash(&std::fs::read_to_string(COVER).unwrap()))
    );
}

/// A sheet that is complete: it parses, has one page and carries the hash
/// of its source.
fn assert_complete_sheet(pdf: &[u8], source_text: &str, name: &str) {
    let doc = lopdf::Document::load_mem(pdf)
        .unwrap_or_else(|e| panic!("{name} does not parse as a PDF: {e}"));
    assert_eq!(doc.get_pages().len(), 1, "{name}");
    assert_eq!(
        sheet_source_hash(pdf).unwrap(),
        Some(source_hash(source_text)),
        "{name} is not the sheet of its source"
    );
}

/// A name the writer gives its temporary files: hidden, so that no batch
/// takes it for a source or a sheet.
fn is_temporary(name: &str) -> bool {
    name.starts_with(".lotsman-") && name.ends_with(".tmp")
}

#[cfg(unix)]
#[test]
fn a_batch_killed_part_way_leaves_complete_sheets_and_the_files_that_were_there() {
    const SOURCES: usize = 300;
    let dir = tempfile::tempdir().unwrap();
    let input = dir.path().join("in");
    let out = dir.path().join("out");
    std::fs::create_dir(&input).unwrap();
    std::fs::create_dir(&out).unwrap();
    let texts = [
        std::fs::read_to_string(SEAL).unwrap(),
        std::fs::read_to_string(COVER).unwrap(),
    ];
    for i in 0..SOURCES {
        std::fs::write(input.join(format!("s{i:03}.yaml")), &texts[i % 2]).unwrap();
    }
    // Files there before: every tenth target holds an older sheet, and
    // two files are no target at all.
    let mut before = BTreeMap::new();
    for i in (0..SOURCES).step_by(10) {
        before.insert(
            format!("s{i:03}.pdf"),
            format!("older sheet {i}").into_bytes(),
        );
    }
    before.insert("notes.txt".into(), b"kept as it is".to_vec());
    before.insert("filed.pdf".into(), b"%PDF-1.3 not a target".to_vec());
    for (name, bytes) in &before {
        std::fs::write(out.join(name), bytes).unwrap();
    }

    let mut child = std::process::Command::new(assert_cmd::cargo::cargo_bin("lotsman"))
        .args(["sheet", input.to_str().unwrap(), "--output-dir"])
        .arg(&out)
        .arg("--force")
        .stdout(std::process::Stdio::null())
        .stderr(std::process::Stdio::null())
        .spawn()
        .unwrap();
    // Kill it (SIGKILL) once ten new sheets have appeared.
    let new_sheets = || {
        std::fs::read_dir(&out)
            .unwrap()
            .filter_map(|e| e.ok())
            .map(|e| e.file_name().to_string_lossy().into_owned())
            .filter(|n| n.ends_with(".pdf") && !before.contains_key(n))
            .count()
    };
    let start = Instant::now();
    while new_sheets() < 10 {
        assert!(
            start.elapsed() < Duration::from_secs(300),
            "no sheets appeared"
        );
        std::thread::sleep(Duration::from_millis(5));
    }
    child.kill().unwrap();
    let status = child.wait().unwrap();
    assert_eq!(
        status.code(),
        None,
        "the batch ended before it was killed ({status}); it needs more sources"
    );

    let mut complete = 0;
    let mut kept = 0;
    for entry in std::fs::read_dir(&out).unwrap() {
        let name = entry.unwrap().file_name().to_string_lossy().into_owned();
        let bytes = std::fs::read(out.join(&name)).unwrap();
        if name.starts_with('.') {
            assert!(
                is_temporary(&name),
                "a hidden file the writer did not make: {name}"
            );
            continue;
        }
        if before.get(&name) == Some(&bytes) {
            kept += 1;
            continue;
        }
        // Not as it was: it must be the complete sheet of its source.
        let i: usize = name
            .strip_prefix('s')
            .and_then(|n| n.strip_suffix(".pdf"))
            .and_then(|n| n.parse().ok())
            .unwrap_or_else(|| panic!("{name} was changed but is no target"));
        assert_complete_sheet(&bytes, &texts[i % 2], &name);
        complete += 1;
    }
    assert!((10..SOURCES).contains(&complete), "{complete} sheets");
    // The two files that are no target, and the older sheets not reached.
    assert!(kept >= 3, "{kept} files kept");
    for name in ["notes.txt", "filed.pdf"] {
        assert_eq!(std::fs::read(out.join(name)).unwrap(), before[name]);
    }
    // A folder walk takes none of the leftovers for a source or a sheet.
    lotsman()
        .args(["verify", out.to_str().unwrap()])
        .assert()
        .code(2)
        .stdout(predicate::str::contains("the folder holds no plan sources"));
}

/// Whether the tests run as root, for whom permissions do not bind.
#[cfg(unix)]
fn running_as_root() -> bool {
    let out = std::process::Command::new("id").arg("-u").output().unwrap();
    String::from_utf8_lossy(&out.stdout).trim() == "0"
}

#[cfg(unix)]
#[test]
fn a_write_that_fails_keeps_the_existing_file_and_leaves_nothing_behind() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    std::fs::create_dir(&out).unwrap();
    // What makes the write fail: a folder that cannot be written to, or for
    // root, whom permissions do not stop, a folder in the target's place.
    let target = if running_as_root() {
        let target = out.join("seal.pdf");
        std::fs::create_dir(&target).unwrap();
        std::fs::write(target.join("inside.txt"), b"inside").unwrap();
        target
    } else {
        std::fs::write(out.join("seal.pdf"), b"the previous sheet").unwrap();
        set_mode(&out, 0o555);
        out.join("seal.pdf")
    };
    let before = snapshot(&out);
    lotsman()
        .args(["sheet", SEAL, "--force", "--output"])
        .arg(&target)
        .assert()
        .code(2)
        .stderr(predicate::str::starts_with(format!(
            "lotsman: error: {}: ",
            target.display()
        )));
    assert_eq!(snapshot(&out), before);
    set_mode(&out, 0o755);
}

#[cfg(unix)]
fn set_mode(path: &Path, mode: u32) {
    use std::os::unix::fs::PermissionsExt;
    std::fs::set_permissions(path, std::fs::Permissions::from_mode(mode)).unwrap();
}

#[cfg(unix)]
#[test]
fn a_run_stopped_by_the_file_size_limit_keeps_the_existing_pdf() {
    // The limit binds root too: the write of the temporary file goes past
    // it, and the process is stopped (SIGXFSZ) or the write fails.
    let dir = tempfile::tempdir().unwrap();
    let target = dir.path().join("seal.pdf");
    std::fs::write(&target, b"the previous sheet").unwrap();
    let status = std::process::Command::new("sh")
        .args(["-c", "ulimit -f 8 && exec \"$0\" \"$@\""])
        .arg(assert_cmd::cargo::cargo_bin("lotsman"))
        .args(["sheet", SEAL, "--force", "--output"])
        .arg(&target)
        .stderr(std::process::Stdio::null())
        .status()
        .unwrap();
    assert!(!status.success(), "{status}");
    assert_eq!(std::fs::read(&target).unwrap(), b"the previous sheet");
    for (name, _) in snapshot(dir.path()) {
        let name = name.to_string_lossy().into_owned();
        assert!(
            name == "seal.pdf" || is_temporary(&name),
            "left behind: {name}"
        );
    }
}

/// The names in `dir` (not below it), sorted.
fn names(dir: &Path) -> Vec<String> {
    let mut v: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    v.sort();
    v
}

/// The pid of a process that has ended (a `true` run to its end).
#[cfg(unix)]
fn ended_pid() -> u32 {
    let mut child = std::process::Command::new("true").spawn().unwrap();
    let pid = child.id();
    child.wait().unwrap();
    pid
}

#[cfg(unix)]
#[test]
fn the_next_run_into_a_folder_removes_what_a_killed_run_left_and_nothing_else() {
    const SOURCES: usize = 120;
    let dir = tempfile::tempdir().unwrap();
    let input = dir.path().join("in");
    let out = dir.path().join("out");
    std::fs::create_dir(&input).unwrap();
    std::fs::create_dir(&out).unwrap();
    for i in 0..SOURCES {
        std::fs::copy(SEAL, input.join(format!("s{i:03}.yaml"))).unwrap();
    }
    let sheet = |force: bool| {
        let mut command = std::process::Command::new(assert_cmd::cargo::cargo_bin("lotsman"));
        command
            .args(["sheet", input.to_str().unwrap(), "--output-dir"])
            .arg(&out)
            .stdout(std::process::Stdio::null())
            .stderr(std::process::Stdio::null());
        if force {
            command.arg("--force");
        }
        command
    };
    // A batch killed (SIGKILL) once three sheets have appeared.
    let mut child = sheet(false).spawn().unwrap();
    let start = Instant::now();
    while names(&out).iter().filter(|n| n.ends_with(".pdf")).count() < 3 {
        assert!(start.elapsed() < Duration::from_secs(300), "no sheets");
        std::thread::sleep(Duration::from_millis(5));
    }
    child.kill().unwrap();
    assert_eq!(
        child.wait().unwrap().code(),
        None,
        "the batch was not killed"
    );
    // What a kill leaves (the kill may or may not have caught a write in
    // the act, so one such file is made for certain): the killed run's
    // temporary file, and one of an earlier version's form.
    let killed = child.id();
    let left = [
        format!(".lotsman-{killed}-Qz81Kd.tmp"),
        ".lotsman-Ab3xYz.tmp".to_string(),
    ];
    for name in &left {
        std::fs::write(out.join(name), b"half of a sheet").unwrap();
    }
    // Not leftovers: a concurrent run's temporary file (its process is
    // running: this test), one made after the next run started (its date
    // in the future), names the writer never gives, and a folder.
    let running = format!(".lotsman-{}-Rn5Wq2.tmp", std::process::id());
    let future = format!(".lotsman-{}-Fu7Tr3.tmp", ended_pid());
    let kept = [
        running.as_str(),
        future.as_str(),
        ".lotsman-notes",
        ".lotsman-12-Ab3xYz.tmp.bak",
        "lotsman-12-Ab3xYz.tmp",
    ];
    for name in kept {
        std::fs::write(out.join(name), b"not a leftover").unwrap();
    }
    let touched = std::process::Command::new("touch")
        .args(["-d", "+1 hour"])
        .arg(out.join(&future))
        .status()
        .unwrap();
    assert!(touched.success());
    std::thread::sleep(Duration::from_millis(50));

    assert!(sheet(true).status().unwrap().success());
    let after = names(&out);
    for name in &left {
        assert!(!after.contains(name), "{name} was left: {after:?}");
    }
    for name in kept {
        assert!(after.contains(&name.to_string()), "{name} was removed");
        assert_eq!(std::fs::read(out.join(name)).unwrap(), b"not a leftover");
    }
    // Nothing else hidden, and every sheet complete.
    let seal = std::fs::read_to_string(SEAL).unwrap();
    for name in &after {
        if name.starts_with('.') || name.starts_with("lotsman-") {
            assert!(kept.contains(&name.as_str()), "left behind: {name}");
        } else {
            assert_complete_sheet(&std::fs::read(out.join(name)).unwrap(), &seal, name);
        }
    }
    assert_eq!(after.len(), SOURCES + kept.len());
}

/// A small tmpfs mounted on a folder: a disk that fills at `size`,
/// unmounted when dropped. `None` where mounting is not allowed (not root,
/// or a container without the right).
#[cfg(target_os = "linux")]
struct SmallDisk(PathBuf);

#[cfg(target_os = "linux")]
impl SmallDisk {
    fn mount(at: &Path, size: &str) -> Option<SmallDisk> {
        std::fs::create_dir_all(at).unwrap();
        let mounted = std::process::Command::new("mount")
            .args(["-t", "tmpfs", "-o", &format!("size={size}"), "tmpfs"])
            .arg(at)
            .stderr(std::process::Stdio::null())
            .status()
            .is_ok_and(|s| s.success());
        mounted.then(|| SmallDisk(at.to_path_buf()))
    }
}

#[cfg(target_os = "linux")]
impl Drop for SmallDisk {
    fn drop(&mut self) {
        let _ = std::process::Command::new("umount").arg(&self.0).status();
    }
}

/// The demo under a file-size limit (`ulimit -f`, which binds root too):
/// stopped (SIGXFSZ) at its first sheet, as a full disk would stop it.
#[cfg(unix)]
fn demo_with_a_small_limit(out: &Path, force: bool) -> std::process::ExitStatus {
    let mut command = std::process::Command::new("sh");
    command
        .args(["-c", "ulimit -f 8 && exec \"$0\" \"$@\""])
        .arg(assert_cmd::cargo::cargo_bin("lotsman"))
        .args(["demo", "--output-dir"])
        .arg(out)
        .stdout(std::process::Stdio::null())
        .stderr(std::process::Stdio::null());
    if force {
        command.arg("--force");
    }
    command.status().unwrap()
}

#[cfg(target_os = "linux")]
#[test]
fn a_demo_that_runs_out_of_space_leaves_no_partial_set() {
    let dir = tempfile::tempdir().unwrap();
    // The demo's files take about 430 kB (some 120 pages of 4 kB).
    match SmallDisk::mount(&dir.path().join("small"), "200k") {
        Some(disk) => {
            let out = disk.0.join("demo");
            lotsman()
                .args(["demo", "--output-dir"])
                .arg(&out)
                .assert()
                .code(2)
                .stderr(predicate::str::contains("the disk is full"));
            assert!(names(&disk.0).is_empty(), "{:?}", names(&disk.0));
        }
        None => {
            eprintln!("no tmpfs can be mounted here: the full disk is a file-size limit");
            let parent = dir.path().join("small");
            std::fs::create_dir(&parent).unwrap();
            let out = parent.join("demo");
            assert!(!demo_with_a_small_limit(&out, false).success());
            assert!(!out.exists());
            // The killed run's temporary folder is all it left, and the
            // next run into the folder removes it.
            for name in names(&parent) {
                assert!(is_temporary(&name), "left behind: {name}");
            }
            lotsman()
                .args(["demo", "--output-dir"])
                .arg(&out)
                .assert()
                .success();
            assert_eq!(names(&parent), ["demo"]);
        }
    }
}

#[cfg(target_os = "linux")]
#[test]
fn a_demo_forced_over_its_folder_on_a_full_disk_replaces_nothing() {
    let dir = tempfile::tempdir().unwrap();
    // Room for one set of the demo's files, not for a second beside it.
    let disk = SmallDisk::mount(&dir.path().join("small"), "800k");
    let out = match &disk {
        Some(disk) => disk.0.join("demo"),
        None => dir.path().join("demo"),
    };
    lotsman()
        .args(["demo", "--output-dir"])
        .arg(&out)
        .assert()
        .success();
    // An older demo set: every file differs from what the demo writes (at
    // the same size, so that the disk fills at the same point), so that a
    // file replaced before the disk filled would show.
    for (name, bytes) in snapshot(&out) {
        std::fs::write(out.join(name), vec![b'o'; bytes.len()]).unwrap();
    }
    let before = snapshot(&out);
    if disk.is_some() {
        lotsman()
            .args(["demo", "--force", "--output-dir"])
            .arg(&out)
            .assert()
            .code(2)
            .stderr(predicate::str::contains("the disk is full"));
        assert_eq!(snapshot(&out), before);
    } else {
        eprintln!("no tmpfs can be mounted here: the full disk is a file-size limit");
        assert!(!demo_with_a_small_limit(&out, true).success());
        // Every file as it was; what the killed run left is hidden.
        let after: BTreeMap<_, _> = snapshot(&out)
            .into_iter()
            .filter(|(p, _)| !p.to_string_lossy().starts_with(".lotsman-"))
            .collect();
        assert_eq!(after, before);
    }
}

#[test]
fn an_output_folder_written_with_steps_back_creates_only_the_folder_meant() {
    let dir = tempfile::tempdir().unwrap();
    lotsman()
        .current_dir(dir.path())
        .args(["demo", "--output-dir", "x/../y/../z"])
        .assert()
        .success()
        .stdout(predicate::str::contains("wrote z/tpw-seal-visual.yaml"));
    assert_eq!(names(dir.path()), ["z"]);
    assert!(dir.path().join("z/tpw-seal-visual.pdf").is_file());
    let seal = std::fs::canonicalize(SEAL).unwrap();
    lotsman()
        .current_dir(dir.path())
        .arg("sheet")
        .arg(&seal)
        .args(["--output-dir", "a/../b/./c/../d"])
        .assert()
        .success()
        .stderr(predicate::str::contains(
            "wrote sheet b/d/tpw-seal-visual.pdf",
        ));
    assert_eq!(names(dir.path()), ["b", "z"]);
    assert_eq!(names(&dir.path().join("b")), ["d"]);
    // A step back out of the folder the command runs in stays one.
    let inner = dir.path().join("inner");
    std::fs::create_dir(&inner).unwrap();
    lotsman()
        .current_dir(&inner)
        .arg("sheet")
        .arg(&seal)
        .args(["--output-dir", "../up"])
        .assert()
        .success();
    assert!(dir.path().join("up/tpw-seal-visual.pdf").is_file());
}

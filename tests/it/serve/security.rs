//! The security rules: the Host check, the CSRF token of every form, the
//! login with --token, file names confined to the workspace, the body
//! limit, and no overwriting without the confirmation.

use std::process::Command;

use super::{BIN, DESIGN, Server, csrf_of, save_form};

#[test]
fn a_foreign_host_header_is_refused() {
    let server = Server::start(&[]);
    let port = server.port;
    assert_eq!(server.status_with_host(&format!("127.0.0.1:{port}")), 200);
    assert_eq!(server.status_with_host(&format!("localhost:{port}")), 200);
    assert_eq!(server.status_with_host(&format!("LOCALHOST:{port}")), 200);
    for host in [
        format!("evil.example:{port}"),
        "evil.example".to_string(),
        format!("127.0.0.1:{}", port.wrapping_add(1)),
        format!("127.0.0.1.evil.example:{port}"),
    ] {
        assert_eq!(server.status_with_host(&host), 403, "{host}");
    }
}

#[test]
fn a_form_post_needs_the_csrf_token_of_its_session() {
    let server = Server::start(&[]);
    let (cookie, csrf) = server.session();
    let target = server.path("cover-fit.yaml");
    let without: Vec<_> = save_form(&csrf, "cover-fit.yaml")
        .into_iter()
        .filter(|(k, _)| *k != "csrf")
        .collect();
    let refused = server.post("/plans", Some(&cookie), &without);
    assert_eq!(refused.status, 403);
    assert!(refused.body.contains("carried no session token"));
    let wrong = "0".repeat(64);
    assert_eq!(
        server
            .post(
                "/plans",
                Some(&cookie),
                &save_form(&wrong, "cover-fit.yaml")
            )
            .status,
        403
    );
    // The right token without its session's cookie: another session.
    assert_eq!(
        server
            .post("/plans", None, &save_form(&csrf, "cover-fit.yaml"))
            .status,
        403
    );
    assert!(!target.exists());
    let saved = server.post("/plans", Some(&cookie), &save_form(&csrf, "cover-fit.yaml"));
    assert_eq!(saved.status, 200, "{}", saved.body);
    assert!(saved.body.contains("n = 110, c = 3"));
    // The source saved is one that `lotsman verify` finds in order.
    let text = std::fs::read_to_string(&target).unwrap();
    assert!(text.contains("Cover fit, incoming") && text.contains("A. Inspector, quality"));
    let verify = Command::new(BIN)
        .arg("verify")
        .arg(&target)
        .output()
        .unwrap();
    assert_eq!(
        verify.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&verify.stdout)
    );
}

#[test]
fn a_save_replaces_a_file_only_when_asked_and_needs_a_title_and_a_preparer() {
    let server = Server::start(&[]);
    let (cookie, csrf) = server.session();
    let target = server.path("plan.yaml");
    std::fs::write(&target, "kept\n").unwrap();
    let again = server.post("/plans", Some(&cookie), &save_form(&csrf, "plan.yaml"));
    assert_eq!(again.status, 400);
    assert!(
        again
            .body
            .contains("plan.yaml already exists in the workspace"),
        "{}",
        again.body
    );
    assert_eq!(std::fs::read_to_string(&target).unwrap(), "kept\n");
    let mut replace = save_form(&csrf, "plan.yaml");
    replace.push(("replace", "yes"));
    assert_eq!(server.post("/plans", Some(&cookie), &replace).status, 200);
    assert!(
        std::fs::read_to_string(&target)
            .unwrap()
            .contains("Cover fit")
    );
    for (field, words) in [
        ("title", "give the plan a title"),
        ("prepared_by", "who prepared the plan"),
    ] {
        let form: Vec<_> = save_form(&csrf, "other.yaml")
            .into_iter()
            .map(|(k, v)| if k == field { (k, "  ") } else { (k, v) })
            .collect();
        let page = server.post("/plans", Some(&cookie), &form);
        assert_eq!(page.status, 400);
        assert!(page.body.contains(words), "{field}: {}", page.body);
    }
    let pdf = server.post("/plans", Some(&cookie), &save_form(&csrf, "plan.pdf"));
    assert_eq!(pdf.status, 400);
    assert!(pdf.body.contains("does not end in .yaml or .yml"));
    assert!(!server.path("other.yaml").exists() && !server.path("plan.pdf").exists());
}

#[test]
fn file_names_are_confined_to_the_workspace() {
    let server = Server::start(&[]);
    let outside = tempfile::tempdir().unwrap();
    let (cookie, csrf) = server.session();
    std::fs::create_dir(server.path("plans")).unwrap();
    let absolute = outside.path().join("absolute.yaml");
    let absolute = absolute.to_str().unwrap();
    let mut cases = vec![
        ("../escaped.yaml", "goes up a folder with &#39;..&#39;"),
        ("plans/../../escaped.yaml", "goes up a folder"),
        (absolute, "is an absolute path"),
        ("no-folder/x.yaml", "does not exist"),
    ];
    #[cfg(unix)]
    {
        std::os::unix::fs::symlink(outside.path(), server.path("out")).unwrap();
        std::fs::write(outside.path().join("target.yaml"), "outside\n").unwrap();
        std::os::unix::fs::symlink(outside.path().join("target.yaml"), server.path("link.yaml"))
            .unwrap();
        cases.push(("out/linked.yaml", "linked to a place outside the workspace"));
        cases.push(("link.yaml", "is a link to a file outside the workspace"));
    }
    for (name, words) in cases {
        let mut form = save_form(&csrf, name);
        form.push(("replace", "yes"));
        let page = server.post("/plans", Some(&cookie), &form);
        assert_eq!(page.status, 400, "{name}");
        assert!(page.body.contains(words), "{name}: {}", page.body);
    }
    assert_eq!(
        std::fs::read_dir(outside.path()).unwrap().count(),
        if cfg!(unix) { 1 } else { 0 }
    );
    assert!(
        !server
            .workspace
            .path()
            .parent()
            .unwrap()
            .join("escaped.yaml")
            .exists()
    );
    // A name in a folder of the workspace is fine.
    let inside = server.post(
        "/plans",
        Some(&cookie),
        &save_form(&csrf, "plans/inside.yaml"),
    );
    assert_eq!(inside.status, 200, "{}", inside.body);
    assert!(server.path("plans/inside.yaml").exists());
}

#[test]
fn a_body_beyond_the_limit_is_refused() {
    let server = Server::start(&[]);
    let (cookie, csrf) = server.session();
    let padding = "x".repeat(100 * 1024);
    let mut form = save_form(&csrf, "big.yaml");
    form.push(("item", &padding));
    let page = server.post("/plans", Some(&cookie), &form);
    assert_eq!(page.status, 413);
    assert!(page.body.contains("the most a page takes"));
    assert!(!server.path("big.yaml").exists());
}

#[test]
fn with_a_token_every_page_needs_the_login() {
    let token = "correct horse battery";
    let server = Server::start(&["--token", token]);
    let first = server.get("/", None);
    assert_eq!(first.status, 303);
    assert_eq!(first.location.as_deref(), Some("/login"));
    assert_eq!(server.get(&format!("/design?{DESIGN}"), None).status, 303);
    let login = server.get("/login", None);
    assert_eq!(login.status, 200);
    assert!(login.body.contains("type=\"password\" name=\"token\""));
    let cookie = login.cookie.clone().unwrap();
    let csrf = csrf_of(&login.body);
    // Not logged in, a form post is refused whatever it carries.
    assert_eq!(
        server
            .post("/plans", Some(&cookie), &save_form(&csrf, "x.yaml"))
            .status,
        403
    );
    let wrong = server.post(
        "/login",
        Some(&cookie),
        &[("csrf", &csrf), ("token", "guess guess guess")],
    );
    assert_eq!(wrong.status, 403);
    assert!(
        wrong
            .body
            .contains("not the token the server was started with")
    );
    assert_eq!(server.get("/", Some(&cookie)).status, 303);
    // The login form too needs its CSRF token.
    assert_eq!(
        server
            .post("/login", Some(&cookie), &[("token", token)])
            .status,
        403
    );
    let right = server.post(
        "/login",
        Some(&cookie),
        &[("csrf", &csrf), ("token", token)],
    );
    assert_eq!(right.status, 303);
    let logged_in = right.cookie.clone().expect("a new session cookie");
    assert_ne!(logged_in, cookie);
    assert_eq!(server.get("/", Some(&logged_in)).status, 200);
    assert_eq!(
        server
            .get(&format!("/design?{DESIGN}"), Some(&logged_in))
            .status,
        200
    );
    // The session ID known before the login is worth nothing after it.
    assert_eq!(server.get("/", Some(&cookie)).status, 303);
    assert!(!server.path("x.yaml").exists());
}

#[test]
fn another_address_than_this_machine_needs_a_token() {
    for (args, words) in [
        (vec!["--listen", "192.0.2.10"], "give --token T as well"),
        (
            vec!["--listen", "0.0.0.0", "--token", "correct horse battery"],
            "would answer on every address",
        ),
        (vec!["--listen", "here"], "--listen"),
        (vec!["--token", "short"], "give at least 12"),
        (
            vec!["--token-file", "no-such-token-file"],
            "--token-file no-such-token-file: the file does not exist",
        ),
        (
            vec!["--token", "correct horse battery", "--token-file", "t.txt"],
            "--token",
        ),
    ] {
        let out = Command::new(BIN).arg("serve").args(&args).output().unwrap();
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        let text = String::from_utf8(out.stderr).unwrap();
        assert_eq!(text.lines().count(), 1, "{text}");
        assert!(text.contains(words), "{args:?}: {text}");
        assert!(out.stdout.is_empty());
    }
}

#[test]
fn the_token_can_come_from_a_file_and_a_wrong_login_waits() {
    let dir = tempfile::tempdir().unwrap();
    let file = dir.path().join("token.txt");
    std::fs::write(&file, "correct horse battery\n").unwrap();
    let server = Server::start(&["--token-file", file.to_str().unwrap()]);
    let login = server.get("/login", None);
    let cookie = login.cookie.clone().unwrap();
    let csrf = csrf_of(&login.body);
    // A wrong login is answered after a pause of a second (logins pass
    // one at a time), so a token cannot be guessed quickly.
    let started = std::time::Instant::now();
    let wrong = server.post(
        "/login",
        Some(&cookie),
        &[("csrf", &csrf), ("token", "correct horse batterY")],
    );
    assert_eq!(wrong.status, 403);
    assert!(started.elapsed() >= std::time::Duration::from_millis(950));
    let right = server.post(
        "/login",
        Some(&cookie),
        &[("csrf", &csrf), ("token", "correct horse battery")],
    );
    assert_eq!(right.status, 303);
}

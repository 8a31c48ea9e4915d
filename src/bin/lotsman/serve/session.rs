//! Sessions: each browser gets a random session ID in a cookie, and with
//! it a random CSRF token that every form of its pages carries in a
//! hidden field. A form posted without the token of its session (from
//! another site, or from a page of an older session) is refused. With
//! `--token`, a session is logged in only after the login form.
//!
//! Both are 32 bytes from the operating system's generator, written in
//! hexadecimal. The sessions live in memory, at most [`MAX_SESSIONS`],
//! the oldest forgotten first; they end with the server.

use std::collections::HashMap;
use std::fmt::Write;
use std::sync::{Mutex, MutexGuard};

/// The most sessions kept at once.
pub const MAX_SESSIONS: usize = 10_000;

/// The bytes of a session ID and of a CSRF token.
const TOKEN_BYTES: usize = 32;

/// One browser's session.
#[derive(Clone, Debug)]
pub struct Session {
    /// The ID its cookie holds.
    pub id: String,
    /// The token its forms carry.
    pub csrf: String,
    /// Whether it passed the login (always, when no `--token` was given).
    pub logged_in: bool,
}

/// What is kept of a session.
struct Kept {
    csrf: String,
    logged_in: bool,
    /// The order in which sessions were opened, to forget the oldest.
    opened: u64,
}

/// The sessions of the server.
pub struct Sessions {
    kept: Mutex<(HashMap<String, Kept>, u64)>,
    cookie: String,
}

impl Sessions {
    /// No sessions yet; the cookie is named after the port, so that two
    /// servers on one machine keep their sessions apart.
    pub fn new(port: u16) -> Self {
        Sessions {
            kept: Mutex::new((HashMap::new(), 0)),
            cookie: format!("lotsman_session_{port}"),
        }
    }

    /// The name of the session cookie.
    pub fn cookie_name(&self) -> &str {
        &self.cookie
    }

    /// The session of the ID a cookie holds, if the server knows it.
    pub fn find(&self, id: &str) -> Option<Session> {
        let kept = self.lock();
        kept.0.get(id).map(|k| Session {
            id: id.to_string(),
            csrf: k.csrf.clone(),
            logged_in: k.logged_in,
        })
    }

    /// A new session with new tokens.
    pub fn open(&self, logged_in: bool) -> Result<Session, getrandom::Error> {
        let session = Session {
            id: random_token()?,
            csrf: random_token()?,
            logged_in,
        };
        let mut kept = self.lock();
        if kept.0.len() >= MAX_SESSIONS
            // The oldest session not logged in goes first, so that
            // requests without a login cannot push out those with one.
            && let Some(oldest) = kept
                .0
                .iter()
                .min_by_key(|(_, k)| (k.logged_in, k.opened))
                .map(|(id, _)| id.clone())
        {
            kept.0.remove(&oldest);
        }
        kept.1 += 1;
        let opened = kept.1;
        kept.0.insert(
            session.id.clone(),
            Kept {
                csrf: session.csrf.clone(),
                logged_in,
                opened,
            },
        );
        Ok(session)
    }

    /// Forgets the session `id` (after a login, which opens a new one).
    pub fn close(&self, id: &str) {
        self.lock().0.remove(id);
    }

    /// The `Set-Cookie` value of `session`: sent back only to this
    /// server, never to scripts, never with a request from another site.
    pub fn cookie(&self, session: &Session) -> String {
        format!(
            "{}={}; Path=/; HttpOnly; SameSite=Strict",
            self.cookie, session.id
        )
    }

    /// The map, even after a thread panicked while holding it (it holds
    /// no invariant a half-done change could break).
    fn lock(&self) -> MutexGuard<'_, (HashMap<String, Kept>, u64)> {
        self.kept
            .lock()
            .unwrap_or_else(std::sync::PoisonError::into_inner)
    }
}

/// [`TOKEN_BYTES`] random bytes from the operating system, in hexadecimal.
pub fn random_token() -> Result<String, getrandom::Error> {
    let mut bytes = [0u8; TOKEN_BYTES];
    getrandom::fill(&mut bytes)?;
    let mut text = String::with_capacity(2 * TOKEN_BYTES);
    for b in bytes {
        let _ = write!(text, "{b:02x}");
    }
    Ok(text)
}

/// Whether `given` equals `expected`, compared in a time that does not
/// depend on where they first differ.
pub fn same(given: &str, expected: &str) -> bool {
    let (a, b) = (given.as_bytes(), expected.as_bytes());
    if a.len() != b.len() {
        return false;
    }
    a.iter().zip(b).fold(0u8, |acc, (x, y)| acc | (x ^ y)) == 0
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tokens_are_new_each_time() {
        let (a, b) = (random_token().unwrap(), random_token().unwrap());
        assert_eq!(a.len(), 64);
        assert_ne!(a, b);
    }

    #[test]
    fn same_compares_whole_texts() {
        assert!(same("abc", "abc"));
        assert!(!same("abc", "abd"));
        assert!(!same("ab", "abc"));
    }

    #[test]
    fn a_session_is_found_by_its_id_until_closed() {
        let sessions = Sessions::new(1);
        let s = sessions.open(false).unwrap();
        assert_eq!(sessions.find(&s.id).unwrap().csrf, s.csrf);
        sessions.close(&s.id);
        assert!(sessions.find(&s.id).is_none());
    }
}

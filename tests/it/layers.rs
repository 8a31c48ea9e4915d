//! The library's layers look only down (issue 15).
//!
//! Every file under `src/` belongs to one layer, found by the longest path
//! prefix in [`LAYERS`]. A file may import from its own layer or a lower
//! one, never from a higher one, and no files may import each other around
//! a circle, even inside one folder.
//!
//! An import is every `use` of the crate's own items and every path written
//! out in the code (`crate::x::y`, `super::x`, also inside macros and
//! attributes such as `#[error(...)]`). A path is followed through the
//! modules' re-exports to the file that defines the item, so `crate::Model`
//! counts as an import of `src/model/mod.rs`, not of `src/lib.rs`. A
//! re-export (`pub use`, in a folder's `mod.rs` or the crate root) is a
//! door, not a need: it must look down like any import, but it does not
//! close a cycle, unless the file's own code uses the name too. Unit tests
//! (`#[cfg(test)]` items) are left out: a test may use what it checks
//! against. Doc comments are not read: a link in the docs is no import.
//!
//! The check of the real tree runs the same code as the checks of made-up
//! trees below, which show that each kind of breach is caught.
//!
//! The files are read as Rust tokens (`proc-macro2`), so comments and
//! string contents never count as paths.

use std::collections::{BTreeMap, BTreeSet};
use std::path::Path;
use std::str::FromStr;

use proc_macro2::{Delimiter, Spacing, TokenStream, TokenTree};

/// The layer of each file by path prefix, lowest layer first; the longest
/// matching prefix wins. Update it when a folder moves (`src/print/`
/// replacing `src/sheet/`, the binary moving to `src/bin/lotsman/`).
const LAYERS: &[(&str, u8, &str)] = &[
    ("src/numeric/", 0, "base"),
    ("src/plain.rs", 0, "base"),
    ("src/fs/", 0, "base"),
    ("src/input.rs", 0, "base"),
    ("src/budget/", 0, "base"),
    ("src/model/", 1, "model"),
    ("src/plan/", 2, "plan"),
    ("src/draw/", 2, "plan"),
    ("src/design/", 3, "design"),
    ("src/standard/", 3, "design"),
    ("src/source/", 4, "source"),
    // The ledger decides its rows again by their plan sources.
    ("src/ledger/", 4, "source"),
    ("src/report/", 5, "report"),
    ("src/print/", 6, "print"),
    ("src/batch/", 7, "orchestration"),
    ("src/demo.rs", 7, "orchestration"),
    ("src/demo_ledger.rs", 7, "orchestration"),
    // The crate root re-exports every layer; nothing imports it.
    ("src/lib.rs", 7, "orchestration"),
    ("src/bin/", 8, "binary"),
];

/// The layer of `path`, by the longest prefix in [`LAYERS`].
fn layer_of(path: &str) -> Option<(u8, &'static str)> {
    LAYERS
        .iter()
        .filter(|(prefix, _, _)| path.starts_with(prefix))
        .max_by_key(|(prefix, _, _)| prefix.len())
        .map(|&(_, layer, name)| (layer, name))
}

/// One module: a file, or an inline `mod name { ... }` inside one.
#[derive(Default)]
struct Module {
    file: String,
    parent: Option<usize>,
    /// Where the files of its `mod name;` children live.
    dir: String,
    children: BTreeMap<String, usize>,
    /// Names of the items it defines.
    items: BTreeSet<String>,
    /// Names its `use` declarations bring in: the path they name.
    uses: BTreeMap<String, Vec<String>>,
    /// The modules of its `use path::*`.
    globs: Vec<Vec<String>>,
    /// A `#[cfg(test)]` module: unit tests may use what they check against.
    test: bool,
}

/// One `use` leaf: its path, the name it binds and whether it is a glob.
struct Leaf {
    path: Vec<String>,
    name: Option<String>,
    glob: bool,
}

/// An import of one file by another.
struct Import {
    from: String,
    to: String,
    /// The path as written.
    text: String,
    /// A re-export (`pub use`): checked for direction, not for cycles.
    reexport: bool,
}

/// The modules of every crate found under `src/`, and what could not be read.
struct Crates {
    modules: Vec<Module>,
    problems: Vec<String>,
}

fn tokens(text: &str) -> Vec<TokenTree> {
    TokenStream::from_str(text)
        .map(|s| s.into_iter().collect())
        .unwrap_or_default()
}

fn is_ident(t: Option<&TokenTree>, word: &str) -> bool {
    matches!(t, Some(TokenTree::Ident(i)) if i == word)
}

fn is_punct(t: Option<&TokenTree>, c: char) -> bool {
    matches!(t, Some(TokenTree::Punct(p)) if p.as_char() == c)
}

/// Whether `ts[i..]` starts with `::`.
fn is_path_sep(ts: &[TokenTree], i: usize) -> bool {
    matches!(ts.get(i), Some(TokenTree::Punct(p)) if p.as_char() == ':' && p.spacing() == Spacing::Joint)
        && is_punct(ts.get(i + 1), ':')
}

/// The leaves of a use tree (the tokens between `use` and `;`).
fn use_leaves(ts: &[TokenTree], prefix: &[String], out: &mut Vec<Leaf>) {
    let mut path = prefix.to_vec();
    let mut i = 0;
    while i < ts.len() {
        match &ts[i] {
            TokenTree::Ident(id) if id == "as" => {
                let name = ts.get(i + 1).map(ToString::to_string);
                let name = name.filter(|n| n != "_");
                out.push(Leaf {
                    path,
                    name,
                    glob: false,
                });
                return;
            }
            TokenTree::Ident(id) => path.push(id.to_string()),
            TokenTree::Punct(p) if p.as_char() == '*' => {
                out.push(Leaf {
                    path,
                    name: None,
                    glob: true,
                });
                return;
            }
            TokenTree::Group(g) if g.delimiter() == Delimiter::Brace => {
                let inner: Vec<TokenTree> = g.stream().into_iter().collect();
                for part in inner.split(|t| is_punct(Some(t), ',')) {
                    if !part.is_empty() {
                        use_leaves(part, &path, out);
                    }
                }
                return;
            }
            _ => {}
        }
        i += 1;
    }
    if path.last().is_some_and(|s| s == "self") {
        path.pop();
    }
    let name = path.last().cloned();
    if !path.is_empty() {
        out.push(Leaf {
            path,
            name,
            glob: false,
        });
    }
}

/// The tokens of a `use` declaration starting at `ts[i]` (the `use`), and
/// the index after its `;`. `None` for `use<..>` bounds.
fn use_declaration(ts: &[TokenTree], i: usize) -> Option<(&[TokenTree], usize)> {
    if is_punct(ts.get(i + 1), '<') {
        return None;
    }
    let end = (i + 1..ts.len())
        .find(|&j| is_punct(ts.get(j), ';'))
        .unwrap_or(ts.len());
    Some((&ts[i + 1..end], end + 1))
}

/// Whether the item at `ts[i]` is public in some way (`pub`, `pub(crate)`).
fn is_public(ts: &[TokenTree], i: usize) -> bool {
    (i >= 1 && is_ident(ts.get(i - 1), "pub"))
        || (i >= 2
            && matches!(&ts[i - 1], TokenTree::Group(g) if g.delimiter() == Delimiter::Parenthesis)
            && is_ident(ts.get(i - 2), "pub"))
}

/// Whether `ts[i]` starts the attribute `#[cfg(test)]`.
fn is_cfg_test(ts: &[TokenTree], i: usize) -> bool {
    is_punct(ts.get(i), '#')
        && matches!(ts.get(i + 1), Some(TokenTree::Group(g))
            if g.delimiter() == Delimiter::Bracket
                && g.stream().to_string().replace(' ', "") == "cfg(test)")
}

/// The index after the item that starts at `ts[i]`: after its first `;`
/// or body in braces.
fn item_end(ts: &[TokenTree], i: usize) -> usize {
    (i..ts.len())
        .find(|&j| {
            is_punct(ts.get(j), ';')
                || matches!(&ts[j], TokenTree::Group(g) if g.delimiter() == Delimiter::Brace)
        })
        .map_or(ts.len(), |j| j + 1)
}

/// The names used in `ts` outside `use` declarations and unit tests.
fn code_names(ts: &[TokenTree], out: &mut BTreeSet<String>) {
    let mut i = 0;
    while i < ts.len() {
        if is_cfg_test(ts, i) {
            i = item_end(ts, i + 2);
            continue;
        }
        match &ts[i] {
            TokenTree::Ident(id) if id == "use" => {
                if let Some((_, next)) = use_declaration(ts, i) {
                    i = next;
                    continue;
                }
            }
            TokenTree::Ident(id) => {
                out.insert(id.to_string());
            }
            TokenTree::Group(g) => {
                let inner: Vec<TokenTree> = g.stream().into_iter().collect();
                code_names(&inner, out);
            }
            _ => {}
        }
        i += 1;
    }
}

const ITEM_WORDS: &[&str] = &[
    "fn", "struct", "enum", "trait", "type", "const", "static", "union",
];

impl Crates {
    /// Reads the crates rooted at `src/lib.rs`, `src/main.rs` and
    /// `src/bin/`, from `files` (path relative to the package, text).
    fn read(files: &BTreeMap<String, String>) -> Crates {
        let mut crates = Crates {
            modules: Vec::new(),
            problems: Vec::new(),
        };
        let roots = files.keys().filter(|p| {
            *p == "src/lib.rs"
                || *p == "src/main.rs"
                || (p.starts_with("src/bin/")
                    && (p.matches('/').count() == 2 || p.ends_with("/main.rs")))
        });
        for root in roots {
            let dir = root.rsplit_once('/').map_or("", |(d, _)| d).to_string();
            crates.file_module(files, root, None, dir);
        }
        crates
    }

    fn file_module(
        &mut self,
        files: &BTreeMap<String, String>,
        path: &str,
        parent: Option<usize>,
        dir: String,
    ) -> usize {
        let id = self.modules.len();
        self.modules.push(Module {
            file: path.to_string(),
            parent,
            dir,
            ..Module::default()
        });
        match files.get(path) {
            Some(text) => {
                let ts = tokens(text);
                if ts.is_empty() && !text.trim().is_empty() {
                    self.problems
                        .push(format!("{path}: not read as Rust tokens"));
                }
                self.scan_module(files, id, &ts);
            }
            None => self.problems.push(format!("{path}: declared but missing")),
        }
        id
    }

    /// Records the items, uses and child modules at the top level of `ts`.
    fn scan_module(&mut self, files: &BTreeMap<String, String>, id: usize, ts: &[TokenTree]) {
        let mut i = 0;
        let mut test = false;
        while i < ts.len() {
            if is_cfg_test(ts, i) {
                // Only a test module in its own file is kept, to be left
                // out with its file.
                let end = item_end(ts, i + 2);
                if !is_punct(ts.get(end - 1), ';')
                    || !ts[i + 2..end].iter().any(|t| is_ident(Some(t), "mod"))
                {
                    i = end;
                    continue;
                }
                test = true;
                i += 2;
                continue;
            }
            let TokenTree::Ident(word) = &ts[i] else {
                i += 1;
                continue;
            };
            let word = word.to_string();
            if word == "use" {
                if let Some((tree, next)) = use_declaration(ts, i) {
                    let mut leaves = Vec::new();
                    use_leaves(tree, &[], &mut leaves);
                    for leaf in leaves {
                        if leaf.glob {
                            self.modules[id].globs.push(leaf.path);
                        } else if let Some(name) = leaf.name {
                            self.modules[id].uses.insert(name, leaf.path);
                        }
                    }
                    i = next;
                    continue;
                }
            } else if word == "mod"
                && let Some(TokenTree::Ident(name)) = ts.get(i + 1)
            {
                let name = name.to_string();
                let dir = self.modules[id].dir.clone();
                let child = match ts.get(i + 2) {
                    Some(TokenTree::Group(g)) if g.delimiter() == Delimiter::Brace => {
                        let child = self.modules.len();
                        self.modules.push(Module {
                            file: self.modules[id].file.clone(),
                            parent: Some(id),
                            dir: format!("{dir}/{name}"),
                            ..Module::default()
                        });
                        let inner: Vec<TokenTree> = g.stream().into_iter().collect();
                        self.scan_module(files, child, &inner);
                        child
                    }
                    _ => {
                        let flat = format!("{dir}/{name}.rs");
                        let folder = format!("{dir}/{name}/mod.rs");
                        if files.contains_key(&flat) {
                            self.file_module(files, &flat, Some(id), format!("{dir}/{name}"))
                        } else {
                            let dir = format!("{dir}/{name}");
                            self.file_module(files, &folder, Some(id), dir)
                        }
                    }
                };
                self.modules[id].children.insert(name, child);
                self.modules[child].test = std::mem::take(&mut test);
                i += 3;
                continue;
            } else if ITEM_WORDS.contains(&word.as_str())
                && let Some(TokenTree::Ident(name)) = ts.get(i + 1)
            {
                self.modules[id].items.insert(name.to_string());
            } else if word == "macro_rules"
                && is_punct(ts.get(i + 1), '!')
                && let Some(TokenTree::Ident(name)) = ts.get(i + 2)
            {
                self.modules[id].items.insert(name.to_string());
            }
            i += 1;
        }
    }

    /// Whether module `id` or one around it is a `#[cfg(test)]` module.
    fn in_test(&self, mut id: usize) -> bool {
        loop {
            if self.modules[id].test {
                return true;
            }
            match self.modules[id].parent {
                Some(p) => id = p,
                None => return false,
            }
        }
    }

    /// The root module of the crate that holds module `id`.
    fn root_of(&self, mut id: usize) -> usize {
        while let Some(p) = self.modules[id].parent {
            id = p;
        }
        id
    }

    /// The module whose file defines what `path` names, seen from module
    /// `at`; `None` for a path outside the crate (std, serde, ...).
    fn resolve(&self, at: usize, path: &[String], depth: usize) -> Option<usize> {
        if depth > 32 || path.is_empty() {
            return None;
        }
        let (mut m, mut rest) = match path[0].as_str() {
            "crate" => (self.root_of(at), &path[1..]),
            "self" => (at, &path[1..]),
            "super" => (self.modules[at].parent?, &path[1..]),
            _ => (at, path),
        };
        while rest.first().is_some_and(|s| s == "super") {
            m = self.modules[m].parent?;
            rest = &rest[1..];
        }
        let relative = !matches!(path[0].as_str(), "crate" | "self" | "super");
        for (k, seg) in rest.iter().enumerate() {
            let module = &self.modules[m];
            if let Some(&child) = module.children.get(seg) {
                m = child;
                continue;
            }
            if module.items.contains(seg) {
                return Some(m);
            }
            if let Some(target) = module.uses.get(seg) {
                let mut full = target.clone();
                full.extend_from_slice(&rest[k + 1..]);
                let found = self.resolve(m, &full, depth + 1);
                // A relative first segment that is no local name is an
                // outside crate's.
                return if found.is_none() && relative && k == 0 {
                    None
                } else {
                    found.or(Some(m))
                };
            }
            for glob in &module.globs {
                let mut full = glob.clone();
                full.extend_from_slice(&rest[k..]);
                if let Some(found) = self.resolve(m, &full, depth + 1) {
                    return Some(found);
                }
            }
            // A variant, an associated item or a macro-made name: the
            // module reached so far is what the file depends on.
            return (!(relative && k == 0)).then_some(m);
        }
        Some(m)
    }

    /// Every import written in module `at`'s tokens `ts`; `used` holds the
    /// names its file's code uses, outside its `use` declarations.
    fn imports(&self, at: usize, ts: &[TokenTree], used: &BTreeSet<String>, out: &mut Vec<Import>) {
        let mut i = 0;
        while i < ts.len() {
            if is_cfg_test(ts, i) {
                i = item_end(ts, i + 2);
                continue;
            }
            match &ts[i] {
                TokenTree::Ident(id) if id == "use" => {
                    if let Some((tree, next)) = use_declaration(ts, i) {
                        let public = is_public(ts, i);
                        let mut leaves = Vec::new();
                        use_leaves(tree, &[], &mut leaves);
                        for leaf in leaves {
                            // A public name the file's own code also uses
                            // is an import as well as a door.
                            let reexport = public
                                && (leaf.glob
                                    || leaf.name.as_ref().is_none_or(|n| !used.contains(n)));
                            self.push(at, &leaf.path, reexport, out);
                        }
                        i = next;
                        continue;
                    }
                }
                TokenTree::Ident(id) if id == "mod" => {
                    if let (Some(TokenTree::Ident(name)), Some(TokenTree::Group(g))) =
                        (ts.get(i + 1), ts.get(i + 2))
                        && g.delimiter() == Delimiter::Brace
                        && let Some(&child) = self.modules[at].children.get(&name.to_string())
                    {
                        let inner: Vec<TokenTree> = g.stream().into_iter().collect();
                        self.imports(child, &inner, used, out);
                        i += 3;
                        continue;
                    }
                }
                TokenTree::Punct(p) if p.as_char() == '$' => {
                    // `$crate` in a macro_rules body.
                    i += 2;
                    continue;
                }
                TokenTree::Ident(id)
                    if (id == "crate" || id == "super" || id == "self")
                        && is_path_sep(ts, i + 1) =>
                {
                    let mut path = vec![id.to_string()];
                    let mut j = i + 1;
                    while is_path_sep(ts, j) {
                        match ts.get(j + 2) {
                            Some(TokenTree::Ident(seg)) => path.push(seg.to_string()),
                            _ => break,
                        }
                        j += 3;
                    }
                    self.push(at, &path, false, out);
                    i = j;
                    continue;
                }
                TokenTree::Group(g) => {
                    let inner: Vec<TokenTree> = g.stream().into_iter().collect();
                    self.imports(at, &inner, used, out);
                }
                _ => {}
            }
            i += 1;
        }
    }

    fn push(&self, at: usize, path: &[String], reexport: bool, out: &mut Vec<Import>) {
        let Some(target) = self.resolve(at, path, 0) else {
            return;
        };
        let from = &self.modules[at].file;
        let to = &self.modules[target].file;
        if from != to {
            out.push(Import {
                from: from.clone(),
                to: to.clone(),
                text: path.join("::"),
                reexport,
            });
        }
    }
}

/// Every breach of the layering rule in `files` (package-relative path,
/// text), one line each; empty when the layers hold.
fn breaches(files: &BTreeMap<String, String>) -> Vec<String> {
    let crates = Crates::read(files);
    let mut found = crates.problems.clone();
    let in_crate: BTreeSet<&str> = crates.modules.iter().map(|m| m.file.as_str()).collect();
    for path in files.keys() {
        if layer_of(path).is_none() {
            found.push(format!("{path}: no layer in the table LAYERS"));
        }
        if !in_crate.contains(path.as_str()) {
            found.push(format!("{path}: no `mod` declares it"));
        }
    }
    let mut imports = Vec::new();
    for (id, module) in crates.modules.iter().enumerate() {
        // Inline modules are read with their file.
        let inline = module
            .parent
            .is_some_and(|p| crates.modules[p].file == module.file);
        if !inline
            && !crates.in_test(id)
            && let Some(text) = files.get(&module.file)
        {
            let ts = tokens(text);
            let mut used = BTreeSet::new();
            code_names(&ts, &mut used);
            crates.imports(id, &ts, &used, &mut imports);
        }
    }
    for import in &imports {
        if let (Some((a, a_name)), Some((b, b_name))) =
            (layer_of(&import.from), layer_of(&import.to))
            && b > a
        {
            found.push(format!(
                "{} ({a_name}, layer {a}) imports `{}` from {} ({b_name}, layer {b}), a higher layer",
                import.from, import.text, import.to
            ));
        }
    }
    found.extend(cycles(&imports));
    found
}

/// The file-level import cycles among `imports` (re-exports left out), one
/// line per cycle, naming each file and the import that leads on.
fn cycles(imports: &[Import]) -> Vec<String> {
    let mut next: BTreeMap<&str, BTreeMap<&str, &str>> = BTreeMap::new();
    for import in imports.iter().filter(|i| !i.reexport) {
        next.entry(&import.from)
            .or_default()
            .entry(&import.to)
            .or_insert(&import.text);
    }
    let mut reported: BTreeSet<BTreeSet<&str>> = BTreeSet::new();
    let mut found = Vec::new();
    for &start in next.keys() {
        // The shortest way back to `start`, by breadth-first search.
        let mut came_from: BTreeMap<&str, &str> = BTreeMap::new();
        let mut frontier = vec![start];
        let mut closed = None;
        while !frontier.is_empty() && closed.is_none() {
            let mut later = Vec::new();
            for &file in &frontier {
                for &to in next.get(file).into_iter().flat_map(|m| m.keys()) {
                    if to == start {
                        closed = Some(file);
                        break;
                    }
                    if !came_from.contains_key(to) {
                        came_from.insert(to, file);
                        later.push(to);
                    }
                }
                if closed.is_some() {
                    break;
                }
            }
            frontier = later;
        }
        let Some(last) = closed else { continue };
        let mut ring = vec![last];
        while let Some(&before) = came_from.get(ring[ring.len() - 1]) {
            ring.push(before);
        }
        ring.reverse();
        if ring[0] != start {
            ring.insert(0, start);
        }
        if !reported.insert(ring.iter().copied().collect()) {
            continue;
        }
        let mut line = String::from("import cycle:");
        for (k, &file) in ring.iter().enumerate() {
            let to = ring.get(k + 1).copied().unwrap_or(start);
            line.push_str(&format!(" {file} imports `{}` ->", next[file][to]));
        }
        line.push_str(&format!(" {start}"));
        found.push(line);
    }
    found
}

/// Every `.rs` file under `src/`, by package-relative path.
fn source_files() -> BTreeMap<String, String> {
    fn walk(dir: &Path, root: &Path, out: &mut BTreeMap<String, String>) {
        let mut entries: Vec<_> = std::fs::read_dir(dir)
            .unwrap()
            .map(|e| e.unwrap().path())
            .collect();
        entries.sort();
        for path in entries {
            if path.is_dir() {
                walk(&path, root, out);
            } else if path.extension().is_some_and(|e| e == "rs") {
                let name = path.strip_prefix(root).unwrap();
                let name = name.to_string_lossy().replace('\\', "/");
                out.insert(name, std::fs::read_to_string(&path).unwrap());
            }
        }
    }
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let mut files = BTreeMap::new();
    walk(&root.join("src"), root, &mut files);
    files
}

#[test]
fn every_import_in_src_looks_down_and_none_closes_a_cycle() {
    let files = source_files();
    assert!(files.len() > 50, "src/ read: {} files", files.len());
    let found = breaches(&files);
    assert!(
        found.is_empty(),
        "{} breaches of the layers:\n{}",
        found.len(),
        found.join("\n")
    );
}

/// A made-up crate from `(path, text)` pairs.
fn made_up(files: &[(&str, &str)]) -> BTreeMap<String, String> {
    files
        .iter()
        .map(|(p, t)| (p.to_string(), t.to_string()))
        .collect()
}

#[test]
fn an_import_from_a_higher_layer_is_named_with_its_file() {
    let files = made_up(&[
        ("src/lib.rs", "mod model; mod design; pub use design::Plan;"),
        (
            "src/model/mod.rs",
            "use crate::design::{Plan, other::Rule}; pub struct Model;",
        ),
        ("src/design/mod.rs", "mod other; pub struct Plan;"),
        ("src/design/other.rs", "pub struct Rule;"),
    ]);
    let found = breaches(&files);
    assert_eq!(found.len(), 2, "{found:#?}");
    assert!(found[0].contains("src/model/mod.rs (model, layer 1) imports `crate::design::Plan` from src/design/mod.rs (design, layer 3)"));
    assert!(found[1].contains("`crate::design::other::Rule` from src/design/other.rs"));
}

#[test]
fn a_path_through_the_root_counts_as_an_import_of_the_file_defining_it() {
    let files = made_up(&[
        ("src/lib.rs", "mod model; mod design; pub use design::Plan;"),
        (
            "src/model/mod.rs",
            "pub fn f() -> usize { std::mem::size_of::<crate::Plan>() }",
        ),
        ("src/design/mod.rs", "mod plan; pub use plan::Plan;"),
        ("src/design/plan.rs", "pub struct Plan;"),
    ]);
    let found = breaches(&files);
    assert_eq!(found.len(), 1, "{found:#?}");
    assert!(found[0].contains("imports `crate::Plan` from src/design/plan.rs"));
}

#[test]
fn two_files_of_one_layer_importing_each_other_are_a_cycle() {
    let files = made_up(&[
        ("src/lib.rs", "mod design;"),
        (
            "src/design/mod.rs",
            "mod a; mod b; pub use a::A; pub use b::B;",
        ),
        ("src/design/a.rs", "use super::B; pub struct A(B);"),
        // An import inside a macro's arguments counts too.
        (
            "src/design/b.rs",
            "pub struct B; fn f() { println!(\"{}\", crate::design::a::A(B).0 as u8); }",
        ),
    ]);
    let found = breaches(&files);
    assert_eq!(found.len(), 1, "{found:#?}");
    assert_eq!(
        found[0],
        "import cycle: src/design/a.rs imports `super::B` -> src/design/b.rs imports `crate::design::a::A` -> src/design/a.rs"
    );
}

#[test]
fn re_exports_close_no_cycle_and_comments_are_no_imports() {
    let files = made_up(&[
        ("src/lib.rs", "mod plan; pub use plan::{Stage, StagedPlan};"),
        (
            "src/plan/mod.rs",
            "//! See [`crate::design`].\nmod stage; mod staged; pub use stage::Stage; pub use staged::StagedPlan;",
        ),
        ("src/plan/stage.rs", "pub struct Stage;"),
        (
            "src/plan/staged.rs",
            "use crate::Stage; /// Uses crate::design::Thing.\npub struct StagedPlan(Stage);",
        ),
    ]);
    assert_eq!(breaches(&files), Vec::<String>::new());
}

#[test]
fn a_public_use_that_the_file_also_calls_can_close_a_cycle() {
    let files = made_up(&[
        ("src/lib.rs", "mod design;"),
        (
            "src/design/mod.rs",
            "mod a; mod b; pub use a::A; pub use b::make; pub fn top() -> A { make() }",
        ),
        ("src/design/a.rs", "pub struct A;"),
        (
            "src/design/b.rs",
            "use super::top; pub fn make() -> super::A { top() }",
        ),
    ]);
    let found = breaches(&files);
    assert_eq!(
        found,
        [
            "import cycle: src/design/b.rs imports `super::top` -> src/design/mod.rs imports `b::make` -> src/design/b.rs"
        ]
    );
}

#[test]
fn a_file_outside_the_table_or_outside_the_crate_is_named() {
    let files = made_up(&[
        ("src/lib.rs", "mod elsewhere;"),
        ("src/elsewhere.rs", ""),
        ("src/model/stray.rs", ""),
    ]);
    let found = breaches(&files);
    assert_eq!(
        found,
        [
            "src/elsewhere.rs: no layer in the table LAYERS",
            "src/model/stray.rs: no `mod` declares it",
        ]
    );
}

#[test]
fn the_layer_table_takes_the_longest_prefix() {
    assert_eq!(layer_of("src/design/single.rs"), Some((3, "design")));
    assert_eq!(layer_of("src/print/map/field.rs"), Some((6, "print")));
    assert_eq!(
        layer_of("src/bin/lotsman/commands/judge.rs"),
        Some((8, "binary"))
    );
    assert_eq!(layer_of("src/unknown.rs"), None);
}

#[test]
fn unit_tests_may_use_what_they_check_against() {
    let files = made_up(&[
        ("src/lib.rs", "mod model; mod design;"),
        (
            "src/model/mod.rs",
            "pub struct Model;\n#[cfg(test)]\nmod tests { use crate::design::Plan; }\n#[cfg(test)]\nuse crate::design::Plan;",
        ),
        ("src/design/mod.rs", "pub struct Plan;"),
    ]);
    assert_eq!(breaches(&files), Vec::<String>::new());
}

//! Running poppler-utils on a PDF held in memory.

use std::process::Command as Process;

/// `pdftotext ARGS page.pdf -` on `pdf`: what it prints.
fn pdftotext(pdf: &[u8], args: &[&str]) -> String {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("page.pdf");
    std::fs::write(&path, pdf).unwrap();
    let out = Process::new("pdftotext")
        .args(args)
        .args([path.to_str().unwrap(), "-"])
        .output()
        .expect("pdftotext (poppler-utils) is installed");
    assert!(out.status.success(), "pdftotext {args:?} failed");
    String::from_utf8(out.stdout).unwrap()
}

/// The text of a PDF by pdftotext, in its reading order.
pub fn pdf_text(pdf: &[u8]) -> String {
    pdftotext(pdf, &[])
}

/// The heights in points of the boxes pdftotext gives the words `word` of
/// a PDF: the font size times 1.164 for the sheet's font (DejaVu Sans's
/// ascent plus descent), so 8 pt gives 9.31 and 7 pt 8.15.
pub fn word_heights(pdf: &[u8], word: &str) -> Vec<f64> {
    let attr = |line: &str, key: &str| -> f64 {
        let at = line.find(&format!("{key}=\"")).unwrap() + key.len() + 2;
        line[at..].split('"').next().unwrap().parse().unwrap()
    };
    pdftotext(pdf, &["-bbox"])
        .lines()
        .filter(|l| l.trim_end().ends_with(&format!(">{word}</word>")))
        .map(|l| attr(l, "yMax") - attr(l, "yMin"))
        .collect()
}

/// `pdftoppm -png -r 40` of `pdf`: the PNG of each page, and what poppler
/// said on stderr (a complaint about the file's structure lands there).
pub fn render(pdf: &[u8]) -> (Vec<Vec<u8>>, String) {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("page.pdf");
    std::fs::write(&path, pdf).unwrap();
    let out = Process::new("pdftoppm")
        .args(["-png", "-r", "40"])
        .arg(&path)
        .arg(dir.path().join("page"))
        .output()
        .expect("pdftoppm (poppler-utils) is installed");
    assert!(out.status.success(), "pdftoppm failed");
    let mut pngs: Vec<_> = std::fs::read_dir(dir.path())
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|x| x == "png"))
        .collect();
    pngs.sort();
    let pngs = pngs.iter().map(|p| std::fs::read(p).unwrap()).collect();
    (pngs, String::from_utf8_lossy(&out.stderr).into_owned())
}

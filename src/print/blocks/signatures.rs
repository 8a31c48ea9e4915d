//! Who prepared and who approved the plan, with lines to sign and date:
//! one under the other on a variables sheet ([`signatures`]), side by side
//! under the lot record on an attributes sheet ([`approval_block`]).

use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::facts::{Common, given};
use crate::print::geometry::Rect;
use crate::print::text::Shrink;
use crate::print::wording::sheet;

/// The signature block of a variables sheet in `area`: who prepared and
/// who approved the plan, one under the other, with lines for the
/// signature and the date.
pub fn signatures(c: &mut Canvas, f: &Common, area: Rect) {
    let (sig_x, top, sig_w, table_h) = (area.x, area.top(), area.w, area.h);
    let black = || grey(0.0);
    c.claim("signatures", area);
    c.rect_stroke(area, 0.5, black());
    for (i, (label, name)) in [
        (sheet::PREPARED_BY, given(&f.source.prepared_by)),
        (sheet::APPROVED_BY, given(&f.source.approved_by)),
    ]
    .iter()
    .enumerate()
    {
        let y = top - 5.0 - (table_h / 2.0) * i as f64;
        c.text(sig_x + 2.0, y, label, Face::Bold, 7.0, grey(0.3));
        c.paragraph(
            label,
            Rect::from_top(sig_x + 2.0, y - 1.0, sig_w - 4.0, 4.0),
            name,
            Face::Regular,
            Shrink::new(7.5, 5.5),
        );
        c.line(
            &[(sig_x + 2.0, y - 12.0), (sig_x + sig_w - 26.0, y - 12.0)],
            0.4,
            black(),
            None,
        );
        c.text(
            sig_x + 2.0,
            y - 14.5,
            sheet::SIGNATURE,
            Face::Regular,
            6.0,
            grey(0.4),
        );
        c.line(
            &[
                (sig_x + sig_w - 23.0, y - 12.0),
                (sig_x + sig_w - 2.0, y - 12.0),
            ],
            0.4,
            black(),
            None,
        );
        c.text(
            sig_x + sig_w - 23.0,
            y - 14.5,
            sheet::SIGNED_ON,
            Face::Regular,
            6.0,
            grey(0.4),
        );
    }
}

/// The approval of the plan: who prepared it and who approved it, side by
/// side in `area`, each with a line to sign and one to date (on an
/// attributes sheet, under the lot record).
pub fn approval_block(c: &mut Canvas, f: &Common, area: Rect) {
    approval_of(c, [&f.source.prepared_by, &f.source.approved_by], area);
}

/// [`approval_block`] of the names `[prepared, approved]`.
pub fn approval_of(c: &mut Canvas, [prepared, approved]: [&Option<String>; 2], area: Rect) {
    let (x, top, w, h) = (area.x, area.top(), area.w, area.h);
    c.claim("approval", area);
    c.rect_stroke(area, 0.5, grey(0.0));
    let half = w / 2.0;
    c.line(
        &[(x + half, top - 2.0), (x + half, top - h + 2.0)],
        0.3,
        grey(0.6),
        None,
    );
    let people = [
        (sheet::PREPARED_BY, given(prepared)),
        (sheet::APPROVED_BY, given(approved)),
    ];
    for (i, (label, name)) in people.iter().enumerate() {
        let hx = x + half * i as f64 + 2.0;
        let hw = half - 4.0;
        c.text(hx, top - 3.5, label, Face::Bold, 7.0, grey(0.3));
        c.paragraph(
            label,
            Rect::from_top(hx, top - 4.3, hw, 6.4),
            name,
            Face::Regular,
            Shrink::new(7.0, 5.5),
        );
        let line_y = top - h + 4.2;
        let date_w = 10.0;
        c.line(
            &[(hx, line_y), (hx + hw - date_w - 2.0, line_y)],
            0.4,
            grey(0.0),
            None,
        );
        c.line(
            &[(hx + hw - date_w, line_y), (hx + hw, line_y)],
            0.4,
            grey(0.0),
            None,
        );
        c.text(
            hx,
            line_y - 2.4,
            sheet::SIGNATURE,
            Face::Regular,
            6.0,
            grey(0.4),
        );
        c.text(
            hx + hw - date_w,
            line_y - 2.4,
            sheet::SIGNED_ON,
            Face::Regular,
            6.0,
            grey(0.4),
        );
    }
}

#[cfg(test)]
mod tests {
    use std::path::Path;

    use super::*;
    use crate::print::agreement::Agreement;
    use crate::print::draw::{Call, Font, Recorder, Stroke};
    use crate::print::fonts::Fonts;
    use crate::source::PlanSource;

    /// The approval block of a demo plan, drawn on a recording backend:
    /// its calls, and what the canvas left to check.
    fn approval_calls(area: Rect) -> (Recorder, crate::print::canvas::Laid) {
        let name = "tpw-seal-visual.yaml";
        let text = std::fs::read_to_string(Path::new("plans").join(name)).unwrap();
        let source = PlanSource::from_yaml(&text, Path::new(name)).unwrap();
        let request = source.request().unwrap();
        let plan = source.recorded_plan(&request.model).unwrap();
        let agreement = Agreement::points(&plan, &request.model, request.risks);
        let common = Common::new(
            &source,
            &text,
            name,
            agreement,
            &request.model,
            "single".into(),
        )
        .unwrap();
        let fonts = Fonts::embedded().unwrap();
        let mut recorder = Recorder::default();
        let mut c = Canvas::new(&mut recorder, &fonts);
        approval_block(&mut c, &common, area);
        let laid = c.finish(210.0, 297.0);
        (recorder, laid)
    }

    #[test]
    fn the_approval_block_draws_its_frame_names_and_signing_lines_inside_its_area() {
        let area = Rect::new(130.0, 40.0, 66.0, 17.0);
        let (recorder, laid) = approval_calls(area);
        let calls = &recorder.calls;
        // It claims its area, and fits it.
        assert!(laid.is_clean(), "{:?} {:?}", laid.overflows, laid.faults);
        assert_eq!(laid.regions.len(), 1);
        assert_eq!(laid.regions[0].name, "approval");
        assert_eq!((laid.regions[0].x, laid.regions[0].w), (130.0, 66.0));
        // First the frame: a closed line round the area, half a point black.
        let frame = [
            (130.0, 40.0),
            (196.0, 40.0),
            (196.0, 57.0),
            (130.0, 57.0),
            (130.0, 40.0),
        ];
        match &calls[0] {
            Call::Line { points, stroke } => {
                assert_eq!(points.as_slice(), &frame);
                assert_eq!(
                    *stroke,
                    Stroke {
                        width: 0.5,
                        colour: grey(0.0),
                        dash: None
                    }
                );
            }
            other => panic!("the frame comes first, not {other:?}"),
        }
        // Then, for each person, the label in bold, the name from the
        // source (wrapped to its half of the block), and the signature and
        // date lines with their captions.
        assert_eq!(
            recorder.texts(),
            [
                "Prepared by",
                "R. Odumbe, supplier",
                "quality engineer",
                "Signature",
                "Date",
                "Approved by",
                "H. Vasquez-Lind,",
                "quality manager",
                "Signature",
                "Date",
            ]
        );
        let bold = calls.iter().any(|c| {
            matches!(c, Call::Text { text, font: Font { face: Face::Bold, .. }, .. } if text == "Approved by")
        });
        assert!(bold, "the labels are bold");
        // Everything drawn stays inside the area.
        let inside =
            |&(x, y): &(f64, f64)| (130.0..=196.0).contains(&x) && (40.0..=57.0).contains(&y);
        for call in calls {
            match call {
                Call::Line { points, .. } => assert!(points.iter().all(inside), "{call:?}"),
                Call::Text { at, .. } => assert!(inside(at), "{call:?}"),
                other => panic!("the block draws lines and text only, not {other:?}"),
            }
        }
        // Two lines to sign and two to date, at one height per person.
        let rules = calls
            .iter()
            .filter(|c| matches!(c, Call::Line { points, .. } if points.len() == 2 && points[0].1 == points[1].1))
            .count();
        assert_eq!(rules, 4);
    }

    #[test]
    fn a_name_too_long_for_its_line_is_an_overflow() {
        // Too narrow for the names: the paragraphs overflow, and say so.
        let (_, laid) = approval_calls(Rect::new(130.0, 40.0, 30.0, 17.0));
        assert!(
            laid.overflows.iter().any(|o| o.contains("Vasquez-Lind")),
            "{:?}",
            laid.overflows
        );
    }
}

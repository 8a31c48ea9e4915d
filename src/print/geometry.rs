//! Areas of a page: a [`Rect`] that layouts split and inset instead of
//! passing loose `(x, y, w, h)` numbers, the [`Region`] a block claims for
//! the overlap check, and the corner boxes of labels and cells.
//!
//! Units are millimetres from the page's bottom-left corner, y upwards,
//! as in PDF; type is sized in points ([`MM_PER_PT`]).

/// Millimetres per point (1 pt = 1/72 inch): the page is laid out in mm,
/// type is sized in points.
pub const MM_PER_PT: f64 = 25.4 / 72.0;

/// A point on the page, mm.
pub type Point = (f64, f64);

/// A box by its corners, `(x0, y0, x1, y1)` with `x0 <= x1`, `y0 <= y1`:
/// the form of a label's box, a map cell or a clip area, whose edges are
/// computed rather than measured.
pub type Corners = (f64, f64, f64, f64);

/// A rectangle of the page: its bottom-left corner `(x, y)` and its size.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Rect {
    /// Left edge, mm.
    pub x: f64,
    /// Bottom edge, mm.
    pub y: f64,
    /// Width, mm.
    pub w: f64,
    /// Height, mm.
    pub h: f64,
}

impl Rect {
    /// The rectangle with its bottom-left corner at `(x, y)`.
    pub const fn new(x: f64, y: f64, w: f64, h: f64) -> Self {
        Rect { x, y, w, h }
    }

    /// The rectangle `w` wide and `h` tall whose top-left corner is at
    /// `(x, top)`: how a layout that works down the page places a block.
    pub fn from_top(x: f64, top: f64, w: f64, h: f64) -> Self {
        Rect {
            x,
            y: top - h,
            w,
            h,
        }
    }

    /// A rectangle of no height along `top`, `w` wide from `x`: the top
    /// edge of a block that takes the height it needs.
    pub fn top_edge(x: f64, top: f64, w: f64) -> Self {
        Rect::from_top(x, top, w, 0.0)
    }

    /// The top edge.
    pub fn top(&self) -> f64 {
        self.y + self.h
    }

    /// The right edge.
    pub fn right(&self) -> f64 {
        self.x + self.w
    }

    /// The column `w` wide on the left, and the rest right of it after a
    /// `gap`.
    pub fn split_left(&self, w: f64, gap: f64) -> (Rect, Rect) {
        (
            Rect::new(self.x, self.y, w, self.h),
            Rect::new(self.x + w + gap, self.y, self.w - w - gap, self.h),
        )
    }

    /// The column `w` wide on the right, and the rest left of it before a
    /// `gap`.
    pub fn split_right(&self, w: f64, gap: f64) -> (Rect, Rect) {
        (
            Rect::new(self.right() - w, self.y, w, self.h),
            Rect::new(self.x, self.y, self.w - w - gap, self.h),
        )
    }

    /// The band `h` tall along the bottom, and the rest above it after a
    /// `gap`.
    pub fn split_bottom(&self, h: f64, gap: f64) -> (Rect, Rect) {
        (
            Rect::new(self.x, self.y, self.w, h),
            Rect::new(self.x, self.y + h + gap, self.w, self.h - h - gap),
        )
    }

    /// The rectangle `by` mm inside this one on every side.
    pub fn inset(&self, by: f64) -> Rect {
        Rect::new(
            self.x + by,
            self.y + by,
            self.w - 2.0 * by,
            self.h - 2.0 * by,
        )
    }
}

/// A block a layout claimed, by name, for the overlap check: every block
/// stays on the page and clear of every other.
#[derive(Clone, Debug, PartialEq)]
pub struct Region {
    /// What the block is, as messages name it.
    pub name: String,
    /// Left edge, mm from the page's left edge.
    pub x: f64,
    /// Bottom edge, mm from the page's bottom edge.
    pub y: f64,
    /// Width, mm.
    pub w: f64,
    /// Height, mm.
    pub h: f64,
}

impl Region {
    /// The block `name` at `r`.
    pub fn new(name: &str, r: Rect) -> Self {
        Region {
            name: name.to_string(),
            x: r.x,
            y: r.y,
            w: r.w,
            h: r.h,
        }
    }

    /// Whether the two blocks share more than an edge (to 1e-6 mm).
    pub fn overlaps(&self, other: &Region) -> bool {
        const EPS: f64 = 1e-6;
        self.x + EPS < other.x + other.w
            && other.x + EPS < self.x + self.w
            && self.y + EPS < other.y + other.h
            && other.y + EPS < self.y + self.h
    }

    /// Whether the block lies on a page `pw` x `ph` mm.
    pub fn on_page(&self, pw: f64, ph: f64) -> bool {
        self.x >= 0.0 && self.y >= 0.0 && self.x + self.w <= pw && self.y + self.h <= ph
    }
}

/// Whether the segment `a`-`b` passes through the box `(x0, y0, x1, y1)`
/// (Liang-Barsky clipping).
pub fn segment_hits(a: Point, b: Point, (x0, y0, x1, y1): Corners) -> bool {
    let (dx, dy) = (b.0 - a.0, b.1 - a.1);
    let (mut t0, mut t1) = (0.0_f64, 1.0_f64);
    for (p, q) in [
        (-dx, a.0 - x0),
        (dx, x1 - a.0),
        (-dy, a.1 - y0),
        (dy, y1 - a.1),
    ] {
        if p == 0.0 {
            if q < 0.0 {
                return false;
            }
        } else {
            let r = q / p;
            if p < 0.0 {
                t0 = t0.max(r);
            } else {
                t1 = t1.min(r);
            }
            if t0 > t1 {
                return false;
            }
        }
    }
    true
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn splits_share_the_whole_between_the_parts_and_the_gap() {
        let r = Rect::new(10.0, 20.0, 100.0, 50.0);
        let (left, rest) = r.split_left(25.0, 5.0);
        assert_eq!(left, Rect::new(10.0, 20.0, 25.0, 50.0));
        assert_eq!(rest, Rect::new(40.0, 20.0, 70.0, 50.0));
        let (right, rest) = r.split_right(30.0, 4.0);
        assert_eq!(right, Rect::new(80.0, 20.0, 30.0, 50.0));
        assert_eq!(rest.right() + 4.0, right.x);
        let (bottom, rest) = r.split_bottom(15.0, 0.0);
        assert_eq!(bottom, Rect::new(10.0, 20.0, 100.0, 15.0));
        assert_eq!((rest.y, rest.top()), (35.0, 70.0));
        assert_eq!(r.inset(2.0), Rect::new(12.0, 22.0, 96.0, 46.0));
    }

    #[test]
    fn a_block_placed_by_its_top_edge_hangs_below_it() {
        let r = Rect::from_top(14.0, 283.0, 182.0, 40.0);
        assert_eq!((r.y, r.top(), r.right()), (243.0, 283.0, 196.0));
        let edge = Rect::top_edge(14.0, 239.0, 182.0);
        assert_eq!((edge.y, edge.h, edge.top()), (239.0, 0.0, 239.0));
    }

    #[test]
    fn regions_that_touch_do_not_overlap() {
        let a = Region::new("a", Rect::new(0.0, 0.0, 10.0, 10.0));
        let b = Region::new("b", Rect::new(10.0, 0.0, 10.0, 10.0));
        let c = Region::new("c", Rect::new(9.0, 9.0, 10.0, 10.0));
        assert!(!a.overlaps(&b));
        assert!(a.overlaps(&c) && c.overlaps(&b));
        assert!(a.on_page(10.0, 10.0) && !c.on_page(18.0, 18.0));
    }

    #[test]
    fn a_segment_hits_a_box_it_crosses_and_misses_one_it_passes() {
        let r = (1.0, 1.0, 2.0, 2.0);
        assert!(segment_hits((0.0, 0.0), (3.0, 3.0), r));
        assert!(segment_hits((1.5, 0.0), (1.5, 1.5), r));
        assert!(!segment_hits((0.0, 3.0), (3.0, 2.5), r));
        assert!(!segment_hits((0.0, 0.0), (0.9, 0.9), r));
    }
}

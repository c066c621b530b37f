//! A small rasteriser for the drawing: lines and marks on a grid of terminal cells,
//! each cell holding 2 × 4 dots (braille) or one dot (plain ASCII). Every cell keeps
//! the highest [`Ink`] drawn in it, which decides its colour (and its character in
//! ASCII mode); in ASCII mode a void's outline outranks every other ink, so a hole
//! that shares its cells with a flange's outline still shows. Pure: the view turns
//! the grid into buffer cells.

use super::theme::Ink;

/// How a line is drawn.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Dash {
    Solid,
    /// Runs of four dots with gaps of four.
    Dashed,
    /// One dot in three.
    Dotted,
}

/// One terminal cell of the grid.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Cell {
    /// Braille dot bits (Unicode order), or 1 for a set ASCII cell.
    pub bits: u8,
    pub ink: Option<Ink>,
    /// A character drawn over the dots (markers such as the centroid).
    pub glyph: Option<char>,
    /// A shading character, shown where the cell has neither a glyph nor dots.
    pub shade: Option<char>,
}

/// A grid of `w × h` cells.
#[derive(Debug, Clone)]
pub struct Raster {
    pub w: usize,
    pub h: usize,
    /// Dots per cell across and down: 2 × 4 for braille, 1 × 1 for ASCII.
    pub kx: usize,
    pub ky: usize,
    cells: Vec<Cell>,
}

/// Braille dot bit for dot column `c` (0–1) and row `r` (0–3) of a cell.
const BRAILLE: [[u8; 2]; 4] = [[0x01, 0x08], [0x02, 0x10], [0x04, 0x20], [0x40, 0x80]];

impl Raster {
    pub fn new(w: usize, h: usize, braille: bool) -> Raster {
        let (kx, ky) = if braille { (2, 4) } else { (1, 1) };
        Raster {
            w,
            h,
            kx,
            ky,
            cells: vec![Cell::default(); w * h],
        }
    }

    /// Width and height in dots.
    pub fn dots(&self) -> (usize, usize) {
        (self.w * self.kx, self.h * self.ky)
    }

    pub fn cell(&self, cx: usize, cy: usize) -> Option<&Cell> {
        if cx < self.w && cy < self.h {
            self.cells.get(cy * self.w + cx)
        } else {
            None
        }
    }

    fn cell_mut(&mut self, cx: usize, cy: usize) -> Option<&mut Cell> {
        if cx < self.w && cy < self.h {
            self.cells.get_mut(cy * self.w + cx)
        } else {
            None
        }
    }

    /// Sets the dot at (x, y), dots counted from the top left; outside is ignored.
    pub fn dot(&mut self, x: i64, y: i64, ink: Ink) {
        if x < 0 || y < 0 {
            return;
        }
        let (x, y) = (x as usize, y as usize);
        let (kx, ky) = (self.kx, self.ky);
        if let Some(c) = self.cell_mut(x / kx, y / ky) {
            c.bits |= if kx == 2 { BRAILLE[y % 4][x % 2] } else { 1 };
            let rank = |i: Ink| (kx == 1 && i == Ink::Void, i);
            if c.ink.is_none_or(|i| rank(i) <= rank(ink)) {
                c.ink = Some(ink);
            }
        }
    }

    /// A straight line between two points in dot coordinates (fractions allowed),
    /// drawn in a [`Dash`] pattern.
    pub fn line(&mut self, a: (f64, f64), b: (f64, f64), ink: Ink, dash: Dash) {
        let (dx, dy) = (b.0 - a.0, b.1 - a.1);
        let n = dx.abs().max(dy.abs()).ceil();
        // Far-off lines (a zoomed-in view) are clipped by the step count cap.
        if !n.is_finite() || n > 1e5 {
            return;
        }
        let n = n.max(1.0) as i64;
        for i in 0..=n {
            let gap = match dash {
                Dash::Solid => false,
                Dash::Dashed => (i / 4) % 2 == 1,
                Dash::Dotted => i % 3 != 0,
            };
            if gap {
                continue;
            }
            // Dot i covers [i, i + 1), as for a mark: a line and a mark through one
            // point share its dot, and an edge on the view's border stays inside.
            let t = i as f64 / n as f64;
            self.dot(
                (a.0 + t * dx).floor() as i64,
                (a.1 + t * dy).floor() as i64,
                ink,
            );
        }
    }

    /// A character over the cell holding dot (x, y).
    pub fn mark(&mut self, x: f64, y: f64, glyph: char) {
        if !(x.is_finite() && y.is_finite()) || x < 0.0 || y < 0.0 {
            return;
        }
        let (cx, cy) = (x as usize / self.kx, y as usize / self.ky);
        if let Some(c) = self.cell_mut(cx, cy) {
            c.glyph = Some(glyph);
            c.ink = Some(Ink::Marker);
        }
    }

    /// Shades the cell (cx, cy) with `ch` (under its dots and glyph, if any).
    pub fn shade(&mut self, cx: usize, cy: usize, ch: char) {
        if let Some(c) = self.cell_mut(cx, cy) {
            c.shade = Some(ch);
        }
    }

    /// The ink that colours a cell: its own, or the shading's for a shaded cell with
    /// neither a glyph nor dots.
    pub fn ink_at(&self, cx: usize, cy: usize) -> Option<Ink> {
        let c = self.cell(cx, cy)?;
        match c.shade {
            Some(_) if c.glyph.is_none() && c.bits == 0 => Some(Ink::Shade),
            _ => c.ink,
        }
    }

    /// The character of a cell: its glyph, its braille pattern, or in ASCII mode the
    /// ink's character, else its shading; `None` for an empty cell.
    pub fn char_at(&self, cx: usize, cy: usize, ascii_of: fn(Ink) -> char) -> Option<char> {
        let c = self.cell(cx, cy)?;
        if let Some(g) = c.glyph {
            return Some(g);
        }
        if c.bits == 0 {
            return c.shade;
        }
        if self.kx == 2 {
            char::from_u32(0x2800 + u32::from(c.bits))
        } else {
            c.ink.map(ascii_of)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn braille_dots_and_ink_priority() {
        let mut r = Raster::new(2, 1, true);
        r.dot(0, 0, Ink::Void);
        r.dot(1, 3, Ink::Solid);
        let c = r.cell(0, 0).unwrap();
        assert_eq!(c.bits, 0x01 | 0x80);
        assert_eq!(c.ink, Some(Ink::Solid));
        assert_eq!(r.char_at(0, 0, |_| '#'), Some('⢁'));
        r.dot(99, 99, Ink::Solid);
        r.line((0.0, 0.0), (1e12, 0.0), Ink::Axes, Dash::Solid);
        assert_eq!(r.char_at(1, 0, |_| '#'), None);
    }

    #[test]
    fn shading_shows_only_where_there_is_no_line_or_mark() {
        let mut r = Raster::new(3, 1, true);
        for cx in 0..3 {
            r.shade(cx, 0, '▒');
        }
        r.dot(2, 0, Ink::Void);
        r.mark(4.0, 0.0, '◆');
        let row: String = (0..3).filter_map(|x| r.char_at(x, 0, |_| '#')).collect();
        assert_eq!(row, "▒⠁◆");
        assert_eq!(r.ink_at(0, 0), Some(Ink::Shade));
        assert_eq!(r.ink_at(1, 0), Some(Ink::Void));
    }

    #[test]
    fn ascii_line_fills_cells() {
        let mut r = Raster::new(4, 2, false);
        r.line((0.0, 0.0), (3.0, 0.0), Ink::Solid, Dash::Solid);
        let row: String = (0..4).filter_map(|x| r.char_at(x, 0, |_| '#')).collect();
        assert_eq!(row, "####");
    }

    /// One character per cell cannot show both a flange's outline and a hole in it:
    /// the hole wins, so it never vanishes into the solid (in braille both show).
    #[test]
    fn ascii_void_outranks_the_solid_it_shares_a_cell_with() {
        let ch = |i: Ink| if i == Ink::Void { 'o' } else { '#' };
        for first_void in [true, false] {
            let mut r = Raster::new(1, 1, false);
            let inks = if first_void {
                [Ink::Void, Ink::Selected]
            } else {
                [Ink::Selected, Ink::Void]
            };
            for i in inks {
                r.dot(0, 0, i);
            }
            assert_eq!(r.char_at(0, 0, ch), Some('o'));
        }
        let mut r = Raster::new(1, 1, true);
        r.dot(0, 0, Ink::Void);
        r.dot(1, 0, Ink::Solid);
        assert_eq!(r.cell(0, 0).unwrap().ink, Some(Ink::Solid));
    }
}

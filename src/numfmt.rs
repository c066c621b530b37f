//! Numbers for people, written in one place for every view (the workbench's panel,
//! the `kern calc` table, the calculation sheet and the drawing's labels; JSON never
//! comes here). Three forms ([`Numbers`]):
//!
//! - **engineering** (the default): plain digits from 0.001 up to 999 999, grouped in
//!   threes by a narrow no-break space from 10 000 up (`13 800`; ISO 80000-1 leaves a
//!   four-digit number ungrouped), and outside that range a mantissa from 1 to 999 times
//!   a power of ten that is a multiple of 3 (`687.0×10⁶`, `748.4×10⁻⁶`), so the exponent
//!   matches a unit prefix (k, M, G; m, µ). The workbench's ASCII mode writes the power
//!   as `x10^6`.
//! - **scientific**: the computer's notation (`6.870e8`), plain from 0.001 below the
//!   largest number with as many integer digits as figures shown ([`sig`]).
//! - **plain**: all the digits, no grouping and no exponent (`687000000`), for copying
//!   into a spreadsheet; beyond 10¹⁵ or below 10⁻⁹ it falls back to scientific.
//!
//! Every form shows the same significant figures.

/// How the views write numbers.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Numbers {
    #[default]
    Engineering,
    Scientific,
    Plain,
}

impl Numbers {
    /// The names the CLI flag and the config file take.
    pub const NAMES: &'static str = "engineering, scientific or plain";

    pub fn parse(s: &str) -> Option<Numbers> {
        match s {
            "engineering" => Some(Numbers::Engineering),
            "scientific" => Some(Numbers::Scientific),
            "plain" => Some(Numbers::Plain),
            _ => None,
        }
    }

    /// `x` to `figs` significant figures (at least 1) in this form; non-finite values
    /// print as `—`.
    ///
    /// ```
    /// use kern::numfmt::Numbers::*;
    /// assert_eq!(Engineering.show(13800.0, 4), "13\u{202f}800");
    /// assert_eq!(Engineering.show(6.87e8, 4), "687.0×10⁶");
    /// assert_eq!(Scientific.show(6.87e8, 4), "6.870e8");
    /// assert_eq!(Plain.show(6.87e8, 4), "687000000");
    /// ```
    pub fn show(self, x: f64, figs: usize) -> String {
        let figs = figs.clamp(1, 17);
        if !x.is_finite() || x == 0.0 {
            return sig(x, figs);
        }
        // The magnitude after rounding, so 999.96 to 4 figures counts as 1000.
        let r: f64 = format!("{x:.p$e}", p = figs - 1).parse().unwrap_or(x);
        let mag = r.abs().log10().floor() as i32;
        match self {
            Numbers::Scientific => sig(x, figs),
            Numbers::Engineering if (-3..6).contains(&mag) => group(&fixed(r, figs, mag)),
            Numbers::Engineering => {
                let e = 3 * mag.div_euclid(3);
                let m = r / 10f64.powi(e);
                format!("{}×10{}", fixed(m, figs, mag - e), superscript(e))
            }
            Numbers::Plain if (-9..=15).contains(&mag) => fixed(r, figs, mag),
            Numbers::Plain => sig(x, figs),
        }
    }
}

/// `x` (already rounded to `figs` figures, of magnitude `mag`) in positional notation.
fn fixed(x: f64, figs: usize, mag: i32) -> String {
    let decimals = (figs as i32 - 1 - mag).max(0) as usize;
    format!("{x:.decimals$}")
}

/// The integer digits of `s` in groups of three from 10 000 up, by a narrow no-break
/// space (U+202F, which neither a terminal nor a browser breaks).
fn group(s: &str) -> String {
    let (sign, rest) = s.split_at(usize::from(s.starts_with('-')));
    let (int, frac) = rest.split_at(rest.find('.').unwrap_or(rest.len()));
    if int.len() < 5 {
        return s.to_string();
    }
    let mut out = String::from(sign);
    for (i, c) in int.chars().enumerate() {
        if i > 0 && (int.len() - i) % 3 == 0 {
            out.push('\u{202f}');
        }
        out.push(c);
    }
    out + frac
}

/// An exponent in superscript digits (`-6` → `⁻⁶`).
fn superscript(e: i32) -> String {
    const DIGITS: [char; 10] = ['⁰', '¹', '²', '³', '⁴', '⁵', '⁶', '⁷', '⁸', '⁹'];
    let mut out = String::new();
    if e < 0 {
        out.push('⁻');
    }
    for d in e.unsigned_abs().to_string().bytes() {
        out.push(DIGITS[usize::from(d - b'0')]);
    }
    out
}

/// `x` to `sig` significant figures (at least 1). Plain notation from 1e-3 up to the
/// largest number with `sig` integer digits, scientific outside (so no digit shown is
/// beyond the figures asked); non-finite values print as `—`.
///
/// ```
/// use kern::numfmt::sig;
/// assert_eq!(sig(1234.5678, 4), "1235");
/// assert_eq!(sig(0.012345, 3), "0.0123");
/// assert_eq!(sig(-2.5e9, 3), "-2.50e9");
/// assert_eq!(sig(0.0, 3), "0");
/// ```
pub fn sig(x: f64, sig: usize) -> String {
    let sig = sig.clamp(1, 17);
    if !x.is_finite() {
        return "—".into();
    }
    if x == 0.0 {
        return "0".into();
    }
    let mag = x.abs().log10().floor() as i32;
    if (-3..sig as i32).contains(&mag) {
        let decimals = (sig as i32 - 1 - mag).max(0) as usize;
        let s = format!("{x:.decimals$}");
        // Rounding can carry into a new digit (999.96 → 1000.0); trim to the figures asked.
        let carried = s
            .parse::<f64>()
            .is_ok_and(|r| r.abs() >= 10f64.powi(mag + 1));
        if decimals > 0 && carried {
            let d = decimals - 1;
            return format!("{x:.d$}");
        }
        s
    } else {
        let p = sig - 1;
        let s = format!("{x:.p$e}");
        s.replace("e-0", "e-").replace("e0", "e")
    }
}

/// `x` as a number is usually typed: [`sig`] with trailing zeros dropped in plain
/// notation (scientific notation keeps its figures).
///
/// ```
/// use kern::numfmt::plain;
/// assert_eq!(plain(200.0, 6), "200");
/// assert_eq!(plain(262.654148, 6), "262.654");
/// assert_eq!(plain(2.5e9, 3), "2.50e9");
/// ```
pub fn plain(x: f64, n: usize) -> String {
    let s = sig(x, n);
    if s.contains('.') && !s.contains('e') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// How a change of a value against a baseline is read.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Compare {
    /// Relative to the baseline's value, in percent.
    Relative,
    /// Of the magnitude |x|, in percent: for a stress, "lower" is always less stress.
    Magnitude,
    /// The difference, in the value's own unit.
    Difference,
    /// Not shown.
    Omit,
}

/// A change against a baseline, for the views to mark (`↑`/`↓` and the amount).
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Change {
    /// Higher (of magnitude, for [`Compare::Magnitude`]) by the amount.
    Up(String),
    /// Lower by the amount.
    Down(String),
    /// The same to the figures shown.
    Same,
    /// One of the two has no value to compare (not formed, or not in the baseline).
    NotComparable,
    /// Nothing to show.
    Blank,
}

impl Change {
    /// The change as a signed amount for a column of its own (`+12.3%`, `−4.00`,
    /// `±0`); empty when there is nothing to compare.
    pub fn signed(&self) -> String {
        match self {
            Change::Up(s) => format!("+{s}"),
            Change::Down(s) => format!("−{s}"),
            Change::Same => "±0".into(),
            Change::NotComparable | Change::Blank => String::new(),
        }
    }
}

/// The change from `base` to `now` read as `how`. A relative change from a baseline
/// of zero is shown as a difference (no percentage exists).
///
/// ```
/// use kern::numfmt::{change, Change, Compare};
/// // σmin from −116.9 to −99.5 MPa: 14.9 % less stress.
/// assert_eq!(change(Some(-99.5), Some(-116.9), Compare::Magnitude), Change::Down("14.9%".into()));
/// assert_eq!(change(Some(110.0), Some(100.0), Compare::Relative), Change::Up("10.0%".into()));
/// ```
pub fn change(now: Option<f64>, base: Option<f64>, how: Compare) -> Change {
    let (x, b) = match (now, base, how) {
        (_, _, Compare::Omit) | (None, None, _) => return Change::Blank,
        (Some(x), Some(b), _) if x.is_finite() && b.is_finite() => (x, b),
        _ => return Change::NotComparable,
    };
    let (d, amount) = match how {
        Compare::Relative | Compare::Magnitude if b != 0.0 => {
            let (x, b) = if how == Compare::Magnitude {
                (x.abs(), b.abs())
            } else {
                (x, b)
            };
            let pct = 100.0 * (x - b) / b.abs();
            if pct.abs() < 0.05 {
                return Change::Same;
            }
            (pct, format!("{}%", sig(pct.abs(), 3)))
        }
        _ => {
            let d = x - b;
            // Below the fourth figure of the larger value: the same as shown.
            if d.abs() <= 5e-4 * x.abs().max(b.abs()) {
                return Change::Same;
            }
            (d, sig(d.abs(), 3))
        }
    };
    if d > 0.0 {
        Change::Up(amount)
    } else {
        Change::Down(amount)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rounding_carry_keeps_the_figure_count() {
        assert_eq!(sig(999.96, 4), "1000");
        assert_eq!(sig(9.9996, 4), "10.00");
        assert_eq!(sig(1.0e-5, 3), "1.00e-5");
        assert_eq!(sig(f64::NAN, 3), "—");
    }

    #[test]
    fn changes_read_the_right_way() {
        use Compare::*;
        assert_eq!(
            change(Some(90.0), Some(100.0), Relative),
            Change::Down("10.0%".into())
        );
        assert_eq!(change(Some(100.0), Some(100.0), Relative), Change::Same);
        // A stress of −116.9 MPa becoming −99.5 MPa is |σ| 14.9 % lower, and −99.5 to
        // −116.9 is 17.5 % higher: (116.9 − 99.5) / 99.5 = 0.1749.
        assert_eq!(
            change(Some(-116.9), Some(-99.5), Magnitude),
            Change::Up("17.5%".into())
        );
        assert_eq!(
            change(Some(-116.9), Some(-99.5), Relative),
            Change::Down("17.5%".into())
        );
        // From zero: a difference (a shear centre moved off the axis of symmetry).
        assert_eq!(
            change(Some(2.5), Some(0.0), Relative),
            Change::Up("2.50".into())
        );
        assert_eq!(change(Some(0.0), Some(0.0), Relative), Change::Same);
        assert_eq!(
            change(Some(-3.0), Some(2.0), Difference),
            Change::Down("5.00".into())
        );
        assert_eq!(change(None, Some(1.0), Relative), Change::NotComparable);
        assert_eq!(change(Some(1.0), Some(2.0), Omit), Change::Blank);
    }

    #[test]
    fn engineering_forms() {
        // Exponents in multiples of 3 (the SI prefixes' steps, BIPM SI Brochure §3) and
        // digits grouped in threes by a thin space (ISO 80000-1 §7.3.1).
        let e = |x| Numbers::Engineering.show(x, 4);
        assert_eq!(e(4442.0), "4442");
        assert_eq!(e(13800.0), "13\u{202f}800");
        assert_eq!(e(-210000.0), "-210\u{202f}000");
        assert_eq!(e(999_999.0), "1.000×10⁶");
        assert_eq!(e(3.106e8), "310.6×10⁶");
        assert_eq!(e(1.617e7), "16.17×10⁶");
        assert_eq!(e(3.05e11), "305.0×10⁹");
        assert_eq!(e(0.007484), "0.007484");
        assert_eq!(e(0.0007484), "748.4×10⁻⁶");
        assert_eq!(e(151.04), "151.0");
        assert_eq!(e(0.0), "0");
        assert_eq!(e(f64::INFINITY), "—");
        let p = |x| Numbers::Plain.show(x, 4);
        assert_eq!(p(3.106e8), "310600000");
        assert_eq!(p(1.234e-5), "0.00001234");
        assert_eq!(p(1e20), "1.000e20");
        assert_eq!(Numbers::Scientific.show(13800.0, 4), "1.380e4");
    }
}

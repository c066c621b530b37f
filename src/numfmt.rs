//! Numbers for people: a fixed count of significant figures, plain notation for
//! everyday magnitudes and scientific notation (`1.234e9`) for the rest.

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

/// A percentage change from `base` to `x`, e.g. `+12.3%`; `None` when the base is 0.
pub fn change(x: f64, base: f64) -> Option<String> {
    if base == 0.0 || !base.is_finite() || !x.is_finite() {
        return None;
    }
    let pct = 100.0 * (x - base) / base.abs();
    if pct.abs() < 0.05 {
        return Some("±0%".into());
    }
    Some(format!(
        "{}{}%",
        if pct > 0.0 { "+" } else { "" },
        sig(pct, 3)
    ))
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
    fn change_reads_as_a_signed_percentage() {
        assert_eq!(change(110.0, 100.0).unwrap(), "+10.0%");
        assert_eq!(change(90.0, 100.0).unwrap(), "-10.0%");
        assert_eq!(change(100.0, 100.0).unwrap(), "±0%");
        assert!(change(1.0, 0.0).is_none());
    }
}

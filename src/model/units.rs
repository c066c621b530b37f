//! Units: the file's length unit, quantities written with a unit ("200 GPa", "85 kN*m")
//! converted to SI base units, and the units results are shown in for each unit system.
//!
//! The rule (also in DEVELOPERS.md, "Units"): geometry and section properties stay in the
//! file's length unit (exact, and what users see); everything else is SI from the moment it
//! is read: [`parse_quantity`] gives forces, moments, stresses, densities and the member's
//! lengths in N, N·m, Pa, kg/m³, m. A geometric quantity becomes SI in one way only,
//! [`LengthUnit::to_si`] with its [`Dim`] (the power of length it carries), and only where a
//! section meets SI values (the stresses and the member check in `crate::analysis`).
//! Results are shown in the units of [`display_unit`], read from the same table the parser
//! uses.
//!
//! Conversion factors are exact by definition: 1 in = 0.0254 m, 1 ft = 0.3048 m,
//! 1 lb = 0.45359237 kg, 1 lbf = 1 lb × 9.80665 m/s² (standard gravity) = 4.4482216152605 N,
//! 1 kip = 1000 lbf (NIST Special Publication 811, 2008 ed., Appendix B).
//!
//! Not here: expressions (see [`super::expr`]), which lengths a file holds.

use super::expr::{Expr, ExprError};

/// One inch in metres (exact).
const INCH: f64 = 0.0254;
/// One foot in metres (exact).
const FOOT: f64 = 0.3048;
/// One pound (mass) in kilograms (exact).
const POUND: f64 = 0.45359237;
/// Standard acceleration of gravity, m/s² (exact by definition, NIST SP 811): the weight
/// of a mass, here and for self-weight.
pub const GRAVITY: f64 = 9.80665;
/// One pound-force in newtons: 0.45359237 kg × [`GRAVITY`] (exact; the `exact_definitions`
/// test checks the product).
const LBF: f64 = 4.4482216152605;
/// One kip (1000 lbf) in newtons.
const KIP: f64 = 1000.0 * LBF;
/// One pound-force per square inch in pascals.
const PSI: f64 = LBF / (INCH * INCH);

/// The unit of every length in a section file.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum LengthUnit {
    Mm,
    Cm,
    M,
    In,
    Ft,
}

impl LengthUnit {
    pub const ALL: [LengthUnit; 5] = [
        LengthUnit::Mm,
        LengthUnit::Cm,
        LengthUnit::M,
        LengthUnit::In,
        LengthUnit::Ft,
    ];

    /// "mm" "cm" "m" "in" "ft"; anything else is `None`.
    pub fn parse(s: &str) -> Option<LengthUnit> {
        LengthUnit::ALL.into_iter().find(|u| u.name() == s)
    }

    pub fn name(self) -> &'static str {
        match self {
            LengthUnit::Mm => "mm",
            LengthUnit::Cm => "cm",
            LengthUnit::M => "m",
            LengthUnit::In => "in",
            LengthUnit::Ft => "ft",
        }
    }

    /// The size of one unit in metres.
    pub fn metres(self) -> f64 {
        match self {
            LengthUnit::Mm => 0.001,
            LengthUnit::Cm => 0.01,
            LengthUnit::M => 1.0,
            LengthUnit::In => INCH,
            LengthUnit::Ft => FOOT,
        }
    }

    /// A geometric quantity of dimension `dim` written in this unit, in SI (m, m², m³, m⁴,
    /// m⁶): `value × (metres per unit)^power`. The one conversion of file lengths to SI.
    ///
    /// ```
    /// use kern::model::units::{Dim, LengthUnit};
    /// // 100 × 200 mm rectangle: Ixx = b·h³/12 = 6.667e7 mm⁴ = 6.667e-5 m⁴.
    /// let ixx = 100.0 * 200f64.powi(3) / 12.0;
    /// let si = LengthUnit::Mm.to_si(ixx, Dim::SecondMoment);
    /// assert!((si - 6.666_666_7e-5).abs() < 1e-12);
    /// ```
    pub fn to_si(self, value: f64, dim: Dim) -> f64 {
        value * self.metres().powi(dim.power())
    }

    /// How values of this length are shown: its name and size (from the parser's table).
    pub fn display(self) -> DisplayUnit {
        DisplayUnit {
            name: self.name(),
            si_per_unit: self.metres(),
        }
    }

    /// Whether this is a US customary unit (in, ft).
    pub fn is_us(self) -> bool {
        matches!(self, LengthUnit::In | LengthUnit::Ft)
    }
}

/// The length dimension of a geometric quantity: the power of length it carries.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Dim {
    /// Per length (m⁻¹): a shear flow V·Q/I with V already in N becomes N/m.
    PerLength,
    /// Coordinates, dimensions, radii of gyration (m).
    Length,
    /// Area (m²).
    Area,
    /// Elastic and plastic section moduli (m³).
    Modulus,
    /// Second moments of area and the torsion constant J (m⁴).
    SecondMoment,
    /// The warping constant Cw (m⁶).
    Warping,
}

impl Dim {
    /// The power of length: −1, 1, 2, 3, 4 or 6.
    pub fn power(self) -> i32 {
        match self {
            Dim::PerLength => -1,
            Dim::Length => 1,
            Dim::Area => 2,
            Dim::Modulus => 3,
            Dim::SecondMoment => 4,
            Dim::Warping => 6,
        }
    }
}

/// What a quantity measures.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    Length,
    Stress,
    Density,
    Force,
    Moment,
    LineLoad,
}

impl Kind {
    /// The word used in messages: "a stress is needed here".
    pub fn name(self) -> &'static str {
        match self {
            Kind::Length => "length",
            Kind::Stress => "stress",
            Kind::Density => "density",
            Kind::Force => "force",
            Kind::Moment => "moment",
            Kind::LineLoad => "line load",
        }
    }

    /// Values written as examples in messages, a metric one and a US customary one: the
    /// one table of examples (`parse_quantity`'s messages use the first).
    pub fn examples(self) -> [&'static str; 2] {
        match self {
            Kind::Length => ["6 m", "20 ft"],
            Kind::Stress => ["200 GPa", "50 ksi"],
            Kind::Density => ["7850 kg/m3", "490 lb/ft3"],
            Kind::Force => ["120 kN", "6.5 kip"],
            Kind::Moment => ["85 kN*m", "60 kip*ft"],
            Kind::LineLoad => ["15 kN/m", "1.2 kip/ft"],
        }
    }

    /// The metric example.
    fn example(self) -> &'static str {
        self.examples()[0]
    }
}

/// A unit a quantity may be written in: its main spelling, kind and size in SI base units.
#[derive(Clone, Copy)]
struct UnitDef {
    name: &'static str,
    kind: Kind,
    si: f64,
    /// Further spellings besides those derived from `name` (see [`spellings`]).
    aliases: &'static [&'static str],
}

const fn unit(name: &'static str, kind: Kind, si: f64) -> UnitDef {
    UnitDef {
        name,
        kind,
        si,
        aliases: &[],
    }
}

/// Every unit but lengths (those come from [`LengthUnit`]).
const UNITS: &[UnitDef] = &[
    unit("Pa", Kind::Stress, 1.0),
    unit("kPa", Kind::Stress, 1e3),
    unit("MPa", Kind::Stress, 1e6),
    unit("GPa", Kind::Stress, 1e9),
    unit("psi", Kind::Stress, PSI),
    unit("ksi", Kind::Stress, 1000.0 * PSI),
    unit("N/mm2", Kind::Stress, 1e6),
    unit("kg/m3", Kind::Density, 1.0),
    UnitDef {
        aliases: &["pcf"],
        ..unit("lb/ft3", Kind::Density, POUND / (FOOT * FOOT * FOOT))
    },
    unit("N", Kind::Force, 1.0),
    unit("kN", Kind::Force, 1e3),
    unit("MN", Kind::Force, 1e6),
    unit("lbf", Kind::Force, LBF),
    UnitDef {
        aliases: &["kips"],
        ..unit("kip", Kind::Force, KIP)
    },
    UnitDef {
        aliases: &["Nm"],
        ..unit("N*m", Kind::Moment, 1.0)
    },
    UnitDef {
        aliases: &["kNm"],
        ..unit("kN*m", Kind::Moment, 1e3)
    },
    unit("MN*m", Kind::Moment, 1e6),
    unit("kip*ft", Kind::Moment, KIP * FOOT),
    unit("kip*in", Kind::Moment, KIP * INCH),
    unit("lbf*ft", Kind::Moment, LBF * FOOT),
    unit("lbf*in", Kind::Moment, LBF * INCH),
    unit("N/m", Kind::LineLoad, 1.0),
    unit("kN/m", Kind::LineLoad, 1e3),
    unit("N/mm", Kind::LineLoad, 1e3),
    unit("kip/ft", Kind::LineLoad, KIP / FOOT),
    unit("kip/in", Kind::LineLoad, KIP / INCH),
    unit("lbf/ft", Kind::LineLoad, LBF / FOOT),
    unit("lbf/in", Kind::LineLoad, LBF / INCH),
];

/// All units, lengths included.
fn all_units() -> impl Iterator<Item = UnitDef> {
    let lengths = LengthUnit::ALL
        .into_iter()
        .map(|u| unit(u.name(), Kind::Length, u.metres()));
    lengths.chain(UNITS.iter().copied())
}

/// Every way a unit may be written: its name; for a product (`kN*m`) the `*` may be `·`,
/// `.` or a space; a trailing power 2 or 3 may be `^2`, `²`, `^3`, `³`; plus its aliases.
fn spellings(u: &UnitDef) -> Vec<String> {
    let mut out = vec![u.name.to_string()];
    if u.name.contains('*') {
        out.extend(["·", ".", " "].map(|sep| u.name.replace('*', sep)));
    }
    for (digit, sup) in [('2', "²"), ('3', "³")] {
        if let Some(base) = u.name.strip_suffix(digit) {
            out.push(format!("{base}^{digit}"));
            out.push(format!("{base}{sup}"));
        }
    }
    out.extend(u.aliases.iter().map(|a| a.to_string()));
    out
}

/// The accepted unit names of a kind, space-separated: "Pa kPa MPa GPa psi ksi N/mm2".
pub fn accepted_units(kind: Kind) -> String {
    all_units()
        .filter(|u| u.kind == kind)
        .map(|u| u.name)
        .collect::<Vec<_>>()
        .join(" ")
}

/// A parsed quantity.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Quantity {
    /// The value in SI base units (m, Pa, kg/m³, N, N·m, N/m).
    Si(f64),
    /// A number written without a unit (only accepted for lengths, which are then in file units).
    Bare(f64),
}

/// Parse a number or arithmetic expression followed by a unit ("200 GPa", "2*15 kN",
/// "7850 kg/m3") into SI base units. The unit is the longest known spelling at the end of
/// the text (case-sensitive) that does not continue a word. A number without a unit is
/// `Quantity::Bare` for a length and an error for every other kind. Errors are
/// [`ExprError`]s, like those of the number part: what is wrong and the byte offset in `src`.
///
/// ```
/// use kern::model::units::{parse_quantity, Kind, Quantity};
/// assert_eq!(parse_quantity("2*15 kN", Kind::Force), Ok(Quantity::Si(30_000.0)));
/// assert_eq!(parse_quantity("350 MPa", Kind::Stress), Ok(Quantity::Si(350e6)));
/// assert_eq!(parse_quantity("12", Kind::Length), Ok(Quantity::Bare(12.0)));
/// assert!(parse_quantity("350 mpa", Kind::Stress).unwrap_err().message.contains("`MPa`"));
/// ```
pub fn parse_quantity(src: &str, kind: Kind) -> Result<Quantity, ExprError> {
    let text = src.trim_end();
    if text.trim_start().is_empty() {
        return Err(ExprError::new(
            format!("empty value; write e.g. `{}`", kind.example()),
            0,
        ));
    }
    let exact = find_unit(text, None);
    if let Some(hint) = find_unit(text, Some(kind)) {
        if exact.as_ref().is_none_or(|e| hint.start < e.start) {
            let written = text.get(hint.start..).unwrap_or("");
            return Err(ExprError::new(
                format!(
                    "unknown unit `{written}`; did you mean `{}`?",
                    hint.spelling
                ),
                hint.start,
            ));
        }
    }
    let Some(found) = exact else {
        return no_known_unit(text, kind);
    };
    if found.def.kind != kind {
        return Err(ExprError::new(
            format!(
                "`{}` is a {} unit, but a {} is needed here; use one of: {}",
                found.spelling,
                found.def.kind.name(),
                kind.name(),
                accepted_units(kind)
            ),
            found.start,
        ));
    }
    let number = text.get(..found.start).unwrap_or("");
    if number.trim().is_empty() {
        return Err(ExprError::new(
            format!(
                "missing number before `{}`; write e.g. `{}`",
                found.spelling,
                kind.example()
            ),
            found.start,
        ));
    }
    let si = number_value(number)? * found.def.si;
    if !si.is_finite() {
        return Err(ExprError::new(
            "value is too large once converted to SI units",
            0,
        ));
    }
    Ok(Quantity::Si(si))
}

/// A unit spelling found at the end of a quantity.
struct Found {
    start: usize,
    def: UnitDef,
    spelling: String,
}

/// The longest unit spelling that ends `text` and does not continue a word or a unit (the
/// character before it is not a letter nor one of `/ * · ^`). With `fold_case_for`, only
/// units of that kind are considered and ASCII letter case is ignored (used for hints).
fn find_unit(text: &str, fold_case_for: Option<Kind>) -> Option<Found> {
    let mut best: Option<Found> = None;
    for def in all_units() {
        if fold_case_for.is_some_and(|k| k != def.kind) {
            continue;
        }
        for spelling in spellings(&def) {
            let Some(start) = text.len().checked_sub(spelling.len()) else {
                continue;
            };
            let Some(tail) = text.get(start..) else {
                continue;
            };
            let ends_here = if fold_case_for.is_some() {
                tail.eq_ignore_ascii_case(&spelling)
            } else {
                tail == spelling
            };
            let joined = text
                .get(..start)
                .and_then(|before| before.chars().next_back())
                .is_some_and(|c| c.is_alphabetic() || "/*·^".contains(c));
            let longer = best.as_ref().is_none_or(|b| start < b.start);
            if ends_here && !joined && longer {
                best = Some(Found {
                    start,
                    def,
                    spelling,
                });
            }
        }
    }
    best
}

/// The number part: an arithmetic expression without names.
fn number_value(number: &str) -> Result<f64, ExprError> {
    let expr = Expr::parse(number)?;
    if let Some(name) = expr.names().first() {
        let offset = number.find(name.as_str()).unwrap_or(0);
        return Err(ExprError::new(
            format!("`{name}` is not a number; a value with a unit cannot use params"),
            offset,
        ));
    }
    expr.eval(&|_| None)
}

/// No known unit ends the text: a bare number, or an unknown unit.
fn no_known_unit(text: &str, kind: Kind) -> Result<Quantity, ExprError> {
    let parsed = Expr::parse(text);
    if let Ok(expr) = &parsed {
        if expr.names().is_empty() {
            let value = expr.eval(&|_| None)?;
            if kind == Kind::Length {
                return Ok(Quantity::Bare(value));
            }
            return Err(ExprError::new(
                format!(
                    "missing unit; write it after the number, e.g. `{}` (a {} takes one of: {})",
                    kind.example(),
                    kind.name(),
                    accepted_units(kind)
                ),
                text.len(),
            ));
        }
    }
    // The unit written: the last word, from its first letter on.
    let word_start = text
        .char_indices()
        .rev()
        .find(|(_, c)| c.is_whitespace())
        .map_or(0, |(i, c)| i + c.len_utf8());
    let word = text.get(word_start..).unwrap_or("");
    let Some(letter) = word.find(char::is_alphabetic) else {
        return Err(parsed
            .err()
            .unwrap_or_else(|| ExprError::new("not a number; write e.g. `6 m`", 0)));
    };
    let written = word.get(letter..).unwrap_or("");
    Err(ExprError::new(
        format!(
            "unknown unit `{written}`; a {} takes one of: {}",
            kind.name(),
            accepted_units(kind)
        ),
        word_start + letter,
    ))
}

/// Which family of units results are shown in.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum System {
    Si,
    Us,
}

impl System {
    /// The system a file's length unit belongs to.
    pub fn of(unit: LengthUnit) -> System {
        if unit.is_us() {
            System::Us
        } else {
            System::Si
        }
    }
}

/// A unit to show values in: its name and the number of SI base units in one of it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DisplayUnit {
    pub name: &'static str,
    pub si_per_unit: f64,
}

impl DisplayUnit {
    /// A value in SI base units expressed in this unit.
    pub fn from_si(self, si: f64) -> f64 {
        si / self.si_per_unit
    }

    /// A value in this unit expressed in SI base units.
    pub fn to_si(self, value: f64) -> f64 {
        value * self.si_per_unit
    }
}

/// The unit results of a kind are shown in: for SI kN, kN*m, MPa, kN/m, kg/m3 (lengths in
/// mm); for US kip, kip*ft, ksi, kip/ft, lb/ft3 (lengths in in). The size of each is read
/// from the parser's table, so a value shown in a unit reads back as the same value.
pub fn display_unit(kind: Kind, system: System) -> DisplayUnit {
    let name = match (kind, system) {
        (Kind::Length, System::Si) => "mm",
        (Kind::Length, System::Us) => "in",
        (Kind::Stress, System::Si) => "MPa",
        (Kind::Stress, System::Us) => "ksi",
        (Kind::Density, System::Si) => "kg/m3",
        (Kind::Density, System::Us) => "lb/ft3",
        (Kind::Force, System::Si) => "kN",
        (Kind::Force, System::Us) => "kip",
        (Kind::Moment, System::Si) => "kN*m",
        (Kind::Moment, System::Us) => "kip*ft",
        (Kind::LineLoad, System::Si) => "kN/m",
        (Kind::LineLoad, System::Us) => "kip/ft",
    };
    // Every name above is in the table (the `round_trips` test); NaN would show as no value.
    let si_per_unit = all_units()
        .find(|u| u.kind == kind && u.name == name)
        .map_or(f64::NAN, |u| u.si);
    DisplayUnit { name, si_per_unit }
}

/// The unit mass per length is shown in: kg/m, or lb/ft. The only units not in the
/// parser's table: no value in a file is a mass per length.
pub fn mass_per_length_unit(system: System) -> DisplayUnit {
    match system {
        System::Si => DisplayUnit {
            name: "kg/m",
            si_per_unit: 1.0,
        },
        System::Us => DisplayUnit {
            name: "lb/ft",
            si_per_unit: POUND / FOOT,
        },
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn si(src: &str, kind: Kind) -> f64 {
        match parse_quantity(src, kind) {
            Ok(Quantity::Si(v)) => v,
            other => panic!("{src}: {other:?}"),
        }
    }

    fn err(src: &str, kind: Kind) -> ExprError {
        parse_quantity(src, kind).expect_err(src)
    }

    fn close(a: f64, b: f64, rel: f64) -> bool {
        (a - b).abs() <= rel * b.abs()
    }

    // NIST Special Publication 811 (2008 ed.), Appendix B.8: inch, foot, pound (avoirdupois)
    // are exact; the pound-force is the force of standard gravity 9.80665 m/s² (exact, the
    // NIST SP 811 definition of the kilogram-force) on one pound.
    #[test]
    fn exact_definitions() {
        assert_eq!(LengthUnit::In.metres(), 0.0254);
        assert_eq!(LengthUnit::Ft.metres(), 0.3048);
        assert!(close(
            LengthUnit::Ft.metres() / LengthUnit::In.metres(),
            12.0,
            1e-15
        ));
        assert!(close(LBF, POUND * GRAVITY, 1e-15));
        assert_eq!(GRAVITY, 9.80665);
        assert_eq!(KIP, 1000.0 * LBF);
        assert!(close(PSI, 6894.757293168361, 1e-15));
        assert!(close(
            si("1 lb/ft3", Kind::Density),
            0.45359237 / 0.3048f64.powi(3),
            1e-15
        ));
    }

    // NIST Special Publication 811 (2008 ed.), Appendix B.8 factors, as printed there to 7
    // significant digits (quoted from memory of the table; each also follows from the exact
    // definitions checked above).
    #[test]
    fn nist_table_factors() {
        let cases: [(&str, Kind, f64); 13] = [
            ("1 lbf", Kind::Force, 4.448222),
            ("1 kip", Kind::Force, 4.448222e3),
            ("1 psi", Kind::Stress, 6.894757e3),
            ("1 ksi", Kind::Stress, 6.894757e6),
            ("1 lb/ft3", Kind::Density, 1.601846e1),
            ("1 lbf*ft", Kind::Moment, 1.355818),
            ("1 lbf*in", Kind::Moment, 1.129848e-1),
            ("1 kip*ft", Kind::Moment, 1.355818e3),
            ("1 kip*in", Kind::Moment, 1.129848e2),
            ("1 lbf/ft", Kind::LineLoad, 1.459390e1),
            ("1 lbf/in", Kind::LineLoad, 1.751268e2),
            ("1 kip/ft", Kind::LineLoad, 1.459390e4),
            ("1 kip/in", Kind::LineLoad, 1.751268e5),
        ];
        for (src, kind, nist) in cases {
            assert!(close(si(src, kind), nist, 5e-7), "{src}");
        }
        let lb_per_ft = mass_per_length_unit(System::Us).si_per_unit;
        assert!(close(lb_per_ft, 1.488164, 5e-7));
    }

    #[test]
    fn every_spelling() {
        let cases: &[(&str, Kind, f64)] = &[
            ("6 mm", Kind::Length, 0.006),
            ("6 cm", Kind::Length, 0.06),
            ("6 m", Kind::Length, 6.0),
            ("6 in", Kind::Length, 6.0 * 0.0254),
            ("6 ft", Kind::Length, 6.0 * 0.3048),
            ("5 Pa", Kind::Stress, 5.0),
            ("5 kPa", Kind::Stress, 5e3),
            ("350 MPa", Kind::Stress, 350e6),
            ("200 GPa", Kind::Stress, 200e9),
            ("5 N/mm2", Kind::Stress, 5e6),
            ("5 N/mm^2", Kind::Stress, 5e6),
            ("5 N/mm²", Kind::Stress, 5e6),
            ("7850 kg/m3", Kind::Density, 7850.0),
            ("7850 kg/m^3", Kind::Density, 7850.0),
            ("7850 kg/m³", Kind::Density, 7850.0),
            ("-120 kN", Kind::Force, -120e3),
            ("5 N", Kind::Force, 5.0),
            ("5 MN", Kind::Force, 5e6),
            ("85 kN*m", Kind::Moment, 85e3),
            ("85 kN·m", Kind::Moment, 85e3),
            ("85 kN.m", Kind::Moment, 85e3),
            ("85 kN m", Kind::Moment, 85e3),
            ("85 kNm", Kind::Moment, 85e3),
            ("85 N*m", Kind::Moment, 85.0),
            ("85 Nm", Kind::Moment, 85.0),
            ("2 MN*m", Kind::Moment, 2e6),
            ("15 kN/m", Kind::LineLoad, 15e3),
            ("15 N/m", Kind::LineLoad, 15.0),
            ("15 N/mm", Kind::LineLoad, 15e3),
            ("2*15 kN", Kind::Force, 30e3),
            ("(1 + 2) kN", Kind::Force, 3e3),
            ("sqrt(4) m", Kind::Length, 2.0),
            ("1e3 N", Kind::Force, 1e3),
            ("120kN", Kind::Force, 120e3),
            ("  7 kN  ", Kind::Force, 7e3),
        ];
        for &(src, kind, want) in cases {
            assert!(close(si(src, kind), want, 1e-15), "{src}");
        }
        let aliases: [(&str, &str, Kind); 9] = [
            ("3 kips", "3 kip", Kind::Force),
            ("3 pcf", "3 lb/ft3", Kind::Density),
            ("3 lb/ft^3", "3 lb/ft3", Kind::Density),
            ("3 lb/ft³", "3 lb/ft3", Kind::Density),
            ("3 kip·ft", "3 kip*ft", Kind::Moment),
            ("3 kip ft", "3 kip*ft", Kind::Moment),
            ("3 kip.in", "3 kip*in", Kind::Moment),
            ("3 lbf in", "3 lbf*in", Kind::Moment),
            ("3 lbf·ft", "3 lbf*ft", Kind::Moment),
        ];
        for (a, b, kind) in aliases {
            assert_eq!(si(a, kind), si(b, kind), "{a}");
        }
    }

    #[test]
    fn bare_numbers() {
        assert_eq!(parse_quantity("12", Kind::Length), Ok(Quantity::Bare(12.0)));
        assert_eq!(
            parse_quantity("2*pi", Kind::Length),
            Ok(Quantity::Bare(2.0 * std::f64::consts::PI))
        );
        let e = err("200", Kind::Stress);
        assert!(e.message.starts_with("missing unit"), "{}", e.message);
        assert!(e.message.contains("Pa kPa MPa GPa psi ksi N/mm2"));
        assert_eq!(e.offset, 3);
        assert!(err("-120", Kind::Force).message.contains("N kN MN lbf kip"));
        assert!(err("", Kind::Force).message.contains("empty"));
        assert!(err("kN", Kind::Force)
            .message
            .contains("missing number before `kN`"));
    }

    #[test]
    fn wrong_case_and_unknown_units() {
        let e = err("350 mpa", Kind::Stress);
        assert_eq!(e.message, "unknown unit `mpa`; did you mean `MPa`?");
        assert_eq!(e.offset, 4);
        for (src, kind, hint) in [
            ("200 gpa", Kind::Stress, "GPa"),
            ("5 KN", Kind::Force, "kN"),
            ("5 KN*M", Kind::Moment, "kN*m"),
            ("5 kn m", Kind::Moment, "kN m"),
            ("5 PSI", Kind::Stress, "psi"),
            ("5 KG/M3", Kind::Density, "kg/m3"),
            ("5 MM", Kind::Length, "mm"),
            ("5 Mm", Kind::Length, "mm"),
            ("5 n/MM2", Kind::Stress, "N/mm2"),
            ("5 KNM", Kind::Moment, "kNm"),
        ] {
            let e = err(src, kind);
            assert!(
                e.message.ends_with(&format!("did you mean `{hint}`?")),
                "{src}: {}",
                e.message
            );
        }
        let e = err("5 furlong", Kind::Length);
        assert_eq!(
            e.message,
            "unknown unit `furlong`; a length takes one of: mm cm m in ft"
        );
        assert_eq!(e.offset, 2);
        let e = err("5 kN/mm", Kind::LineLoad);
        assert!(
            e.message.starts_with("unknown unit `kN/mm`"),
            "{}",
            e.message
        );
        let e = err("5 min", Kind::Length);
        assert!(e.message.starts_with("unknown unit `min`"), "{}", e.message);
        let e = err("6 m", Kind::Force);
        assert_eq!(
            e.message,
            "`m` is a length unit, but a force is needed here; use one of: N kN MN lbf kip"
        );
        assert_eq!(e.offset, 2);
        let e = err("2*x kN", Kind::Force);
        assert!(e.message.contains("cannot use params"));
        assert_eq!(e.offset, 2);
        let e = err("1/0 kN", Kind::Force);
        assert!(e.message.contains("division by zero"));
        assert_eq!(e.offset, 1);
        assert!(err("5 %", Kind::Force)
            .message
            .contains("unexpected character `%`"));
        assert!(err("1e308 GPa", Kind::Stress).message.contains("too large"));
    }

    #[test]
    fn round_trips() {
        for kind in [
            Kind::Length,
            Kind::Stress,
            Kind::Density,
            Kind::Force,
            Kind::Moment,
            Kind::LineLoad,
        ] {
            for system in [System::Si, System::Us] {
                let unit = display_unit(kind, system);
                let v = 12.345;
                assert!(close(unit.from_si(unit.to_si(v)), v, 1e-15));
                // The display unit is an accepted unit with the same factor.
                let written = format!("{v} {}", unit.name);
                assert!(close(si(&written, kind), unit.to_si(v), 1e-15), "{written}");
            }
        }
        for u in LengthUnit::ALL {
            assert_eq!(LengthUnit::parse(u.name()), Some(u));
            let v = 3.75;
            assert!(close(
                si(&format!("{v} {}", u.name()), Kind::Length) / u.metres(),
                v,
                1e-15
            ));
        }
        assert_eq!(LengthUnit::parse("MM"), None);
        assert_eq!(LengthUnit::parse("yd"), None);
        assert!(LengthUnit::In.is_us() && LengthUnit::Ft.is_us() && !LengthUnit::M.is_us());
        assert_eq!(System::of(LengthUnit::Ft), System::Us);
        assert_eq!(System::of(LengthUnit::Cm), System::Si);
        assert_eq!(display_unit(Kind::Moment, System::Us).name, "kip*ft");
        assert_eq!(mass_per_length_unit(System::Si).name, "kg/m");
    }

    // A 100 × 200 mm rectangle, written in each length unit: A = b·h = 2e4 mm² = 0.02 m²,
    // S = b·h²/6 = 6.667e5 mm³ = 6.667e-4 m³, Ixx = b·h³/12 = 6.667e7 mm⁴ = 6.667e-5 m⁴
    // (Gere & Goodno, Mechanics of Materials, App. E case 1). An I of two 200 × 10 flanges
    // 400 apart (centre to centre): Iy ≈ 2·tf·b³/12 = 1.333e7 mm⁴ and Cw = Iy·h0²/4 =
    // 5.333e11 mm⁶ = 5.333e-7 m⁶ (AISC Design Guide 9, doubly symmetric I). Each SI value is
    // the same from every unit; a wrong power would be off by the unit's size to that power.
    #[test]
    fn to_si_of_every_dimension() {
        for u in LengthUnit::ALL {
            let k = 0.001 / u.metres(); // this unit's figures per mm
            let (b, h) = (100.0 * k, 200.0 * k);
            let cases = [
                (h, Dim::Length, 0.2),
                (b * h, Dim::Area, 0.02),
                (b * h * h / 6.0, Dim::Modulus, 0.1 * 0.04 / 6.0),
                (
                    b * h.powi(3) / 12.0,
                    Dim::SecondMoment,
                    6.666_666_666_666_667e-5,
                ),
            ];
            for (value, dim, want) in cases {
                assert!(close(u.to_si(value, dim), want, 1e-12), "{u:?} {dim:?}");
            }
            let (bf, tf, h0) = (200.0 * k, 10.0 * k, 400.0 * k);
            let cw = 2.0 * tf * bf.powi(3) / 12.0 * h0 * h0 / 4.0;
            assert!(close(
                u.to_si(cw, Dim::Warping),
                5.333_333_333_333_333e-7,
                1e-12
            ));
        }
        let powers = [
            Dim::Length,
            Dim::Area,
            Dim::Modulus,
            Dim::SecondMoment,
            Dim::Warping,
        ]
        .map(Dim::power);
        assert_eq!(powers, [1, 2, 3, 4, 6]);
        assert_eq!(LengthUnit::In.display().name, "in");
        assert_eq!(LengthUnit::Cm.display().from_si(0.2), 20.0);
    }

    #[test]
    fn one_table_of_examples() {
        // Each example parses as its own kind, so messages never suggest a wrong unit.
        for kind in [
            Kind::Length,
            Kind::Stress,
            Kind::Density,
            Kind::Force,
            Kind::Moment,
            Kind::LineLoad,
        ] {
            for ex in kind.examples() {
                assert!(
                    matches!(parse_quantity(ex, kind), Ok(Quantity::Si(_))),
                    "{ex}"
                );
            }
            assert!(err("", kind).message.contains(kind.examples()[0]));
        }
    }

    #[test]
    fn never_panics_on_odd_text() {
        for src in [
            "·", "²", "kN kN", "^", "5 ^2", "5 /m", "5 · m", "\u{0} kN", "é kN", "5 ²",
        ] {
            for kind in [Kind::Length, Kind::Moment, Kind::Density] {
                if let Err(e) = parse_quantity(src, kind) {
                    assert!(src.is_char_boundary(e.offset.min(src.len())), "{src}");
                }
            }
        }
    }
}

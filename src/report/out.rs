//! Output units: lengths in the file's unit (or the one asked for with `--units`),
//! forces, moments and stresses in kN, kN·m, MPa for metric lengths and kip, kip·ft,
//! ksi for US customary ones (FORMAT.md, `quantity_units`); and how the views write
//! numbers and symbols (`numfmt::Numbers`, `rows::Notation`), which JSON ignores.

use super::rows::Notation;
use crate::model::units::{
    display_unit, mass_per_length_unit, DisplayUnit, Kind, LengthUnit, System,
};
use crate::numfmt::Numbers;

/// How to express results.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OutUnits {
    pub length: LengthUnit,
    /// Output length units per file length unit.
    k: f64,
    pub system: System,
    /// The form of numbers in the views.
    pub numbers: Numbers,
    /// The letters of moduli and axes in the views.
    pub notation: Notation,
}

impl OutUnits {
    pub fn new(file: LengthUnit, wanted: Option<LengthUnit>) -> OutUnits {
        let length = wanted.unwrap_or(file);
        OutUnits {
            length,
            k: file.metres() / length.metres(),
            system: System::of(length),
            numbers: Numbers::default(),
            notation: Notation::default(),
        }
    }

    /// The same units, with numbers and symbols written as given.
    pub fn written(self, numbers: Numbers, notation: Notation) -> OutUnits {
        OutUnits {
            numbers,
            notation,
            ..self
        }
    }

    /// `x` to `figs` significant figures in the chosen form of numbers.
    pub fn num(&self, x: f64, figs: usize) -> String {
        self.numbers.show(x, figs)
    }

    /// A file quantity of length dimension `power` (1 length, 2 area, 4 second moment…).
    pub fn geo(&self, x: f64, power: i32) -> f64 {
        x * self.k.powi(power)
    }

    /// A length given in metres.
    pub fn metres(&self, x: f64) -> f64 {
        x / self.length.metres()
    }

    pub fn force(&self) -> DisplayUnit {
        display_unit(Kind::Force, self.system)
    }
    pub fn moment(&self) -> DisplayUnit {
        display_unit(Kind::Moment, self.system)
    }
    pub fn stress(&self) -> DisplayUnit {
        display_unit(Kind::Stress, self.system)
    }
    pub fn line_load(&self) -> DisplayUnit {
        display_unit(Kind::LineLoad, self.system)
    }
    /// Shear flow (force per length of member): N/mm for metric files, kip/in for US
    /// customary ones (FORMAT.md, `quantity_units.shear_flow`).
    pub fn shear_flow(&self) -> DisplayUnit {
        match self.system {
            System::Si => DisplayUnit {
                name: "N/mm",
                si_per_unit: 1.0 / LengthUnit::Mm.metres(),
            },
            System::Us => DisplayUnit {
                name: "kip/in",
                si_per_unit: self.force().si_per_unit / LengthUnit::In.metres(),
            },
        }
    }
    pub fn mass(&self) -> DisplayUnit {
        mass_per_length_unit(self.system)
    }

    /// Deflections: the output length unit for metric files, inches for US customary.
    pub fn deflection(&self) -> DisplayUnit {
        match self.system {
            System::Si => self.length.display(),
            System::Us => display_unit(Kind::Length, System::Us),
        }
    }

    /// `mm²`, `in⁴`…
    pub fn label(&self, power: i32) -> String {
        let sup = match power {
            2 => "²",
            3 => "³",
            4 => "⁴",
            6 => "⁶",
            _ => "",
        };
        format!("{}{sup}", self.length.name())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::units::Dim;

    #[test]
    fn output_lengths_agree_with_the_si_conversion() {
        // A second moment of 6.667e7 mm⁴ (100 × 200 mm rectangle, b·h³/12) shown in inches:
        // 6.667e-5 m⁴ / 0.0254⁴ m⁴/in⁴ = 160.2 in⁴ (1 in = 0.0254 m, NIST SP 811).
        let u = OutUnits::new(LengthUnit::Mm, Some(LengthUnit::In));
        let ixx = 100.0 * 200f64.powi(3) / 12.0;
        let si = LengthUnit::Mm.to_si(ixx, Dim::SecondMoment);
        let shown = u.geo(ixx, Dim::SecondMoment.power());
        assert!((shown - si / 0.0254f64.powi(4)).abs() <= 1e-12 * shown);
        assert!((shown - 160.2).abs() < 0.05);
        assert_eq!(u.label(Dim::SecondMoment.power()), "in⁴");
        assert_eq!(u.deflection().name, "in");
        let cm = OutUnits::new(LengthUnit::M, Some(LengthUnit::Cm));
        assert_eq!(
            (cm.deflection().name, cm.deflection().si_per_unit),
            ("cm", 0.01)
        );
    }
}

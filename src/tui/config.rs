//! The workbench's settings: read from `config.toml` in the platform's config directory
//! (e.g. `~/.config/kern/config.toml` on Linux), all keys optional.
//!
//! ```toml
//! units = "cm"          # lengths in results: mm, cm, m, in or ft (default: the file's)
//! step = 5              # step of the + and - keys, percent of the value
//! fine_step = 1         # step of ] and [
//! coarse_step = 25      # step of } and {
//! ascii = false         # plain-ASCII borders and drawing for bare terminals
//! colour = true         # false (or the NO_COLOR variable) draws without colours
//! numbers = "engineering"  # engineering (13 800, 687.0×10⁶), scientific (6.870e8) or plain
//! notation = "xy"       # xy: Sx, Zx, Ixx about x–y; yz: Wel,y, Wpl,y, Iy about y–z
//! [colours]             # any of: accent solid void selected centroid axes neutral kern shear shade warning
//! solid = "cyan"        # a colour name or #rrggbb
//! ```

use crate::model::units::LengthUnit;
use crate::numfmt::Numbers;
use crate::report::rows::Notation;
use ratatui::style::Color;
use std::path::PathBuf;
use std::str::FromStr;

/// Settings with their defaults filled in.
#[derive(Debug, Clone, PartialEq)]
pub struct Config {
    /// Length unit of the results, if not the file's.
    pub units: Option<LengthUnit>,
    /// Steps in percent: fine, normal, coarse.
    pub steps: [f64; 3],
    pub ascii: bool,
    pub colour: bool,
    /// The form of numbers in the results.
    pub numbers: Numbers,
    /// The letters of moduli and axes in the results.
    pub notation: Notation,
    /// Colour overrides by role name.
    pub colours: Vec<(String, Color)>,
}

impl Default for Config {
    fn default() -> Config {
        Config {
            units: None,
            steps: [1.0, 5.0, 25.0],
            ascii: false,
            colour: true,
            numbers: Numbers::default(),
            notation: Notation::default(),
            colours: Vec::new(),
        }
    }
}

/// The roles a colour can be set for in `[colours]`.
pub const COLOUR_ROLES: &[&str] = &[
    "accent", "solid", "void", "selected", "centroid", "axes", "neutral", "kern", "shear", "shade",
    "warning",
];

impl Config {
    /// Where the config file is looked for.
    pub fn path() -> Option<PathBuf> {
        directories::ProjectDirs::from("", "", "kern").map(|d| d.config_dir().join("config.toml"))
    }

    /// The user's settings (defaults when there is no file), with `NO_COLOR` honoured.
    /// A problem in the file is returned beside the settings, to be shown, not fatal.
    pub fn load() -> (Config, Option<String>) {
        let (mut c, err) = match Config::path().and_then(|p| std::fs::read_to_string(p).ok()) {
            None => (Config::default(), None),
            Some(text) => match Config::parse(&text) {
                Ok(c) => (c, None),
                Err(e) => (Config::default(), Some(format!("config file: {e}"))),
            },
        };
        if std::env::var_os("NO_COLOR").is_some_and(|v| !v.is_empty()) {
            c.colour = false;
        }
        (c, err)
    }

    /// Reads settings from the text of a config file.
    pub fn parse(text: &str) -> Result<Config, String> {
        let doc = text
            .parse::<toml_edit::DocumentMut>()
            .map_err(|e| e.message().trim().to_string())?;
        let mut c = Config::default();
        for (k, item) in doc.iter() {
            let num = || {
                item.as_float()
                    .or(item.as_integer().map(|i| i as f64))
                    .filter(|x| *x > 0.0 && x.is_finite())
                    .ok_or_else(|| format!("`{k}` must be a positive number (percent)"))
            };
            let flag = || {
                item.as_bool()
                    .ok_or_else(|| format!("`{k}` must be true or false"))
            };
            match k {
                "units" => {
                    let u = item.as_str().and_then(LengthUnit::parse);
                    c.units = Some(u.ok_or("`units` must be one of mm, cm, m, in, ft")?);
                }
                "fine_step" => c.steps[0] = num()?,
                "step" => c.steps[1] = num()?,
                "coarse_step" => c.steps[2] = num()?,
                "ascii" => c.ascii = flag()?,
                "colour" | "color" => c.colour = flag()?,
                "numbers" => {
                    let n = item.as_str().and_then(Numbers::parse);
                    c.numbers = n.ok_or(format!("`numbers` must be one of {}", Numbers::NAMES))?;
                }
                "notation" => {
                    let n = item.as_str().and_then(Notation::parse);
                    c.notation = n.ok_or(format!("`notation` must be {}", Notation::NAMES))?;
                }
                "colours" | "colors" => {
                    let t = item.as_table_like().ok_or("`colours` must be a table")?;
                    for (role, v) in t.iter() {
                        if !COLOUR_ROLES.contains(&role) {
                            return Err(format!(
                                "unknown colour role `{role}`; use one of {}",
                                COLOUR_ROLES.join(", ")
                            ));
                        }
                        let col = v
                            .as_str()
                            .and_then(|s| Color::from_str(s).ok())
                            .ok_or_else(|| format!("`{role}`: not a colour name or #rrggbb"))?;
                        c.colours.push((role.to_string(), col));
                    }
                }
                other => return Err(format!("unknown key `{other}`")),
            }
        }
        Ok(c)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_every_key_and_refuses_typos() {
        let c = Config::parse(
            "units = \"cm\"\nstep = 10\nfine_step = 0.5\nascii = true\ncolour = false\n[colours]\nsolid = \"#ff0000\"\n",
        )
        .unwrap();
        assert_eq!(c.units, Some(LengthUnit::Cm));
        assert_eq!(c.steps, [0.5, 10.0, 25.0]);
        assert!(c.ascii && !c.colour);
        assert_eq!(
            c.colours,
            vec![("solid".to_string(), Color::Rgb(255, 0, 0))]
        );
        assert!(Config::parse("stpe = 3").is_err());
        let c = Config::parse("numbers = \"plain\"\nnotation = \"yz\"").unwrap();
        assert_eq!((c.numbers, c.notation), (Numbers::Plain, Notation::Yz));
        assert!(Config::parse("numbers = \"sci\"").is_err());
        assert!(Config::parse("notation = \"eu\"").is_err());
        assert!(Config::parse("step = -1").is_err());
        assert_eq!(Config::parse("").unwrap(), Config::default());
    }
}

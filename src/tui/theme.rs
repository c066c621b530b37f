//! Every colour, style and border glyph of the workbench, in three variants: colour,
//! no colour (bold, reverse and dim only; for `NO_COLOR`), and plain ASCII (borders and
//! drawing in ASCII characters, for bare terminals). Views take all looks from here.

use super::config::Config;
use ratatui::style::{Color, Modifier, Style};
use ratatui::symbols::border;

/// What a mark in the drawing stands for; later ones are drawn over earlier ones.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
pub enum Ink {
    /// A cell shaded by a stress level.
    Shade,
    Mesh,
    Kern,
    Axes,
    Neutral,
    Void,
    Solid,
    Selected,
    Marker,
}

/// The look of the workbench.
#[derive(Debug, Clone, PartialEq)]
pub struct Theme {
    pub ascii: bool,
    pub colour: bool,
    pub title: Style,
    pub border: Style,
    pub border_focus: Style,
    pub header: Style,
    pub row_selected: Style,
    pub cell_selected: Style,
    pub muted: Style,
    pub error: Style,
    pub warning: Style,
    pub note: Style,
    pub up: Style,
    pub down: Style,
    pub editing: Style,
    pub caution: Style,
    ink: [Style; 9],
}

const ASCII_BORDER: border::Set = border::Set {
    top_left: "+",
    top_right: "+",
    bottom_left: "+",
    bottom_right: "+",
    vertical_left: "|",
    vertical_right: "|",
    horizontal_top: "-",
    horizontal_bottom: "-",
};

impl Theme {
    /// The theme the settings ask for.
    pub fn from_config(c: &Config) -> Theme {
        let mut t = if c.colour {
            Theme::coloured()
        } else {
            Theme::plain()
        };
        t.ascii = c.ascii;
        if c.colour {
            for (role, col) in &c.colours {
                let s = Style::new().fg(*col);
                match role.as_str() {
                    "accent" => t.border_focus = s,
                    "warning" => t.warning = s,
                    "solid" => t.ink[Ink::Solid as usize] = s,
                    "void" => t.ink[Ink::Void as usize] = s,
                    "selected" => t.ink[Ink::Selected as usize] = s.add_modifier(Modifier::BOLD),
                    "centroid" | "shear" => t.ink[Ink::Marker as usize] = s,
                    "axes" => t.ink[Ink::Axes as usize] = s,
                    "neutral" => t.ink[Ink::Neutral as usize] = s,
                    "kern" => t.ink[Ink::Kern as usize] = s,
                    "shade" => t.ink[Ink::Shade as usize] = s,
                    _ => {}
                }
            }
        }
        t
    }

    /// Colours on a dark or light background (the terminal's own palette).
    pub fn coloured() -> Theme {
        let fg = |c| Style::new().fg(c);
        Theme {
            ascii: false,
            colour: true,
            title: Style::new().add_modifier(Modifier::BOLD),
            border: fg(Color::DarkGray),
            border_focus: fg(Color::Cyan),
            header: fg(Color::Gray).add_modifier(Modifier::BOLD),
            row_selected: Style::new().add_modifier(Modifier::BOLD),
            cell_selected: Style::new().bg(Color::Cyan).fg(Color::Black),
            muted: fg(Color::DarkGray),
            error: fg(Color::LightRed).add_modifier(Modifier::BOLD),
            warning: fg(Color::Yellow),
            note: fg(Color::Green),
            up: fg(Color::Green),
            down: fg(Color::LightRed),
            editing: Style::new().bg(Color::Blue).fg(Color::White),
            caution: fg(Color::DarkGray).add_modifier(Modifier::ITALIC),
            ink: [
                fg(Color::LightGreen),
                fg(Color::DarkGray),
                fg(Color::Magenta),
                fg(Color::Blue),
                fg(Color::Yellow),
                fg(Color::LightRed),
                fg(Color::White),
                fg(Color::Cyan).add_modifier(Modifier::BOLD),
                fg(Color::LightYellow).add_modifier(Modifier::BOLD),
            ],
        }
    }

    /// No colours: emphasis by bold, reverse and dim only.
    pub fn plain() -> Theme {
        let s = Style::new();
        let bold = s.add_modifier(Modifier::BOLD);
        let dim = s.add_modifier(Modifier::DIM);
        let rev = s.add_modifier(Modifier::REVERSED);
        Theme {
            ascii: false,
            colour: false,
            title: bold,
            border: s,
            border_focus: bold,
            header: bold,
            row_selected: bold,
            cell_selected: rev,
            muted: dim,
            error: bold,
            warning: bold,
            note: s,
            up: s,
            down: s,
            editing: rev,
            caution: dim,
            ink: [s, dim, dim, dim, s, s, s, bold, bold],
        }
    }

    /// The style of a mark in the drawing.
    pub fn ink(&self, ink: Ink) -> Style {
        self.ink[ink as usize]
    }

    /// The character of a mark in ASCII mode.
    pub fn ascii_ink(ink: Ink) -> char {
        match ink {
            Ink::Shade => '-',
            Ink::Mesh => ',',
            Ink::Kern => ':',
            Ink::Axes => '.',
            Ink::Neutral => '=',
            Ink::Void => 'o',
            Ink::Solid => '#',
            Ink::Selected => '@',
            Ink::Marker => '+',
        }
    }

    pub fn border_set(&self) -> border::Set {
        if self.ascii {
            ASCII_BORDER
        } else {
            border::ROUNDED
        }
    }

    /// `s` as drawn: unchanged, or in ASCII mode with superscripts, Greek letters and
    /// other symbols spelled out (`mm⁴` → `mm^4`, `x̄` → `xc`, `687.0×10⁶` → `687.0x10^6`).
    pub fn text(&self, s: &str) -> String {
        if !self.ascii {
            return s.to_string();
        }
        const SUPERSCRIPTS: &str = "⁰¹²³⁴⁵⁶⁷⁸⁹⁻";
        let mut out = String::with_capacity(s.len());
        let mut raised = false;
        for c in s.chars() {
            // A run of superscripts is one power: `10⁻⁶` → `10^-6`.
            if let Some(i) = SUPERSCRIPTS.chars().position(|x| x == c) {
                if !raised {
                    out.push('^');
                }
                out.push(char::from(b"0123456789-"[i]));
                raised = true;
                continue;
            }
            raised = false;
            match c {
                '\u{202f}' | '\u{2009}' => out.push(' '),
                '\u{304}' => out.push('c'),
                'ȳ' => out.push_str("yc"),
                'θ' => out.push_str("theta"),
                'σ' => out.push('s'),
                'τ' => out.push_str("tau"),
                'δ' => out.push('d'),
                '−' | '—' | '–' => out.push('-'),
                '±' => out.push_str("+/-"),
                '√' => out.push_str("sqrt"),
                '°' => out.push_str("deg"),
                '…' => out.push_str("..."),
                '·' => out.push('-'),
                '→' => out.push_str("->"),
                '×' => out.push('x'),
                c if c.is_ascii() => out.push(c),
                _ => out.push('?'),
            }
        }
        out
    }

    /// A glyph in Unicode, or its ASCII stand-in.
    pub fn glyph(&self, unicode: &'static str, ascii: &'static str) -> &'static str {
        if self.ascii {
            ascii
        } else {
            unicode
        }
    }
}

//! Regenerates `screenshots/`: the workbench's main screens drawn on a test terminal,
//! each saved as plain text and as an SVG of the coloured cells.
//!
//! Run from the repository root: `cargo run --example screenshots`.

use kern::tui::app::{App, Solver};
use kern::tui::commands::run;
use kern::tui::config::Config;
use kern::tui::keys::Cmd;
use kern::tui::views;
use ratatui::backend::TestBackend;
use ratatui::buffer::Buffer;
use ratatui::style::{Color, Modifier};
use ratatui::Terminal;
use std::fmt::Write as _;
use std::path::Path;

/// The palette the SVGs use for the terminal's named colours (a dark theme).
fn hex(c: Color, fg: bool) -> String {
    match c {
        Color::Reset => (if fg { "#d0d0d0" } else { "#1c1c1c" }).into(),
        Color::Black => "#1c1c1c".into(),
        Color::Red => "#cd3131".into(),
        Color::Green => "#0dbc79".into(),
        Color::Yellow => "#e5e510".into(),
        Color::Blue => "#2472c8".into(),
        Color::Magenta => "#bc3fbc".into(),
        Color::Cyan => "#11a8cd".into(),
        Color::Gray => "#c0c0c0".into(),
        Color::DarkGray => "#767676".into(),
        Color::LightRed => "#f14c4c".into(),
        Color::LightGreen => "#23d18b".into(),
        Color::LightYellow => "#f5f543".into(),
        Color::LightBlue => "#3b8eea".into(),
        Color::LightMagenta => "#d670d6".into(),
        Color::LightCyan => "#29b8db".into(),
        Color::White => "#ffffff".into(),
        Color::Rgb(r, g, b) => format!("#{r:02x}{g:02x}{b:02x}"),
        Color::Indexed(i) => format!("#{0:02x}{0:02x}{0:02x}", i),
    }
}

fn esc(s: &str) -> String {
    s.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
}

/// The buffer as an SVG: one text element per cell run of one style.
fn svg(buf: &Buffer) -> String {
    let (cw, ch) = (8.4, 17.0);
    let a = buf.area;
    let (w, h) = (a.width as f64 * cw, a.height as f64 * ch);
    let mut s = format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{w}\" height=\"{h}\" viewBox=\"0 0 {w} {h}\" font-family=\"DejaVu Sans Mono, Menlo, Consolas, monospace\" font-size=\"14\">\n<rect width=\"100%\" height=\"100%\" fill=\"{}\"/>\n",
        hex(Color::Reset, false)
    );
    for y in 0..a.height {
        for x in 0..a.width {
            let Some(cell) = buf.cell((x, y)) else {
                continue;
            };
            let (mut fg, mut bg) = (cell.fg, cell.bg);
            if cell.modifier.contains(Modifier::REVERSED) {
                std::mem::swap(&mut fg, &mut bg);
            }
            let (px, py) = (x as f64 * cw, y as f64 * ch);
            if bg != Color::Reset {
                let _ = writeln!(
                    s,
                    "<rect x=\"{px:.1}\" y=\"{py:.1}\" width=\"{cw}\" height=\"{ch}\" fill=\"{}\"/>",
                    hex(bg, false)
                );
            }
            let sym = cell.symbol();
            if sym.trim().is_empty() {
                continue;
            }
            let weight = if cell.modifier.contains(Modifier::BOLD) {
                " font-weight=\"bold\""
            } else {
                ""
            };
            let _ = writeln!(
                s,
                "<text x=\"{px:.1}\" y=\"{:.1}\" fill=\"{}\"{weight}>{}</text>",
                py + ch * 0.78,
                hex(fg, true),
                esc(sym)
            );
        }
    }
    s.push_str("</svg>\n");
    s
}

fn shoot(dir: &Path, name: &str, app: &App, w: u16, h: u16) {
    let mut t = Terminal::new(TestBackend::new(w, h)).expect("test terminal");
    t.draw(|f| views::render(app, f.area(), f.buffer_mut()))
        .expect("draw");
    let buf = t.backend().buffer();
    let text: String = (0..h)
        .map(|y| {
            let line: String = (0..w)
                .filter_map(|x| buf.cell((x, y)).map(|c| c.symbol().to_string()))
                .collect();
            format!("{}\n", line.trim_end())
        })
        .collect();
    std::fs::write(dir.join(format!("{name}.txt")), text).expect("write text");
    std::fs::write(dir.join(format!("{name}.svg")), svg(buf)).expect("write svg");
    println!("screenshots/{name}.txt, .svg");
}

fn main() {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("screenshots");
    std::fs::create_dir_all(&dir).expect("screenshots folder");
    let new = || {
        App::new(
            kern::tui::DEMO.to_string(),
            None,
            Config::default(),
            Solver::Off,
        )
        .expect("the demo computes")
    };
    let mut app = new();
    shoot(&dir, "main-120x40", &app, 120, 40);
    shoot(&dir, "main-80x24", &app, 80, 24);
    // A what-if: the top flange 300 → 350 wide, against the file as opened.
    run(&mut app, Cmd::SwitchList);
    run(&mut app, Cmd::CoarseUp);
    run(&mut app, Cmd::SwitchList);
    shoot(&dir, "what-if-120x40", &app, 120, 40);
    run(&mut app, Cmd::Help);
    shoot(&dir, "help-120x40", &app, 120, 40);
    let mut app = new();
    run(&mut app, Cmd::AddPart);
    shoot(&dir, "add-part-120x40", &app, 120, 40);
    let mut app = new();
    run(&mut app, Cmd::ToggleAscii);
    shoot(&dir, "ascii-80x24", &app, 80, 24);
}

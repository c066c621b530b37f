//! `kern`: arguments and dispatch only; the work is in the library.

use clap::{Parser, Subcommand};
use kern::analysis::Options;
use kern::cli::{calc, print_out, report, svg, CalcArgs, ReportArgs};
use kern::fe::TorsionOptions;
use kern::model::units::LengthUnit;
use std::path::PathBuf;

/// Design and check beam and column cross-sections in the terminal.
#[derive(Parser)]
#[command(name = "kern", version, about, long_about = None)]
struct Cli {
    #[command(subcommand)]
    verb: Option<Verb>,
    /// A section file to open in the workbench (without one, a bundled demo opens).
    file: Option<PathBuf>,
}

#[derive(Subcommand)]
enum Verb {
    /// Compute every property of one or more section files.
    Calc {
        #[arg(required = true)]
        files: Vec<PathBuf>,
        /// One JSON object per file, one per line (keys in docs/format.md).
        #[arg(long)]
        json: bool,
        /// Express lengths in this unit: mm, cm, m, in or ft.
        #[arg(long, value_parser = parse_unit)]
        units: Option<LengthUnit>,
        /// Skip the finite-element torsion solve.
        #[arg(long)]
        no_torsion: bool,
        /// Target relative error of the torsion results.
        #[arg(long, default_value_t = kern::fe::DEFAULT_TOL)]
        torsion_tol: f64,
    },
    /// Write a calculation sheet for one section file (Markdown, or HTML with --html).
    Report {
        file: PathBuf,
        /// Write to this file instead of stdout.
        #[arg(short, long)]
        out: Option<PathBuf>,
        /// A self-contained HTML page with the drawing inline.
        #[arg(long)]
        html: bool,
        /// Express lengths in this unit: mm, cm, m, in or ft.
        #[arg(long, value_parser = parse_unit)]
        units: Option<LengthUnit>,
        /// Skip the finite-element torsion solve.
        #[arg(long)]
        no_torsion: bool,
    },
    /// Draw one section file to scale as SVG.
    Svg {
        file: PathBuf,
        /// Write to this file instead of stdout.
        #[arg(short, long)]
        out: Option<PathBuf>,
        /// Express lengths in this unit: mm, cm, m, in or ft.
        #[arg(long, value_parser = parse_unit)]
        units: Option<LengthUnit>,
        /// Skip the finite-element torsion solve (no shear centre).
        #[arg(long)]
        no_torsion: bool,
    },
    /// Print the workbench's keys as Markdown (the list in README.md).
    Keys,
}

fn parse_unit(s: &str) -> Result<LengthUnit, String> {
    LengthUnit::parse(s).ok_or_else(|| format!("unknown unit `{s}`; use mm, cm, m, in or ft"))
}

/// Analysis options: torsion to the default relative error unless skipped.
fn torsion_options(no_torsion: bool) -> Options {
    Options {
        torsion: (!no_torsion).then(TorsionOptions::default),
    }
}

fn main() {
    let cli = Cli::parse();
    let status = match cli.verb {
        Some(Verb::Calc {
            files,
            json,
            units,
            no_torsion,
            torsion_tol,
        }) => {
            let torsion = (!no_torsion).then(|| TorsionOptions {
                tol: torsion_tol,
                ..TorsionOptions::default()
            });
            calc(&CalcArgs {
                files,
                json,
                units,
                options: Options { torsion },
            })
        }
        Some(Verb::Report {
            file,
            out,
            html,
            units,
            no_torsion,
        }) => report(&ReportArgs {
            file,
            out,
            html,
            units,
            options: torsion_options(no_torsion),
        }),
        Some(Verb::Svg {
            file,
            out,
            units,
            no_torsion,
        }) => svg(&file, out.as_deref(), units, &torsion_options(no_torsion)),
        Some(Verb::Keys) => print_out(&kern::tui::keys::markdown()),
        None => kern::tui::run(cli.file),
    };
    std::process::exit(status);
}

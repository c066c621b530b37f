//! `kern`: arguments and dispatch only; the work is in the library.

use clap::{Parser, Subcommand};
use kern::analysis::Options;
use kern::cli::check::CheckArgs;
use kern::cli::diff::DiffArgs;
use kern::cli::seek::SeekArgs;
use kern::cli::sensitivity::SensitivityArgs;
use kern::cli::sweep::SweepArgs;
use kern::cli::{calc, print_out, report, svg, CalcArgs, ReportArgs, Written};
use kern::fe::TorsionOptions;
use kern::model::units::LengthUnit;
use kern::numfmt::Numbers;
use kern::report::rows::Notation;
use std::path::PathBuf;

/// Small blocks are cached a thread in front of the system allocator ([`kern::blocks`]).
#[global_allocator]
static ALLOCATOR: kern::blocks::Blocks = kern::blocks::Blocks;

/// Design and check beam and column cross-sections in the terminal.
#[derive(Parser)]
#[command(name = "kern", version, about, long_about = None)]
struct Cli {
    #[command(subcommand)]
    verb: Option<Verb>,
    /// A section file to open in the workbench (without one, a bundled demo opens).
    file: Option<PathBuf>,
    /// How numbers are written: engineering (13 800, 687.0×10⁶; the default, or the
    /// config file's), scientific (6.870e8) or plain (687000000). JSON is never affected.
    #[arg(long, global = true, value_parser = parse_numbers)]
    numbers: Option<Numbers>,
    /// Symbols of moduli and axes: xy (Sx, Zx, Ixx about x–y; the default) or yz
    /// (Wel,y, Wpl,y, Iy about y–z, z vertical). JSON is never affected.
    #[arg(long, global = true, value_parser = parse_notation)]
    notation: Option<Notation>,
}

/// Each verb's arguments are built only when that verb runs (`defer`): a start builds
/// the names and summaries of all, and the arguments of one.
#[derive(Subcommand)]
#[command(defer = true)]
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
        /// Solve torsion alone, without the flexure (shear) problem beside it: no shear
        /// areas, shear stresses (shear, member.tau_max), flow across joints on a closed
        /// cell, or deflection with shear deformation.
        #[arg(long)]
        no_shear: bool,
        /// Target relative error of the torsion results.
        #[arg(long, default_value_t = kern::fe::DEFAULT_TOL)]
        torsion_tol: f64,
        /// For every param, the rate of change of one result (--result) per unit of the
        /// param and per kg/m of added mass, ranked.
        #[arg(long)]
        sensitivity: bool,
        /// With --sensitivity: the dotted JSON key of the result (default inertia.xx).
        #[arg(long, requires = "sensitivity")]
        result: Option<String>,
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
        /// Add a table of the sensitivities of this result (a dotted JSON key, e.g.
        /// inertia.xx) to every param.
        #[arg(long, value_name = "KEY")]
        sensitivity: Option<String>,
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
    /// A table of results against one param over evenly spaced values.
    Sweep {
        file: PathBuf,
        /// The param to vary (a name in [params]).
        #[arg(long)]
        param: String,
        /// The first value, in the file's length unit.
        #[arg(long, allow_hyphen_values = true)]
        from: f64,
        /// The last value, in the file's length unit.
        #[arg(long, allow_hyphen_values = true)]
        to: f64,
        /// How many values, both ends included (at least 2).
        #[arg(long)]
        steps: usize,
        /// One `calc --json` object per value, with "sweep": {"param", "value"}.
        #[arg(long, conflicts_with = "csv")]
        json: bool,
        /// Comma-separated values for a spreadsheet.
        #[arg(long)]
        csv: bool,
        /// A result to show, by its dotted JSON key (repeat for more; default: a set of
        /// the main ones).
        #[arg(long)]
        result: Vec<String>,
        /// Skip the finite-element torsion solve.
        #[arg(long)]
        no_torsion: bool,
    },
    /// Find the value of a param for which a result reaches a target.
    Seek {
        file: PathBuf,
        /// The param to solve for (a name in [params]).
        #[arg(long)]
        param: String,
        /// KEY=VALUE: a dotted JSON key and its target, e.g. inertia.xx=8e8,
        /// member.utilization=0.9, member.deflection_max=span/500, inertia.xx="800 cm4".
        #[arg(long)]
        target: String,
        /// Search between A and B (A..B); default: out from the current value over the
        /// positive values for which the file computes.
        #[arg(long, allow_hyphen_values = true)]
        within: Option<String>,
        /// {"param", "value", "result": {calc object}}.
        #[arg(long)]
        json: bool,
        /// Put the value into the file (one line changed, layout kept).
        #[arg(long)]
        write: bool,
    },
    /// Two sections' results side by side; B may be REV:PATH of A's git repository
    /// (REV: alone is A at that revision, e.g. HEAD:).
    Diff {
        a: PathBuf,
        b: String,
        /// {"a": {calc object}, "b": {calc object}}.
        #[arg(long)]
        json: bool,
        /// Express lengths in this unit: mm, cm, m, in or ft.
        #[arg(long, value_parser = parse_unit)]
        units: Option<LengthUnit>,
        /// Skip the finite-element torsion solve.
        #[arg(long)]
        no_torsion: bool,
    },
    /// Check section files for CI: exit 0 all pass, 1 any fails, 2 any invalid.
    Check {
        #[arg(required = true)]
        files: Vec<PathBuf>,
        /// One JSON object per file.
        #[arg(long)]
        json: bool,
    },
    /// Print the workbench's keys as Markdown (the list in README.md).
    Keys,
}

fn parse_numbers(s: &str) -> Result<Numbers, String> {
    Numbers::parse(s).ok_or_else(|| format!("unknown form `{s}`; use {}", Numbers::NAMES))
}

fn parse_notation(s: &str) -> Result<Notation, String> {
    Notation::parse(s).ok_or_else(|| format!("unknown notation `{s}`; use {}", Notation::NAMES))
}

fn parse_unit(s: &str) -> Result<LengthUnit, String> {
    LengthUnit::parse(s).ok_or_else(|| format!("unknown unit `{s}`; use mm, cm, m, in or ft"))
}

/// Analysis options: torsion to the default relative error unless skipped.
fn torsion_options(no_torsion: bool) -> Options {
    Options {
        torsion: (!no_torsion).then(TorsionOptions::default),
        ..Options::default()
    }
}

fn main() {
    kern::heap::set_up();
    let cli = Cli::parse();
    let written = Written {
        numbers: cli.numbers.unwrap_or_default(),
        notation: cli.notation.unwrap_or_default(),
    };
    let status = match cli.verb {
        Some(Verb::Calc {
            files,
            json,
            units,
            no_torsion,
            no_shear,
            torsion_tol,
            sensitivity,
            result,
        }) => {
            let torsion = (!no_torsion).then(|| TorsionOptions {
                tol: torsion_tol,
                ..TorsionOptions::default()
            });
            let options = Options {
                torsion,
                shear: !no_shear,
            };
            if sensitivity {
                kern::cli::sensitivity::sensitivity(&SensitivityArgs {
                    files,
                    result,
                    json,
                    written,
                    options,
                })
            } else {
                calc(&CalcArgs {
                    files,
                    json,
                    units,
                    written,
                    options,
                })
            }
        }
        Some(Verb::Report {
            file,
            out,
            html,
            units,
            no_torsion,
            sensitivity,
        }) => report(&ReportArgs {
            file,
            out,
            html,
            units,
            written,
            options: torsion_options(no_torsion),
            sensitivity,
        }),
        Some(Verb::Svg {
            file,
            out,
            units,
            no_torsion,
        }) => svg(
            &file,
            out.as_deref(),
            units,
            written,
            &torsion_options(no_torsion),
        ),
        Some(Verb::Sweep {
            file,
            param,
            from,
            to,
            steps,
            json,
            csv,
            result,
            no_torsion,
        }) => kern::cli::sweep::sweep(&SweepArgs {
            file,
            param,
            from,
            to,
            steps,
            json,
            csv,
            results: result,
            written,
            options: torsion_options(no_torsion),
        }),
        Some(Verb::Seek {
            file,
            param,
            target,
            within,
            json,
            write,
        }) => kern::cli::seek::seek(&SeekArgs {
            file,
            param,
            target,
            within,
            json,
            write,
            written,
            options: torsion_options(false),
        }),
        Some(Verb::Diff {
            a,
            b,
            json,
            units,
            no_torsion,
        }) => kern::cli::diff::diff(&DiffArgs {
            a,
            b,
            json,
            units,
            written,
            options: torsion_options(no_torsion),
        }),
        Some(Verb::Check { files, json }) => kern::cli::check::check(&CheckArgs {
            files,
            json,
            written,
        }),
        Some(Verb::Keys) => print_out(&kern::tui::keys::markdown()),
        None => kern::tui::run(cli.file, cli.numbers, cli.notation),
    };
    std::process::exit(status);
}

//! Writes the throughput batch (`support/sections.rs`) as TOML files into the folder
//! given as the first argument, for `benches/batch.sh` to time `kern calc` on:
//! `cargo bench --bench batch_files -- DIR` (cargo adds `--bench`, which is skipped).

#[path = "support/sections.rs"]
mod sections;

fn main() {
    let Some(dir) = std::env::args().skip(1).find(|a| !a.starts_with("--")) else {
        eprintln!("usage: cargo bench --bench batch_files -- DIR");
        std::process::exit(2);
    };
    let dir = std::path::Path::new(&dir);
    if let Err(e) = std::fs::create_dir_all(dir) {
        eprintln!("{}: cannot create the folder: {e}", dir.display());
        std::process::exit(1);
    }
    for k in 0..sections::COUNT {
        let p = dir.join(format!("member-{k:03}.toml"));
        if let Err(e) = std::fs::write(&p, sections::section(k)) {
            eprintln!("{}: cannot write the file: {e}", p.display());
            std::process::exit(1);
        }
    }
}

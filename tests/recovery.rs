//! The workbench's safety nets on the app state, without a terminal: the recovery copy
//! of unsaved edits (written as a panic or a signal would, then offered on the next
//! open, never taken without a yes) and the question before replacing a read-only file.

use kern::file::recover;
use kern::tui::app::{App, Mode, Solver};
use kern::tui::commands::run;
use kern::tui::config::Config;
use kern::tui::keys::Cmd;
use kern::tui::rescue;
use std::path::Path;

#[path = "support/scratch.rs"]
mod support_scratch;
use support_scratch::scratch;

const LINTEL: &str = include_str!("../sections/garage-lintel.toml");

fn open(file: &Path) -> App {
    let text = std::fs::read_to_string(file).unwrap();
    App::new(
        text,
        Some(file.to_path_buf()),
        Config::default(),
        Solver::Off,
    )
    .unwrap()
}

/// An edit of the first param, so the text differs from the file.
fn edit(a: &mut App) {
    run(a, Cmd::SwitchList);
    run(a, Cmd::StepUp);
    assert!(a.modified());
}

#[test]
fn unsaved_edits_are_kept_and_offered_on_the_next_open() {
    let dir = scratch("offer");
    let file = dir.join("lintel.toml");
    std::fs::write(&file, LINTEL).unwrap();
    let copy = recover::recovery_path(Some(&file)).unwrap();

    // Nothing unsaved: nothing written.
    let mut a = open(&file);
    rescue::keep(&a);
    assert_eq!(rescue::write_copy(), None);
    // Unsaved edits: what the panic hook and the signal handler write.
    edit(&mut a);
    rescue::keep(&a);
    let said = rescue::write_copy().expect("a copy is written");
    assert!(said.contains("lintel.toml.kern-recover"), "{said}");
    assert_eq!(std::fs::read_to_string(&copy).unwrap(), a.text);
    let unsaved = a.text.clone();

    // The next open asks; no leaves the file as saved and keeps the copy.
    let mut b = open(&file);
    b.offer_recovery();
    assert_eq!(b.mode, Mode::AskRecover(copy.clone()));
    run(&mut b, Cmd::Cancel);
    assert_eq!(b.text, LINTEL);
    assert!(copy.exists());

    // Yes takes the edits as unsaved (and undoable) and removes the copy.
    let mut c = open(&file);
    c.offer_recovery();
    run(&mut c, Cmd::Yes);
    assert_eq!(c.text, unsaved);
    assert!(c.modified());
    assert!(!copy.exists());
    assert_eq!(
        std::fs::read_to_string(&file).unwrap(),
        LINTEL,
        "not saved yet"
    );
    run(&mut c, Cmd::Undo);
    assert_eq!(c.text, LINTEL);

    // Without a copy there is no question.
    let mut d = open(&file);
    d.offer_recovery();
    assert_eq!(d.mode, Mode::Main);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[cfg(unix)]
#[test]
fn a_read_only_file_is_replaced_only_after_a_yes() {
    use std::os::unix::fs::{MetadataExt, PermissionsExt};
    let dir = scratch("readonly");
    let file = dir.join("lintel.toml");
    std::fs::write(&file, LINTEL).unwrap();
    std::fs::set_permissions(&file, std::fs::Permissions::from_mode(0o444)).unwrap();
    let mut a = open(&file);
    edit(&mut a);
    run(&mut a, Cmd::Save);
    assert_eq!(a.mode, Mode::AskReadOnly(file.clone()));
    run(&mut a, Cmd::Cancel);
    assert_eq!(std::fs::read_to_string(&file).unwrap(), LINTEL);
    assert!(a.modified());
    run(&mut a, Cmd::Save);
    run(&mut a, Cmd::Yes);
    assert_eq!(std::fs::read_to_string(&file).unwrap(), a.text);
    assert!(!a.modified());
    assert_eq!(std::fs::metadata(&file).unwrap().mode() & 0o777, 0o444);
    std::fs::remove_dir_all(&dir).unwrap();
}

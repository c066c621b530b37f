//! kill -9 in the middle of saves: a child process (this test binary again, in helper
//! mode) saves versions of a file in a loop and is killed at varying moments. After
//! every kill the file is a complete old or new version, never a mix or a stub, and the
//! next save removes the temporary file the killed process left behind.

use kern::file::save::{save, Overwrite};
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::Duration;

/// When set, [`helper_saves_in_a_loop`] saves to this path until it is killed.
const HELPER_ENV: &str = "KERN_SAVE_CRASH_HELPER";

/// Version `n` of the file: about 2 MB (so a write takes a while), its number at both
/// ends and its length checkable.
fn version(n: u64) -> String {
    let mut s = format!("# version {n}\n");
    for i in 0..40_000 {
        s.push_str(&format!("x{i} = {n}  # a line of a long section file\n"));
    }
    s.push_str(&format!("# end of version {n}\n"));
    s
}

/// Is `text` exactly one whole version?
fn is_whole(text: &str) -> bool {
    text.strip_prefix("# version ")
        .and_then(|rest| rest.split('\n').next())
        .and_then(|n| n.parse::<u64>().ok())
        .is_some_and(|n| text == version(n))
}

#[test]
fn helper_saves_in_a_loop() {
    let Some(path) = std::env::var_os(HELPER_ENV) else {
        return; // An ordinary run: nothing to do.
    };
    let path = PathBuf::from(path);
    for n in 1.. {
        save(&path, &version(n), Overwrite::Writable).expect("helper save");
    }
}

fn temp_files(dir: &Path) -> Vec<String> {
    std::fs::read_dir(dir)
        .unwrap()
        .filter_map(|e| e.ok())
        .map(|e| e.file_name().to_string_lossy().into_owned())
        .filter(|n| n.ends_with(".tmp"))
        .collect()
}

#[test]
fn kill_9_leaves_old_or_new_and_the_next_save_cleans_up() {
    let dir = std::env::temp_dir().join(format!("kern-crash-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    let file = dir.join("runway.toml");
    save(&file, &version(0), Overwrite::Writable).unwrap();
    let me = std::env::current_exe().unwrap();
    let mut left_behind = 0;
    for round in 0..12u64 {
        let mut child = Command::new(&me)
            .args(["--exact", "helper_saves_in_a_loop", "--test-threads=1"])
            .env(HELPER_ENV, &file)
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .spawn()
            .unwrap();
        std::thread::sleep(Duration::from_millis(40 + 17 * round));
        child.kill().unwrap(); // SIGKILL
        child.wait().unwrap();
        let text = std::fs::read_to_string(&file).unwrap();
        assert!(is_whole(&text), "round {round}: a partial file");
        left_behind += temp_files(&dir).len();
        // The next save removes what the killed process left.
        save(&file, &version(1000 + round), Overwrite::Writable).unwrap();
        assert_eq!(temp_files(&dir), Vec::<String>::new(), "round {round}");
        assert_eq!(
            std::fs::read_to_string(&file).unwrap(),
            version(1000 + round)
        );
    }
    // Not an assertion on timing: just a note of how often a kill hit mid-write.
    eprintln!("temp files left by a kill in 12 rounds: {left_behind}");
    std::fs::remove_dir_all(&dir).unwrap();
}

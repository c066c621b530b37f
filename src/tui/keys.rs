//! The one key table: every key the workbench answers to, the named command it runs,
//! the group it belongs to and what it does in words. The help overlay and the key list
//! in README.md (`kern keys`) are both generated from [`KEYS`], so they cannot drift.

use crossterm::event::{KeyCode, KeyEvent, KeyModifiers};

/// A key, with or without Ctrl or Alt (Shift is part of the character: `G`, `{`).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Key {
    pub code: KeyCode,
    pub ctrl: bool,
    pub alt: bool,
}

const fn ch(c: char) -> Key {
    Key {
        code: KeyCode::Char(c),
        ctrl: false,
        alt: false,
    }
}
const fn ctrl(c: char) -> Key {
    Key {
        code: KeyCode::Char(c),
        ctrl: true,
        alt: false,
    }
}
const fn alt(c: char) -> Key {
    Key {
        code: KeyCode::Char(c),
        ctrl: false,
        alt: true,
    }
}
const fn code(code: KeyCode) -> Key {
    Key {
        code,
        ctrl: false,
        alt: false,
    }
}

/// Is a key press a chord (Ctrl or Alt held), which never types its character?
pub fn is_chord(ev: &KeyEvent) -> bool {
    ev.modifiers
        .intersects(KeyModifiers::CONTROL | KeyModifiers::ALT)
}

impl Key {
    /// Does a key press match this key?
    pub fn matches(&self, ev: &KeyEvent) -> bool {
        let ev_ctrl = ev.modifiers.contains(KeyModifiers::CONTROL);
        let ev_alt = ev.modifiers.contains(KeyModifiers::ALT);
        if ev_ctrl != self.ctrl || ev_alt != self.alt {
            return false;
        }
        match (self.code, ev.code) {
            (KeyCode::Char(a), KeyCode::Char(b)) => a == b,
            (KeyCode::Tab, KeyCode::BackTab) => false,
            (a, b) => a == b,
        }
    }

    /// The key as written in the help and the README (`Ctrl-s`, `Left`, `Space`).
    pub fn label(&self) -> String {
        let base = match self.code {
            KeyCode::Char(' ') => "Space".to_string(),
            KeyCode::Char(c) => c.to_string(),
            KeyCode::Left => "Left".into(),
            KeyCode::Right => "Right".into(),
            KeyCode::Up => "Up".into(),
            KeyCode::Down => "Down".into(),
            KeyCode::Home => "Home".into(),
            KeyCode::End => "End".into(),
            KeyCode::PageUp => "PgUp".into(),
            KeyCode::PageDown => "PgDn".into(),
            KeyCode::Enter => "Enter".into(),
            KeyCode::Esc => "Esc".into(),
            KeyCode::Tab => "Tab".into(),
            KeyCode::Backspace => "Backspace".into(),
            KeyCode::Delete => "Delete".into(),
            KeyCode::F(n) => format!("F{n}"),
            other => format!("{other:?}"),
        };
        if self.ctrl {
            format!("Ctrl-{base}")
        } else if self.alt {
            format!("Alt-{base}")
        } else {
            base
        }
    }
}

/// Where a key applies.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Ctx {
    /// Moving about the tables.
    Main,
    /// Typing a value, a name or a file name.
    Typing,
    /// Choosing a shape for a new part, or a new shape for a part.
    Choosing,
    /// Answering a question (unsaved changes, file changed on disk).
    Asking,
    /// The help overlay.
    Help,
    /// The window of the file's other keys: title, units, params, materials, actions,
    /// member.
    Tables,
    /// A window of results that scrolls (compare, what buys the most).
    Window,
    /// The list of the open file's commits to compare with.
    Revisions,
}

/// Every command a key can run (see [`super::commands::run`]).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Cmd {
    Left,
    Right,
    Up,
    Down,
    First,
    Last,
    FirstColumn,
    LastColumn,
    SwitchList,
    PageDown,
    PageUp,
    Edit,
    StepUp,
    StepDown,
    FineUp,
    FineDown,
    CoarseUp,
    CoarseDown,
    ToggleVoid,
    ToggleHole,
    ToggleEnabled,
    AddPart,
    ChangeShape,
    NextAnchor,
    PrevAnchor,
    FlipX,
    FlipY,
    CopyPart,
    DeletePart,
    MoveUp,
    MoveDown,
    Undo,
    Redo,
    SetBaseline,
    ResetBaseline,
    Save,
    SaveAs,
    Quit,
    Help,
    ToggleMesh,
    Shade,
    ToggleAscii,
    Commit,
    Cancel,
    CursorLeft,
    CursorRight,
    CursorHome,
    CursorEnd,
    WordLeft,
    WordRight,
    Backspace,
    DeleteChar,
    DeleteWordBack,
    KillToStart,
    KillToEnd,
    Yes,
    SaveAndQuit,
    OpenTables,
    Seek,
    Rates,
    Sweep,
    Compare,
    AddKey,
    RemoveKey,
    Rename,
}

/// One line of the key table.
#[derive(Debug, Clone, Copy)]
pub struct Binding {
    pub ctx: Ctx,
    pub keys: &'static [Key],
    pub cmd: Cmd,
    pub group: &'static str,
    pub help: &'static str,
}

const fn b(
    ctx: Ctx,
    keys: &'static [Key],
    cmd: Cmd,
    group: &'static str,
    help: &'static str,
) -> Binding {
    Binding {
        ctx,
        keys,
        cmd,
        group,
        help,
    }
}

use Ctx::{Asking, Choosing, Help, Main, Revisions, Tables, Typing, Window};
use KeyCode as K;

const MOVE: &str = "Moving about";
const WHATIF: &str = "Trying changes";
const PARTS: &str = "Parts";
const FILE: &str = "History, baseline and file";
const VIEW: &str = "View";
const TYPE: &str = "Typing a value";
const PICK: &str = "Choosing a shape";
const ASK: &str = "Questions";
const TABLES: &str = "Keys of the file";
const WINDOW: &str = "Windows of results (compare, what buys the most)";
const REVS: &str = "Choosing a commit to compare with";

/// The key table, one binding a line.
#[rustfmt::skip]
pub const KEYS: &[Binding] = &[
    b(Main, &[code(K::Left), ch('h')], Cmd::Left, MOVE, "previous column"),
    b(Main, &[code(K::Right), ch('l')], Cmd::Right, MOVE, "next column"),
    b(Main, &[code(K::Up), ch('k')], Cmd::Up, MOVE, "previous row"),
    b(Main, &[code(K::Down), ch('j')], Cmd::Down, MOVE, "next row"),
    b(Main, &[ch('g')], Cmd::First, MOVE, "first row"),
    b(Main, &[ch('G')], Cmd::Last, MOVE, "last row"),
    b(Main, &[code(K::Home)], Cmd::FirstColumn, MOVE, "first column (in the params: first row)"),
    b(Main, &[code(K::End)], Cmd::LastColumn, MOVE, "last column (in the params: last row)"),
    b(Main, &[code(K::Tab)], Cmd::SwitchList, MOVE, "switch between parts and params"),
    b(Main, &[code(K::PageDown)], Cmd::PageDown, MOVE, "scroll the results down"),
    b(Main, &[code(K::PageUp)], Cmd::PageUp, MOVE, "scroll the results up"),
    b(Main, &[code(K::Enter), ch('e')], Cmd::Edit, WHATIF, "type a new value (number or expression)"),
    b(Main, &[ch('+'), ch('=')], Cmd::StepUp, WHATIF, "step up (step, default 5 %; rounded)"),
    b(Main, &[ch('-')], Cmd::StepDown, WHATIF, "step the value down"),
    b(Main, &[ch(']')], Cmd::FineUp, WHATIF, "fine step up (fine_step, default 1 %)"),
    b(Main, &[ch('[')], Cmd::FineDown, WHATIF, "fine step down"),
    b(Main, &[ch('}')], Cmd::CoarseUp, WHATIF, "coarse step up (coarse_step, default 25 %)"),
    b(Main, &[ch('{')], Cmd::CoarseDown, WHATIF, "coarse step down"),
    b(Main, &[ch('/')], Cmd::Seek, WHATIF, "seek the param's value for a target"),
    b(Main, &[ch('w')], Cmd::Rates, WHATIF, "what buys the most: params ranked"),
    b(Main, &[ch('p')], Cmd::Sweep, WHATIF, "sweep a result over a range of the param"),
    b(Main, &[ch('v')], Cmd::ToggleVoid, WHATIF, "make the part a void or a solid again"),
    b(Main, &[ch('V')], Cmd::ToggleHole, WHATIF, "make the part a hole (net section only) or a void everywhere again"),
    b(Main, &[ch(' ')], Cmd::ToggleEnabled, WHATIF, "leave the part out, or take it back in"),
    b(Main, &[ch('a')], Cmd::AddPart, PARTS, "add a part; in the params, a param"),
    b(Main, &[ch('t')], Cmd::ChangeShape, PARTS, "new shape (keeps place and shared sizes)"),
    b(Main, &[ch('n')], Cmd::NextAnchor, PARTS, "next anchor (the point put at `at`)"),
    b(Main, &[ch('N')], Cmd::PrevAnchor, PARTS, "previous anchor"),
    b(Main, &[ch('f')], Cmd::FlipX, PARTS, "mirror the part left to right (flip_x)"),
    b(Main, &[ch('F')], Cmd::FlipY, PARTS, "mirror the part top to bottom (flip_y)"),
    b(Main, &[ch('c')], Cmd::CopyPart, PARTS, "copy the part below itself"),
    b(Main, &[ch('x'), code(K::Delete)], Cmd::DeletePart, PARTS, "delete the part, or the param if unused"),
    b(Main, &[ch('K')], Cmd::MoveUp, PARTS, "move the part up the list"),
    b(Main, &[ch('J')], Cmd::MoveDown, PARTS, "move the part down the list"),
    b(Main, &[ch('o')], Cmd::OpenTables, TABLES, "the file's other keys (title, units, …)"),
    b(Tables, &[code(K::Up), ch('k')], Cmd::Up, TABLES, "previous key"),
    b(Tables, &[code(K::Down), ch('j')], Cmd::Down, TABLES, "next key"),
    b(Tables, &[code(K::Enter), ch('e')], Cmd::Edit, TABLES, "type a new value (heading: add a key)"),
    b(Tables, &[ch('a')], Cmd::AddKey, TABLES, "add a key, typed key = value"),
    b(Tables, &[ch('x'), code(K::Delete)], Cmd::RemoveKey, TABLES, "remove the key (heading: the table)"),
    b(Tables, &[ch('R')], Cmd::Rename, TABLES, "rename the param and its every use"),
    b(Tables, &[code(K::Esc), ch('o'), ch('q')], Cmd::Cancel, TABLES, "close the window"),
    b(Main, &[ch('u')], Cmd::Undo, FILE, "undo"),
    b(Main, &[ch('r'), ctrl('r')], Cmd::Redo, FILE, "redo"),
    b(Main, &[ch('b')], Cmd::SetBaseline, FILE, "compare against the section as it is now"),
    b(Main, &[ch('B')], Cmd::ResetBaseline, FILE, "compare against the file as opened"),
    b(Main, &[ch('C')], Cmd::Compare, FILE, "compare with a listed commit or a file"),
    b(Main, &[ch('s'), ctrl('s')], Cmd::Save, FILE, "save (asks for a name for the demo)"),
    b(Main, &[ch('S')], Cmd::SaveAs, FILE, "save under another name"),
    b(Main, &[ch('q'), ctrl('c')], Cmd::Quit, FILE, "quit (asks first if there are unsaved changes)"),
    b(Main, &[ch('?'), code(K::F(1))], Cmd::Help, VIEW, "this help"),
    b(Main, &[ch('m')], Cmd::ToggleMesh, VIEW, "show the torsion mesh in the drawing"),
    b(Main, &[ch('d')], Cmd::Shade, VIEW, "shade the drawing by the shear stress under [actions], then von Mises, then none"),
    b(Main, &[ch('i')], Cmd::ToggleAscii, VIEW, "plain-ASCII drawing and borders"),
    b(Typing, &[code(K::Enter)], Cmd::Commit, TYPE, "keep the value (refused with the reason if invalid)"),
    b(Typing, &[code(K::Esc)], Cmd::Cancel, TYPE, "cancel, nothing changes"),
    b(Typing, &[code(K::Left), ctrl('b')], Cmd::CursorLeft, TYPE, "cursor left"),
    b(Typing, &[code(K::Right), ctrl('f')], Cmd::CursorRight, TYPE, "cursor right"),
    b(Typing, &[alt('b')], Cmd::WordLeft, TYPE, "back a word"),
    b(Typing, &[alt('f')], Cmd::WordRight, TYPE, "forward a word"),
    b(Typing, &[code(K::Home), ctrl('a')], Cmd::CursorHome, TYPE, "start of the line"),
    b(Typing, &[code(K::End), ctrl('e')], Cmd::CursorEnd, TYPE, "end of the line"),
    b(Typing, &[code(K::Backspace), ctrl('h')], Cmd::Backspace, TYPE, "delete before the cursor"),
    b(Typing, &[code(K::Delete), ctrl('d')], Cmd::DeleteChar, TYPE, "delete at the cursor"),
    b(Typing, &[ctrl('w')], Cmd::DeleteWordBack, TYPE, "delete the word before the cursor"),
    b(Typing, &[ctrl('u')], Cmd::KillToStart, TYPE, "delete from the start of the line to the cursor"),
    b(Typing, &[ctrl('k')], Cmd::KillToEnd, TYPE, "delete from the cursor to the end of the line"),
    b(Choosing, &[code(K::Up), ch('k')], Cmd::Up, PICK, "previous shape"),
    b(Choosing, &[code(K::Down), ch('j')], Cmd::Down, PICK, "next shape"),
    b(Choosing, &[code(K::Enter)], Cmd::Commit, PICK, "take that shape (for the new part, or the part being changed)"),
    b(Choosing, &[code(K::Esc), ch('q')], Cmd::Cancel, PICK, "choose nothing, nothing changes"),
    b(Asking, &[ch('y')], Cmd::Yes, ASK, "yes (quit unsaved, overwrite, new baseline, void/solid, reload)"),
    b(Asking, &[ch('s')], Cmd::SaveAndQuit, ASK, "save, then quit"),
    b(Asking, &[ch('n'), code(K::Esc)], Cmd::Cancel, ASK, "no, go back (reload: keep mine)"),
    b(Window, &[code(K::Down), ch('j')], Cmd::Down, WINDOW, "scroll down a line"),
    b(Window, &[code(K::Up), ch('k')], Cmd::Up, WINDOW, "scroll up a line"),
    b(Window, &[code(K::PageDown), ch(' ')], Cmd::PageDown, WINDOW, "scroll down a page"),
    b(Window, &[code(K::PageUp)], Cmd::PageUp, WINDOW, "scroll up a page"),
    b(Window, &[code(K::Home), ch('g')], Cmd::First, WINDOW, "to the top"),
    b(Window, &[code(K::End), ch('G')], Cmd::Last, WINDOW, "to the end"),
    b(Window, &[code(K::Esc), ch('q'), ch('n')], Cmd::Cancel, WINDOW, "close the window"),
    b(Revisions, &[code(K::Down), ch('j')], Cmd::Down, REVS, "the next (older) commit"),
    b(Revisions, &[code(K::Up), ch('k')], Cmd::Up, REVS, "the previous (newer) commit"),
    b(Revisions, &[code(K::Home), ch('g')], Cmd::First, REVS, "the last commit"),
    b(Revisions, &[code(K::End), ch('G')], Cmd::Last, REVS, "the oldest commit listed"),
    b(Revisions, &[code(K::Enter)], Cmd::Commit, REVS, "compare with the highlighted commit"),
    b(Revisions, &[ch('e'), code(K::Tab)], Cmd::Edit, REVS, "type a file or a revision instead"),
    b(Revisions, &[code(K::Esc), ch('q')], Cmd::Cancel, REVS, "compare with nothing, nothing changes"),
    b(Help, &[code(K::Down), ch('j')], Cmd::Down, VIEW, "scroll the help"),
    b(Help, &[code(K::Up), ch('k')], Cmd::Up, VIEW, "scroll the help back"),
    b(Help, &[code(K::PageDown), ch(' ')], Cmd::PageDown, VIEW, "scroll the help a page"),
    b(Help, &[code(K::PageUp)], Cmd::PageUp, VIEW, "scroll the help a page back"),
    b(Help, &[code(K::Home), ch('g')], Cmd::First, VIEW, "top of the help"),
    b(Help, &[code(K::End), ch('G')], Cmd::Last, VIEW, "end of the help"),
    b(Help, &[code(K::Esc), ch('?'), ch('q')], Cmd::Cancel, VIEW, "close the help"),
];

/// The command bound to a key press in a context.
pub fn lookup(ctx: Ctx, ev: &KeyEvent) -> Option<Cmd> {
    KEYS.iter()
        .filter(|b| b.ctx == ctx)
        .find(|b| b.keys.iter().any(|k| k.matches(ev)))
        .map(|b| b.cmd)
}

/// The groups in table order, each with its bindings (help-overlay keys left out).
pub fn groups() -> Vec<(&'static str, Vec<&'static Binding>)> {
    let mut out: Vec<(&str, Vec<&Binding>)> = Vec::new();
    for bd in KEYS.iter().filter(|b| b.ctx != Ctx::Help) {
        match out.iter_mut().find(|(g, _)| *g == bd.group) {
            Some((_, v)) => v.push(bd),
            None => out.push((bd.group, vec![bd])),
        }
    }
    out
}

/// The keys of a binding joined for display: `Left h`.
pub fn keys_label(bd: &Binding) -> String {
    bd.keys.iter().map(Key::label).collect::<Vec<_>>().join(" ")
}

/// The key list as Markdown (the README section between the `keys` markers).
pub fn markdown() -> String {
    let mut s = String::new();
    for (group, binds) in groups() {
        s.push_str(&format!(
            "\n**{group}**\n\n| keys | what it does |\n|---|---|\n"
        ));
        for bd in binds {
            let keys: Vec<String> = bd
                .keys
                .iter()
                .map(|k| format!("`{}`", k.label().replace('|', "\\|")))
                .collect();
            s.push_str(&format!("| {} | {} |\n", keys.join(" "), bd.help));
        }
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn no_key_is_bound_twice_in_one_context() {
        for (i, a) in KEYS.iter().enumerate() {
            for bd in &KEYS[i + 1..] {
                if a.ctx == bd.ctx {
                    for k in a.keys {
                        assert!(!bd.keys.contains(k), "{} bound twice", k.label());
                    }
                }
            }
        }
    }

    #[test]
    fn shifted_letters_and_ctrl_match() {
        let ev = KeyEvent::new(KeyCode::Char('G'), KeyModifiers::SHIFT);
        assert_eq!(lookup(Ctx::Main, &ev), Some(Cmd::Last));
        let ev = KeyEvent::new(KeyCode::Char('s'), KeyModifiers::CONTROL);
        assert_eq!(lookup(Ctx::Main, &ev), Some(Cmd::Save));
        let ev = KeyEvent::new(KeyCode::Char('z'), KeyModifiers::NONE);
        assert_eq!(lookup(Ctx::Main, &ev), None);
    }
}

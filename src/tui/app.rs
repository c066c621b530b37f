//! The workbench's state: the file text being edited, undo and redo, the selection,
//! the mode (moving, typing, choosing, asking), the current analysis and the baseline it
//! is compared against, and the message line. Changes go through [`App::edit`], which
//! applies an [`Edit`] to the document the workbench keeps and refuses one whose text
//! does not compute, saying why.

use super::columns::{columns, Col};
use super::config::Config;
use super::theme::Theme;
use super::worker::{Poll, Worker};
use crate::analysis::{nu_ref, Analysis, Options};
use crate::fe::torsion;
use crate::file::edit::{self, Edit, Place};
use crate::file::input::read_text;
use crate::file::recover;
use crate::geom::Pt;
use crate::model::Diagnostic;
use crate::report::out::OutUnits;
use ratatui::layout::Rect;
use std::cell::OnceCell;
use std::path::{Path, PathBuf};
use toml_edit::DocumentMut;

/// Which list has the keyboard.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Focus {
    Parts,
    Params,
}

/// A line being typed, with the cursor as a character index.
#[derive(Debug, Clone, PartialEq, Eq, Default)]
pub struct LineEdit {
    pub text: String,
    pub cursor: usize,
}

impl LineEdit {
    pub fn new(text: &str) -> LineEdit {
        LineEdit {
            text: text.to_string(),
            cursor: text.chars().count(),
        }
    }

    fn byte(&self, ch: usize) -> usize {
        self.text
            .char_indices()
            .nth(ch)
            .map_or(self.text.len(), |(i, _)| i)
    }

    pub fn insert(&mut self, c: char) {
        let at = self.byte(self.cursor);
        self.text.insert(at, c);
        self.cursor += 1;
    }

    pub fn backspace(&mut self) {
        if self.cursor > 0 {
            self.cursor -= 1;
            let at = self.byte(self.cursor);
            self.text.remove(at);
        }
    }

    pub fn delete(&mut self) {
        if self.cursor < self.text.chars().count() {
            let at = self.byte(self.cursor);
            self.text.remove(at);
        }
    }

    pub fn left(&mut self) {
        self.cursor = self.cursor.saturating_sub(1);
    }

    pub fn right(&mut self) {
        self.cursor = (self.cursor + 1).min(self.len());
    }

    /// The length in characters.
    pub fn len(&self) -> usize {
        self.text.chars().count()
    }

    pub fn is_empty(&self) -> bool {
        self.text.is_empty()
    }

    /// Removes the characters from `from` to `to` (character indices) and puts the
    /// cursor where they were.
    pub fn cut(&mut self, from: usize, to: usize) {
        let (a, b) = (self.byte(from.min(to)), self.byte(to.max(from)));
        self.text.replace_range(a..b, "");
        self.cursor = from.min(to);
    }

    /// Where the word before the cursor starts (a word: letters, digits, `_` or `.`).
    pub fn word_start(&self) -> usize {
        let chars: Vec<char> = self.text.chars().collect();
        let mut i = self.cursor.min(chars.len());
        while i > 0 && !is_word(chars[i - 1]) {
            i -= 1;
        }
        while i > 0 && is_word(chars[i - 1]) {
            i -= 1;
        }
        i
    }

    /// Where the word at or after the cursor ends.
    pub fn word_end(&self) -> usize {
        let chars: Vec<char> = self.text.chars().collect();
        let mut i = self.cursor.min(chars.len());
        while i < chars.len() && !is_word(chars[i]) {
            i += 1;
        }
        while i < chars.len() && is_word(chars[i]) {
            i += 1;
        }
        i
    }
}

/// A character that belongs to a word for the word moves (a name or a number).
fn is_word(c: char) -> bool {
    c.is_alphanumeric() || c == '_' || c == '.'
}

/// What a typed line is for.
#[derive(Debug, Clone, PartialEq)]
pub enum Target {
    /// A cell of the parts table.
    Cell { part: usize, col: Col },
    /// A param's value.
    Param(String),
    /// The file name to save under.
    SaveAs,
    /// The value of a key of a table other than the parts.
    Key { table: Place, key: String },
    /// A new key of a table, typed `key = value`; for a new material (one past the
    /// last), several separated by commas.
    NewKey(Place),
    /// A new name for a param.
    Rename(String),
    /// A target for a param to reach (`Ixx = 8e8`).
    Seek(String),
    /// The result to rank the params by.
    Rates,
    /// The result (and range) to sweep a param over.
    Sweep(String),
    /// A file or git revision to compare against.
    Baseline,
}

/// The shape picker: the highlighted row, and what the chosen shape is for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Picker {
    pub row: usize,
    /// The part whose shape changes; `None` adds a new part.
    pub change: Option<usize>,
}

/// What the keys do at the moment.
#[derive(Debug, Clone, PartialEq)]
pub enum Mode {
    Main,
    Typing {
        target: Target,
        line: LineEdit,
    },
    /// The shape picker.
    Choosing(Picker),
    /// Quit with unsaved changes?
    AskQuit,
    /// The file changed on disk (or exists): overwrite it?
    AskOverwrite(PathBuf),
    /// The file is read-only: replace it anyway?
    AskReadOnly(PathBuf),
    /// A recovery copy of unsaved edits is at this place: take it?
    AskRecover(PathBuf),
    /// Compare against the section as it is now (the old baseline is not kept)?
    AskBaseline,
    /// Solid or void for this part (Enter on the ± cell)?
    AskVoid(usize),
    /// The help overlay, scrolled by so many lines.
    Help(u16),
    /// The open file changed on disk while there are unsaved edits: keep them or take
    /// the file's text (this one)?
    AskDisk(String),
    /// Take the value a seek found?
    AskSeek(super::commands::seek::Found),
    /// The params ranked by what they buy of a result.
    Rates(super::listing::Listing),
    /// A result swept over a param: plot and table.
    Sweep(super::commands::sweep::Swept),
    /// Work with many torsion solves is under way in the background ([`App::job`]).
    Working,
    /// Both designs' results side by side.
    Compare(super::listing::Listing),
    /// The open file's commits, to compare with one.
    Revisions(super::commands::compare::Revisions),
}

/// How torsion is solved.
pub enum Solver {
    /// Not at all (tests, snapshots).
    Off,
    /// On the calling thread, before the edit returns (deterministic tests).
    Inline,
    /// On a background thread.
    Thread(Worker),
}

/// The workbench.
pub struct App {
    /// Where the section is saved; `None` for the bundled demo.
    pub path: Option<PathBuf>,
    pub text: String,
    /// `text` as a document to edit; only [`App::edit`] and [`App::restore`] change
    /// the two, together.
    doc: DocumentMut,
    /// The file's content as last read or written, to notice changes made by others.
    pub disk: Option<String>,
    /// The text as last saved (or opened): differs from `text` when there are changes.
    pub saved: String,
    /// The text as opened, the first baseline.
    pub opened: String,
    pub undo: Vec<String>,
    pub redo: Vec<String>,
    pub analysis: Analysis,
    pub baseline: Analysis,
    pub baseline_text: String,
    /// What the baseline is, in words.
    pub baseline_label: &'static str,
    pub focus: Focus,
    pub part: usize,
    pub col: usize,
    pub param: usize,
    pub mode: Mode,
    /// The message line: text and whether it is an error.
    pub message: Option<(String, bool)>,
    pub config: Config,
    pub theme: Theme,
    pub results_scroll: u16,
    /// The size of the screen last drawn on (the help scrolls within it).
    pub screen: Rect,
    pub show_mesh: bool,
    /// What the drawing is shaded by.
    pub shading: super::shade::Shading,
    /// The sides of the drawn torsion mesh, made the first time the mesh is shown for
    /// the current analysis (not every frame).
    drawn_mesh: OnceCell<Vec<(Pt, Pt)>>,
    pub solver: Solver,
    /// A background solve for the current text is under way.
    pub solving: bool,
    /// Work running in the background (a sweep or a ranking that needs the torsion solve).
    pub job: Option<super::commands::background::Job>,
    generation: u64,
    /// The generation of a background solve for the baseline, when one is under way.
    baseline_job: Option<u64>,
    /// The window of the file's other keys (title, units, params, materials, actions,
    /// member) is open, on this row.
    pub tables: Option<usize>,
    /// What the open file looked like on disk when last looked at.
    pub watch: super::watch::Watch,
    pub quit: bool,
    /// Quit once the pending save succeeds.
    pub quit_after_save: bool,
}

/// Most triangles of the torsion mesh drawn (finer meshes would fill the cells solid).
const MESH_ELEMENTS: usize = 2000;

impl App {
    /// A workbench on `text` (read from `path`, if any). An invalid section is an error.
    pub fn new(
        text: String,
        path: Option<PathBuf>,
        config: Config,
        solver: Solver,
    ) -> Result<App, Diagnostic> {
        let analysis = crate::file::load::analyse(&text, &Options::default())?;
        let doc = edit::open(&text).map_err(|m| Diagnostic::new(0..1, m))?;
        let mut app = App {
            doc,
            disk: path.as_ref().map(|_| text.clone()),
            path,
            saved: text.clone(),
            opened: text.clone(),
            baseline: analysis.clone(),
            baseline_text: text.clone(),
            baseline_label: "file as opened",
            text,
            undo: Vec::new(),
            redo: Vec::new(),
            analysis,
            focus: Focus::Parts,
            part: 0,
            col: 0,
            param: 0,
            mode: Mode::Main,
            message: None,
            theme: Theme::from_config(&config),
            config,
            results_scroll: 0,
            screen: Rect::new(0, 0, 80, 24),
            show_mesh: false,
            shading: super::shade::Shading::Off,
            drawn_mesh: OnceCell::new(),
            solver,
            solving: false,
            job: None,
            generation: 0,
            baseline_job: None,
            tables: None,
            watch: super::watch::Watch::default(),
            quit: false,
            quit_after_save: false,
        };
        app.start_torsion();
        Ok(app)
    }

    /// The kept document of the current text.
    pub fn doc(&self) -> &DocumentMut {
        &self.doc
    }

    /// Takes the file's new text from disk, keeping the selection and the baseline; the
    /// text shown before is one undo away. One that does not compute is not taken, and
    /// the message says why.
    pub fn take_disk(&mut self, text: String) -> bool {
        let name = self
            .path
            .as_ref()
            .map_or("the file".into(), |p| p.display().to_string());
        let doc = match edit::open(&text) {
            Ok(d) => d,
            Err(m) => {
                self.error(format!("{name} changed on disk and is not valid: {m}; showing the last state that computed"));
                return false;
            }
        };
        match crate::file::load::analyse(&text, &Options::default()) {
            Err(d) => {
                let at = crate::file::load::diagnostic_line(&name, &text, &d);
                self.error(format!("changed on disk, not taken: {at}"));
                false
            }
            Ok(a) => {
                self.doc = doc;
                let old = std::mem::replace(&mut self.text, text.clone());
                if old != text {
                    self.undo.push(old);
                    self.redo.clear();
                }
                self.saved = text.clone();
                self.disk = Some(text);
                self.set_analysis(a);
                true
            }
        }
    }

    /// Are there changes since the last save?
    pub fn modified(&self) -> bool {
        self.text != self.saved
    }

    /// Output units of the results.
    pub fn units(&self) -> OutUnits {
        OutUnits::new(self.analysis.section.units, self.config.units)
            .written(self.config.numbers, self.config.notation)
    }

    /// The columns of the parts table.
    pub fn columns(&self) -> Vec<Col> {
        columns(&self.analysis.document)
    }

    /// The selected column (clamped).
    pub fn column(&self) -> Col {
        let cols = self.columns();
        cols.get(self.col.min(cols.len().saturating_sub(1)))
            .copied()
            .unwrap_or(Col::Name)
    }

    pub fn note(&mut self, m: impl Into<String>) {
        self.message = Some((m.into(), false));
    }

    pub fn error(&mut self, m: impl Into<String>) {
        self.message = Some((m.into(), true));
    }

    /// Makes an edit if its text computes; otherwise shows why and changes nothing.
    /// Returns whether the edit was taken.
    pub fn edit(&mut self, e: Edit) -> bool {
        if let Err(m) = e.apply(&mut self.doc) {
            self.error(format!("refused: {m}"));
            return false;
        }
        let text = self.doc.to_string();
        self.commit(text, None)
    }

    /// Makes several edits as one (one step of undo), if all apply and the text computes.
    pub fn edit_all(&mut self, edits: Vec<Edit>) -> bool {
        for e in edits {
            if let Err(m) = e.apply(&mut self.doc) {
                self.error(format!("refused: {m}"));
                if let Ok(doc) = edit::open(&self.text) {
                    self.doc = doc;
                }
                return false;
            }
        }
        let text = self.doc.to_string();
        self.commit(text, None)
    }

    /// Takes a whole new text (an undoable change) if it computes; otherwise shows why
    /// and changes nothing. Returns whether it was taken.
    pub fn replace_text(&mut self, text: String) -> bool {
        match edit::open(&text) {
            Ok(doc) => self.commit(text, Some(doc)),
            Err(m) => {
                self.error(format!("refused: {m}"));
                false
            }
        }
    }

    /// Makes `text` the current state, pushing the old one on the undo stack, when it
    /// computes. `doc` is its kept document when the caller has not already edited
    /// `self.doc` into it; on refusal `self.doc` goes back to the current text.
    fn commit(&mut self, text: String, doc: Option<DocumentMut>) -> bool {
        match crate::file::load::analyse(&text, &Options::default()) {
            Err(d) => {
                // What is wrong with the value; where it sits in the file is no help to
                // someone typing into a cell.
                self.error(format!("refused: {}", d.message));
                if let Ok(doc) = edit::open(&self.text) {
                    self.doc = doc;
                }
                false
            }
            Ok(a) => {
                if let Some(doc) = doc {
                    self.doc = doc;
                }
                let old = std::mem::replace(&mut self.text, text);
                self.undo.push(old);
                self.redo.clear();
                self.set_analysis(a);
                true
            }
        }
    }

    /// Goes back to an earlier (or later) text from the history.
    pub fn restore(&mut self, text: String) {
        match (
            crate::file::load::analyse(&text, &Options::default()),
            edit::open(&text),
        ) {
            (Ok(a), Ok(doc)) => {
                self.text = text;
                self.doc = doc;
                self.set_analysis(a);
            }
            (Ok(_), Err(m)) => self.error(format!("cannot go back to that state: {m}")),
            (Err(d), _) => self.error(format!("cannot go back to that state: {}", d.message)),
        }
    }

    /// The sides of the torsion mesh's triangles, in the file's frame (for the mesh
    /// toggle): at most `MESH_ELEMENTS` (2000) triangles, kept until the analysis changes.
    pub fn mesh_lines(&self) -> &[(Pt, Pt)] {
        self.drawn_mesh.get_or_init(|| {
            crate::fe::mesh_outline(&self.analysis.pieces, MESH_ELEMENTS)
                .into_iter()
                .flat_map(|[p, q, r]| [(p, q), (q, r), (r, p)])
                .collect()
        })
    }

    fn set_analysis(&mut self, a: Analysis) {
        let col = self.column();
        self.analysis = a;
        self.drawn_mesh = OnceCell::new();
        let n = self.analysis.document.parts.len();
        self.part = self.part.min(n.saturating_sub(1));
        self.param = self
            .param
            .min(self.analysis.document.params.len().saturating_sub(1));
        self.col = self.col.min(self.columns().len().saturating_sub(1));
        self.keep_column(col);
        self.start_torsion();
    }

    /// Selects `col` by its key in the current columns and row: where the selected part
    /// has it, that column; a dimension it does not have, its first dimension instead;
    /// otherwise the column stays where it is.
    pub fn keep_column(&mut self, col: Col) {
        let cols = self.columns();
        let part = self.analysis.document.parts.get(self.part);
        let want = match (col, part) {
            (Col::Dim(k), Some(p)) if p.shape.key(k).is_none() => {
                match p.shape.spec().keys.first() {
                    Some(first) => Col::Dim(first.key),
                    None => Col::Points,
                }
            }
            _ => col,
        };
        if let Some(i) = cols.iter().position(|c| *c == want) {
            self.col = i;
        }
    }

    /// Starts (or, solving inline, does) the torsion solve for the current text.
    fn start_torsion(&mut self) {
        self.generation += 1;
        match &mut self.solver {
            Solver::Off => {}
            Solver::Inline => {
                let r = solve_here(&self.analysis);
                self.take_torsion(r);
            }
            Solver::Thread(w) => {
                w.submit(self.generation, &self.analysis);
                self.solving = true;
            }
        }
    }

    fn take_torsion(&mut self, r: Result<crate::fe::Torsion, crate::model::Warning>) {
        let same = |a: &Analysis, b: &Analysis| {
            a.pieces == b.pieces && nu_ref(&a.section) == nu_ref(&b.section)
        };
        if self.baseline.torsion.is_none() && same(&self.baseline, &self.analysis) {
            self.baseline.set_torsion(r.clone());
        }
        self.analysis.set_torsion(r);
        self.solving = false;
        // A note that the shading waits for this solve is answered now.
        let waiting = super::shade::status(&self.analysis, self.shading, true);
        if self.message.as_ref().is_some_and(|(m, _)| *m == waiting) {
            let now = super::shade::status(&self.analysis, self.shading, false);
            self.note(now);
        }
        self.solve_baseline();
    }

    /// Solves the baseline's torsion like any other state's when it has none (edited
    /// before its own solve finished), after the current section's.
    pub fn solve_baseline(&mut self) {
        if self.baseline.torsion.is_some() {
            return;
        }
        match &mut self.solver {
            Solver::Off => {}
            Solver::Inline => {
                let r = solve_here(&self.baseline);
                self.baseline.set_torsion(r);
            }
            Solver::Thread(w) => {
                self.generation += 1;
                self.baseline_job = Some(self.generation);
                w.submit(self.generation, &self.baseline);
            }
        }
    }

    /// Takes a finished background solve, if any; returns whether anything changed.
    pub fn poll_solver(&mut self) -> bool {
        let Solver::Thread(w) = &self.solver else {
            return false;
        };
        match w.poll() {
            Poll::Nothing => false,
            Poll::Finished(d) => {
                if Some(d.generation) == self.baseline_job {
                    self.baseline_job = None;
                    self.baseline.set_torsion(d.result);
                    true
                } else if d.generation == self.generation {
                    self.take_torsion(d.result);
                    true
                } else {
                    false
                }
            }
            Poll::Stopped => {
                self.solver = Solver::Off;
                self.solving = false;
                self.error("the torsion solver stopped; torsion results are not available");
                true
            }
        }
    }

    /// Asks whether to take the recovery copy of unsaved edits left by a workbench that
    /// was stopped, if there is one (never taken without asking).
    pub fn offer_recovery(&mut self) {
        if let Some(at) = recover::find(self.path.as_deref()) {
            self.mode = Mode::AskRecover(at);
        }
    }

    /// Takes the recovery copy at `at` as unsaved edits (an undoable change), and removes
    /// the copy once its text is in the workbench.
    pub fn take_recovery(&mut self, at: &Path) {
        let name = at.display();
        match read_text(at) {
            Err(e) => self.error(e.line(at)),
            Ok(text) => {
                if self.replace_text(text) {
                    match std::fs::remove_file(at) {
                        Ok(()) => self.note("took the unsaved edits; save (s) to keep them"),
                        Err(e) => self.error(format!(
                            "took the unsaved edits, but could not remove {name}: {e}"
                        )),
                    }
                }
            }
        }
    }

    /// Makes the current section the baseline.
    pub fn set_baseline(&mut self, label: &'static str) {
        self.baseline = self.analysis.clone();
        self.baseline_text = self.text.clone();
        self.baseline_label = label;
    }
}

/// The torsion solve, with the flexure solution, on this thread to the default tolerance
/// (the inline solver).
fn solve_here(a: &Analysis) -> Result<crate::fe::Torsion, crate::model::Warning> {
    torsion(
        &a.pieces,
        &a.torsion_options(crate::fe::DEFAULT_TOL, None, true),
    )
}

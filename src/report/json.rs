//! `kern calc --json`: one object per section, keys and conventions exactly as in
//! FORMAT.md, written straight into text ([`Writer`]) by the thread that analysed the
//! file. Each quantity of [`QUANTITIES`] goes in at its dotted path, the objects on the
//! way laid out once from the table ([`layout`]: a key's place is its first path in the
//! table), between the keys that are not quantities (file, title and units first; the
//! per-material stresses, connections, quantity units and warnings after). Values that
//! cannot be formed (a modulus with no fibre beyond the centroid) are `null`. Text from
//! the file (title, names, warnings) is cleaned ([`clean`]): the writer escapes control
//! characters, but a `\u001b` read back by another tool must not become a live escape
//! either.

use super::out::OutUnits;
use super::rows::{net_view, Cell, QUANTITIES};
use crate::analysis::Analysis;
use crate::checks::stress::StressPoint;
use crate::text::clean;
use std::sync::OnceLock;

/// Compact JSON text written as it goes, as `serde_json::to_string` writes a value:
/// no spaces, strings escaped and numbers formatted by serde_json itself (floats the
/// shortest text that reads back to the same `f64`; NaN and infinities `null`).
/// Commas are placed by one flag: a value or a closed object or array is followed by
/// a comma if anything else comes in the same object or array.
#[derive(Debug, Default)]
pub struct Writer {
    buf: Vec<u8>,
    /// A value has ended here: the next key or array element needs a comma first.
    comma: bool,
}

impl Writer {
    pub fn new() -> Writer {
        Writer::default()
    }

    /// A writer with room for `bytes` of text before it grows.
    pub fn with_capacity(bytes: usize) -> Writer {
        Writer {
            buf: Vec::with_capacity(bytes),
            comma: false,
        }
    }

    /// Writes `text` where a value, a key or an opening bracket goes: after a comma
    /// if a value ended just before; `ends` says whether a value ends with it (not
    /// after a key or an opening bracket).
    fn put(&mut self, text: impl FnOnce(&mut Vec<u8>), ends: bool) -> &mut Writer {
        if self.comma {
            self.buf.push(b',');
        }
        text(&mut self.buf);
        self.comma = ends;
        self
    }

    /// A closing bracket: the object or array it closes is a value that has ended.
    fn end(&mut self, bracket: u8) -> &mut Writer {
        self.buf.push(bracket);
        self.comma = true;
        self
    }

    /// Opens an object (as a value: after a key, in an array or at the top).
    pub fn open(&mut self) -> &mut Writer {
        self.put(|b| b.push(b'{'), false)
    }

    pub fn close(&mut self) -> &mut Writer {
        self.end(b'}')
    }

    pub fn open_array(&mut self) -> &mut Writer {
        self.put(|b| b.push(b'['), false)
    }

    pub fn close_array(&mut self) -> &mut Writer {
        self.end(b']')
    }

    /// The key of the next member of the open object: a name of FORMAT.md, written
    /// between quotes as it is (none has a character JSON escapes).
    pub fn key(&mut self, k: &'static str) -> &mut Writer {
        debug_assert!(!k.bytes().any(|b| b < 0x20 || b == b'"' || b == b'\\'));
        self.put(
            |b| {
                b.reserve(k.len() + 3);
                b.push(b'"');
                b.extend_from_slice(k.as_bytes());
                b.extend_from_slice(b"\":");
            },
            false,
        )
    }

    pub fn str(&mut self, s: &str) -> &mut Writer {
        self.put(|b| string(b, s), true)
    }

    /// A float as serde_json writes an `f64` (the shortest text that reads back to the
    /// same value; `null` for NaN and the infinities, as `json!(x)` gave).
    pub fn num(&mut self, x: f64) -> &mut Writer {
        // Into a Vec, a number cannot fail to be written.
        self.put(|b| drop(serde_json::to_writer(b, &x)), true)
    }

    pub fn count(&mut self, n: usize) -> &mut Writer {
        self.put(|b| drop(serde_json::to_writer(b, &n)), true)
    }

    pub fn null(&mut self) -> &mut Writer {
        self.put(|b| b.extend_from_slice(b"null"), true)
    }

    /// The text written.
    pub fn finish(self) -> String {
        // Every piece written is UTF-8 (keys, serde_json's output, ASCII punctuation).
        String::from_utf8(self.buf)
            .unwrap_or_else(|e| String::from_utf8_lossy(e.as_bytes()).into_owned())
    }
}

/// `s` quoted and escaped by serde_json itself (one definition of JSON's escaping: the
/// crate's, as before this writer); a string with nothing to escape (no `"`, `\` or
/// control character below U+0020, all serde_json escapes) is copied between quotes.
fn string(buf: &mut Vec<u8>, s: &str) {
    // Over every byte without stopping early, so that the loop vectorises.
    let plain = !s
        .bytes()
        .fold(false, |e, b| e | (b < 0x20) | (b == b'"') | (b == b'\\'));
    if plain {
        buf.reserve(s.len() + 2);
        buf.push(b'"');
        buf.extend_from_slice(s.as_bytes());
        buf.push(b'"');
    } else {
        // Into a Vec, a string cannot fail to be written.
        drop(serde_json::to_writer(buf, s));
    }
}

/// One key of the quantities' objects: its name, the quantity written at exactly
/// this path (if any) and the keys under it, each in the order of its first path in
/// [`QUANTITIES`].
#[derive(Debug)]
pub struct Key {
    pub name: &'static str,
    /// The whole dotted path up to and including this key.
    pub path: &'static str,
    /// Index into [`QUANTITIES`] of the value at this path; an object below it wins
    /// (a `null` "not formed" key becomes the object when its members are formed).
    pub leaf: Option<usize>,
    pub under: Vec<Key>,
}

impl Key {
    /// Whether `cells` give this key anything to write.
    fn present(&self, cells: &[Cell]) -> bool {
        self.leaf.is_some_and(|i| !matches!(cells[i], Cell::Absent))
            || self.under.iter().any(|k| k.present(cells))
    }
}

/// The tree of the quantities' keys, laid out once from [`QUANTITIES`].
pub fn layout() -> &'static [Key] {
    static KEYS: OnceLock<Vec<Key>> = OnceLock::new();
    KEYS.get_or_init(|| {
        let mut top: Vec<Key> = Vec::new();
        for (i, q) in QUANTITIES.iter().enumerate() {
            let mut level = &mut top;
            let mut end = 0;
            let names: Vec<&'static str> = q.path.split('.').collect();
            for (d, name) in names.iter().enumerate() {
                end += name.len() + usize::from(d > 0);
                let at = match level.iter().position(|k| k.name == *name) {
                    Some(at) => at,
                    None => {
                        level.push(Key {
                            name,
                            path: &q.path[..end],
                            leaf: None,
                            under: Vec::new(),
                        });
                        level.len() - 1
                    }
                };
                if d + 1 == names.len() {
                    level[at].leaf = Some(i);
                }
                level = &mut level[at].under;
            }
        }
        top
    })
}

/// Writes the quantities of `keys` that `cells` (one per [`QUANTITIES`]) give, and
/// after the members of each object the ones `more` adds at that object's path.
fn write_keys(
    w: &mut Writer,
    keys: &[Key],
    cells: &[Cell],
    u: &OutUnits,
    more: &dyn Fn(&mut Writer, &str),
) {
    for k in keys.iter().filter(|k| k.present(cells)) {
        w.key(k.name);
        if k.under.iter().any(|c| c.present(cells)) {
            w.open();
            write_keys(w, &k.under, cells, u, more);
            more(w, k.path);
            w.close();
        } else if let Some(i) = k.leaf {
            match &cells[i] {
                Cell::Absent | Cell::Null => w.null(),
                Cell::Num(x) => w.num(QUANTITIES[i].dim.json(*x, u)),
                Cell::Text(t) => w.str(&clean(t)),
                Cell::Count(n) => w.count(*n),
            };
        }
    }
}

/// The cells of every quantity of `a`.
fn cells(a: &Analysis) -> Vec<Cell> {
    QUANTITIES.iter().map(|q| (q.get)(a)).collect()
}

/// The JSON object for one analysed file.
pub fn to_json(file: &str, a: &Analysis, u: &OutUnits) -> String {
    // A section's line is one to a few kilobytes (1.3 kB for a typical one).
    let mut w = Writer::with_capacity(4096);
    w.open();
    members(&mut w, file, a, u);
    w.close();
    w.finish()
}

/// Writes the members of the JSON object for one analysed file into the open object
/// of `w` (a caller may add its own after them).
pub fn members(w: &mut Writer, file: &str, a: &Analysis, u: &OutUnits) {
    w.key("file").str(&clean(file));
    w.key("title")
        .str(&clean(a.section.title.as_deref().unwrap_or_default()));
    w.key("units").str(u.length.name());
    let g = |x: f64, pw: i32| u.geo(x, pw);
    let stress_unit = u.stress();
    let per_material = |w: &mut Writer, path: &str| {
        let Some(s) = a
            .stress
            .as_ref()
            .filter(|s| path == "stress" && !s.per_material.is_empty())
        else {
            return;
        };
        let pt = |w: &mut Writer, sp: &StressPoint| {
            w.open();
            w.key("value").num(stress_unit.from_si(sp.value));
            w.key("x").num(g(sp.x, 1));
            w.key("y").num(g(sp.y, 1));
            w.close();
        };
        w.key("per_material").open_array();
        for (name, e) in &s.per_material {
            w.open();
            w.key("material").str(&clean(name));
            w.key("max_tension");
            pt(w, &e.max_tension);
            w.key("max_compression");
            pt(w, &e.max_compression);
            w.close();
        }
        w.close_array();
    };
    write_keys(w, layout(), &cells(a), u, &per_material);
    let qu = u.shear_flow();
    w.key("connections").open_array();
    for c in &a.connections {
        w.open();
        w.key("parts").open_array();
        w.str(&clean(&a.pieces[c.joint.a].name));
        w.str(&clean(&a.pieces[c.joint.b].name));
        w.close_array();
        w.key("length").num(g(c.joint.length, 1));
        if let Some(q) = a.connection_flow(c) {
            w.key("shear_flow").num(qu.from_si(q));
        }
        w.close();
    }
    w.close_array();
    if let Some(n) = net_view(a) {
        let net: Vec<&Key> = layout()
            .iter()
            .filter(|k| first(k).is_some_and(|i| QUANTITIES[i].in_net()))
            .collect();
        let cells = cells(&n);
        w.key("net").open();
        for k in net {
            write_keys(w, std::slice::from_ref(k), &cells, u, &|_, _| {});
        }
        w.close();
    }
    w.key("quantity_units").open();
    w.key("force").str(u.force().name);
    w.key("moment").str(u.moment().name);
    w.key("stress").str(stress_unit.name);
    w.key("deflection").str(u.deflection().name);
    w.key("shear_flow").str(qu.name);
    w.close();
    w.key("warnings").open_array();
    for warning in &a.warnings {
        w.str(&clean(&warning.to_string()));
    }
    w.close_array();
}

/// The first quantity under `k`.
fn first(k: &Key) -> Option<usize> {
    k.leaf.or_else(|| k.under.iter().find_map(first))
}

//! A TOML document as the reader ([`super::read`]) walks it: tables of keyed items, each
//! with the byte range it stands at. Two parsers fill it — the strict one for the common
//! subset ([`super::strict`]) and `toml_edit` for everything else ([`from_toml_edit`]) —
//! and the reader is one, so a file reads the same, errors and all, whichever parsed it.
//!
//! The ranges are those `toml_edit` 0.22 gives: a value's own text (a string with its
//! quotes, an array or inline table from bracket to bracket), a key's name, a `[name]`
//! or `[[name]]` table from its header to the end of its last value, and an array of
//! tables from its first table to the end of its last.

use crate::model::Span;
use std::borrow::Cow;

/// A table: its entries in the order of the file.
#[derive(Debug, Clone, PartialEq)]
pub struct Table<'a> {
    pub entries: Vec<Entry<'a>>,
    pub span: Option<Span>,
}

/// One `key = value` of a table, or a table header's name and its table.
#[derive(Debug, Clone, PartialEq)]
pub struct Entry<'a> {
    pub key: Cow<'a, str>,
    pub key_span: Option<Span>,
    pub item: Item<'a>,
}

/// What a key holds: a value, a `[name]` table, or the `[[name]]` tables.
#[derive(Debug, Clone, PartialEq)]
pub enum Item<'a> {
    Value(Value<'a>),
    Table(Table<'a>),
    Tables(Vec<Table<'a>>, Option<Span>),
}

/// A value and where it stands.
#[derive(Debug, Clone, PartialEq)]
pub struct Value<'a> {
    pub kind: Kind<'a>,
    pub span: Option<Span>,
}

/// The kinds of value the reader tells apart; a date or time is `Other`.
#[derive(Debug, Clone, PartialEq)]
pub enum Kind<'a> {
    Integer(i64),
    Float(f64),
    Str(Cow<'a, str>),
    Bool(bool),
    Array(Vec<Value<'a>>),
    Table(Table<'a>),
    Other,
}

impl<'a> Table<'a> {
    /// The item under `key`.
    pub fn get(&self, key: &str) -> Option<&Item<'a>> {
        self.entries.iter().find(|e| e.key == key).map(|e| &e.item)
    }
}

impl<'a> Item<'a> {
    pub fn span(&self) -> Option<Span> {
        match self {
            Item::Value(v) => v.span.clone(),
            Item::Table(t) => t.span.clone(),
            Item::Tables(_, sp) => sp.clone(),
        }
    }

    pub fn value(&self) -> Option<&Value<'a>> {
        match self {
            Item::Value(v) => Some(v),
            _ => None,
        }
    }

    /// A `[name]` table or an inline `{ ... }` one.
    pub fn table(&self) -> Option<&Table<'a>> {
        match self {
            Item::Table(t) => Some(t),
            Item::Value(v) => v.inline_table(),
            Item::Tables(..) => None,
        }
    }

    pub fn str(&self) -> Option<&str> {
        self.value().and_then(Value::str)
    }

    pub fn bool(&self) -> Option<bool> {
        match self.value()?.kind {
            Kind::Bool(b) => Some(b),
            _ => None,
        }
    }

    pub fn integer(&self) -> Option<i64> {
        match self.value()?.kind {
            Kind::Integer(n) => Some(n),
            _ => None,
        }
    }

    pub fn array(&self) -> Option<&[Value<'a>]> {
        self.value().and_then(Value::array)
    }
}

impl<'a> Value<'a> {
    pub fn str(&self) -> Option<&str> {
        match &self.kind {
            Kind::Str(s) => Some(s),
            _ => None,
        }
    }

    pub fn array(&self) -> Option<&[Value<'a>]> {
        match &self.kind {
            Kind::Array(a) => Some(a),
            _ => None,
        }
    }

    pub fn inline_table(&self) -> Option<&Table<'a>> {
        match &self.kind {
            Kind::Table(t) => Some(t),
            _ => None,
        }
    }
}

/// The tree of a document `toml_edit` parsed (its root table).
pub fn from_toml_edit(root: &toml_edit::Table) -> Table<'static> {
    table(root, root.span())
}

fn table(t: &dyn toml_edit::TableLike, span: Option<Span>) -> Table<'static> {
    let entries = t
        .iter()
        .map(|(k, v)| Entry {
            key: Cow::Owned(k.to_string()),
            key_span: t.key(k).and_then(|k| k.span()),
            item: item(v),
        })
        .collect();
    Table { entries, span }
}

fn item(i: &toml_edit::Item) -> Item<'static> {
    match i {
        toml_edit::Item::Value(v) => Item::Value(value(v)),
        toml_edit::Item::Table(t) => Item::Table(table(t, t.span())),
        toml_edit::Item::ArrayOfTables(a) => {
            Item::Tables(a.iter().map(|t| table(t, t.span())).collect(), a.span())
        }
        // A parsed document holds no empty items; read as a value of no kind.
        toml_edit::Item::None => Item::Value(Value {
            kind: Kind::Other,
            span: None,
        }),
    }
}

fn value(v: &toml_edit::Value) -> Value<'static> {
    use toml_edit::Value as V;
    let kind = match v {
        V::Integer(n) => Kind::Integer(*n.value()),
        V::Float(x) => Kind::Float(*x.value()),
        V::String(s) => Kind::Str(Cow::Owned(s.value().clone())),
        V::Boolean(b) => Kind::Bool(*b.value()),
        V::Datetime(_) => Kind::Other,
        V::Array(a) => Kind::Array(a.iter().map(value).collect()),
        V::InlineTable(t) => Kind::Table(table(t, t.span())),
    };
    Value {
        kind,
        span: v.span(),
    }
}

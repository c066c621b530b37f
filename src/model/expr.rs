//! Arithmetic expressions in a section file: parsing, evaluation and `[params]` resolution.
//!
//! Grammar (whitespace is allowed between any two tokens):
//!
//! ```text
//! expr    = term  { ("+" | "-") term }
//! term    = unary { ("*" | "/") unary }
//! unary   = ("-" | "+") unary | power
//! power   = primary [ "^" unary ]                 right-associative; -2^2 = -4
//! primary = number | "pi" | name | func "(" expr { "," expr } ")" | "(" expr ")"
//! ```
//!
//! `sin`, `cos` and `tan` take degrees; `min` and `max` take two or more arguments.
//! Names are `[A-Za-z_][A-Za-z0-9_]*` and refer to params. Nothing here panics and no input
//! can exhaust the stack: the parser refuses nesting deeper than [`MAX_DEPTH`] and text
//! longer than [`MAX_LEN`] characters, and chains of `+ -` or `* /` are kept flat.
//!
//! A parsed expression is a list of steps in postfix order (operands before what
//! applies to them, as a stack machine runs them), so that parsing allocates once for
//! the steps and once for the names, whatever the expression's shape.
//!
//! Not here: units (see [`super::units`]) and where an expression sits in the file.

use std::collections::BTreeMap;
use std::fmt;

/// Deepest nesting of parentheses, function calls, signs and powers the parser accepts.
pub const MAX_DEPTH: usize = 64;
/// Longest expression text accepted, in characters.
pub const MAX_LEN: usize = 4096;

/// The functions, by the name they are written with.
const FUNCS: [(&str, Func); 7] = [
    ("sqrt", Func::Sqrt),
    ("sin", Func::Sin),
    ("cos", Func::Cos),
    ("tan", Func::Tan),
    ("abs", Func::Abs),
    ("min", Func::Min),
    ("max", Func::Max),
];
const KNOWN_FUNCS: &str = "sqrt sin cos tan abs min max";

/// An error in an expression or in a quantity with a unit ([`super::units`]): what is
/// wrong and the byte offset in the text where it is.
#[derive(Debug, Clone, PartialEq)]
pub struct ExprError {
    pub message: String,
    pub offset: usize,
}

impl ExprError {
    pub(crate) fn new(message: impl Into<String>, offset: usize) -> ExprError {
        ExprError {
            message: message.into(),
            offset,
        }
    }
}

impl fmt::Display for ExprError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message)
    }
}

impl std::error::Error for ExprError {}

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Func {
    Sqrt,
    Sin,
    Cos,
    Tan,
    Abs,
    Min,
    Max,
}

impl Func {
    fn named(name: &str) -> Option<Func> {
        FUNCS.iter().find(|(n, _)| *n == name).map(|&(_, f)| f)
    }

    fn name(self) -> &'static str {
        FUNCS
            .iter()
            .find(|(_, f)| *f == self)
            .map_or("?", |&(n, _)| n)
    }

    /// `min` and `max` are variadic (two or more); the others take exactly one argument.
    fn variadic(self) -> bool {
        matches!(self, Func::Min | Func::Max)
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum BinOp {
    Add,
    Sub,
    Mul,
    Div,
}

/// One step of an expression in postfix order: a value pushed on the stack, or an
/// operation on the values on top of it. Operators of equal precedence follow their
/// operands left to right, so long chains stay shallow.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Op {
    Num(f64),
    /// A param: its name is `len` bytes at `at` of [`Expr::names`], written at byte
    /// `offset` of the text.
    Name {
        at: usize,
        len: usize,
        offset: usize,
    },
    Neg,
    /// A binary operator, written at byte `offset`.
    Bin(BinOp, usize),
    /// `^`, written at byte `offset`.
    Pow(usize),
    /// A function of the `args` values on top, written at byte `offset`.
    Call {
        func: Func,
        args: usize,
        offset: usize,
    },
}

impl Op {
    /// How many values the step takes from the stack.
    fn takes(self) -> usize {
        match self {
            Op::Num(_) | Op::Name { .. } => 0,
            Op::Neg => 1,
            Op::Bin(..) | Op::Pow(_) => 2,
            Op::Call { args, .. } => args,
        }
    }
}

/// A parsed arithmetic expression.
///
/// ```
/// use kern::model::expr::Expr;
/// let e = Expr::parse("2*tf + sqrt(9)").unwrap();
/// assert_eq!(e.names(), vec!["tf".to_string()]);
/// let tf = |n: &str| (n == "tf").then_some(16.0);
/// assert_eq!(e.eval(&tf), Ok(35.0));
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Expr {
    ops: Vec<Op>,
    /// The names of the params used, one after the other.
    names: String,
    /// The most values on the stack while the steps run.
    depth: usize,
}

/// Values an evaluation holds on the machine's own stack; a deeper expression (a call
/// of many arguments) takes a vector.
const ON_STACK: usize = 16;

/// The values of an evaluation: a fixed slice, filled from the bottom. Reading below
/// the bottom or writing past the top gives NaN or drops the value (which the parser's
/// steps never do), so nothing here panics.
struct Stack<'a> {
    values: &'a mut [f64],
    len: usize,
}

impl Stack<'_> {
    fn push(&mut self, v: f64) {
        if let Some(slot) = self.values.get_mut(self.len) {
            *slot = v;
        }
        self.len += 1;
    }

    /// The top `n` values, taken off the stack, bottom first.
    fn take(&mut self, n: usize) -> &[f64] {
        let from = self.len.saturating_sub(n);
        self.len = from;
        self.values.get(from..from + n).unwrap_or(&[])
    }
}

impl Expr {
    /// Parse expression text; errors carry the byte offset of the problem.
    pub fn parse(src: &str) -> Result<Expr, ExprError> {
        if src.len() > MAX_LEN {
            if let Some((offset, _)) = src.char_indices().nth(MAX_LEN) {
                return Err(ExprError::new(
                    format!("expression is longer than {MAX_LEN} characters; split it into params"),
                    offset,
                ));
            }
        }
        if src.trim().is_empty() {
            return Err(ExprError::new(
                "empty expression; write a number or an expression such as `2*tf`",
                0,
            ));
        }
        let mut parser = Parser {
            src,
            pos: 0,
            depth: 0,
            // About the steps of the usual text (one a token); more grow the vector.
            ops: Vec::with_capacity(src.len() / 2 + 2),
            names: String::new(),
            height: 0,
            max_height: 0,
        };
        parser.expr()?;
        match parser.peek() {
            None => Ok(Expr {
                ops: parser.ops,
                names: parser.names,
                depth: parser.max_height,
            }),
            Some(')') => Err(ExprError::new(
                "unmatched `)`; remove it or add a `(` before it",
                parser.pos,
            )),
            Some(_) if !parser.at_known_character() => Err(parser.unexpected_character()),
            Some(_) => Err(ExprError::new(
                format!(
                    "unexpected `{}` after a complete expression; is an operator such as `*` missing?",
                    parser.token_text()
                ),
                parser.pos,
            )),
        }
    }

    /// The param name `src` is, when it is nothing else: one name as [`Expr::parse`]
    /// reads it (ASCII letters, digits and `_`, not starting with a digit), not `pi`
    /// nor a function, with nothing but whitespace around it. Such an expression's
    /// value is the param's, so a caller may look it up without parsing; any other
    /// text (and any error) is [`Expr::parse`]'s.
    pub fn lone_name(src: &str) -> Option<&str> {
        let name = src.trim();
        let b = name.as_bytes();
        let plain = b
            .first()
            .is_some_and(|c| c.is_ascii_alphabetic() || *c == b'_')
            && b.iter().all(|c| c.is_ascii_alphanumeric() || *c == b'_');
        (plain && src.len() <= MAX_LEN && name != "pi" && Func::named(name).is_none())
            .then_some(name)
    }

    /// Evaluate; `lookup` gives the value of a name (a param).
    pub fn eval(&self, lookup: &dyn Fn(&str) -> Option<f64>) -> Result<f64, ExprError> {
        if self.depth <= ON_STACK {
            self.eval_on(&mut [0.0; ON_STACK], lookup)
        } else {
            self.eval_on(&mut vec![0.0; self.depth], lookup)
        }
    }

    /// The name of a [`Op::Name`] step.
    fn name(&self, at: usize, len: usize) -> &str {
        self.names.get(at..at + len).unwrap_or("")
    }

    /// Runs the steps with `values` (at least [`Expr::depth`] long) for the stack.
    fn eval_on(
        &self,
        values: &mut [f64],
        lookup: &dyn Fn(&str) -> Option<f64>,
    ) -> Result<f64, ExprError> {
        let mut stack = Stack { values, len: 0 };
        for &op in &self.ops {
            let taken = stack.take(op.takes());
            let v = match op {
                Op::Num(v) => v,
                Op::Name { at, len, offset } => {
                    let name = self.name(at, len);
                    match lookup(name) {
                        Some(v) => finite(v, offset)?,
                        None => {
                            return Err(ExprError::new(
                                format!("unknown name `{name}`; define it under [params]"),
                                offset,
                            ))
                        }
                    }
                }
                Op::Neg => -first(taken),
                Op::Bin(op, offset) => binary(op, taken, offset)?,
                Op::Pow(offset) => power(taken, offset)?,
                Op::Call { func, offset, .. } => call(func, taken, offset)?,
            };
            stack.push(v);
        }
        Ok(first(stack.take(1)))
    }

    /// Names referenced (params), each once, in order of first appearance.
    pub fn names(&self) -> Vec<String> {
        self.references()
            .into_iter()
            .map(|(name, _)| name.to_string())
            .collect()
    }

    /// Every use of a name, with its byte offset, in the order of the text (postfix
    /// order keeps the operands' left-to-right order).
    fn uses(&self) -> impl Iterator<Item = (&str, usize)> {
        self.ops.iter().filter_map(|op| match *op {
            Op::Name { at, len, offset } => Some((self.name(at, len), offset)),
            _ => None,
        })
    }

    /// Every place `name` is used, as byte offsets into the parsed text, in order.
    fn offsets_of(&self, name: &str) -> Vec<usize> {
        self.uses()
            .filter(|(n, _)| *n == name)
            .map(|(_, offset)| offset)
            .collect()
    }

    /// Each referenced name once, with the byte offset of its first appearance.
    fn references(&self) -> Vec<(&str, usize)> {
        let mut found: Vec<(&str, usize)> = Vec::new();
        for (name, offset) in self.uses() {
            if !found.iter().any(|(n, _)| *n == name) {
                found.push((name, offset));
            }
        }
        found
    }
}

/// `src` with every use of the name `from` replaced by `to`, the rest as written; `None`
/// when `src` is not an expression or does not use `from`.
///
/// ```
/// use kern::model::expr::rename;
/// assert_eq!(rename("2*tf + tf_2 - tf^2", "tf", "t").as_deref(), Some("2*t + tf_2 - t^2"));
/// assert_eq!(rename("300 MPa", "MPa", "x"), None);
/// assert_eq!(rename("bf", "tf", "t"), None);
/// ```
pub fn rename(src: &str, from: &str, to: &str) -> Option<String> {
    let offsets = Expr::parse(src).ok()?.offsets_of(from);
    if offsets.is_empty() {
        return None;
    }
    let mut out = src.to_string();
    for at in offsets.into_iter().rev() {
        out.replace_range(at..at + from.len(), to);
    }
    Some(out)
}

/// Parse and evaluate with no names available.
pub fn eval_str(src: &str) -> Result<f64, ExprError> {
    Expr::parse(src)?.eval(&|_| None)
}

struct Parser<'a> {
    src: &'a str,
    pos: usize,
    depth: usize,
    /// The steps so far, in postfix order.
    ops: Vec<Op>,
    /// The names of the [`Op::Name`] steps, one after the other.
    names: String,
    /// Values on the stack after the steps so far, and the most at any point.
    height: usize,
    max_height: usize,
}

impl Parser<'_> {
    /// Appends a step, keeping count of the stack it needs.
    fn emit(&mut self, op: Op) {
        self.height = self.height.saturating_sub(op.takes()) + 1;
        self.max_height = self.max_height.max(self.height);
        self.ops.push(op);
    }

    fn rest(&self) -> &str {
        self.src.get(self.pos..).unwrap_or("")
    }

    /// The next character after any whitespace (which is skipped).
    fn peek(&mut self) -> Option<char> {
        loop {
            // An ASCII byte is its character: no decoding for the usual text.
            let c = match self.src.as_bytes().get(self.pos) {
                None => return None,
                Some(&b) if b.is_ascii() => char::from(b),
                Some(_) => self.rest().chars().next()?,
            };
            if !c.is_whitespace() {
                return Some(c);
            }
            self.pos += c.len_utf8();
        }
    }

    fn bump(&mut self) {
        self.pos += self.rest().chars().next().map_or(0, char::len_utf8);
    }

    /// The token at the current position, for messages: a name or number, else one character.
    fn token_text(&self) -> &str {
        let rest = self.rest();
        let word: usize = rest
            .chars()
            .take_while(|c| c.is_ascii_alphanumeric() || *c == '_' || *c == '.')
            .map(char::len_utf8)
            .sum();
        let len = if word > 0 {
            word
        } else {
            rest.chars().next().map_or(0, char::len_utf8)
        };
        rest.get(..len).unwrap_or("")
    }

    /// Enter one level of nesting, refusing to go deeper than [`MAX_DEPTH`].
    fn nest(&mut self, offset: usize) -> Result<(), ExprError> {
        self.depth += 1;
        if self.depth > MAX_DEPTH {
            return Err(ExprError::new(
                format!(
                    "expression is nested more than {MAX_DEPTH} levels deep; split it into params"
                ),
                offset,
            ));
        }
        Ok(())
    }

    fn expr(&mut self) -> Result<(), ExprError> {
        self.chain(
            |c| match c {
                '+' => Some(BinOp::Add),
                '-' => Some(BinOp::Sub),
                _ => None,
            },
            Parser::term,
        )
    }

    fn term(&mut self) -> Result<(), ExprError> {
        self.chain(
            |c| match c {
                '*' => Some(BinOp::Mul),
                '/' => Some(BinOp::Div),
                _ => None,
            },
            Parser::unary,
        )
    }

    /// `operand { op operand }` for one precedence level.
    fn chain(
        &mut self,
        op_of: fn(char) -> Option<BinOp>,
        operand: fn(&mut Self) -> Result<(), ExprError>,
    ) -> Result<(), ExprError> {
        operand(self)?;
        while let Some(op) = self.peek().and_then(op_of) {
            let offset = self.pos;
            self.bump();
            operand(self)?;
            self.emit(Op::Bin(op, offset));
        }
        Ok(())
    }

    fn unary(&mut self) -> Result<(), ExprError> {
        match self.peek() {
            Some(sign @ ('-' | '+')) => {
                self.nest(self.pos)?;
                self.bump();
                self.unary()?;
                self.depth -= 1;
                if sign == '-' {
                    self.emit(Op::Neg);
                }
                Ok(())
            }
            _ => self.power(),
        }
    }

    fn power(&mut self) -> Result<(), ExprError> {
        self.primary()?;
        if self.peek() != Some('^') {
            return Ok(());
        }
        let offset = self.pos;
        self.nest(offset)?;
        self.bump();
        self.unary()?;
        self.depth -= 1;
        self.emit(Op::Pow(offset));
        Ok(())
    }

    fn primary(&mut self) -> Result<(), ExprError> {
        match self.peek() {
            None => Err(ExprError::new(
                "expression ends too early; a number, name or `(` is missing here",
                self.pos,
            )),
            Some(c) if c.is_ascii_digit() || c == '.' => self.number(),
            Some(c) if c.is_ascii_alphabetic() || c == '_' => self.name(),
            Some('(') => {
                let open = self.pos;
                self.nest(open)?;
                self.bump();
                self.expr()?;
                self.close(open, false)?;
                self.depth -= 1;
                Ok(())
            }
            Some(')') => Err(ExprError::new(
                "unexpected `)`; a number, name or `(` is missing before it",
                self.pos,
            )),
            Some(c) if "+-*/^,".contains(c) => Err(ExprError::new(
                format!("unexpected `{c}`; a number, name or `(` is missing before it"),
                self.pos,
            )),
            Some(_) => Err(self.unexpected_character()),
        }
    }

    /// The error for a character that starts no token, if the current one is such.
    fn unexpected_character(&self) -> ExprError {
        let c = self.rest().chars().next().unwrap_or(' ');
        ExprError::new(
            format!(
                "unexpected character `{c}`; expressions use numbers, names, \
                 + - * / ^, parentheses and commas between function arguments"
            ),
            self.pos,
        )
    }

    /// Whether the current character can start or continue an expression.
    fn at_known_character(&self) -> bool {
        self.rest()
            .chars()
            .next()
            .is_some_and(|c| c.is_ascii_alphanumeric() || "_.+-*/^(),".contains(c))
    }

    /// Expect the `)` closing the `(` at `open`; in an argument list a `,` is also possible.
    fn close(&mut self, open: usize, in_args: bool) -> Result<(), ExprError> {
        let expected = if in_args { "`,` or `)`" } else { "`)`" };
        match self.peek() {
            Some(')') => {
                self.bump();
                Ok(())
            }
            None => Err(ExprError::new(
                format!("missing `)` for the `(` at offset {open}; add it"),
                self.pos,
            )),
            Some(_) if !self.at_known_character() => Err(self.unexpected_character()),
            Some(_) => Err(ExprError::new(
                format!(
                    "expected {expected} but found `{}`; is an operator such as `*` missing?",
                    self.token_text()
                ),
                self.pos,
            )),
        }
    }

    fn digits(&mut self) -> usize {
        let n = self
            .rest()
            .bytes()
            .take_while(|b| b.is_ascii_digit())
            .count();
        self.pos += n;
        n
    }

    fn number(&mut self) -> Result<(), ExprError> {
        let start = self.pos;
        let mut count = self.digits();
        if self.rest().starts_with('.') {
            self.pos += 1;
            count += self.digits();
        }
        if count == 0 {
            return Err(ExprError::new(
                "a lone `.` is not a number; write e.g. `0.5`",
                start,
            ));
        }
        if self.rest().starts_with(['e', 'E']) {
            let after = self.rest().get(1..).unwrap_or("");
            let sign = usize::from(after.starts_with(['+', '-']));
            let has_digits = after
                .get(sign..)
                .is_some_and(|s| s.starts_with(|c: char| c.is_ascii_digit()));
            if !has_digits {
                return Err(ExprError::new(
                    "malformed number: the exponent needs digits, e.g. `2e-3`",
                    self.pos,
                ));
            }
            self.pos += 1 + sign;
            self.digits();
        }
        let text = self.src.get(start..self.pos).unwrap_or("");
        match text.parse::<f64>() {
            Ok(v) if v.is_finite() => {
                self.emit(Op::Num(v));
                Ok(())
            }
            _ => Err(ExprError::new(
                format!("number `{text}` is too large; the largest is about 1.8e308"),
                start,
            )),
        }
    }

    fn name(&mut self) -> Result<(), ExprError> {
        let start = self.pos;
        let len = self
            .rest()
            .bytes()
            .take_while(|b| b.is_ascii_alphanumeric() || *b == b'_')
            .count();
        self.pos += len;
        let name = self.src.get(start..self.pos).unwrap_or("");
        if self.peek() == Some('(') {
            let func = Func::named(name).ok_or_else(|| {
                ExprError::new(
                    format!("unknown function `{name}`; known: {KNOWN_FUNCS}"),
                    start,
                )
            })?;
            return self.call(func, start);
        }
        if name == "pi" {
            self.emit(Op::Num(std::f64::consts::PI));
            return Ok(());
        }
        if Func::named(name).is_some() {
            return Err(ExprError::new(
                format!("`{name}` is a function; write `{name}(...)`"),
                start,
            ));
        }
        let at = self.names.len();
        self.names.push_str(name);
        self.emit(Op::Name {
            at,
            len: name.len(),
            offset: start,
        });
        Ok(())
    }

    /// The argument list of a call; the current character is its `(`.
    fn call(&mut self, func: Func, offset: usize) -> Result<(), ExprError> {
        let open = self.pos;
        self.nest(open)?;
        self.bump();
        let mut n = 0;
        if self.peek() == Some(')') {
            self.bump();
        } else {
            loop {
                self.expr()?;
                n += 1;
                if self.peek() == Some(',') {
                    self.bump();
                } else {
                    self.close(open, true)?;
                    break;
                }
            }
        }
        self.depth -= 1;
        let name = func.name();
        if func.variadic() && n < 2 {
            return Err(ExprError::new(
                format!("`{name}` takes 2 or more arguments, found {n}"),
                offset,
            ));
        }
        if !func.variadic() && n != 1 {
            return Err(ExprError::new(
                format!("`{name}` takes 1 argument, found {n}"),
                offset,
            ));
        }
        self.emit(Op::Call {
            func,
            args: n,
            offset,
        });
        Ok(())
    }
}

fn finite(v: f64, offset: usize) -> Result<f64, ExprError> {
    if v.is_finite() {
        Ok(v)
    } else {
        Err(ExprError::new(
            "result is not a finite number (overflow or undefined); check the values",
            offset,
        ))
    }
}

/// The first of `values` (NaN for none, which the parser's steps never give).
fn first(values: &[f64]) -> f64 {
    values.first().copied().unwrap_or(f64::NAN)
}

/// `a op b` of the two `values`, the operator written at `offset`.
fn binary(op: BinOp, values: &[f64], offset: usize) -> Result<f64, ExprError> {
    let (acc, v) = (first(values), values.get(1).copied().unwrap_or(f64::NAN));
    let x = match op {
        BinOp::Add => acc + v,
        BinOp::Sub => acc - v,
        BinOp::Mul => acc * v,
        BinOp::Div if v == 0.0 => {
            return Err(ExprError::new(
                "division by zero; check the divisor",
                offset,
            ))
        }
        BinOp::Div => acc / v,
    };
    finite(x, offset)
}

/// `b^e` of the two `values`, the `^` written at `offset`.
fn power(values: &[f64], offset: usize) -> Result<f64, ExprError> {
    let (b, e) = (first(values), values.get(1).copied().unwrap_or(f64::NAN));
    if b < 0.0 && e.fract() != 0.0 {
        return Err(ExprError::new(
            format!("`{b}^{e}`: a negative number to a fractional power has no real value"),
            offset,
        ));
    }
    finite(b.powf(e), offset)
}

/// `func` of its arguments `vals`, the call written at `offset`.
fn call(func: Func, vals: &[f64], offset: usize) -> Result<f64, ExprError> {
    let x = first(vals);
    let v = match func {
        Func::Sqrt if x < 0.0 => {
            return Err(ExprError::new(
                format!("square root of a negative number ({x}); check the sign"),
                offset,
            ))
        }
        Func::Sqrt => x.sqrt(),
        Func::Sin => sin_deg(x),
        Func::Cos => sin_deg(x + 90.0),
        Func::Tan => tan_deg(x).ok_or_else(|| {
            ExprError::new(
                format!("tan({x}) is undefined (90° + k·180°); check the angle"),
                offset,
            )
        })?,
        Func::Abs => x.abs(),
        Func::Min => vals.iter().copied().fold(f64::INFINITY, f64::min),
        Func::Max => vals.iter().copied().fold(f64::NEG_INFINITY, f64::max),
    };
    finite(v, offset)
}

/// Sine of an angle in degrees, exact at multiples of 30° where the value is rational
/// (sin 30° = 1/2, sin 90° = 1), so that e.g. `cos(90)` is exactly 0.
fn sin_deg(deg: f64) -> f64 {
    let r = deg.rem_euclid(360.0);
    match r {
        0.0 | 180.0 => 0.0,
        30.0 | 150.0 => 0.5,
        90.0 => 1.0,
        210.0 | 330.0 => -0.5,
        270.0 => -1.0,
        _ => r.to_radians().sin(),
    }
}

/// Tangent of an angle in degrees, exact at multiples of 45°; `None` at 90° + k·180°.
fn tan_deg(deg: f64) -> Option<f64> {
    match deg.rem_euclid(180.0) {
        0.0 => Some(0.0),
        45.0 => Some(1.0),
        90.0 => None,
        135.0 => Some(-1.0),
        _ => Some(sin_deg(deg) / sin_deg(deg + 90.0)),
    }
}

/// A number as written in the file: a literal, or an expression in a string (a `[params]`
/// entry, a dimension, a quantity with its unit).
#[derive(Debug, Clone, PartialEq)]
pub enum Value {
    Number(f64),
    Expr(String),
}

impl Value {
    /// The value as the user would type it.
    pub fn text(&self) -> String {
        match self {
            Value::Number(x) => format!("{x}"),
            Value::Expr(s) => s.clone(),
        }
    }
}

/// Why a name cannot be a param, if it cannot.
fn check_param_name(name: &str) -> Result<(), ExprError> {
    let mut chars = name.chars();
    let valid = chars
        .next()
        .is_some_and(|c| c.is_ascii_alphabetic() || c == '_')
        && chars.all(|c| c.is_ascii_alphanumeric() || c == '_');
    let message = if !valid {
        format!(
            "param name `{name}` cannot be used in expressions; use letters, digits and `_`, \
             starting with a letter or `_`"
        )
    } else if name == "pi" {
        "`pi` is a built-in constant; give the param another name".to_string()
    } else if Func::named(name).is_some() {
        format!("`{name}` is a built-in function; give the param another name")
    } else {
        return Ok(());
    };
    Err(ExprError::new(message, 0))
}

/// A param as [`resolve_params`] reads it: a number, or an expression of others.
enum Param {
    Number(f64),
    Expr(Expr),
}

/// Resolve `[params]` in any order of dependence.
///
/// Input: (name, value) in file order. Output: every value, or the index of the offending
/// param with its error: a bad or repeated name (offset 0), a parse error, a cycle
/// ("cycle: a → b → a", reported at the param of the cycle that comes first in the file),
/// an unknown name, a division by zero or a non-finite result. Offsets are in that param's
/// expression text.
pub fn resolve_params(
    params: &[(String, Value)],
) -> Result<BTreeMap<String, f64>, (usize, ExprError)> {
    let mut index: BTreeMap<&str, usize> = BTreeMap::new();
    for (i, (name, _)) in params.iter().enumerate() {
        check_param_name(name).map_err(|e| (i, e))?;
        if index.insert(name, i).is_some() {
            let e = ExprError::new(
                format!("param `{name}` is defined twice; remove or rename one"),
                0,
            );
            return Err((i, e));
        }
    }
    let exprs = params
        .iter()
        .enumerate()
        .map(|(i, (_, value))| match value {
            Value::Number(v) => finite(*v, 0).map(Param::Number).map_err(|e| (i, e)),
            Value::Expr(src) => Expr::parse(src).map(Param::Expr).map_err(|e| (i, e)),
        })
        .collect::<Result<Vec<Param>, _>>()?;
    // deps[i]: (param index, offset of the reference) for each param that param i uses.
    let deps: Vec<Vec<(usize, usize)>> = exprs
        .iter()
        .map(|p| match p {
            Param::Number(_) => Vec::new(),
            Param::Expr(e) => e
                .references()
                .into_iter()
                .filter_map(|(name, offset)| index.get(name).map(|&j| (j, offset)))
                .collect(),
        })
        .collect();
    let order = dependency_order(&deps).map_err(|cycle| cycle_error(&cycle, &deps, params))?;
    let mut values = BTreeMap::new();
    for i in order {
        let (Some((name, _)), Some(expr)) = (params.get(i), exprs.get(i)) else {
            continue;
        };
        let v = match expr {
            Param::Number(v) => *v,
            Param::Expr(e) => e.eval(&|n| values.get(n).copied()).map_err(|e| (i, e))?,
        };
        values.insert(name.clone(), v);
    }
    Ok(values)
}

/// Order the params so each comes after those it uses (iterative depth-first search).
/// On a cycle, returns its members as (param, index into its deps of the edge to the next).
fn dependency_order(deps: &[Vec<(usize, usize)>]) -> Result<Vec<usize>, Vec<(usize, usize)>> {
    #[derive(Clone, Copy, PartialEq)]
    enum Mark {
        New,
        Active,
        Done,
    }
    let mut mark = vec![Mark::New; deps.len()];
    let mut order = Vec::with_capacity(deps.len());
    for start in 0..deps.len() {
        if mark.get(start) != Some(&Mark::New) {
            continue;
        }
        mark[start] = Mark::Active;
        // (param, index of the next dep to visit)
        let mut stack = vec![(start, 0usize)];
        while let Some(top) = stack.last_mut() {
            let node = top.0;
            let next = deps.get(node).and_then(|d| d.get(top.1)).map(|&(j, _)| j);
            top.1 += 1;
            match next.map(|j| (j, mark.get(j).copied())) {
                Some((j, Some(Mark::New))) => {
                    mark[j] = Mark::Active;
                    stack.push((j, 0));
                }
                Some((j, Some(Mark::Active))) => {
                    let from = stack.iter().position(|&(n, _)| n == j).unwrap_or(0);
                    let cycle = stack
                        .get(from..)
                        .unwrap_or_default()
                        .iter()
                        .map(|&(n, next)| (n, next.saturating_sub(1)))
                        .collect();
                    return Err(cycle);
                }
                Some(_) => {}
                None => {
                    mark[node] = Mark::Done;
                    order.push(node);
                    stack.pop();
                }
            }
        }
    }
    Ok(order)
}

/// How many names of a long cycle its message shows before "…" and the count.
const CYCLE_NAMES: usize = 6;

/// "cycle: a → b → a", told from the member that comes first in the file, at its reference
/// to the next member; a long cycle shows its first [`CYCLE_NAMES`] names, the last one
/// and how many params it holds.
fn cycle_error(
    cycle: &[(usize, usize)],
    deps: &[Vec<(usize, usize)>],
    params: &[(String, Value)],
) -> (usize, ExprError) {
    let first = (0..cycle.len())
        .min_by_key(|&k| cycle.get(k).map(|c| c.0))
        .unwrap_or(0);
    let name_of = |i: usize| params.get(i).map_or("?", |p| p.0.as_str());
    let mut names: Vec<&str> = (0..=cycle.len())
        .filter_map(|k| cycle.get((first + k) % cycle.len()))
        .map(|&(i, _)| name_of(i))
        .collect();
    if names.len() == 1 {
        names.push(names[0]);
    }
    let (param, edge) = cycle.get(first).copied().unwrap_or((0, 0));
    let offset = deps
        .get(param)
        .and_then(|d| d.get(edge))
        .map_or(0, |&(_, o)| o);
    let hint = if cycle.len() == 1 {
        "a param cannot use itself"
    } else {
        "give one of these params a number"
    };
    let shown = if names.len() > CYCLE_NAMES + 1 {
        let head = names[..CYCLE_NAMES].join(" → ");
        format!(
            "{head} → … → {} ({} params in the cycle)",
            names[names.len() - 1],
            cycle.len()
        )
    } else {
        names.join(" → ")
    };
    let message = format!("cycle: {shown}; {hint}");
    (param, ExprError::new(message, offset))
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    fn ev(src: &str) -> f64 {
        eval_str(src).unwrap_or_else(|e| panic!("{src}: {e} at {}", e.offset))
    }

    fn err(src: &str) -> ExprError {
        eval_str(src).expect_err(src)
    }

    /// A lone name is what the parser reads as one param and nothing else: its value
    /// is the param's (the parser's own result is the reference), and `pi`, functions,
    /// numbers and anything with an operator are left to the parser.
    #[test]
    fn a_lone_name_is_the_parsers_single_param() {
        let tf = |n: &str| (n == "tf" || n == "_b2").then_some(16.0);
        for src in ["tf", " tf\t", "_b2"] {
            let name = Expr::lone_name(src).expect(src);
            let parsed = Expr::parse(src).unwrap();
            assert_eq!(parsed.names(), vec![name.to_string()], "{src}");
            assert_eq!(parsed.eval(&tf), Ok(16.0), "{src}");
        }
        for src in [
            "pi", "sqrt", "2tf", "tf*2", "-tf", "", " ", "t f", "tf)", "é",
        ] {
            assert_eq!(Expr::lone_name(src), None, "{src}");
        }
    }

    fn params(list: &[(&str, &str)]) -> Vec<(String, Value)> {
        list.iter()
            .map(|&(n, v)| {
                let value = match v.parse::<f64>() {
                    Ok(x) => Value::Number(x),
                    Err(_) => Value::Expr(v.to_string()),
                };
                (n.to_string(), value)
            })
            .collect()
    }

    // Precedence and associativity follow ordinary algebraic convention (common practice;
    // e.g. -2^2 = -4 as in written mathematics).
    #[test]
    fn numbers() {
        assert_eq!(ev("12"), 12.0);
        assert_eq!(ev("1.5"), 1.5);
        assert_eq!(ev(".5"), 0.5);
        assert_eq!(ev("5."), 5.0);
        assert_eq!(ev("2e-3"), 0.002);
        assert_eq!(ev("1E6"), 1e6);
        assert_eq!(ev("2.5e+2"), 250.0);
        assert_eq!(ev("  \t 7 \n"), 7.0);
    }

    #[test]
    fn precedence_and_associativity() {
        assert_eq!(ev("2+3*4"), 14.0);
        assert_eq!(ev("(2+3)*4"), 20.0);
        assert_eq!(ev("10-4-3"), 3.0);
        assert_eq!(ev("100/10/5"), 2.0);
        assert_eq!(ev("2*3/4"), 1.5);
        assert_eq!(ev("2^3^2"), 512.0);
        assert_eq!(ev("(2^3)^2"), 64.0);
        assert_eq!(ev("-2^2"), -4.0);
        assert_eq!(ev("(-2)^2"), 4.0);
        assert_eq!(ev("2^-1"), 0.5);
        assert_eq!(ev("2*-3"), -6.0);
        assert_eq!(ev("--3"), 3.0);
        assert_eq!(ev("+3 - -2"), 5.0);
        assert_eq!(ev("1 - 2 * 3 ^ 2 / 6"), -2.0);
        assert_eq!(ev("500 + 2*16"), 532.0);
    }

    // Exact values of the trigonometric functions at 30°, 45°, 60°, 90°: any trigonometry
    // table (e.g. Abramowitz & Stegun, Handbook of Mathematical Functions, 4.3.46).
    #[test]
    fn functions_in_degrees() {
        assert_eq!(ev("sin(30)"), 0.5);
        assert_eq!(ev("cos(60)"), 0.5);
        assert_eq!(ev("cos(90)"), 0.0);
        assert_eq!(ev("sin(-90)"), -1.0);
        assert_eq!(ev("cos(180)"), -1.0);
        assert_eq!(ev("sin(390)"), 0.5);
        assert_eq!(ev("tan(45)"), 1.0);
        assert_eq!(ev("tan(-45)"), -1.0);
        assert!((ev("sin(45)") - 0.5f64.sqrt()).abs() < 1e-15);
        assert!((ev("tan(60)") - 3f64.sqrt()).abs() < 1e-14);
        assert!((ev("cos(30)") - 3f64.sqrt() / 2.0).abs() < 1e-15);
        assert!(err("tan(90)").message.contains("undefined"));
        assert!(err("tan(-270)").message.contains("undefined"));
        assert_eq!(ev("sqrt(16)"), 4.0);
        assert_eq!(ev("abs(-3)"), 3.0);
        assert_eq!(ev("min(3, 1, 2)"), 1.0);
        assert_eq!(ev("max(3, 1, 2)"), 3.0);
        assert_eq!(ev("pi"), std::f64::consts::PI);
        assert_eq!(ev("pi*10^2/4"), std::f64::consts::PI * 25.0);
        assert_eq!(ev("sqrt (9) + max( 1 , 2 )"), 5.0);
    }

    #[test]
    fn function_errors() {
        let e = err("sqr(4)");
        assert_eq!(
            e.message,
            "unknown function `sqr`; known: sqrt sin cos tan abs min max"
        );
        assert_eq!(e.offset, 0);
        assert!(err("sqrt(1, 2)")
            .message
            .contains("takes 1 argument, found 2"));
        assert!(err("sin()").message.contains("takes 1 argument, found 0"));
        assert!(err("min(1)").message.contains("2 or more arguments"));
        assert!(err("sqrt").message.contains("write `sqrt(...)`"));
        let e = err("1 + sqrt(-4)");
        assert!(e.message.contains("negative"));
        assert_eq!(e.offset, 4);
        assert!(err("(-8)^(1/3)").message.contains("fractional power"));
        assert!(err("pi(2)").message.contains("unknown function `pi`"));
    }

    #[test]
    fn syntax_errors_with_offsets() {
        let cases: [(&str, &str, usize); 14] = [
            ("", "empty expression", 0),
            ("   ", "empty expression", 0),
            ("2 # 3", "unexpected character `#`", 2),
            ("(1 + 2", "missing `)` for the `(` at offset 0", 6),
            ("(1 + 2 3)", "expected `)` but found `3`", 7),
            ("max(1 2)", "expected `,` or `)` but found `2`", 6),
            ("1 2", "unexpected `2` after a complete expression", 2),
            ("2pi", "unexpected `pi`", 1),
            ("1 + 2)", "unmatched `)`", 5),
            ("1 +", "expression ends too early", 3),
            ("2 ** 3", "unexpected `*`", 3),
            ("()", "unexpected `)`", 1),
            (".", "a lone `.`", 0),
            ("2e", "exponent needs digits", 1),
        ];
        for (src, message, offset) in cases {
            let e = err(src);
            assert!(e.message.contains(message), "{src}: {}", e.message);
            assert_eq!(e.offset, offset, "{src}: {}", e.message);
            assert_eq!(e.to_string(), e.message);
        }
    }

    #[test]
    fn evaluation_errors() {
        let e = err("1 + 2/(3-3)");
        assert!(e.message.contains("division by zero"));
        assert_eq!(e.offset, 5);
        let e = err("1e308*10");
        assert!(e.message.contains("not a finite number"));
        assert_eq!(e.offset, 5);
        assert!(err("0^-1").message.contains("not a finite number"));
        assert!(err("10^400").message.contains("not a finite number"));
        assert!(err("1e999").message.contains("too large"));
        let e = err("2 * bf");
        assert_eq!(e.message, "unknown name `bf`; define it under [params]");
        assert_eq!(e.offset, 4);
    }

    #[test]
    fn names_once_in_order() {
        let e = Expr::parse("b*h^3/12 + max(b, t) - sin(a) + pi").unwrap();
        assert_eq!(e.names(), vec!["b", "h", "t", "a"]);
        let look = |n: &str| match n {
            "b" => Some(2.0),
            "h" => Some(3.0),
            "t" => Some(1.0),
            "a" => Some(30.0),
            _ => None,
        };
        assert_eq!(e.eval(&look), Ok(4.5 + 2.0 - 0.5 + std::f64::consts::PI));
        assert!(Expr::parse("3").unwrap().names().is_empty());
    }

    #[test]
    fn deep_nesting_refused_without_overflow() {
        let ok = format!("{}1{}", "(".repeat(MAX_DEPTH), ")".repeat(MAX_DEPTH));
        assert_eq!(ev(&ok), 1.0);
        let deep = format!(
            "{}1{}",
            "(".repeat(MAX_DEPTH + 1),
            ")".repeat(MAX_DEPTH + 1)
        );
        assert!(err(&deep).message.contains("nested more than 64"));
        for src in [
            "(".repeat(2000),
            format!("{}1", "-".repeat(4000)),
            format!("{}1", "+".repeat(4000)),
            format!("{}2", "2^".repeat(2000)),
            format!("{}1{}", "sqrt(".repeat(600), ")".repeat(600)),
        ] {
            assert!(err(&src).message.contains("nested"), "{}", &src[..10]);
        }
        let long = "(".repeat(100_000);
        let e = err(&long);
        assert!(e.message.contains("longer than 4096"));
        assert_eq!(e.offset, MAX_LEN);
        // Long flat chains are fine: they do not nest.
        let sum = format!("1{}", "+1".repeat(2000));
        assert_eq!(ev(&sum), 2001.0);
    }

    #[test]
    fn garbage_bytes() {
        for src in [
            "\u{0}",
            "1 + \u{FFFD}",
            "é",
            "2 * ∞",
            "1,2",
            ",",
            "^",
            "1e",
            "1..2",
            "$x",
        ] {
            let e = err(src);
            assert!(e.offset <= src.len(), "{src:?}");
            assert!(src.is_char_boundary(e.offset), "{src:?}");
        }
        assert_eq!(err("2 * ∞").offset, 4);
    }

    #[test]
    fn params_in_any_order() {
        let p = params(&[("d", "500 + 2*tf"), ("bf", "250"), ("tf", "bf/25 + 6")]);
        let v = resolve_params(&p).unwrap();
        assert_eq!(v["bf"], 250.0);
        assert_eq!(v["tf"], 16.0);
        assert_eq!(v["d"], 532.0);
        let chain: Vec<(String, Value)> = (0..500)
            .map(|i| {
                let value = if i == 499 {
                    Value::Number(1.0)
                } else {
                    Value::Expr(format!("p{} + 1", i + 1))
                };
                (format!("p{i}"), value)
            })
            .collect();
        assert_eq!(resolve_params(&chain).unwrap()["p0"], 500.0);
        assert!(resolve_params(&[]).unwrap().is_empty());
    }

    #[test]
    fn param_cycles() {
        let (i, e) =
            resolve_params(&params(&[("x", "1"), ("a", "b + 1"), ("b", "2*a")])).unwrap_err();
        assert_eq!(i, 1);
        assert!(e.message.starts_with("cycle: a → b → a;"), "{}", e.message);
        assert_eq!(e.offset, 0);
        let (i, e) = resolve_params(&params(&[("b", "2*a"), ("a", "b + 1")])).unwrap_err();
        assert_eq!(i, 0);
        assert!(e.message.starts_with("cycle: b → a → b;"), "{}", e.message);
        assert_eq!(e.offset, 2);
        let (i, e) = resolve_params(&params(&[("k", "3"), ("s", "1 + s")])).unwrap_err();
        assert_eq!(i, 1);
        assert_eq!(e.message, "cycle: s → s; a param cannot use itself");
        assert_eq!(e.offset, 4);
        let (i, e) = resolve_params(&params(&[("c", "a"), ("a", "b"), ("b", "c*2"), ("z", "a")]))
            .unwrap_err();
        assert_eq!(i, 0);
        assert!(
            e.message.starts_with("cycle: c → a → b → c;"),
            "{}",
            e.message
        );
        // A long cycle is found without deep recursion.
        let ring: Vec<(String, Value)> = (0..5000)
            .map(|i| (format!("q{i}"), Value::Expr(format!("q{}", (i + 1) % 5000))))
            .collect();
        assert_eq!(resolve_params(&ring).unwrap_err().0, 0);
    }

    #[test]
    fn param_errors() {
        let (i, e) = resolve_params(&params(&[("a", "1"), ("b", "a + c")])).unwrap_err();
        assert_eq!(i, 1);
        assert_eq!(e.message, "unknown name `c`; define it under [params]");
        assert_eq!(e.offset, 4);
        let (i, e) = resolve_params(&params(&[("z", "0"), ("a", "1/z"), ("b", "a")])).unwrap_err();
        assert_eq!((i, e.offset), (1, 1));
        assert!(e.message.contains("division by zero"));
        let (i, e) = resolve_params(&params(&[("a", "10^300"), ("b", "a*a")])).unwrap_err();
        assert_eq!(i, 1);
        assert!(e.message.contains("not a finite number"));
        let nan = vec![("a".to_string(), Value::Number(f64::NAN))];
        assert!(resolve_params(&nan)
            .unwrap_err()
            .1
            .message
            .contains("finite"));
        let (i, e) = resolve_params(&params(&[("a", "1"), ("b", "2 +")])).unwrap_err();
        assert_eq!((i, e.offset), (1, 3));
        for (bad, message) in [
            ("pi", "built-in constant"),
            ("sqrt", "built-in function"),
            ("max", "built-in function"),
            ("2x", "cannot be used in expressions"),
            ("b-1", "cannot be used in expressions"),
            ("", "cannot be used in expressions"),
        ] {
            let (i, e) = resolve_params(&params(&[("a", "1"), (bad, "1")])).unwrap_err();
            assert_eq!(i, 1);
            assert!(e.message.contains(message), "{bad}: {}", e.message);
        }
        let (i, e) = resolve_params(&params(&[("a", "1"), ("a", "2")])).unwrap_err();
        assert_eq!(i, 1);
        assert!(e.message.contains("defined twice"));
    }

    proptest! {
        #[test]
        fn never_panics(src in any::<String>()) {
            if let Ok(e) = Expr::parse(&src) {
                let _ = e.eval(&|_| Some(1.0));
                let _ = e.names();
            }
        }

        #[test]
        fn never_panics_on_expression_like_text(src in "[0-9a-z_+*/^(),.eE \\-]{0,200}") {
            match Expr::parse(&src) {
                Ok(e) => {
                    if let Err(err) = e.eval(&|n| (n.len() % 3 != 0).then_some(n.len() as f64)) {
                        prop_assert!(err.offset <= src.len());
                    }
                }
                Err(err) => prop_assert!(err.offset <= src.len()),
            }
        }

        #[test]
        fn printed_numbers_round_trip(
            v in proptest::num::f64::POSITIVE
                | proptest::num::f64::NEGATIVE
                | proptest::num::f64::NORMAL
                | proptest::num::f64::SUBNORMAL
                | proptest::num::f64::ZERO
        ) {
            for text in [format!("{v}"), format!("{v:?}"), format!("{v:e}"), format!("{v:E}")] {
                let back = eval_str(&text);
                prop_assert_eq!(back.map(f64::to_bits), Ok(v.to_bits()), "{}", text);
            }
        }
    }
}

//! Printing a formula: as Typst math or as plain text, symbolically or with the input
//! values substituted, and its estimated width.

use super::number::{const_text, math_number};
use super::{Expr, Symbol};

/// How a formula is printed.
#[derive(Clone, Copy, PartialEq, Eq)]
pub enum Style {
    /// Typst math.
    Math,
    /// Plain text for terminals and CSV.
    Plain,
}

/// Prints a formula: symbolically (`values = None`) or with the input values substituted.
pub struct Printer<'a> {
    pub style: Style,
    pub symbols: &'a [&'a Symbol],
    pub values: Option<&'a [String]>,
}

impl Printer<'_> {
    pub fn print(&self, e: &Expr) -> String {
        let mut s = String::new();
        self.write(e, &mut s);
        s
    }

    fn atom(&self, i: usize) -> String {
        match self.values {
            Some(vals) => {
                let v = vals.get(i).cloned().unwrap_or_default();
                let v = if self.style == Style::Math { math_number(&v) } else { v };
                if v.starts_with('-') || v.starts_with('−') { format!("({v})") } else { v }
            }
            None => match self.style {
                Style::Math => self.symbols.get(i).map(|s| s.math.clone()).unwrap_or_default(),
                Style::Plain => self.symbols.get(i).map(|s| s.plain.clone()).unwrap_or_default(),
            },
        }
    }

    fn child(&self, e: &Expr, min_prec: u8, out: &mut String) {
        if e.prec() < min_prec {
            out.push('(');
            self.write(e, out);
            out.push(')');
        } else {
            self.write(e, out);
        }
    }

    // One arm per kind of expression, each a few lines: the function is long because the
    // expression language has many kinds, and reads best as one table of them.
    fn write(&self, e: &Expr, out: &mut String) {
        let math = self.style == Style::Math;
        match e {
            Expr::Var(i) => out.push_str(&self.atom(*i)),
            Expr::Num(v) => {
                let t = const_text(*v);
                if *v < 0.0 {
                    out.push('(');
                    out.push_str(&t);
                    out.push(')');
                } else {
                    out.push_str(&t);
                }
            }
            Expr::Add(xs) => {
                for (k, x) in xs.iter().enumerate() {
                    if k > 0 {
                        if let Expr::Neg(inner) = x {
                            out.push_str(" - ");
                            self.child(inner, 2, out);
                            continue;
                        }
                        out.push_str(" + ");
                    }
                    self.child(x, 1, out);
                }
            }
            Expr::Sub(a, b) => {
                self.child(a, 1, out);
                out.push_str(" - ");
                self.child(b, 2, out);
            }
            Expr::Mul(xs) => {
                let symbolic = self.values.is_none();
                for (k, x) in xs.iter().enumerate() {
                    if k > 0 {
                        let both_vars = symbolic && !matches!(x, Expr::Num(_));
                        out.push_str(match (math, both_vars) {
                            (true, true) => " ",
                            (true, false) => " times ",
                            (false, _) => " * ",
                        });
                    }
                    self.child(x, 3, out);
                }
            }
            Expr::Div(a, b) => {
                if math {
                    out.push_str("frac(");
                    self.write(a, out);
                    out.push_str(", ");
                    self.write(b, out);
                    out.push(')');
                } else {
                    self.child(a, 3, out);
                    out.push_str(" / ");
                    self.child(b, 5, out);
                }
            }
            Expr::Neg(a) => {
                out.push('-');
                self.child(a, 3, out);
            }
            Expr::Pow(a, b) => {
                self.child(a, 6, out);
                if math {
                    out.push_str("^(");
                    self.write(b, out);
                    out.push(')');
                } else {
                    out.push('^');
                    self.child(b, 6, out);
                }
            }
            Expr::Sqrt(a) => {
                out.push_str("sqrt(");
                self.write(a, out);
                out.push(')');
            }
            Expr::Min(xs) | Expr::Max(xs) => {
                out.push_str(if matches!(e, Expr::Min(_)) { "min(" } else { "max(" });
                for (k, x) in xs.iter().enumerate() {
                    if k > 0 {
                        out.push_str(", ");
                    }
                    self.write(x, out);
                }
                out.push(')');
            }
            Expr::Per(a, d) => {
                if self.values.is_none() {
                    self.write(a, out);
                } else {
                    self.child(a, 4, out);
                    if *d < 1.0 {
                        out.push_str(if math { " times " } else { " * " });
                        out.push_str(&const_text(1.0 / *d));
                    } else {
                        // a literal slash in math: a conversion, not a fraction
                        out.push_str(if math { " \\/ " } else { " / " });
                        out.push_str(&const_text(*d));
                    }
                }
            }
        }
    }
}

/// Estimated width of a printed formula in characters of body text (fractions take the
/// wider of their parts, subscripts count less). The templates use it to choose between
/// one line and a stacked layout without measuring.
pub fn width(e: &Expr, symbols: &[&Symbol], values: Option<&[String]>) -> f64 {
    let w = |x: &Expr| width(x, symbols, values);
    match e {
        Expr::Var(i) => match values {
            Some(v) => v.get(*i).map_or(1.0, |s| s.chars().count() as f64 + if s.starts_with('-') { 2.0 } else { 0.0 }),
            None => symbols.get(*i).map_or(1.0, |s| 1.0 + 0.7 * (s.plain.chars().count() as f64 - 1.0).max(0.0)),
        },
        Expr::Num(v) => const_text(*v).chars().count() as f64,
        Expr::Add(xs) | Expr::Mul(xs) => {
            xs.iter().map(w).sum::<f64>()
                + 2.0 * (xs.len().saturating_sub(1)) as f64
                + if values.is_some() { 2.0 } else { 0.0 }
        }
        Expr::Sub(a, b) => w(a) + w(b) + 4.0,
        Expr::Div(a, b) => w(a).max(w(b)) + 1.0,
        Expr::Neg(a) => w(a) + 1.5,
        Expr::Pow(a, b) => w(a) + 0.7 * w(b) + 1.0,
        Expr::Sqrt(a) => w(a) + 2.0,
        Expr::Min(xs) | Expr::Max(xs) => 5.0 + xs.iter().map(w).sum::<f64>() + 2.0 * xs.len() as f64,
        Expr::Per(a, d) => w(a) + if values.is_some() { 4.0 + const_text(*d).chars().count() as f64 } else { 0.0 },
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::trace::Symbol;
    use crate::trace::f::*;

    #[test]
    fn prints_and_evaluates() {
        let a = Symbol::new("A_\"ps\"", "Aps");
        let fp = Symbol::new("f_\"ps\"", "fps");
        let e = per(mul(vec![v(0), v(1)]), 1000.0);
        let syms = [&a, &fp];
        let vals = ["1184".to_string(), "1650".to_string()];
        let p = Printer { style: Style::Math, symbols: &syms, values: None };
        assert_eq!(p.print(&e), "A_\"ps\" f_\"ps\"");
        let p = Printer { style: Style::Plain, symbols: &syms, values: Some(&vals) };
        assert_eq!(p.print(&e), "(1184 * 1650) / 1000");
        assert_eq!(e.eval(&[1184.0, 1650.0]), 1953.6);
        let d = div(n(0.04), sub(v(0), n(0.007)));
        let p = Printer { style: Style::Math, symbols: &syms, values: None };
        assert_eq!(p.print(&d), "frac(0.04, A_\"ps\" - 0.007)");
    }
}

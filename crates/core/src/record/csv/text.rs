//! The record CSV reader's text at the byte level: lines and cells cut at
//! ASCII bytes and borrowed, trimming, and plain decimals read by an exact
//! fast path.

use super::*;

/// Splits one line into fields, honouring double quotes (`""` inside
/// quotes is a quote).
pub(super) fn split(line: &str, sep: char) -> Vec<String> {
    let mut fields = Vec::new();
    let mut field = String::new();
    let mut quoted = false;
    let mut chars = line.chars().peekable();
    while let Some(c) = chars.next() {
        match c {
            '"' if quoted && chars.peek() == Some(&'"') => {
                field.push('"');
                chars.next();
            }
            '"' => quoted = !quoted,
            c if c == sep && !quoted => fields.push(std::mem::take(&mut field)),
            c => field.push(c),
        }
    }
    fields.push(field);
    fields
}

/// A trimmed cell as a number; with a decimal comma, `74,5` is 74.5.
pub(super) fn number(text: &str, decimal_comma: bool) -> Option<f64> {
    let v = if decimal_comma {
        parse_f64(&decimal(text, true))
    } else {
        parse_f64(text)
    };
    v.filter(|v| v.is_finite())
}

/// `text` with a decimal comma made a point, when the file uses them;
/// borrowed unless a comma must change.
pub(super) fn decimal(text: &str, decimal_comma: bool) -> Cow<'_, str> {
    if decimal_comma && text.contains(',') {
        Cow::Owned(text.replace(',', "."))
    } else {
        Cow::Borrowed(text)
    }
}

/// Whether a byte is ASCII and not white space: a cell or line that starts
/// and ends with one needs no trimming.
pub(super) fn plain(b: u8) -> bool {
    b.is_ascii() && !matches!(b, b'\t'..=b'\r' | b' ')
}

/// `text.trim()`, without walking characters when both ends are plain.
pub(super) fn trim(text: &str) -> &str {
    let bytes = text.as_bytes();
    match (bytes.first(), bytes.last()) {
        (Some(&first), Some(&last)) if !(plain(first) && plain(last)) => text.trim(),
        _ => text,
    }
}

/// Exact powers of ten up to 10^15, for [`parse_f64`].
pub(super) const POWERS_OF_TEN: [f64; 16] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
];

/// The decimal digits of `bytes` from `at` on, taken into `mantissa`
/// (wrapping past 20 digits, which [`parse_f64`] then leaves to the
/// standard reader); how many there were. Inlined: it is the import's
/// innermost loop, and the release build optimises for size.
#[inline(always)]
pub(super) fn digits(bytes: &[u8], at: &mut usize, mantissa: &mut u64) -> usize {
    let start = *at;
    while let Some(digit) = bytes.get(*at).map(|b| b.wrapping_sub(b'0')) {
        if digit >= 10 {
            break;
        }
        *mantissa = mantissa.wrapping_mul(10).wrapping_add(u64::from(digit));
        *at += 1;
    }
    *at - start
}

/// `text.parse::<f64>()`, sooner for a plain decimal (`-74.25`): up to 15
/// digits are exact in an f64, as is every power of ten to 10^15, and one
/// correctly rounded division then gives the nearest f64, which is what
/// the standard reader gives. Anything else goes to the standard reader.
pub(super) fn parse_f64(text: &str) -> Option<f64> {
    let bytes = text.as_bytes();
    let negative = bytes.first() == Some(&b'-');
    let mut at = usize::from(negative);
    let mut mantissa = 0u64;
    let whole = digits(bytes, &mut at, &mut mantissa);
    let decimals = if bytes.get(at) == Some(&b'.') {
        at += 1;
        digits(bytes, &mut at, &mut mantissa)
    } else {
        0
    };
    match POWERS_OF_TEN.get(decimals) {
        Some(scale) if at == bytes.len() && (1..=15).contains(&(whole + decimals)) => {
            // Exact: the mantissa is below 10^15 < 2^53.
            #[allow(clippy::cast_precision_loss)]
            let m = mantissa as f64;
            let v = if decimals == 0 { m } else { m / scale };
            Some(if negative { -v } else { v })
        }
        _ => text.parse().ok(),
    }
}

/// The cells of a line without quotes, cut at an ASCII separator, so every
/// cut falls between characters.
pub(super) struct Cells<'a> {
    pub(super) line: &'a str,
    pub(super) start: usize,
    pub(super) sep: u8,
}

impl<'a> Iterator for Cells<'a> {
    type Item = &'a str;

    fn next(&mut self) -> Option<&'a str> {
        let bytes = self.line.as_bytes();
        let start = self.start;
        if start > bytes.len() {
            return None;
        }
        let mut end = start;
        while bytes.get(end).is_some_and(|b| *b != self.sep) {
            end += 1;
        }
        self.start = end + 1;
        self.line.get(start..end)
    }
}

/// How many cells a line has, or `None` when it has quotes (and goes
/// through [`split`]).
pub(super) fn count_cells(line: &str, sep: u8) -> Option<usize> {
    let mut cells = 1;
    for &b in line.as_bytes() {
        if b == sep {
            cells += 1;
        } else if b == b'"' {
            return None;
        }
    }
    Some(cells)
}

/// The lines of a file that hold something, numbered from 1 as
/// `str::lines` numbers them: blank lines and `#` comments left out, line
/// ends (`\n`, `\r\n`, any `\r`s before them) removed.
pub(super) struct ContentLines<'a> {
    pub(super) rest: &'a str,
    pub(super) number: usize,
}

impl<'a> Iterator for ContentLines<'a> {
    type Item = (usize, &'a str);

    fn next(&mut self) -> Option<(usize, &'a str)> {
        while !self.rest.is_empty() {
            let (line, rest) = match self.rest.as_bytes().iter().position(|&b| b == b'\n') {
                Some(end) => (
                    self.rest.get(..end).unwrap_or_default(),
                    self.rest.get(end + 1..).unwrap_or_default(),
                ),
                None => (self.rest, ""),
            };
            self.rest = rest;
            self.number += 1;
            let mut line = line;
            while line.as_bytes().last() == Some(&b'\r') {
                line = line.get(..line.len() - 1).unwrap_or_default();
            }
            let holds_something = match line.as_bytes().first() {
                Some(&b) if plain(b) => b != b'#',
                _ => {
                    let l = line.trim_start();
                    !l.is_empty() && !l.starts_with('#')
                }
            };
            if holds_something {
                return Some((self.number, line));
            }
        }
        None
    }
}

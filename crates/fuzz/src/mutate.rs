//! Mutations for the stable campaign: byte-level ones for every decoder,
//! structure-aware ones that keep an input readable long enough to reach
//! deep code (JSON trees for cases and saved states, rows and cells for
//! CSV files, deflated cases and deflate bombs for share links), and the
//! small deterministic generator that drives them.

use std::sync::OnceLock;

use base64::engine::general_purpose::URL_SAFE_NO_PAD;
use base64::Engine as _;
use serde_json::{Map, Value};

use crate::Decoder;

/// A small deterministic generator (splitmix64): the same seed gives the
/// same campaign.
pub struct Rng(u64);

impl Rng {
    /// A generator from `seed`.
    pub fn new(seed: u64) -> Self {
        Rng(seed)
    }

    /// The next 64 random bits.
    pub fn bits(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }

    /// A number in `0..n` (0 when `n` is 0).
    pub fn below(&mut self, n: usize) -> usize {
        if n == 0 {
            return 0;
        }
        usize::try_from(self.bits() % n as u64).unwrap_or(0)
    }

    /// One of `items`, if any.
    pub fn pick<'a, T>(&mut self, items: &'a [T]) -> Option<&'a T> {
        items.get(self.below(items.len()))
    }
}

/// Words harvested from the seeds, so mutations write names the readers
/// know (fields, landmarks, units, channels) instead of only noise.
#[derive(Default)]
pub struct Dictionary {
    keys: Vec<String>,
    strings: Vec<String>,
    cells: Vec<String>,
}

impl Dictionary {
    /// Every object key and string of the JSON seeds and every cell of the
    /// other seeds.
    pub fn harvest<'a>(seeds: impl Iterator<Item = &'a [u8]>) -> Self {
        let mut d = Dictionary::default();
        for seed in seeds {
            let Ok(text) = std::str::from_utf8(seed) else {
                continue;
            };
            match serde_json::from_str::<Value>(text) {
                Ok(value) => d.walk(&value),
                Err(_) => {
                    for line in text.lines().take(50) {
                        d.cells
                            .extend(line.split([',', ';', '\t']).map(str::to_owned));
                    }
                }
            }
        }
        for list in [&mut d.keys, &mut d.strings, &mut d.cells] {
            list.sort();
            list.dedup();
        }
        d
    }

    fn walk(&mut self, value: &Value) {
        match value {
            Value::String(s) => self.strings.push(s.clone()),
            Value::Array(items) => items.iter().for_each(|v| self.walk(v)),
            Value::Object(map) => {
                for (k, v) in map {
                    self.keys.push(k.clone());
                    self.walk(v);
                }
            }
            _ => {}
        }
    }
}

/// Numbers at the edges: zeros, extremes, just past the caps, the ranges'
/// ends, and text that only looks like a number.
const NUMBERS: &[&str] = &[
    "0",
    "-0",
    "1",
    "-1",
    "0.1",
    "1e308",
    "-1e308",
    "5e-324",
    "1e400",
    "9007199254740993",
    "18446744073709551616",
    "-9223372036854775809",
    "65",
    "64",
    "90",
    "91",
    "180",
    "250",
    "251",
    "300",
    "1000",
    "259200",
    "259201",
    "2000001",
    "1.0000000001",
    "4294967296",
];

/// Texts at the edges: units, near-units, empty, long, odd characters.
const TEXTS: &[&str] = &[
    "",
    " ",
    "120 mmHg",
    "15 kPa",
    "14 cmH2O",
    "24 cm",
    "9 in",
    "1055 kg/m3",
    "1.055 g/mL",
    "12,5 mmHg",
    "NaN mmHg",
    "inf mmHg",
    "1e400 mmHg",
    "-0 mmHg",
    "120 MMHG",
    "１２０ mmHg",
    "120mmHg",
    "mmHg",
    "120 mm Hg",
    "\u{feff}",
    "\u{202e}abc",
    "\\",
    "\"",
    "08:15:00",
    "2026-03-04T08:15:00Z",
    "23:59:60",
    "radial line.mean",
    "icp",
    "<script>",
];

fn random_number(rng: &mut Rng) -> String {
    match rng.below(3) {
        0 => rng.pick(NUMBERS).map_or("0", |s| s).to_owned(),
        1 => format!("{}", rng.below(400)),
        _ => format!("{}.{}", rng.below(400), rng.below(100)),
    }
}

fn random_text(rng: &mut Rng, d: &Dictionary) -> String {
    match rng.below(6) {
        0 => "x".repeat(1 + rng.below(2_000)),
        1 | 2 => rng.pick(TEXTS).map_or("", |s| s).to_owned(),
        _ => rng.pick(&d.strings).cloned().unwrap_or_default(),
    }
}

fn random_value(rng: &mut Rng, d: &Dictionary) -> Value {
    match rng.below(8) {
        0 => Value::Null,
        1 => Value::Bool(rng.below(2) == 0),
        2 | 3 => serde_json::from_str(&random_number(rng)).unwrap_or(Value::Null),
        4 => Value::Array(Vec::new()),
        5 => Value::Object(Map::new()),
        _ => Value::String(random_text(rng, d)),
    }
}

/// How many nodes a JSON tree has, counting every value.
fn nodes(value: &Value) -> usize {
    1 + match value {
        Value::Array(items) => items.iter().map(nodes).sum(),
        Value::Object(map) => map.values().map(nodes).sum(),
        _ => 0,
    }
}

/// The `n`-th node in document order.
fn node_mut<'a>(value: &'a mut Value, n: &mut usize) -> Option<&'a mut Value> {
    if *n == 0 {
        return Some(value);
    }
    *n -= 1;
    match value {
        Value::Array(items) => items.iter_mut().find_map(|v| node_mut(v, n)),
        Value::Object(map) => map.values_mut().find_map(|v| node_mut(v, n)),
        _ => None,
    }
}

/// One change to a JSON tree at a random node.
fn mutate_json(rng: &mut Rng, d: &Dictionary, root: &mut Value) {
    let count = nodes(root);
    let donor = {
        let mut n = rng.below(count);
        node_mut(root, &mut n).cloned().unwrap_or(Value::Null)
    };
    let mut n = rng.below(count);
    let Some(node) = node_mut(root, &mut n) else {
        return;
    };
    match rng.below(10) {
        0 | 1 => *node = random_value(rng, d),
        2 => *node = donor,
        3 => match node {
            Value::Array(items) if !items.is_empty() => {
                let at = rng.below(items.len());
                items.remove(at);
            }
            Value::Object(map) if !map.is_empty() => {
                let key = map
                    .keys()
                    .nth(rng.below(map.len()))
                    .cloned()
                    .unwrap_or_default();
                map.remove(&key);
            }
            _ => *node = Value::Null,
        },
        4 => match node {
            Value::Object(map) => {
                let key = rng.pick(&d.keys).cloned().unwrap_or_default();
                map.insert(key, random_value(rng, d));
            }
            Value::Array(items) => items.push(donor),
            _ => *node = Value::Array(vec![node.take()]),
        },
        5 => {
            // An array grown many times over: past the caps, or just under.
            if let Value::Array(items) = node {
                if let Some(item) = rng.pick(items).cloned() {
                    let times = *rng.pick(&[2, 3, 10, 65, 130, 300]).unwrap_or(&2);
                    for i in 0..times {
                        let mut copy = item.clone();
                        // Sources need their own ids to be read as many.
                        if let Value::Object(map) = &mut copy {
                            if map.contains_key("id") {
                                map.insert("id".into(), Value::String(format!("line {i}")));
                            }
                        }
                        items.push(copy);
                    }
                }
            }
        }
        6 => {
            let depth = *rng.pick(&[2, 31, 33, 127, 200]).unwrap_or(&2);
            for _ in 0..depth {
                *node = if rng.below(2) == 0 {
                    Value::Array(vec![node.take()])
                } else {
                    let mut map = Map::new();
                    map.insert("x".into(), node.take());
                    Value::Object(map)
                };
            }
        }
        7 => {
            if let Value::String(s) = node {
                match rng.below(4) {
                    0 => s.push_str(&random_text(rng, d)),
                    1 => *s = s.to_uppercase(),
                    2 => *s = format!(" {s} "),
                    _ => *s = s.chars().rev().collect(),
                }
            } else {
                *node = Value::String(random_text(rng, d));
            }
        }
        8 => *node = Value::String(random_number(rng)),
        _ => {
            if let Value::Object(map) = node {
                if let Some(key) = map.keys().nth(rng.below(map.len().max(1))).cloned() {
                    if let Some(v) = map.remove(&key) {
                        let renamed = rng.pick(&d.keys).cloned().unwrap_or_default();
                        map.insert(renamed, v);
                    }
                }
            }
        }
    }
}

/// Up to four JSON changes; `None` when the seed is not JSON.
fn json(rng: &mut Rng, d: &Dictionary, seed: &[u8]) -> Option<Vec<u8>> {
    let mut value: Value = serde_json::from_slice(seed).ok()?;
    for _ in 0..1 + rng.below(4) {
        mutate_json(rng, d, &mut value);
    }
    let text = if rng.below(2) == 0 {
        serde_json::to_string(&value)
    } else {
        serde_json::to_string_pretty(&value)
    };
    text.ok().map(String::into_bytes)
}

/// Up to four changes to the rows and cells of a CSV file.
fn csv(rng: &mut Rng, d: &Dictionary, seed: &[u8]) -> Vec<u8> {
    let text = String::from_utf8_lossy(seed);
    let sep = [',', ';', '\t']
        .into_iter()
        .max_by_key(|c| text.lines().next().unwrap_or("").matches(*c).count())
        .unwrap_or(',');
    let mut rows: Vec<Vec<String>> = text
        .lines()
        .map(|l| l.split(sep).map(str::to_owned).collect())
        .collect();
    let mut sep_out = sep.to_string();
    let mut ending = "\n";
    for _ in 0..1 + rng.below(4) {
        let r = rng.below(rows.len());
        match rng.below(12) {
            0..=2 => {
                let cell = match rng.below(3) {
                    0 => random_number(rng),
                    1 => rng.pick(&d.cells).cloned().unwrap_or_default(),
                    _ => random_text(rng, d),
                };
                if let Some(row) = rows.get_mut(r) {
                    let c = rng.below(row.len());
                    if let Some(x) = row.get_mut(c) {
                        *x = cell;
                    }
                }
            }
            3 => {
                if let Some(row) = rows.get(r).cloned() {
                    for _ in 0..1 + rng.below(20) {
                        rows.insert(r, row.clone());
                    }
                }
            }
            4 => {
                if r < rows.len() {
                    rows.remove(r);
                }
            }
            5 => {
                let s = rng.below(rows.len());
                if r < rows.len() && s < rows.len() {
                    rows.swap(r, s);
                }
            }
            6 => {
                sep_out = rng
                    .pick(&[",", ";", "\t", ", ", "|"])
                    .map_or(",", |s| s)
                    .to_owned()
            }
            7 => {
                ending = rng
                    .pick(&["\r\n", "\r", "\n\n", "\n#\n", "\n \n"])
                    .map_or("\n", |s| s)
            }
            8 => {
                if let Some(row) = rows.get_mut(r) {
                    let width = *rng.pick(&[1, 300, 20_000]).unwrap_or(&1);
                    row.extend((0..width).map(|_| random_number(rng)));
                }
            }
            9 => {
                if let Some(cell) = rows.get_mut(r).and_then(|row| row.last_mut()) {
                    *cell = format!("\"{cell}\"");
                }
            }
            10 => {
                if let Some(cell) = rows.get_mut(r).and_then(|row| row.first_mut()) {
                    *cell = random_number(rng);
                }
            }
            _ => {
                if let Some(cell) = rows.get_mut(r).and_then(|row| row.get_mut(1)) {
                    *cell = cell.replace('.', ",");
                }
            }
        }
    }
    let mut out = String::new();
    for row in rows {
        out.push_str(&row.join(&sep_out));
        out.push_str(ending);
    }
    out.into_bytes()
}

/// The fragment a share link would carry for `bytes`, whatever they are.
pub fn fragment_of(bytes: &[u8]) -> String {
    let deflated = miniz_oxide::deflate::compress_to_vec(bytes, 6);
    format!("p1.{}", URL_SAFE_NO_PAD.encode(deflated))
}

/// Deflate bombs, made once: links whose case unpacks to just under, at
/// and past the cap, up to 64 times it, of one repeated pattern each.
fn bombs() -> &'static [Vec<u8>] {
    static BOMBS: OnceLock<Vec<Vec<u8>>> = OnceLock::new();
    BOMBS.get_or_init(|| {
        let cap = plumbline_core::limits::MAX_INFLATED_BYTES;
        let mut out = Vec::new();
        for size in [cap - 1, cap, cap + 1, 4 * cap, 64 * cap] {
            for pattern in [&b" "[..], b"[", b"{\"a\":", b"\x00", b"0"] {
                let mut body = b"{\"format\":\"plumbline-case\",\"version\":1,\"x\":\"".to_vec();
                while body.len() < size {
                    body.extend_from_slice(pattern);
                }
                body.truncate(size);
                out.push(fragment_of(&body).into_bytes());
            }
        }
        out
    })
}

/// One of the deflate bombs, perhaps with a byte changed.
fn bomb(rng: &mut Rng) -> Vec<u8> {
    let bomb = rng.pick(bombs()).cloned().unwrap_or_default();
    if rng.below(2) == 0 {
        bytes(rng, &bomb)
    } else {
        bomb
    }
}

/// A link carrying a mutated case: the case seeds' text is not at hand in
/// the share decoder's seeds, so the link is inflated, changed and packed
/// again.
fn link(rng: &mut Rng, d: &Dictionary, seed: &[u8]) -> Option<Vec<u8>> {
    let text = std::str::from_utf8(seed).ok()?;
    let body = text.trim_start_matches('#').strip_prefix("p1.")?;
    let packed = URL_SAFE_NO_PAD.decode(body).ok()?;
    let json = miniz_oxide::inflate::decompress_to_vec_with_limit(&packed, 1 << 20).ok()?;
    let changed = match rng.below(3) {
        0 => bytes(rng, &json),
        _ => self::json(rng, d, &json)?,
    };
    Some(fragment_of(&changed).into_bytes())
}

/// Up to eight byte-level changes: flips, new bytes, inserts, deletions,
/// repeats, cuts.
fn bytes(rng: &mut Rng, seed: &[u8]) -> Vec<u8> {
    const SPECIAL: &[u8] = b"\x00\xff\"{}[],:.-+eE0123456789 \t\r\n#\\;p";
    let mut out = seed.to_vec();
    for _ in 0..1 + rng.below(8) {
        let len = out.len();
        let at = rng.below(len + 1);
        match rng.below(7) {
            0 => {
                if let Some(b) = out.get_mut(at) {
                    *b ^= 1 << rng.below(8);
                }
            }
            1 => {
                if let Some(b) = out.get_mut(at) {
                    *b = *rng.pick(SPECIAL).unwrap_or(&b' ');
                }
            }
            2 => {
                let b = u8::try_from(rng.below(256)).unwrap_or(0);
                out.insert(at, b);
            }
            3 => {
                let end = (at + 1 + rng.below(16)).min(len);
                if at < end {
                    out.drain(at..end);
                }
            }
            4 => {
                let end = (at + 1 + rng.below(64)).min(len);
                if let Some(piece) = out.get(at..end).map(<[u8]>::to_vec) {
                    for _ in 0..1 + rng.below(8) {
                        out.splice(at..at, piece.iter().copied());
                    }
                }
            }
            5 => out.truncate(at),
            _ => out.insert(at, *rng.pick(SPECIAL).unwrap_or(&b'"')),
        }
    }
    out
}

/// The largest input a campaign builds (bombs and long lines aside, which
/// are made small and unpack or repeat to their size).
const MAX_INPUT: usize = 1 << 20;

/// A new input for `decoder` from one of `pool`.
pub fn mutate(decoder: Decoder, rng: &mut Rng, d: &Dictionary, pool: &[Vec<u8>]) -> Vec<u8> {
    let seed = rng.pick(pool).map_or(&[][..], Vec::as_slice);
    let structured = match decoder {
        Decoder::Case | Decoder::SavedState if rng.below(10) < 7 => json(rng, d, seed),
        Decoder::Csv if rng.below(10) < 7 => Some(csv(rng, d, seed)),
        Decoder::Share => match rng.below(10) {
            0 => Some(bomb(rng)),
            1..=5 => link(rng, d, seed),
            _ => None,
        },
        _ => None,
    };
    let mut out = structured.unwrap_or_else(|| bytes(rng, seed));
    out.truncate(MAX_INPUT);
    out
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    #[test]
    fn the_same_seed_gives_the_same_inputs() {
        let pool = vec![br#"{"a": [1, "x"]}"#.to_vec(), b"t,a\n1,2\n".to_vec()];
        let d = Dictionary::harvest(pool.iter().map(Vec::as_slice));
        let run = |seed| {
            let mut rng = Rng::new(seed);
            (0..50)
                .map(|_| mutate(Decoder::Case, &mut rng, &d, &pool))
                .collect::<Vec<_>>()
        };
        assert_eq!(run(7), run(7));
        assert_ne!(run(7), run(8));
    }

    #[test]
    fn links_and_bombs_are_links() {
        let mut rng = Rng::new(1);
        let fragment = fragment_of(br#"{"format": "plumbline-case", "version": 1}"#);
        let d = Dictionary::default();
        let changed = link(&mut rng, &d, fragment.as_bytes()).unwrap();
        assert!(changed.starts_with(b"p1."));
        assert!(bomb(&mut rng).starts_with(b"p1."));
    }
}

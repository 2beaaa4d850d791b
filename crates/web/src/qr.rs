//! A QR code of a share link, as the data for one SVG path: each row's
//! runs of dark modules become one rectangle each, so a code of a hundred
//! modules a side is one element, not thousands.
//!
//! The symbol comes from the `qrcodegen` crate, error correction "low"
//! (raised when it costs no extra size): the code is read off a screen,
//! not a worn label, and a lower level keeps the modules large.

use qrcodegen::{QrCode, QrCodeEcc};

/// The light margin around the symbol, in modules (the standard's minimum).
pub const QUIET: i32 = 4;

/// A QR code ready to draw.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct QrPicture {
    /// Modules per side, without the margin.
    pub modules: i32,
    /// The `viewBox` side, margin included.
    pub side: i32,
    /// The path's `d`: one `M x y h w v 1 h -w z` per run of dark modules.
    pub path: String,
}

/// The QR code of `text`, or `None` when it is too long for any QR code.
pub fn picture(text: &str) -> Option<QrPicture> {
    let code = QrCode::encode_text(text, QrCodeEcc::Low).ok()?;
    let n = code.size();
    let mut path = String::new();
    for y in 0..n {
        let mut x = 0;
        while x < n {
            if !code.get_module(x, y) {
                x += 1;
                continue;
            }
            let start = x;
            while x < n && code.get_module(x, y) {
                x += 1;
            }
            path.push_str(&format!(
                "M{} {}h{}v1h-{}z",
                start + QUIET,
                y + QUIET,
                x - start,
                x - start
            ));
        }
    }
    Some(QrPicture {
        modules: n,
        side: n + 2 * QUIET,
        path,
    })
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;

    /// The dark modules the path paints, read back from its runs.
    fn painted(p: &QrPicture) -> Vec<Vec<bool>> {
        let side = usize::try_from(p.side).unwrap();
        let mut grid = vec![vec![false; side]; side];
        for run in p.path.split('M').filter(|r| !r.is_empty()) {
            let nums: Vec<usize> = run
                .split(|c: char| !c.is_ascii_digit())
                .filter(|s| !s.is_empty())
                .map(|s| s.parse().unwrap())
                .collect();
            let (x, y, w) = (nums[0], nums[1], nums[2]);
            for cell in &mut grid[y][x..x + w] {
                *cell = true;
            }
        }
        grid
    }

    #[test]
    fn the_path_paints_exactly_the_dark_modules() {
        let text = "http://127.0.0.1:8080/tools/plumbline/#p1.abc";
        let p = picture(text).unwrap();
        let code = QrCode::encode_text(text, QrCodeEcc::Low).unwrap();
        let grid = painted(&p);
        for y in 0..p.side {
            for x in 0..p.side {
                let dark = (QUIET..QUIET + p.modules).contains(&x)
                    && (QUIET..QUIET + p.modules).contains(&y)
                    && code.get_module(x - QUIET, y - QUIET);
                let (ux, uy) = (usize::try_from(x).unwrap(), usize::try_from(y).unwrap());
                assert_eq!(grid[uy][ux], dark, "module {x},{y}");
            }
        }
    }

    #[test]
    fn a_demo_link_fits_and_a_huge_text_does_not() {
        let case = plumbline_core::case::Case::from_json(plumbline_core::demo::CASE_JSON).unwrap();
        let link = plumbline_core::share::link("https://example.invalid/tools/plumbline/", &case);
        let p = picture(&link).unwrap();
        // Version 20 or below: about a hundred modules, readable off a tablet.
        assert!(p.modules <= 97, "{} modules", p.modules);
        assert_eq!(p.side, p.modules + 8);
        assert_eq!(picture(&"x".repeat(3000)), None);
    }
}

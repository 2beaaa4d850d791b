//! The colour theme the user picked: a plain value of its own, so the
//! state, the saved texts and the toggle can all name it without one of
//! them depending on another.

/// The colour theme.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Theme {
    /// As the device prefers.
    Device,
    /// Light.
    Light,
    /// Dark.
    Dark,
}

impl Theme {
    /// The value of the page's `data-theme` attribute.
    pub fn key(self) -> &'static str {
        match self {
            Theme::Device => "device",
            Theme::Light => "light",
            Theme::Dark => "dark",
        }
    }

    /// The theme named by `key`, the device's for anything else.
    pub fn from_key(key: &str) -> Theme {
        match key {
            "light" => Theme::Light,
            "dark" => Theme::Dark,
            _ => Theme::Device,
        }
    }

    /// The next theme the toggle offers.
    pub fn next(self) -> Theme {
        match self {
            Theme::Device => Theme::Dark,
            Theme::Dark => Theme::Light,
            Theme::Light => Theme::Device,
        }
    }

    /// The theme in words, for the toggle.
    pub fn label(self) -> &'static str {
        match self {
            Theme::Device => "device",
            Theme::Light => "light",
            Theme::Dark => "dark",
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_theme_cycles_through_three() {
        let t = Theme::Device;
        assert_eq!(t.next().next().next(), t);
        assert_eq!(Theme::from_key(Theme::Dark.key()), Theme::Dark);
        assert_eq!(Theme::from_key("neon"), Theme::Device);
    }
}

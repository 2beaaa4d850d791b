//! Serde for the name enums used as map keys in case files.
//!
//! Derived enum deserializers hide a map key from error paths
//! (`readings.?.level`); reading the key as a plain string keeps it
//! (`readings.icp.level`) and lets the message list the valid names.

/// Implements `Serialize` and `Deserialize` through `key()` and `ALL`.
macro_rules! keyed_serde {
    ($($ty:ty),* $(,)?) => {$(
        impl serde::Serialize for $ty {
            fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
                serializer.serialize_str(self.key())
            }
        }

        impl<'de> serde::Deserialize<'de> for $ty {
            fn deserialize<D: serde::Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
                struct NameVisitor;

                impl serde::de::Visitor<'_> for NameVisitor {
                    type Value = $ty;

                    fn expecting(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
                        f.write_str("a name")
                    }

                    fn visit_str<E: serde::de::Error>(self, name: &str) -> Result<$ty, E> {
                        <$ty>::ALL
                            .into_iter()
                            .find(|x| x.key() == name)
                            .ok_or_else(|| {
                                E::custom(format!(
                                    "'{name}' is not a known name here; use one of {}",
                                    <$ty>::ALL.map(|x| x.key()).join(", ")
                                ))
                            })
                    }
                }

                deserializer.deserialize_str(NameVisitor)
            }
        }
    )*};
}

keyed_serde!(
    crate::landmark::Landmark,
    crate::reading::Quantity,
    crate::organ::Organ,
    crate::geometry::Segment,
);

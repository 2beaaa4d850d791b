//! Body proportions: where each landmark and joint sits on its segment, as a
//! fraction of standing body height H, plus the fixed front-to-back and
//! side-to-side offsets.
//!
//! The standing heights are the segment ratios of Drillis and Contini (1966),
//! as reproduced in biomechanics textbooks. They are quoted here from memory
//! and tested as such; the offsets in centimetres are our own assumptions and
//! carry wide uncertainties for that reason.

/// Standing height of a joint or landmark above the floor, as a fraction of
/// body height. Drillis and Contini (1966), from memory.
pub mod standing {
    /// Eye level.
    pub const EYE: f64 = 0.936;
    /// Shoulder joint.
    pub const SHOULDER: f64 = 0.818;
    /// Chest (nipple) level: the 4th intercostal space, the heart reference.
    pub const CHEST: f64 = 0.720;
    /// Elbow joint.
    pub const ELBOW: f64 = 0.630;
    /// Hip joint (greater trochanter).
    pub const HIP: f64 = 0.530;
    /// Wrist joint.
    pub const WRIST: f64 = 0.485;
    /// Knee joint.
    pub const KNEE: f64 = 0.285;
    /// Ankle joint.
    pub const ANKLE: f64 = 0.039;
    /// Chest width, side to side.
    pub const CHEST_WIDTH: f64 = 0.174;
}

/// Tragus sits about 1% of body height below eye level: the Frankfurt plane
/// passes through the ear canal and the lower rim of the orbit (assumed).
pub const TRAGUS: f64 = standing::EYE - 0.010;
/// The vertex, the top of the head: standing height itself.
pub const VERTEX: f64 = 1.0;
/// The posterior fossa's operative site, about 1% of H below the tragus
/// (assumed), behind it by [`forward_cm::POSTERIOR_FOSSA`].
pub const POSTERIOR_FOSSA: f64 = TRAGUS - 0.010;
/// Iliac crest, about 6% of H above the hip joint (assumed).
pub const ILIAC_CREST: f64 = standing::HIP + 0.060;
/// Kidney hilum (L1-L2), about 8% of H above the hip joint (assumed).
pub const KIDNEY: f64 = standing::HIP + 0.080;
/// Conus and lumbar enlargement (L1), about 9% of H above the hip (assumed).
pub const CORD_LUMBAR: f64 = standing::HIP + 0.090;
/// Thoracic cord (T6) taken at chest level (assumed).
pub const CORD_THORACIC: f64 = standing::CHEST;
/// Cervical cord (C5), about 3% of H above the shoulder joint (assumed).
pub const CORD_CERVICAL: f64 = standing::SHOULDER + 0.028;

/// Front-to-back offsets from the mid-axillary (mid-coronal) plane, in cm,
/// positive toward the front. Assumed; each carries ±2 cm.
pub mod forward_cm {
    /// Globe centre in front of the ear canal.
    pub const EYE: f64 = 8.0;
    /// The posterior fossa's surface behind the ear canal.
    pub const POSTERIOR_FOSSA: f64 = -7.0;
    /// Cervical cord behind the plane through the ear and shoulder.
    pub const CORD_CERVICAL: f64 = -2.0;
    /// Thoracic cord behind mid-chest.
    pub const CORD_THORACIC: f64 = -6.0;
    /// Lumbar cord behind mid-abdomen.
    pub const CORD_LUMBAR: f64 = -5.0;
    /// Kidney hilum behind mid-abdomen.
    pub const KIDNEY: f64 = -4.0;
}

/// Side-to-side offsets from the midline in cm, positive to the patient's
/// left. Assumed.
pub mod lateral_cm {
    /// Each eye from the midline (half the interpupillary distance).
    pub const EYE: f64 = 3.2;
    /// Each kidney hilum from the midline.
    pub const KIDNEY: f64 = 5.0;
}

/// Hip joint centres from the midline, as a fraction of H (assumed).
pub const HIP_HALF_WIDTH: f64 = 0.050;

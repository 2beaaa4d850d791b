//! The device as a level: the angle of a tablet or phone laid on the
//! backrest (or on the table), from the browser's orientation angles.
//!
//! The Device Orientation API gives β (about the device's side-to-side
//! axis) and γ (about its long axis), intrinsic, in degrees. The screen's
//! plane is then inclined from horizontal by acos(cos β · cos γ), whichever
//! way the device lies on the surface. Angles only: no pressure here.

/// How far from horizontal the device's screen is, degrees (0-180).
pub fn inclination_deg(beta_deg: f64, gamma_deg: f64) -> f64 {
    let c = beta_deg.to_radians().cos() * gamma_deg.to_radians().cos();
    c.clamp(-1.0, 1.0).acos().to_degrees()
}

/// The backrest angle for a device laid flat on the backrest: its
/// inclination less the table's head-up tilt (the backrest is measured
/// from the seat section, which tilts with the table), whole degrees, 0-90.
pub fn backrest_deg(inclination_deg: f64, tilt_deg: f64) -> f64 {
    (inclination_deg - tilt_deg).round().clamp(0.0, 90.0)
}

/// The table's tilt for a device laid on it with its top edge toward the
/// patient's head: head-up positive, whole degrees, -45 to 45.
pub fn tilt_deg(beta_deg: f64, gamma_deg: f64) -> f64 {
    let sign = if beta_deg < 0.0 { -1.0 } else { 1.0 };
    (sign * inclination_deg(beta_deg, gamma_deg))
        .round()
        .clamp(-45.0, 45.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() < 1e-9
    }

    #[test]
    fn the_screen_plane_is_measured_whichever_way_the_device_lies() {
        // Derived: lying along the slope, β is the slope; across it, γ is.
        assert!(close(inclination_deg(0.0, 0.0), 0.0));
        assert!(close(inclination_deg(30.0, 0.0), 30.0));
        assert!(close(inclination_deg(0.0, -30.0), 30.0));
        assert!(close(inclination_deg(-30.0, 0.0), 30.0));
        // Turned on the backrest, the plane's angle is unchanged: a 40°
        // slope read as β = 30° needs γ with cos γ = cos 40° / cos 30° (D).
        let gamma = (40f64.to_radians().cos() / 30f64.to_radians().cos())
            .acos()
            .to_degrees();
        assert!((inclination_deg(30.0, gamma) - 40.0).abs() < 1e-9);
    }

    #[test]
    fn the_backrest_is_read_from_the_seat_section() {
        assert_eq!(backrest_deg(44.6, 0.0), 45.0);
        assert_eq!(
            backrest_deg(45.0, 10.0),
            35.0,
            "a head-up tilt is not backrest"
        );
        assert_eq!(backrest_deg(95.0, 0.0), 90.0);
        assert_eq!(backrest_deg(3.0, 10.0), 0.0);
        assert_eq!(tilt_deg(-15.2, 0.0), -15.0);
        assert_eq!(tilt_deg(60.0, 0.0), 45.0);
    }
}

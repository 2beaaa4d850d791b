//! The ward's way to keep a record: a blood pressure typed with its time
//! (now by default) goes into the record as a sample of the source's
//! channels and, when it is the latest, becomes the reading on screen, so
//! the answer at the top is always the latest one.

use plumbline_core::units::PressureUnit;
use plumbline_core::usual::read_blood_pressure;

use crate::form::{Edit, Slot, SourcePart};
use crate::record::entry::{bp_readings, fits};
use crate::record::when::{When, WhenMode};
use crate::state::State;

/// How the ward row's time box is read: empty is now, `+5` is minutes after
/// the last entry, anything else a clock time (`08:40`).
pub fn when(text: &str) -> When {
    let text = text.trim();
    let mode = if text.is_empty() {
        WhenMode::Now
    } else if text.starts_with('+') {
        WhenMode::Elapsed
    } else {
        WhenMode::Clock
    };
    When {
        mode,
        text: text.to_owned(),
    }
}

impl State {
    /// Adds the ward row's blood pressure at its time; `now_s` is the
    /// device's time of day, seconds after midnight. A reading that cannot
    /// be added says why beside the row and changes nothing.
    pub(crate) fn add_reading(&mut self, now_s: f64) {
        let i = self.record.ward.source;
        let Some(id) = self.form.sources.get(i).map(|s| s.id.trim().to_owned()) else {
            self.record.ward.problem =
                Some("add a blood pressure source first (a cuff or a line)".to_owned());
            return;
        };
        let text = self.record.ward.bp.clone();
        let bp = match read_blood_pressure(&text, PressureUnit::MmHg) {
            Ok(bp) => bp,
            Err(why) => {
                self.record.ward.problem = Some(why);
                return;
            }
        };
        let r = &self.record;
        let at = match when(&r.ward.time).read(r.clock_start_s(), r.last_s(), now_s) {
            Ok(at) => at,
            Err(why) => {
                self.record.ward.problem = Some(why);
                return;
            }
        };
        if let Err(why) = fits(&r.spec, &id, at.t_s, &bp) {
            self.record.ward.problem = Some(why);
            return;
        }
        if r.last_s().is_none_or(|last| at.t_s >= last) {
            self.form
                .apply(Edit::Text(Slot::Source(i, SourcePart::BloodPressure), text));
            self.recheck();
        }
        let checked = match self.checked.clone().filter(|_| !self.is_stale()) {
            Some(c) => c,
            None => {
                self.record.ward.problem = Some(
                    "the reading is on screen; fix the marked entries, then add it again"
                        .to_owned(),
                );
                return;
            }
        };
        let readings = bp_readings(&self.record.spec, &id, &bp);
        match self
            .record
            .add_ward(at.t_s, at.clock_start, &readings, checked.basis())
        {
            Ok(()) => {
                self.record.ward.bp.clear();
                self.record.ward.time.clear();
            }
            Err(why) => self.record.ward.problem = Some(why),
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use crate::form::Edit;
    use crate::record::RecordAction;
    use crate::session::SessionAction;
    use crate::state::Theme;

    fn ward_state() -> State {
        let mut s = State::demo(Theme::Device);
        s.apply_session(SessionAction::NewCheck);
        s.form.apply(Edit::Text(Slot::Height, "170".into()));
        s.form.apply(Edit::SourceSite(
            0,
            plumbline_core::reading::Method::Cuff,
            plumbline_core::landmark::Landmark::UpperArmLeft,
        ));
        s.recheck();
        s
    }

    fn refused(s: &State) -> &str {
        s.record.ward.problem.as_deref().unwrap_or_default()
    }

    fn add(s: &mut State, time: &str, bp: &str, now_s: f64) {
        s.record
            .apply(RecordAction::WardTime(time.into()), None, false);
        s.record.apply(RecordAction::WardBp(bp.into()), None, false);
        s.add_reading(now_s);
    }

    #[test]
    fn ward_readings_fill_the_record_and_the_latest_is_on_screen() {
        let mut s = ward_state();
        assert!(s.is_stale(), "a new check has no blood pressure yet");
        let eight = 8.0 * 3600.0;
        add(&mut s, "", "100/60", eight);
        assert_eq!(s.record.ward.problem, None);
        assert!(!s.is_stale());
        assert_eq!(s.record.spec.clock_start.as_deref(), Some("08:00:00"));
        add(&mut s, "08:15", "90/50 (63)", eight + 1200.0);
        assert!(refused(&s).contains("without the device's mean"));
        add(&mut s, "08:15", "90/50", eight + 1200.0);
        add(&mut s, "08:05", "95/55", eight + 1200.0);
        let (_, rows) = crate::record::entry::reading_rows(&s.record.spec, "L arm cuff", 24);
        let times: Vec<f64> = rows.iter().map(|r| r.t_s).collect();
        assert_eq!(times, vec![0.0, 300.0, 900.0]);
        // The latest by time stays on screen, not the last typed.
        assert_eq!(s.form.sources[0].pressures.text(), "90/50");
        assert!(s.record.analysis.is_some());
        assert!(s.record.ward.bp.is_empty(), "the row is ready for the next");
        add(&mut s, "", "90/", eight + 1500.0);
        assert!(refused(&s).contains("not a blood pressure"));
        assert_eq!(s.record.ward.bp, "90/", "a refused reading stays as typed");
        assert_eq!(when("+5").mode, WhenMode::Elapsed);
    }
}

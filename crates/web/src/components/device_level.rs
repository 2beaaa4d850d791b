//! "Measure with this device": the tablet or phone laid on the backrest (or
//! the table) as a level. It shows the live angle and fills the box on a
//! tap; a measured backrest counts with a level's smaller uncertainty. Where
//! there is no orientation sensor, or its use is refused (iOS asks from a
//! tap), it says so and the box stays as typed.

use std::cell::RefCell;
use std::rc::Rc;

use gloo::events::EventListener;
use gloo::timers::callback::Timeout;
use wasm_bindgen::JsCast;
use web_sys::DeviceOrientationEvent;
use yew::prelude::*;

use crate::form::AngleKey;
use crate::level;

/// How long to wait for the sensor's first reading, ms.
const WAIT_MS: u32 = 2500;

/// What the level is doing.
#[derive(Clone, Copy, Debug, PartialEq)]
enum Reading {
    /// Not measuring.
    Off,
    /// Waiting for the sensor's first reading.
    Waiting,
    /// The sensor's angles now: β and γ, degrees.
    Live(f64, f64),
    /// No sensor answered.
    NoSensor,
    /// The browser or the user refused the sensor.
    Refused,
}

/// Props of [`DeviceLevel`].
#[derive(Properties, PartialEq)]
pub struct DeviceLevelProps {
    /// The angle measured: the backrest, or the table's tilt.
    pub angle: AngleKey,
    /// The table's head-up tilt now, degrees (the backrest is measured from
    /// the seat section).
    pub tilt_deg: f64,
    /// Called with the measured angle, degrees.
    pub onmeasure: Callback<f64>,
}

/// The sensor's listener and its first-reading timer, while measuring.
#[derive(Default)]
struct Sensor {
    _listener: Option<EventListener>,
    _timer: Option<Timeout>,
}

/// iOS's permission question, where the browser has one.
fn permission_question() -> Option<(js_sys::Function, wasm_bindgen::JsValue)> {
    let window = web_sys::window()?;
    let class = js_sys::Reflect::get(&window, &"DeviceOrientationEvent".into()).ok()?;
    let ask = js_sys::Reflect::get(&class, &"requestPermission".into()).ok()?;
    Some((ask.dyn_into::<js_sys::Function>().ok()?, class))
}

fn listen(reading: UseStateHandle<Reading>, sensor: Rc<RefCell<Sensor>>) {
    let window = gloo::utils::window();
    let on_event = reading.clone();
    let listener = EventListener::new(&window, "deviceorientation", move |e| {
        let angles = e
            .dyn_ref::<DeviceOrientationEvent>()
            .and_then(|o| Some((o.beta()?, o.gamma()?)));
        // Tenths of a degree: the screen changes only when the angle does.
        let tenth = |v: f64| (v * 10.0).round() / 10.0;
        on_event.set(match angles {
            Some((beta, gamma)) => Reading::Live(tenth(beta), tenth(gamma)),
            None => Reading::NoSensor,
        });
    });
    let on_timeout = reading.clone();
    let timer = Timeout::new(WAIT_MS, move || {
        if *on_timeout == Reading::Waiting {
            on_timeout.set(Reading::NoSensor);
        }
    });
    reading.set(Reading::Waiting);
    *sensor.borrow_mut() = Sensor {
        _listener: Some(listener),
        _timer: Some(timer),
    };
}

/// The level.
#[component]
pub fn DeviceLevel(props: &DeviceLevelProps) -> Html {
    let reading = use_state_eq(|| Reading::Off);
    let sensor = use_mut_ref(Sensor::default);
    {
        // No reading is kept once the level stops or the box goes.
        let sensor = sensor.clone();
        let on = !matches!(
            *reading,
            Reading::Off | Reading::NoSensor | Reading::Refused
        );
        use_effect_with(on, move |on| {
            if !*on {
                *sensor.borrow_mut() = Sensor::default();
            }
            move || *sensor.borrow_mut() = Sensor::default()
        });
    }
    let onstart = {
        let (reading, sensor) = (reading.clone(), sensor.clone());
        Callback::from(move |_: MouseEvent| match permission_question() {
            Some((ask, class)) => {
                let (reading, sensor) = (reading.clone(), sensor.clone());
                reading.set(Reading::Waiting);
                wasm_bindgen_futures::spawn_local(async move {
                    let answer = match ask.call0(&class) {
                        Ok(p) => match p.dyn_into::<js_sys::Promise>() {
                            Ok(p) => wasm_bindgen_futures::JsFuture::from(p).await.ok(),
                            Err(_) => None,
                        },
                        Err(_) => None,
                    };
                    if answer.and_then(|a| a.as_string()).as_deref() == Some("granted") {
                        listen(reading, sensor);
                    } else {
                        reading.set(Reading::Refused);
                    }
                });
            }
            None => listen(reading.clone(), sensor.clone()),
        })
    };
    let onstop = {
        let reading = reading.clone();
        Callback::from(move |_: MouseEvent| reading.set(Reading::Off))
    };
    let measured = match *reading {
        Reading::Live(beta, gamma) => Some(match props.angle {
            AngleKey::Tilt => level::tilt_deg(beta, gamma),
            _ => level::backrest_deg(level::inclination_deg(beta, gamma), props.tilt_deg),
        }),
        _ => None,
    };
    let onuse = {
        let (reading, onmeasure) = (reading.clone(), props.onmeasure.clone());
        Callback::from(move |_: MouseEvent| {
            if let Some(v) = measured {
                onmeasure.emit(v);
            }
            reading.set(Reading::Off);
        })
    };
    let how = match props.angle {
        AngleKey::Tilt => "Lay the device flat on the table, its top edge toward the head.",
        _ => "Lay the device flat on the backrest, along it.",
    };
    html! {
        <div class="level" role="group" aria-label="Measure the angle with this device">
            { match *reading {
                Reading::Off => html! {
                    <button type="button" class="level-start" onclick={onstart}>
                        <svg viewBox="0 0 24 24" aria-hidden="true" focusable="false">
                            <rect x="2" y="9" width="20" height="7" rx="2" class="icon-line" />
                            <circle cx="12" cy="12.5" r="1.8" class="theme-half" />
                        </svg>
                        <span>{ "Measure with this device" }</span>
                    </button>
                },
                Reading::Waiting => html! {
                    <p class="level-live" role="status">{ format!("{how} Waiting for the sensor…") }</p>
                },
                Reading::Live(..) => html! {
                    <div class="level-live">
                        <p role="status">
                            { how }{ " " }
                            <strong class="level-value">{ format!("{}°", measured.unwrap_or_default()) }</strong>
                        </p>
                        <button type="button" class="level-use" onclick={onuse}>
                            { format!("Use {}°", measured.unwrap_or_default()) }
                        </button>
                        <button type="button" onclick={onstop.clone()}>{ "Stop" }</button>
                    </div>
                },
                Reading::NoSensor => html! {
                    <p class="level-live" role="status">
                        { "This device reports no orientation sensor here: type the angle or step it. " }
                        <button type="button" onclick={onstop.clone()}>{ "Close" }</button>
                    </p>
                },
                Reading::Refused => html! {
                    <p class="level-live" role="status">
                        { "Reading the device's orientation was not allowed: type the angle or step it. " }
                        <button type="button" onclick={onstop}>{ "Close" }</button>
                    </p>
                },
            } }
        </div>
    }
}

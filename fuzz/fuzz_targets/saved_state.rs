//! libFuzzer target: the screen's saved state and saved record, read back and checked.

#![no_main]

libfuzzer_sys::fuzz_target!(|data: &[u8]| {
    plumbline_fuzz::Decoder::SavedState.run(data);
});

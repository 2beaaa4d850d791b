//! libFuzzer target: a share link's fragment, then everything done with its case.

#![no_main]

libfuzzer_sys::fuzz_target!(|data: &[u8]| {
    plumbline_fuzz::Decoder::Share.run(data);
});

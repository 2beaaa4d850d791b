//! libFuzzer target: a case document (JSON), then its check, the page's boxes for it and its record's exposure.

#![no_main]

libfuzzer_sys::fuzz_target!(|data: &[u8]| {
    plumbline_fuzz::Decoder::Case.run(data);
});

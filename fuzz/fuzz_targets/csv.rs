//! libFuzzer target: a record CSV file imported into the demo case, then its exposure.

#![no_main]

libfuzzer_sys::fuzz_target!(|data: &[u8]| {
    plumbline_fuzz::Decoder::Csv.run(data);
});

//! Any bytes given to the loader either load or are refused with diagnostics; a loaded
//! package analyses or is refused with a reason. Nothing may panic or hang.
#![no_main]

use libfuzzer_sys::fuzz_target;
use strainsheet::{analysis, input};

fuzz_target!(|data: &[u8]| {
    if let Ok(src) = input::from_bytes("fuzz.toml".into(), data.to_vec()) {
        if let Ok(pkg) = input::parse(&src) {
            let _ = analysis::analyze(&pkg, true);
        }
    }
});

//! Arbitrary text through the label grammar (forces, intensities,
//! command-line quantities), the MTEXT/TEXT decoders and the `\U+XXXX`
//! unescaper: none may panic, and what they return must hold what their
//! documentation promises.
#![no_main]

use hangline::dxf::unescape_unicode;
use hangline::model::LIMIT;
use hangline::read::label::{parse_force, parse_intensity, parse_label, parse_quantity_force, parse_quantity_length};
use hangline::read::mtext::{plain_mtext, plain_text};
use libfuzzer_sys::fuzz_target;

fuzz_target!(|text: &str| {
    // Errors are formatted too: the message is what the user sees.
    match parse_force(text) {
        // A label is a magnitude: positive, finite, below LIMIT.
        Ok(f) => assert!(f.value > 0.0 && f.value < LIMIT, "parse_force({text:?}) = {f:?}"),
        Err(e) => drop(e.to_string()),
    }
    match parse_intensity(text) {
        // Intensities as written: finite, ≥ 0, not both zero.
        Ok(w) => assert!(
            w.w0.is_finite() && w.w1.is_finite() && w.w0 >= 0.0 && w.w1 >= 0.0 && (w.w0 > 0.0 || w.w1 > 0.0),
            "parse_intensity({text:?}) = {w:?}"
        ),
        Err(e) => drop(e.to_string()),
    }
    match parse_label(text) {
        Ok(v) => drop(format!("{v:?}")),
        Err(e) => drop(e.to_string()),
    }
    match parse_quantity_force(text) {
        Ok((v, _)) => assert!(v.is_finite(), "parse_quantity_force({text:?}) = {v}"),
        Err(e) => drop(e.to_string()),
    }
    match parse_quantity_length(text) {
        Ok((v, _)) => assert!(v.is_finite(), "parse_quantity_length({text:?}) = {v}"),
        Err(e) => drop(e.to_string()),
    }
    let m = plain_mtext(text);
    let t = plain_text(text);
    let u = unescape_unicode(text);
    // The decoders drop or shorten codes; they never expand the text by more
    // than a character per input character (escapes only get shorter).
    for (name, out) in [("plain_mtext", &m), ("plain_text", &t), ("unescape_unicode", &u)] {
        assert!(out.chars().count() <= text.chars().count(), "{name}({text:?}) = {out:?} is longer than its input");
    }
    // Text without any code character passes through unchanged.
    if !text.contains(['\\', '%']) {
        assert_eq!(t, text, "plain_text changed {text:?}");
        if !text.contains(['{', '}', '^']) {
            assert_eq!(m, text, "plain_mtext changed {text:?}");
        }
    }
    if !text.contains('\\') {
        assert_eq!(u, text, "unescape_unicode changed {text:?}");
    }
    // What the reader does with a label: plain text, then the grammar.
    let _ = parse_force(&m);
    let _ = parse_force(&t);
    let _ = parse_force(&u);
});

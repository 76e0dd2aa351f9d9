//! Arbitrary bytes as a DXF drawing: scan, read, and when that succeeds the
//! whole job (solve, lay out, write), as a cable and as an arch.
//!
//! Error messages, the `inspect --json` view, the result line and the JSON
//! report are formatted as the binary would.
//!
//! What must hold, besides "no panic, no hang":
//! * the scan and the read either succeed or return an error;
//! * the scan gives the same index, or the same kind of error, when its ENTITIES
//!   section is split and scanned on two threads;
//! * whatever the writer produces scans again without error, and reads
//!   again to the same number of loads: the writer must never produce a
//!   drawing the reader rejects;
//! * every handle in the output lies below its `$HANDSEED` (DXF reference,
//!   header variables: the next available handle).
#![no_main]

use hangline::dxf::{DxfError, File, Pairs, ScanOptions};
use hangline::layout::result_line;
use hangline::model::Structure;
use hangline::pipeline::{ForceValue, Given, Job, LengthValue, run};
use hangline::read::{ReadOptions, read, scan_options};
use hangline::report::{inspection, report};
use hangline::solve::Form;
use hangline::write::OutputLayers;
use libfuzzer_sys::fuzz_target;

fuzz_target!(|bytes: &[u8]| {
    let options = ReadOptions::default();
    let layers = OutputLayers::default();
    let scan = scan_options(&options.layers, layers.all());
    // Every error is formatted too: its message is what the user sees.
    let scanned = File::scan(bytes, &scan);
    same_on_two_threads(bytes, &scan, &scanned);
    let file = match scanned {
        Ok(f) => f,
        Err(e) => return drop(e.to_string()),
    };
    let reading = match read(&file, &options) {
        Ok(r) => r,
        Err(e) => return drop(e.to_string()),
    };
    // What `hangline inspect --json` prints.
    let _ = serde_json::to_string(&inspection("fuzz.dxf", &reading));
    let structure = &reading.structure;
    for (form, given) in jobs(structure) {
        let job = Job {
            read: options.clone(),
            form,
            given,
            layout: Default::default(),
            force_scale: None,
            layers: layers.clone(),
            self_weight: None,
            axial_stiffness: None,
            chord_tolerance: None,
        };
        let mut out = Vec::new();
        let outcome = match run(bytes, &job, &mut out) {
            Ok(o) => o,
            Err(e) => {
                drop(e.to_string());
                continue;
            }
        };
        // What `hangline solve` prints and writes with --report.
        let _ = result_line(&outcome.reading.structure, &outcome.solution);
        let _ = serde_json::to_string(&report(
            "fuzz.dxf",
            &outcome.reading,
            &outcome.carried,
            &outcome.solution,
            Some(&outcome.placement),
        ));
        let again = match File::scan(&out, &scan) {
            Ok(f) => f,
            Err(e) => panic!("the writer's output ({form}) does not scan: {e}"),
        };
        handles_below_seed(&again);
        match read(&again, &options) {
            Ok(r) => assert_eq!(
                r.structure.loads().len(),
                structure.loads().len(),
                "the writer's output ({form}) reads to another number of loads"
            ),
            Err(e) => panic!("the writer's output ({form}) does not read: {e}"),
        }
    }
});

/// Scans again with the ENTITIES section split in two and scanned on two
/// threads (`parallel_from: 0`; by default only sections of 8 MiB and more
/// are split, which no fuzz input reaches) and panics unless the result is
/// the same: the same kind of error, or the same index.
fn same_on_two_threads(bytes: &[u8], scan: &ScanOptions, one: &Result<File<'_>, DxfError>) {
    let two = File::scan(bytes, &ScanOptions { parallel_from: 0, ..scan.clone() });
    match (one, &two) {
        (Ok(a), Ok(b)) => {
            assert_eq!(a.entities, b.entities, "entities differ on two threads");
            assert_eq!(a.entities_start, b.entities_start, "entities_start differs on two threads");
            assert_eq!(a.entities_end, b.entities_end, "entities_end differs on two threads");
            // Debug text, so that NaN compares equal to NaN.
            assert_eq!(format!("{:?}", a.extents), format!("{:?}", b.extents), "extents differ on two threads");
            assert_eq!(a.max_handle, b.max_handle, "max_handle differs on two threads");
            assert_eq!(a.paper_space_kept, b.paper_space_kept, "paper_space_kept differs on two threads");
            assert_eq!(a.header, b.header, "header differs on two threads");
            assert_eq!(a.tables, b.tables, "tables differ on two threads");
            assert_eq!(a.blocks, b.blocks, "blocks differ on two threads");
            assert_eq!(a.warnings, b.warnings, "warnings differ on two threads");
        }
        // The same kind of error; its location may be a byte offset on two
        // threads where one thread counts lines.
        (Err(a), Err(b)) => assert_eq!(
            std::mem::discriminant(a),
            std::mem::discriminant(b),
            "the scan fails differently on two threads: {a} / {b}"
        ),
        (a, b) => panic!(
            "one thread: {}; two threads: {}",
            a.as_ref().map_or_else(ToString::to_string, |_| "ok".into()),
            b.as_ref().map_or_else(ToString::to_string, |_| "ok".into())
        ),
    }
}

/// Panics unless every handle (codes 5 and 105) before `0 EOF` is below
/// the `$HANDSEED` of a drawing that has one, the seed's own value apart.
fn handles_below_seed(file: &File<'_>) {
    let Some(seed) = file.header_text("$HANDSEED").and_then(|s| u64::from_str_radix(s.trim(), 16).ok()) else {
        return;
    };
    if seed == 0 {
        // A drawing whose handles are all 0: the writer added none.
        return;
    }
    let Ok(mut pairs) = Pairs::new(file.bytes) else { return };
    let seed_at = file.header_var("$HANDSEED").and_then(|v| v.values.first()).map(|(_, span)| span.start);
    while let Ok(Some(p)) = pairs.next_pair() {
        if p.code == 0 && p.is("EOF") {
            break;
        }
        if (p.code == 5 || p.code == 105) && Some(p.value.0) != seed_at {
            if let Some(h) = p.handle() {
                assert!(h < seed, "the output holds handle {h:X} at byte {}, not below $HANDSEED {seed:X}", p.start);
            }
        }
    }
}

/// Conditions that make three with the structure's fixed supports: a sag (or
/// rise) of a tenth of the span when both supports are fixed points, else a
/// thrust equal to the total load, a level point near mid-span and, with two
/// tower axes, a point above mid-span.
fn jobs(s: &Structure) -> Vec<(Form, Vec<Given>)> {
    let span = s.span();
    let mid = s.left().x() + span / 2.0;
    // Near mid-span but off the round fractions where drawn loads sit.
    let level = s.left().x() + span * 0.4871;
    let total: f64 = s.loads().iter().map(|l| l.magnitude()).sum();
    let thrust = Given::Thrust(ForceValue { value: if total > 0.0 { total } else { 1.0 }, unit: None });
    let tenth = LengthValue { value: span.abs() / 10.0, unit: None };
    let fixed = [s.left(), s.right()].iter().filter(|p| p.fixed_point().is_some()).count();
    match fixed {
        2 => vec![(Form::Cable, vec![Given::Sag(tenth)]), (Form::Arch, vec![Given::Rise(tenth)])],
        1 => {
            vec![(Form::Cable, vec![thrust, Given::LevelAt(level)]), (Form::Arch, vec![thrust, Given::LevelAt(level)])]
        }
        _ => {
            let y = s.loads().iter().map(|l| l.anchor.y).fold(0.0_f64, f64::max) + span.abs() / 10.0;
            vec![
                (Form::Cable, vec![Given::Through(mid, y), thrust, Given::LevelAt(level)]),
                (Form::Arch, vec![Given::Through(mid, y), thrust, Given::LevelAt(level)]),
            ]
        }
    }
}

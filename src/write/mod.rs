//! The writer: the input's bytes, unchanged, with the tool's additions
//! spliced in.
//!
//! Nothing of the user's drawing is parsed and re-emitted: the output is the
//! input copied run by run, with these edits only —
//! * new LAYER records before the LAYER table's `ENDTAB` (count raised), and
//!   the tool's DIMSTYLE before the DIMSTYLE table's `ENDTAB`;
//! * for each dimension, a BLOCK_RECORD (R13 on) and an anonymous `*D` block
//!   holding its geometry, before the BLOCKS section's `ENDSEC`;
//! * new entities, owned by model space, before the ENTITIES section's `ENDSEC`;
//! * `$HANDSEED` raised past every handle used;
//! * the tool's own entities from an earlier run (on its output layers), their
//!   `*D` blocks and block records, left out — so that a second run replaces
//!   its layers instead of piling up copies.
//!
//! New pairs are encoded like the input's (ASCII or binary, line ends, text
//! encoding) by [`crate::dxf::Encoder`].

mod encode;

use std::collections::HashSet;
use std::io::Write;
use std::ops::Range;

use thiserror::Error;

use crate::dxf::{Encoder, File, Release};
use crate::layout::{Additions, Role, Shape};
use encode::{DIM_STYLE_NAME, Handles, Pen};

/// The layer name of each output role.
#[derive(Clone, Debug, PartialEq)]
pub struct OutputLayers {
    names: Vec<(Role, String)>,
}

impl Default for OutputLayers {
    fn default() -> Self {
        OutputLayers { names: Role::ALL.iter().map(|r| (*r, r.default_layer().to_string())).collect() }
    }
}

impl OutputLayers {
    /// The layer for `role`.
    #[must_use]
    pub fn get(&self, role: Role) -> &str {
        self.names.iter().find(|(r, _)| *r == role).map_or(role.default_layer(), |(_, n)| n.as_str())
    }

    /// Renames a role's layer.
    pub fn set(&mut self, role: Role, name: &str) {
        for (r, n) in &mut self.names {
            if *r == role {
                *n = name.to_string();
            }
        }
    }

    /// Every output layer name.
    pub fn all(&self) -> impl Iterator<Item = &str> {
        self.names.iter().map(|(_, n)| n.as_str())
    }
}

/// Checks a layer name for the given release (DXF reference, symbol table
/// names: up to 255 characters without `<>/\":;?*|=‘` from R2000; up to 31
/// of letters, digits, `$`, `-` and `_` in R12).
pub fn check_layer_name(name: &str, release: Release) -> Result<(), String> {
    if name.trim().is_empty() {
        return Err("a layer name cannot be empty".into());
    }
    if release < Release::R2000 {
        let ok = name.len() <= 31 && name.chars().all(|c| c.is_ascii_alphanumeric() || matches!(c, '$' | '-' | '_'));
        if !ok {
            return Err(format!(
                "'{name}' is not a valid R12–R14 layer name: use up to 31 letters, digits, $, - and _"
            ));
        }
    } else if name.chars().count() > 255 || name.chars().any(|c| "<>/\\\":;?*|=`".contains(c) || c.is_control()) {
        return Err(format!("'{name}' is not a valid layer name: up to 255 characters, none of <>/\\\":;?*|=`"));
    }
    Ok(())
}

/// True when `layer` is `base` with a variant's suffix
/// (`HANGLINE-PROFILE-SAG-4` for `HANGLINE-PROFILE`), ignoring case.
#[must_use]
pub fn is_variant_of(base: &str, layer: &str) -> bool {
    let (b, l) = (base.to_uppercase(), layer.to_uppercase());
    l.strip_prefix(&b)
        .and_then(|rest| rest.strip_prefix('-'))
        .and_then(|rest| rest.split_once('-'))
        .is_some_and(|(key, value)| !value.is_empty() && crate::layout::VARIANT_KEYS.contains(&key))
}

/// Why the output could not be written.
#[derive(Debug, Error)]
pub enum WriteError {
    /// The drawing lacks something the additions must be attached to.
    #[error("cannot add to this drawing: {0}; open and save it in CAD as a complete drawing, then run again")]
    Structure(String),
    /// An output layer name the drawing's version does not allow.
    #[error("{0}; choose another with --layer ROLE=NAME")]
    LayerName(String),
    /// Writing failed.
    #[error("could not write the output: {0}")]
    Io(#[from] std::io::Error),
}

/// What the writer did.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Summary {
    /// Entities of an earlier run removed from the output layers.
    pub replaced: usize,
    /// Entities added to model space.
    pub added: usize,
    /// Layers created.
    pub new_layers: Vec<String>,
    /// Dimension blocks created.
    pub blocks: usize,
}

/// A table's entry count (group code 70, a 16-bit integer in the DXF
/// reference), kept in range whatever the drawing held.
fn table_count(n: i64) -> i64 {
    n.clamp(0, i64::from(i16::MAX))
}

/// One edit of the input: the bytes in `range` are replaced by `bytes`
/// (an empty range inserts).
struct Edit {
    range: Range<usize>,
    bytes: Vec<u8>,
    order: usize,
}

/// The output as a sequence of runs: pieces of the input to copy as they
/// are, and new bytes. Applying it needs the input's bytes (in memory, or a
/// file to copy ranges from — which lets the operating system copy the
/// unchanged bulk without it passing through this program).
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Plan {
    runs: Vec<Run>,
}

/// One run of the output.
#[derive(Clone, Debug, PartialEq)]
pub enum Run {
    /// These bytes of the input, unchanged.
    Copy(Range<usize>),
    /// New bytes.
    Insert(Vec<u8>),
}

impl Plan {
    /// The runs in output order.
    #[must_use]
    pub fn runs(&self) -> &[Run] {
        &self.runs
    }

    /// Writes the output, taking the input's bytes from `input`.
    pub fn apply(&self, input: &[u8], out: &mut dyn Write) -> std::io::Result<()> {
        for run in &self.runs {
            match run {
                Run::Copy(r) => out.write_all(&input[r.clone()])?,
                Run::Insert(b) => out.write_all(b)?,
            }
        }
        Ok(())
    }

    /// The output's length in bytes.
    #[must_use]
    pub fn len(&self) -> usize {
        self.runs
            .iter()
            .map(|r| match r {
                Run::Copy(r) => r.len(),
                Run::Insert(b) => b.len(),
            })
            .sum()
    }

    /// True when the output is empty (never, for a drawing).
    #[must_use]
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }
}

/// Writes `file` with `additions` to `out`.
pub fn write(
    file: &File<'_>,
    additions: &Additions,
    layers: &OutputLayers,
    out: &mut dyn Write,
) -> Result<Summary, WriteError> {
    let (plan, summary) = plan(file, additions, layers)?;
    plan.apply(file.bytes, out)?;
    Ok(summary)
}

/// Plans the output of `file` with `additions`: what [`write`] writes.
pub fn plan(file: &File<'_>, additions: &Additions, layers: &OutputLayers) -> Result<(Plan, Summary), WriteError> {
    for name in layers.all() {
        check_layer_name(name, file.release).map_err(WriteError::LayerName)?;
    }
    let layer_of = |index: usize, role: Role| -> String {
        match additions.suffix(index) {
            Some(s) => format!("{}-{s}", layers.get(role)),
            None => layers.get(role).to_string(),
        }
    };
    for v in &additions.variants {
        for i in v.items.clone() {
            if let Some(item) = additions.items.get(i) {
                check_layer_name(&layer_of(i, item.role), file.release).map_err(WriteError::LayerName)?;
            }
        }
    }
    let mut edits: Vec<Edit> = Vec::new();
    let mut push = |range: Range<usize>, bytes: Vec<u8>| {
        let order = edits.len();
        edits.push(Edit { range, bytes, order });
    };
    let mut summary = Summary::default();
    let is_tool_layer =
        |layer: &str| layers.all().any(|n| crate::dxf::names_match(n, layer) || is_variant_of(n, layer));

    // The tool's entities from an earlier run, and the blocks their dimensions own.
    let mut old_blocks: HashSet<String> = HashSet::new();
    for e in file.entities.iter().filter(|e| is_tool_layer(&e.layer)) {
        if e.kind == "DIMENSION"
            && let Some(p) = file.pairs_in(&e.span).find(|p| p.code == 2)
        {
            old_blocks.insert(file.text(p.raw).trim().to_uppercase());
        }
        push(e.span.clone(), Vec::new());
        summary.replaced += 1;
    }
    for b in file.blocks.iter().filter(|b| old_blocks.contains(&b.name.to_uppercase())) {
        push(b.span.clone(), Vec::new());
    }
    let modern = file.release.has_subclasses();
    let record_table = file.table("BLOCK_RECORD");
    let mut removed_records = 0;
    if let Some(t) = record_table {
        for r in t.records.iter().filter(|r| old_blocks.contains(&r.name.to_uppercase())) {
            push(r.span.clone(), Vec::new());
            removed_records += 1;
        }
    }

    // Handles: from $HANDSEED, but never below a handle already in use.
    let uses_handles = modern || file.max_handle > 0 || file.header_i64("$HANDLING") == Some(1);
    let seed_var = file.header_var("$HANDSEED");
    let seed = if uses_handles {
        let declared = seed_var
            .and_then(|v| v.values.first())
            .and_then(|(_, span)| std::str::from_utf8(&file.bytes[span.clone()]).ok())
            .and_then(|s| u64::from_str_radix(s.trim(), 16).ok())
            .unwrap_or(1);
        Some(declared.max(file.max_handle.saturating_add(1)))
    } else {
        None
    };
    let mut handles = Handles::new(seed);

    let text_style = file.table("STYLE").and_then(|t| t.find("STANDARD")).map(|r| r.name.clone());
    let mut pen = Pen { enc: Encoder::for_file(file), release: file.release, handles: &mut handles, text_style };

    let model_space = if modern {
        let record = record_table
            .and_then(|t| t.find("*Model_Space"))
            .ok_or_else(|| WriteError::Structure("it has no *Model_Space block record".into()))?;
        Some(record.handle.ok_or_else(|| WriteError::Structure("its *Model_Space block record has no handle".into()))?)
    } else {
        None
    };

    // Layers.
    if let Some(table) = file.table("LAYER") {
        let linetype = file
            .table("LTYPE")
            .and_then(|t| t.find("CONTINUOUS"))
            .map_or_else(|| "CONTINUOUS".to_string(), |r| r.name.clone());
        let plot_style =
            table.find("0").and_then(|r| file.pairs_in(&r.span).find(|p| p.code == 390)).and_then(|p| p.handle());
        let mut added = 0;
        // A layer for each role (and variant) that draws something, in the
        // order of the roles.
        let mut wanted: Vec<(usize, Role, String)> = Vec::new();
        for (i, item) in additions.items.iter().enumerate() {
            let name = layer_of(i, item.role);
            if !wanted.iter().any(|(_, _, n)| crate::dxf::names_match(n, &name)) {
                let rank = Role::ALL.iter().position(|r| *r == item.role).unwrap_or(usize::MAX);
                wanted.push((rank, item.role, name));
            }
        }
        wanted.sort_by_key(|(rank, _, _)| *rank);
        for (_, role, name) in &wanted {
            if table.find(name).is_none() && !summary.new_layers.iter().any(|n| crate::dxf::names_match(n, name)) {
                pen.layer_record(table.handle, name, role.colour(), &linetype, plot_style);
                summary.new_layers.push(name.clone());
                added += 1;
            }
        }
        push(table.end..table.end, pen.enc.take());
        if let Some((count, span)) = &table.count {
            push(span.clone(), pen.enc.value_int(70, table_count(count.saturating_add(added))));
        }
    } else if modern {
        return Err(WriteError::Structure("it has no LAYER table".into()));
    }

    // Dimensions: style, block records and blocks.
    let dims: Vec<&Shape> =
        additions.items.iter().map(|i| &i.shape).filter(|s| matches!(s, Shape::Dimension(_))).collect();
    let mut block_names: Vec<String> = Vec::new();
    if !dims.is_empty() {
        if let Some(t) = file.table("DIMSTYLE")
            && t.find(DIM_STYLE_NAME).is_none()
        {
            pen.dim_style_record(t.handle, &additions.dim_style);
            push(t.end..t.end, pen.enc.take());
            if let Some((count, span)) = &t.count {
                push(span.clone(), pen.enc.value_int(70, table_count(count.saturating_add(1))));
            }
        }
        let mut next_d = file
            .blocks
            .iter()
            .filter(|b| !old_blocks.contains(&b.name.to_uppercase()))
            .filter_map(|b| b.name.strip_prefix("*D").or_else(|| b.name.strip_prefix("*d")))
            .filter_map(|n| n.parse::<u64>().ok())
            .max()
            .unwrap_or(0)
            .checked_add(1)
            .ok_or_else(|| {
                WriteError::Structure("its anonymous block numbers are used up (*D18446744073709551615)".into())
            })?;
        let mut records = Vec::new();
        let mut blocks = Vec::new();
        for shape in &dims {
            let Shape::Dimension(d) = shape else { continue };
            let name = format!("*D{next_d}");
            next_d = next_d
                .checked_add(1)
                .ok_or_else(|| WriteError::Structure("its anonymous block numbers are used up".into()))?;
            let record = if modern {
                let t = record_table.ok_or_else(|| WriteError::Structure("it has no BLOCK_RECORD table".into()))?;
                let h = pen.block_record(t.handle, &name);
                records.extend(pen.enc.take());
                h
            } else {
                None
            };
            pen.block(&name, record, &d.geometry);
            blocks.extend(pen.enc.take());
            block_names.push(name);
        }
        summary.blocks = block_names.len();
        if modern && let Some(t) = record_table {
            push(t.end..t.end, records);
            if let Some((count, span)) = &t.count {
                let n = count.saturating_sub(removed_records).saturating_add(block_names.len() as i64);
                push(span.clone(), pen.enc.value_int(70, table_count(n)));
            }
        }
        match (file.blocks_end, file.entities_start) {
            (Some(end), _) => push(end..end, blocks),
            (None, Some(start)) => {
                // A drawing with no BLOCKS section gets one, before ENTITIES.
                let mut e = Encoder::for_file(file);
                e.text(0, "SECTION").text(2, "BLOCKS");
                let mut section = e.take();
                section.extend(blocks);
                e.text(0, "ENDSEC");
                section.extend(e.take());
                push(start..start, section);
            }
            (None, None) => return Err(WriteError::Structure("it has no ENTITIES section".into())),
        }
    } else if let Some(t) = record_table
        && removed_records > 0
        && let Some((count, span)) = &t.count
    {
        push(span.clone(), pen.enc.value_int(70, table_count(count.saturating_sub(removed_records))));
    }

    // Entities.
    let mut dim_index = 0;
    for (i, item) in additions.items.iter().enumerate() {
        let block = if matches!(item.shape, Shape::Dimension(_)) {
            dim_index += 1;
            block_names.get(dim_index - 1).map(String::as_str)
        } else {
            None
        };
        pen.shape(&item.shape, model_space, &layer_of(i, item.role), item.colour, block);
        summary.added += 1;
    }
    let entities_end = file.entities_end.ok_or_else(|| WriteError::Structure("it has no ENTITIES section".into()))?;
    push(entities_end..entities_end, pen.enc.take());

    // $HANDSEED last, once every handle is taken; added to the header when
    // a drawing with handles lacks it.
    if let Some(seed) = handles.seed() {
        let mut enc = Encoder::for_file(file);
        match seed_var.and_then(|v| v.values.first()) {
            Some((_, span)) => push(span.clone(), enc.value_text(&format!("{seed:X}"))),
            None => {
                if let Some(end) = file.header_end {
                    enc.text(9, "$HANDSEED").handle(5, seed);
                    push(end..end, enc.take());
                }
            }
        }
    }

    if handles.exhausted {
        return Err(WriteError::Structure(
            "its handles run up to FFFFFFFFFFFFFFFF, so none are left for the additions".into(),
        ));
    }
    Ok((splice(file.bytes.len(), edits), summary))
}

/// The runs that copy an input of `len` bytes with the edits applied.
fn splice(len: usize, mut edits: Vec<Edit>) -> Plan {
    edits.sort_by_key(|e| (e.range.start, e.range.end > e.range.start, e.order));
    let mut runs = Vec::with_capacity(2 * edits.len() + 1);
    let mut at = 0;
    for e in edits {
        if e.range.start < at {
            // Inside a run already removed (a sub-entity of a removed entity).
            continue;
        }
        if e.range.start > at {
            runs.push(Run::Copy(at..e.range.start));
        }
        if !e.bytes.is_empty() {
            runs.push(Run::Insert(e.bytes));
        }
        at = e.range.end;
    }
    if at < len {
        runs.push(Run::Copy(at..len));
    }
    Plan { runs }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn splice_applies_inserts_and_removals_in_order() {
        let src = b"0123456789";
        let edits = vec![
            Edit { range: 5..5, bytes: b"b".to_vec(), order: 1 },
            Edit { range: 2..5, bytes: Vec::new(), order: 0 },
            Edit { range: 5..5, bytes: b"c".to_vec(), order: 2 },
            Edit { range: 9..10, bytes: b"X".to_vec(), order: 3 },
        ];
        let mut out = Vec::new();
        let plan = splice(src.len(), edits);
        plan.apply(src, &mut out).unwrap();
        assert_eq!(out, b"01bc5678X");
        assert_eq!(plan.len(), out.len());
    }

    use crate::dxf::{File, ScanOptions};
    use crate::layout::{DimStyle, Item};
    use kurbo::{Line, Point};

    const R12: &str = "0\nSECTION\n2\nHEADER\n9\n$ACADVER\n1\nAC1009\n0\nENDSEC\n\
0\nSECTION\n2\nTABLES\n0\nTABLE\n2\nLAYER\n70\n1\n0\nLAYER\n5\n10\n2\n0\n70\n0\n62\n7\n6\nCONTINUOUS\n0\nENDTAB\n0\nENDSEC\n\
0\nSECTION\n2\nENTITIES\n0\nLINE\n5\n2F\n8\nLOADS\n10\n1.0\n20\n0.0\n11\n1.0\n21\n2.0\n0\nENDSEC\n0\nEOF\n";

    #[test]
    fn variant_layers_are_recognised_by_their_key_and_value() {
        assert!(is_variant_of("HANGLINE-PROFILE", "hangline-profile-SAG-4_5"));
        assert!(is_variant_of("HANGLINE-PROFILE", "HANGLINE-PROFILE-LEVELAT--3"));
        assert!(!is_variant_of("HANGLINE-PROFILE", "HANGLINE-PROFILE"));
        assert!(!is_variant_of("HANGLINE-PROFILE", "HANGLINE-PROFILE-OLD"));
        assert!(!is_variant_of("HANGLINE-PROFILE", "HANGLINE-PROFILE-SAG-"));
        assert!(!is_variant_of("HANGLINE-PROFILE", "HANGLINE-PROFILES-SAG-4"));
    }

    fn additions() -> Additions {
        let line = Shape::Line(Line::new(Point::new(0.0, 0.0), Point::new(1.0, 1.0)));
        Additions {
            items: vec![Item { role: Role::Profile, shape: line, colour: None }],
            variants: Vec::new(),
            dim_style: DimStyle {
                text_height: 0.2,
                arrow: 0.2,
                ext_offset: 0.05,
                ext_extend: 0.1,
                gap: 0.05,
                decimals: 2,
                literal_text: false,
            },
        }
    }

    fn write_str(src: &str) -> String {
        let layers = OutputLayers::default();
        let options = ScanOptions { keep_layers: layers.all().map(String::from).collect(), ..ScanOptions::default() };
        let file = File::scan(src.as_bytes(), &options).unwrap();
        let mut out = Vec::new();
        write(&file, &additions(), &layers, &mut out).unwrap();
        String::from_utf8(out).unwrap()
    }

    #[test]
    fn the_input_survives_and_handles_continue() {
        let out = write_str(R12);
        // The header, the layer record and the user's line, byte for byte.
        for part in [&R12[..R12.find("0\nENDSEC").unwrap()], "0\nLAYER\n5\n10\n2\n0\n70\n0\n62\n7\n6\nCONTINUOUS\n"] {
            assert!(out.contains(part), "lost: {part}");
        }
        assert!(out.contains("0\nLINE\n5\n2F\n8\nLOADS\n10\n1.0\n20\n0.0\n11\n1.0\n21\n2.0\n"));
        // The drawing had handles but no $HANDSEED: new handles follow the
        // largest (2F), and the seed is recorded.
        assert!(out.contains("  5\n30\n"), "{out}");
        assert!(out.contains("$HANDSEED\n  5\n"), "{out}");
        // One layer added (only roles that draw something get one): 1 to 2.
        assert!(out.contains("LAYER\n70\n     2\n"), "{out}");
    }

    #[test]
    fn a_second_run_replaces_the_first() {
        let once = write_str(R12);
        let twice = write_str(&once);
        assert_eq!(once.matches("HANGLINE-PROFILE").count(), twice.matches("HANGLINE-PROFILE").count());
        assert_eq!(twice.matches("\nLINE\n").count(), 2, "the user's line and one profile line");
    }

    #[test]
    fn layer_names_per_release() {
        assert!(check_layer_name("HANGLINE-PROFILE", Release::R12).is_ok());
        assert!(check_layer_name("Seil Süd", Release::R12).is_err());
        assert!(check_layer_name("Seil Süd", Release::R2018).is_ok());
        assert!(check_layer_name("a/b", Release::R2018).is_err());
        assert!(check_layer_name("", Release::R2018).is_err());
    }
}

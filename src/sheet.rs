//! The calculation sheet (`--sheet FILE.md` or `.html`): what a checker
//! follows — the inputs as read, the conditions, the method, the segments
//! with their forces, the reactions, the self-checks, the caution, and the
//! preview picture — made from the [`Report`], so that the sheet and the
//! JSON can never disagree.
//!
//! Markdown is written here; HTML is the same Markdown rendered by
//! `pulldown-cmark`, with the preview inlined.

use std::fmt::Write as _;

use crate::model::fmt_num;
use crate::report::Report;

/// How the sheet shows the preview picture.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Picture<'a> {
    /// No picture.
    None,
    /// A link to the picture's file (a path relative to the sheet).
    Link(&'a str),
    /// The SVG document itself, inlined (HTML only; Markdown links instead).
    Inline {
        /// The SVG text.
        svg: &'a str,
        /// A path relative to the sheet, for the Markdown link.
        link: &'a str,
    },
}

/// A number for the sheet: six significant decimals at most, as elsewhere.
fn n(v: f64) -> String {
    fmt_num(v)
}

/// The sheet as Markdown.
#[must_use]
pub fn markdown(r: &Report, picture: Picture<'_>) -> String {
    let u = r.units;
    let (lu, fu) = (u.length.to_string(), u.force.to_string());
    let mut s = String::new();
    let _ = writeln!(s, "# Funicular {}: calculation sheet\n", r.structure);
    let _ = writeln!(s, "> **Caution.** {}\n", r.caution);
    let _ = writeln!(s, "Made by {} from `{}`.\n", r.tool, r.input.file);

    s.push_str("## 1. Inputs as read\n\n");
    let _ = writeln!(
        s,
        "Drawing: DXF {} ({}); lengths in {lu} ({}), forces in {fu} ({}).\n",
        r.input.version,
        if r.input.binary { "binary" } else { "ASCII" },
        r.input.length_unit_from,
        r.input.force_unit_from
    );
    s.push_str("| support | x | y | kind | entity |\n| --- | ---: | ---: | --- | --- |\n");
    for (k, sp) in r.supports.iter().enumerate() {
        let _ = writeln!(
            s,
            "| {} | {} | {} | {} | {} |",
            if k == 0 { "left" } else { "right" },
            n(sp.x),
            n(sp.y),
            sp.kind,
            sp.handle.as_deref().unwrap_or("-")
        );
    }
    let _ = writeln!(
        s,
        "\n| load | acts through | force x ({fu}) | force y ({fu}) | magnitude ({fu}) | label | entity |\n| --- | --- | ---: | ---: | ---: | --- | --- |"
    );
    for l in &r.loads {
        let _ = writeln!(
            s,
            "| {} | ({}, {}) | {} | {} | {} | {} | {} |",
            l.name,
            n(l.node.x),
            n(l.node.y),
            n(l.force.x),
            n(l.force.y),
            n(l.magnitude),
            l.label.as_deref().unwrap_or("-").replace('|', "\\|"),
            l.handle.as_deref().unwrap_or("-")
        );
    }
    if !r.distributed.is_empty() {
        let _ = writeln!(
            s,
            "\nDistributed loads (per horizontal {lu}): {}.",
            r.distributed
                .iter()
                .map(|d| format!("{} to {} from x = {} to {}", n(d.w0), n(d.w1), n(d.x0), n(d.x1)))
                .collect::<Vec<_>>()
                .join("; ")
        );
    }

    s.push_str("\n## 2. Conditions\n\n");
    for c in &r.conditions {
        let what = match (c.point, c.value) {
            (Some(p), _) => format!("through ({}, {})", n(p[0]), n(p[1])),
            (None, Some(v)) => n(v),
            _ => String::new(),
        };
        let _ = writeln!(s, "- {} {what}", c.kind);
    }

    s.push_str("\n## 3. Method\n\n");
    s.push_str(
        "Graphic statics, computed: the loads are laid end to end as the load line of the force diagram; the pole \
         is placed so that the three conditions hold; the rays from the pole to the load line give the direction \
         and force of each segment, and the funicular polygon is built segment by segment from the left support \
         (Bow's notation: the spaces of the form diagram are lettered, the points of the force diagram likewise). \
         For vertical loads the polygon is checked against the closed form y = chord \u{2213} M(x)/H, M the \
         simple-beam moment of the loads (e.g. Beer & Johnston, Vector Mechanics for Engineers: Statics, \
         \u{a7}7.8\u{2013}7.9).\n",
    );

    s.push_str("\n## 4. Results\n\n");
    let _ = writeln!(s, "- Horizontal thrust H = {} {fu}", n(r.thrust));
    let _ = writeln!(s, "- Largest segment force {} {fu} in {}", n(r.max_force.value), r.max_force.name);
    if let Some(sag) = r.sag.as_ref().or(r.rise.as_ref()) {
        let _ =
            writeln!(s, "- {} {} {lu} at x = {}", if r.sag.is_some() { "Sag" } else { "Rise" }, n(sag.value), n(sag.x));
    }
    let _ = writeln!(s, "- Span {} {lu}, profile length {} {lu}", n(r.span), n(r.length));
    for t in &r.towers {
        let _ =
            writeln!(s, "- {} tower: profile meets its axis at y = {}, height {} {lu}", t.side, n(t.y), n(t.height));
    }
    let _ = writeln!(
        s,
        "\n| segment | from | to | length ({lu}) | axial force ({fu}, tension +) |\n| --- | --- | --- | ---: | ---: |"
    );
    for (k, seg) in r.segments.iter().enumerate() {
        let (a, b) = (&r.nodes[k], &r.nodes[(k + 1).min(r.nodes.len() - 1)]);
        let _ = writeln!(
            s,
            "| {} | ({}, {}) | ({}, {}) | {} | {} |",
            seg.name,
            n(a.x),
            n(a.y),
            n(b.x),
            n(b.y),
            n(seg.length),
            n(seg.force)
        );
    }
    let _ = writeln!(s, "\n| support | reaction x ({fu}) | reaction y ({fu}) |\n| --- | ---: | ---: |");
    for (k, sp) in r.supports.iter().enumerate() {
        let _ =
            writeln!(s, "| {} | {} | {} |", if k == 0 { "left" } else { "right" }, n(sp.reaction.x), n(sp.reaction.y));
    }
    s.push_str("\n(The reaction is the force of the support on the structure.)\n");
    if !r.alternatives.is_empty() {
        let _ = writeln!(
            s,
            "\n### Alternatives\n\n| alternative | H ({fu}) | largest force ({fu}) | sag or rise ({lu}) | length ({lu}) |\n| --- | ---: | ---: | ---: | ---: |"
        );
        for a in &r.alternatives {
            let _ = writeln!(
                s,
                "| {} ({}) | {} | {} | {} | {} |",
                a.condition,
                a.name,
                n(a.thrust),
                n(a.max_force),
                n(a.sag),
                n(a.length)
            );
        }
        s.push_str("\nThe tables above describe the first alternative.\n");
    }

    if let Some(sz) = &r.sizing {
        s.push_str("\n### Member sizing\n\n");
        for line in crate::sizing::summary_lines(sz, r.units.force) {
            let _ = writeln!(s, "- {line}");
        }
        for w in &sz.warnings {
            let _ = writeln!(s, "- Warning: {w}");
        }
    }

    s.push_str("\n## 5. Checks\n\n");
    let _ = writeln!(s, "- Equilibrium at every node: largest imbalance {} of the total load", n(r.checks.equilibrium));
    // Node by node, from the sheet's own numbers, so that a checker can
    // follow it: the two segment forces (tension positive, pulling the node
    // toward the far end) and the load add up to the residual shown.
    if r.loads.len() + 2 == r.nodes.len() && r.segments.len() + 1 == r.nodes.len() {
        let _ = writeln!(
            s,
            "\n| node of load | load x | load y | residual x ({fu}) | residual y ({fu}) |\n| --- | ---: | ---: | ---: | ---: |"
        );
        for (k, l) in r.loads.iter().enumerate() {
            let (a, p, b) = (&r.nodes[k], &r.nodes[k + 1], &r.nodes[k + 2]);
            let pull = |q: &crate::report::Xy, force: f64| {
                let (dx, dy) = (q.x - p.x, q.y - p.y);
                let len = dx.hypot(dy);
                if len > 0.0 { (force * dx / len, force * dy / len) } else { (0.0, 0.0) }
            };
            let (lx, ly) = pull(a, r.segments[k].force);
            let (rx, ry) = pull(b, r.segments[k + 1].force);
            let _ = writeln!(
                s,
                "| {} | {} | {} | {} | {} |",
                l.name,
                n(l.force.x),
                n(l.force.y),
                n(lx + rx + l.force.x),
                n(ly + ry + l.force.y)
            );
        }
    }
    if let Some(c) = r.checks.closed_form {
        let _ = writeln!(
            s,
            "- Agreement with the closed form y = chord \u{2213} M(x)/H: largest difference {} of the span",
            n(c)
        );
    }
    let _ = writeln!(s, "- Conditions met to {} (relative)", n(r.checks.conditions));
    if !r.warnings.is_empty() {
        s.push_str("\nWarnings:\n\n");
        for w in &r.warnings {
            let _ = writeln!(s, "- {w}");
        }
    }

    match picture {
        Picture::None => {}
        Picture::Link(link) | Picture::Inline { link, .. } => {
            let _ = writeln!(s, "\n## 6. Picture\n\n![the drawing with the funicular and its force diagram]({link})");
        }
    }
    let _ = writeln!(s, "\n---\n\n**Caution.** {}", r.caution);
    s
}

/// The sheet as a standalone HTML page.
#[must_use]
pub fn html(r: &Report, picture: Picture<'_>) -> String {
    let md = markdown(r, if matches!(picture, Picture::Inline { .. }) { Picture::None } else { picture });
    let mut options = pulldown_cmark::Options::empty();
    options.insert(pulldown_cmark::Options::ENABLE_TABLES);
    let mut body = String::new();
    pulldown_cmark::html::push_html(&mut body, pulldown_cmark::Parser::new_ext(&md, options));
    if let Picture::Inline { svg, .. } = picture {
        // The SVG's own XML declaration has no place inside HTML.
        let svg = svg.trim_start().strip_prefix("<?xml").map_or(svg, |rest| rest.split_once("?>").map_or(svg, |x| x.1));
        let _ = write!(body, "<h2>6. Picture</h2>\n<div class=\"picture\">{svg}</div>\n");
    }
    format!(
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>Funicular {}: calculation sheet</title>\n\
         <style>body{{font-family:sans-serif;max-width:60em;margin:2em auto;}}table{{border-collapse:collapse;}}\
         td,th{{border:1px solid #999;padding:0.2em 0.5em;}}td{{text-align:right;}}.picture svg{{width:100%;height:auto;}}</style>\n\
         </head>\n<body>\n{body}</body>\n</html>\n",
        r.structure
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::pipeline::{Given, Job, LengthValue, run};

    fn report() -> Report {
        let input = "0\nSECTION\n2\nENTITIES\n0\nPOINT\n8\nSUPPORTS\n10\n0.0\n20\n0.0\n0\nPOINT\n8\nSUPPORTS\n10\n10.0\n20\n0.0\n\
0\nLINE\n8\nLOADS\n10\n5.0\n20\n-1.0\n11\n5.0\n21\n-2.0\n0\nTEXT\n8\nLOADS\n10\n5.1\n20\n-1.5\n40\n0.1\n1\n10 kN\n0\nENDSEC\n0\nEOF\n";
        let job = Job {
            read: crate::read::ReadOptions::default(),
            form: crate::solve::Form::Cable,
            given: vec![Given::Sag(LengthValue { value: 2.5, unit: None })],
            layout: crate::layout::LayoutOptions::default(),
            force_scale: None,
            layers: crate::write::OutputLayers::default(),
            self_weight: None,
            axial_stiffness: None,
            chord_tolerance: None,
            alternatives: Vec::new(),
            sizing: None,
        };
        let mut out = Vec::new();
        let o = run(input.as_bytes(), &job, &mut out).unwrap();
        crate::report::report("t.dxf", &o.reading, &o.carried, &o.solution, Some(&o.placement))
    }

    /// A 10 kN load at midspan of a 10 m cable with a 2.5 m sag: H = PL/(4f)
    /// = 10 kN and each half carries √(10² + 5²) = 11.18034 kN (statics of
    /// a two-segment cable; Beer & Johnston, Vector Mechanics for Engineers:
    /// Statics, §7.8).
    #[test]
    fn the_sheet_holds_the_reports_numbers_and_the_caution() {
        let r = report();
        let md = markdown(&r, Picture::Link("t.svg"));
        assert!(md.contains("H = 10 kN"), "{md}");
        assert!(md.contains("11.18034"), "{md}");
        assert!(md.contains(crate::report::CAUTION));
        assert!(md.contains("![the drawing") && md.contains("(t.svg)"));
        assert_eq!(r.segments.len(), 2);
        for seg in &r.segments {
            assert!(md.contains(&format!("| {} |", seg.name)), "{} in {md}", seg.name);
        }
        // The node-by-node table: one row per load, residuals at round-off.
        let rows: Vec<&str> =
            md.lines().skip_while(|l| !l.contains("residual x")).skip(2).take_while(|l| l.starts_with("| ")).collect();
        let residuals: Vec<f64> = rows
            .iter()
            .filter_map(|l| {
                let c: Vec<&str> = l.split('|').map(str::trim).collect();
                Some(c[4].parse::<f64>().ok()?.abs().max(c[5].parse::<f64>().ok()?.abs()))
            })
            .collect();
        assert_eq!(residuals.len(), r.loads.len(), "{md}");
        assert!(residuals.iter().all(|&x| x < 1e-9), "{residuals:?}");
        let page = html(&r, Picture::Inline { svg: "<?xml version=\"1.0\"?><svg id=\"x\"></svg>", link: "t.svg" });
        assert!(page.contains("<table>") && page.contains("<svg id=\"x\">") && !page.contains("<?xml"));
        assert!(page.contains("11.18034"));
    }
}

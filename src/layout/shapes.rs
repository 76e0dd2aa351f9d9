//! The plain shapes the layout produces and the writer encodes.
//!
//! Coordinates are in drawing units, in the drawing's world coordinates.

use std::fmt;

use kurbo::{Line, Point};

/// The kinds of thing the tool draws, each on a layer of its own.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Role {
    /// The funicular polygon.
    Profile,
    /// Hangers (cable) or posts (arch) between deck and profile.
    Hangers,
    /// The force diagram: load line, pole, rays, closing line, scale bar.
    Diagram,
    /// Force annotations on the members and at the supports.
    Forces,
    /// Dimensions: span, sag or rise, tower heights, clearance.
    Dimensions,
    /// Bow's notation letters, in the form and the force diagram.
    Bow,
    /// Title and caution notes.
    Notes,
    /// The loads drawn along the span: distributed loads to scale, point
    /// loads as arrows.
    LoadDiagram,
    /// Assessment: the joints between voussoirs.
    Voussoirs,
    /// Assessment: the thrust line of least horizontal thrust.
    ThrustMin,
    /// Assessment: the thrust line of greatest horizontal thrust.
    ThrustMax,
    /// Assessment: the thrust line for the thrust the user gave.
    ThrustTrial,
    /// Assessment: the thrust line of the least thickness, with that
    /// thinner arch's faces.
    ThrustLimit,
    /// Assessment: the thrust line at collapse under the factored live load.
    ThrustCollapse,
    /// Assessment: hinge markers and their labels.
    Hinges,
}

impl Role {
    /// Every role, in drawing order.
    pub const ALL: [Role; 15] = [
        Role::Profile,
        Role::Hangers,
        Role::Diagram,
        Role::Forces,
        Role::Dimensions,
        Role::Bow,
        Role::Notes,
        Role::LoadDiagram,
        Role::Voussoirs,
        Role::ThrustMin,
        Role::ThrustMax,
        Role::ThrustTrial,
        Role::ThrustLimit,
        Role::ThrustCollapse,
        Role::Hinges,
    ];

    /// The key used on the command line (`--layer profile=NAME`) and in reports.
    #[must_use]
    pub fn key(self) -> &'static str {
        match self {
            Role::Profile => "profile",
            Role::Hangers => "hanger-lines",
            Role::Diagram => "diagram",
            Role::Forces => "forces",
            Role::Dimensions => "dimensions",
            Role::Bow => "bow",
            Role::Notes => "notes",
            Role::LoadDiagram => "load-diagram",
            Role::Voussoirs => "voussoirs",
            Role::ThrustMin => "thrust-min",
            Role::ThrustMax => "thrust-max",
            Role::ThrustTrial => "thrust-trial",
            Role::ThrustLimit => "thrust-limit",
            Role::ThrustCollapse => "thrust-collapse",
            Role::Hinges => "hinges",
        }
    }

    /// The default layer name.
    #[must_use]
    pub fn default_layer(self) -> &'static str {
        match self {
            Role::Profile => "HANGLINE-PROFILE",
            Role::Hangers => "HANGLINE-HANGERS",
            Role::Diagram => "HANGLINE-FORCE-DIAGRAM",
            Role::Forces => "HANGLINE-FORCES",
            Role::Dimensions => "HANGLINE-DIMENSIONS",
            Role::Bow => "HANGLINE-BOW",
            Role::Notes => "HANGLINE-NOTES",
            Role::LoadDiagram => "HANGLINE-LOAD-DIAGRAM",
            Role::Voussoirs => "HANGLINE-VOUSSOIRS",
            Role::ThrustMin => "HANGLINE-THRUST-MIN",
            Role::ThrustMax => "HANGLINE-THRUST-MAX",
            Role::ThrustTrial => "HANGLINE-THRUST-TRIAL",
            Role::ThrustLimit => "HANGLINE-THRUST-LIMIT",
            Role::ThrustCollapse => "HANGLINE-THRUST-COLLAPSE",
            Role::Hinges => "HANGLINE-HINGES",
        }
    }

    /// The layer's colour, an AutoCAD Colour Index chosen to tell the
    /// layers apart on a white or a black background.
    #[must_use]
    pub fn colour(self) -> i16 {
        match self {
            Role::Profile => 6,
            Role::Hangers => 8,
            Role::Diagram => 5,
            Role::Forces => 3,
            Role::Dimensions => 4,
            Role::Bow => 30,
            Role::Notes => 7,
            Role::LoadDiagram => 12,
            Role::Voussoirs => 8,
            Role::ThrustMin => 1,
            Role::ThrustMax => 150,
            Role::ThrustTrial => 4,
            Role::ThrustLimit => 40,
            Role::ThrustCollapse => 210,
            Role::Hinges => 7,
        }
    }
}

impl fmt::Display for Role {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.key())
    }
}

/// Horizontal text alignment (DXF TEXT group 72).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum HAlign {
    /// Anchor at the text's left end.
    Left,
    /// Anchor at the text's centre.
    Center,
    /// Anchor at the text's right end.
    Right,
}

/// Vertical text alignment (DXF TEXT group 73).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum VAlign {
    /// Anchor on the baseline.
    Baseline,
    /// Anchor at the bottom of descenders.
    Bottom,
    /// Anchor at mid-height.
    Middle,
    /// Anchor at the top.
    Top,
}

/// A single line of text.
#[derive(Clone, Debug, PartialEq)]
pub struct Text {
    /// The anchor point.
    pub at: Point,
    /// Cap height in drawing units.
    pub height: f64,
    /// Rotation in degrees, counter-clockwise from +x.
    pub rotation: f64,
    /// The text (plain, no formatting codes).
    pub content: String,
    /// Horizontal alignment of the anchor.
    pub h: HAlign,
    /// Vertical alignment of the anchor.
    pub v: VAlign,
}

/// A linear dimension with the geometry it displays.
#[derive(Clone, Debug, PartialEq)]
pub struct Dimension {
    /// Origin of the first extension line (DXF 13).
    pub p1: Point,
    /// Origin of the second extension line (DXF 14).
    pub p2: Point,
    /// A point on the dimension line, at the second extension line (DXF 10).
    pub line_at: Point,
    /// Angle of the dimension line in degrees: 0 horizontal, 90 vertical (DXF 50).
    pub angle: f64,
    /// Middle of the text (DXF 11).
    pub text_at: Point,
    /// The measured distance, drawing units.
    pub measurement: f64,
    /// Text override (DXF 1): `<>` stands for the measurement.
    pub override_text: String,
    /// True when the text was moved out beyond the first extension line
    /// because it is longer than the dimension (DXF 70 flag 128: text at a
    /// user-defined place, kept when a CAD program redraws it).
    pub text_moved: bool,
    /// What the dimension shows, in world coordinates: the content of its
    /// anonymous `*D` block.
    pub geometry: Vec<Shape>,
}

/// A drawable shape.
#[derive(Clone, Debug, PartialEq)]
pub enum Shape {
    /// A straight line.
    Line(Line),
    /// A polyline through the points.
    Polyline {
        /// Vertices.
        points: Vec<Point>,
        /// True for a closed outline.
        closed: bool,
    },
    /// A circle.
    Circle {
        /// Centre.
        center: Point,
        /// Radius.
        radius: f64,
    },
    /// A filled triangle (arrowheads).
    Solid([Point; 3]),
    /// A line of text.
    Text(Text),
    /// A linear dimension.
    Dimension(Box<Dimension>),
}

/// A shape on a role's layer, with an optional colour of its own.
#[derive(Clone, Debug, PartialEq)]
pub struct Item {
    /// Which layer it goes on.
    pub role: Role,
    /// What to draw.
    pub shape: Shape,
    /// AutoCAD Colour Index, or `None` for the layer's colour.
    pub colour: Option<i16>,
}

/// Sizes for the dimension style the writer declares, so that a dimension
/// regenerated by a CAD program looks like the one drawn.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DimStyle {
    /// Text height (DIMTXT).
    pub text_height: f64,
    /// Arrow size (DIMASZ).
    pub arrow: f64,
    /// Extension line offset from the origin (DIMEXO).
    pub ext_offset: f64,
    /// Extension line extension beyond the dimension line (DIMEXE).
    pub ext_extend: f64,
    /// Gap around the text (DIMGAP).
    pub gap: f64,
    /// Decimal places (DIMDEC).
    pub decimals: i64,
    /// Each dimension's text is its measured value written out, not `<>`:
    /// for drawings whose header scales measurements (`$DIMLFAC` ≠ 1),
    /// which some programs apply to `<>` whatever the style says.
    pub literal_text: bool,
}

impl DimStyle {
    /// The tool's dimension sizes for annotations of text height `th`: the
    /// dimension text, arrows and offsets in fixed proportion to it.
    #[must_use]
    pub fn for_text_height(th: f64, decimals: i64, literal_text: bool) -> DimStyle {
        DimStyle {
            text_height: 0.8 * th,
            arrow: 0.8 * th,
            ext_offset: 0.25 * th,
            ext_extend: 0.4 * th,
            gap: 0.2 * th,
            decimals,
            literal_text,
        }
    }
}

/// Everything the tool adds to a drawing.
#[derive(Clone, Debug, PartialEq)]
pub struct Additions {
    /// The shapes, in drawing order.
    pub items: Vec<Item>,
    /// The dimension style.
    pub dim_style: DimStyle,
    /// Runs of items that belong to one design alternative: they go on
    /// their roles' layers with the alternative's suffix
    /// (`HANGLINE-PROFILE-SAG-4`).
    pub variants: Vec<Variant>,
}

/// A run of [`Additions::items`] drawn on layers of their own.
#[derive(Clone, Debug, PartialEq)]
pub struct Variant {
    /// The items' indices.
    pub items: std::ops::Range<usize>,
    /// Appended to each role's layer name after a hyphen: a key of
    /// [`VARIANT_KEYS`], a hyphen and the value (`SAG-4`, `THRUST-450`).
    pub suffix: String,
}

/// The condition keys a variant's suffix starts with; a layer named
/// `<tool layer>-<key>-<value>` is the tool's (and replaced on every run).
pub const VARIANT_KEYS: [&str; 8] = ["SAG", "RISE", "THRUST", "MAXFORCE", "LENGTH", "THROUGH", "LEVELAT", "UNSTRESSED"];

impl Additions {
    /// The suffix of item `index`'s layer, if it belongs to a variant.
    #[must_use]
    pub fn suffix(&self, index: usize) -> Option<&str> {
        self.variants.iter().find(|v| v.items.contains(&index)).map(|v| v.suffix.as_str())
    }
}

impl Shape {
    /// An axis-aligned box around the shape (text estimated from its
    /// height and length).
    #[must_use]
    pub fn bounds(&self) -> Option<kurbo::Rect> {
        let pts: Vec<Point> = match self {
            Shape::Line(l) => vec![l.p0, l.p1],
            Shape::Polyline { points, .. } => points.clone(),
            Shape::Circle { center, radius } => {
                vec![*center - kurbo::Vec2::new(*radius, *radius), *center + kurbo::Vec2::new(*radius, *radius)]
            }
            Shape::Solid(p) => p.to_vec(),
            Shape::Text(t) => {
                let r = 0.6 * t.height * t.content.chars().count() as f64 + t.height;
                vec![t.at - kurbo::Vec2::new(r, r), t.at + kurbo::Vec2::new(r, r)]
            }
            Shape::Dimension(d) => {
                return d.geometry.iter().filter_map(Shape::bounds).reduce(|a, b| a.union(b));
            }
        };
        let first = *pts.first()?;
        Some(pts.iter().fold(kurbo::Rect::from_points(first, first), |r, p| r.union_pt(*p)))
    }
}

//! Layout: what the tool draws back into the drawing, as plain shapes.

mod shapes;

pub use shapes::*;

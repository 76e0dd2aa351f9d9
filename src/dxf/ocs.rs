//! Object coordinate systems: the DXF "arbitrary axis algorithm".
//!
//! Planar entities (CIRCLE, ARC, TEXT, INSERT, LWPOLYLINE, …) store their
//! points in the coordinate system of their extrusion direction N (group
//! codes 210/220/230). From the DXF reference, "Arbitrary Axis Algorithm":
//! if |Nx| < 1/64 and |Ny| < 1/64 then Ax = Wy × N, else Ax = Wz × N; then
//! Ay = N × Ax (both normalised). A point (x, y, z) of the OCS is
//! x·Ax + y·Ay + z·N in world coordinates.

use kurbo::Point;

/// Maps an OCS point to world x, y for the extrusion `n` (need not be unit).
/// A degenerate extrusion is treated as the world z axis.
#[must_use]
pub fn ocs_to_wcs(n: [f64; 3], p: [f64; 3]) -> Point {
    let len = (n[0] * n[0] + n[1] * n[1] + n[2] * n[2]).sqrt();
    if len.is_nan() || len <= 0.0 || !len.is_finite() {
        return Point::new(p[0], p[1]);
    }
    let n = [n[0] / len, n[1] / len, n[2] / len];
    if n == [0.0, 0.0, 1.0] {
        return Point::new(p[0], p[1]);
    }
    let limit = 1.0 / 64.0;
    let w = if n[0].abs() < limit && n[1].abs() < limit { [0.0, 1.0, 0.0] } else { [0.0, 0.0, 1.0] };
    let ax = normalise(cross(w, n));
    let ay = normalise(cross(n, ax));
    Point::new(p[0] * ax[0] + p[1] * ay[0] + p[2] * n[0], p[0] * ax[1] + p[1] * ay[1] + p[2] * n[1])
}

fn cross(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
}

fn normalise(v: [f64; 3]) -> [f64; 3] {
    let l = (v[0] * v[0] + v[1] * v[1] + v[2] * v[2]).sqrt();
    if l > 0.0 { [v[0] / l, v[1] / l, v[2] / l] } else { v }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn mirrored_extrusion_flips_x() {
        // N = (0, 0, −1): Ax = Wy × N = (−1, 0, 0), Ay = (0, 1, 0).
        let p = ocs_to_wcs([0.0, 0.0, -1.0], [3.0, 4.0, 0.0]);
        assert_eq!((p.x, p.y), (-3.0, 4.0));
    }

    #[test]
    fn world_z_is_identity() {
        let p = ocs_to_wcs([0.0, 0.0, 1.0], [3.0, 4.0, 0.0]);
        assert_eq!((p.x, p.y), (3.0, 4.0));
    }
}

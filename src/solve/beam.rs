//! The vertical-load problem's precomputed quantities, O(n) once, after which
//! every condition and every largest-force evaluation is cheap.
//!
//! For vertical loads Wⱼ (downward positive) at xⱼ the polygon's ordinate is
//! y(x) = y_L + v·x + u·F(x) with F(x) = Σ Wⱼ·max(0, x − xⱼ), u = 1/Oₓ and
//! v = O_y/Oₓ (local x). Its chord-to-profile distance is u·M(x), M the
//! simple-beam moment (Beer & Johnston, *Vector Mechanics for Engineers:
//! Statics*, §7.8–7.9, Prob. 7.114).

use super::frame::Frame;

/// Vertical loads on the span, local x.
#[derive(Clone, Debug)]
pub(crate) struct Beam {
    /// x of each load, sorted.
    pub xs: Vec<f64>,
    /// Each load's downward component Wⱼ = −Pⱼ.y.
    pub ws: Vec<f64>,
    /// Span.
    pub span: f64,
    /// Cumulative loads C₀ = 0, Cₖ = Σⱼ≤ₖ Wⱼ: segment k's tension is (Oₓ, O_y + Cₖ).
    pub cum: Vec<f64>,
    /// min over k of Cₖ.
    pub c_min: f64,
    /// max over k of Cₖ.
    pub c_max: f64,
    /// F at the right support.
    pub f_right: f64,
    /// Largest simple-beam moment at a node (≥ 0: the supports count).
    pub m_max: f64,
    /// Σ|Wⱼ|, the scale of the vertical forces (> 0 unless every load is horizontal).
    pub w_scale: f64,
}

impl Beam {
    /// The vertical components of the frame's loads, each placed at its
    /// anchor's x (clamped to the span). Exact for vertical loads; for inclined
    /// loads it is the starting problem of Newton's method.
    pub fn new(frame: &Frame) -> Beam {
        let span = frame.span;
        let xs: Vec<f64> = frame.anchors.iter().map(|a| a.x.clamp(0.0, span)).collect();
        let ws: Vec<f64> = frame.forces.iter().map(|f| -f.y).collect();
        let mut cum = Vec::with_capacity(ws.len() + 1);
        let mut c = 0.0;
        cum.push(c);
        for w in &ws {
            c += w;
            cum.push(c);
        }
        let c_min = cum.iter().copied().fold(f64::INFINITY, f64::min);
        let c_max = cum.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        // F at each node by F(x_{k+1}) = F(x_k) + C_k (x_{k+1} − x_k).
        let mut f_nodes = Vec::with_capacity(xs.len());
        let (mut f, mut x_prev) = (0.0, 0.0);
        for (k, &x) in xs.iter().enumerate() {
            f += cum[k] * (x - x_prev);
            f_nodes.push(f);
            x_prev = x;
        }
        let f_right = f + cum[xs.len()] * (span - x_prev);
        let m_max = xs.iter().zip(&f_nodes).map(|(&x, &f)| x / span * f_right - f).fold(0.0, f64::max);
        let w_scale = ws.iter().map(|w| w.abs()).sum();
        Beam { xs, ws, span, cum, c_min, c_max, f_right, m_max, w_scale }
    }

    /// F(x) = Σ Wⱼ·max(0, x − xⱼ).
    pub fn f_at(&self, x: f64) -> f64 {
        self.xs.iter().zip(&self.ws).filter(|(xj, _)| **xj < x).map(|(xj, w)| w * (x - xj)).sum()
    }

    /// Index of the segment spanning x: the number of loads left of x.
    pub fn segment_at(&self, x: f64) -> usize {
        self.xs.partition_point(|&xj| xj < x)
    }

    /// Largest segment force for pole (Oₓ, O_y): the extremes of O_y + Cₖ
    /// are at C_min and C_max, so this is O(1).
    pub fn max_force(&self, ox: f64, oy: f64) -> f64 {
        ox.hypot((oy + self.c_max).abs().max((oy + self.c_min).abs()))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use kurbo::Vec2;

    #[test]
    fn moment_and_cumulative_loads_of_the_book_case() {
        // Beer & Johnston, Vector Mechanics for Engineers: Statics, Prob. 7.116:
        // 360, 720, 240 lb at 2, 4, 6 ft on 8 ft. Simple-beam moments by hand
        // (statics, common practice): R_A = 690 lb, M(2) = 1380, M(4) = 2040,
        // M(6) = 1260 lb·ft.
        let forces = [360.0, 720.0, 240.0];
        let mut load_line = vec![Vec2::ZERO];
        for w in forces {
            let last = load_line[load_line.len() - 1];
            load_line.push(last + Vec2::new(0.0, -w));
        }
        let frame = Frame {
            x0: 0.0,
            y0: 0.0,
            span: 8.0,
            anchors: vec![Vec2::new(2.0, 0.0), Vec2::new(4.0, 0.0), Vec2::new(6.0, 0.0)],
            forces: forces.iter().map(|w| Vec2::new(0.0, -w)).collect(),
            load_line,
            vertical: true,
            force_scale: 1320.0,
        };
        let b = Beam::new(&frame);
        assert_eq!(b.f_right, 5520.0);
        assert_eq!(b.m_max, 2040.0);
        assert_eq!(b.f_at(4.0), 720.0);
        assert_eq!(b.cum, vec![0.0, 360.0, 1080.0, 1320.0]);
        assert_eq!(b.segment_at(4.0), 1);
        assert_eq!(b.segment_at(4.5), 2);
        assert_eq!(b.max_force(850.0, -945.0), 850f64.hypot(945.0));
    }
}

//! The resistance a meter reads between two terminals of a network of resistors, by nodal
//! analysis: Kirchhoff's current law at every node, one ampere driven in at one terminal
//! and out at the other (grounded), so the first terminal's potential is the resistance
//! (any circuits text, e.g. Hughes, *Electrical and Electronic Technology*, ch. on network
//! theorems). Links of no resistance join nodes into one.
//!
//! The networks here are a winding's sections between its leads: a few nodes, so a dense
//! elimination is all it needs.

/// Resistors between numbered nodes, with some nodes linked together. Nodes are numbered
/// from 0 below the count given to [`Network::new`]; a number beyond it is a programming
/// error and panics.
#[derive(Debug, Clone, PartialEq)]
pub struct Network {
    /// Each node's representative once links are made.
    rep: Vec<usize>,
    /// Resistors: (node, node, ohms).
    branches: Vec<(usize, usize, f64)>,
}

impl Network {
    /// A network of `nodes` nodes and no resistors.
    pub fn new(nodes: usize) -> Self {
        Network {
            rep: (0..nodes).collect(),
            branches: Vec::new(),
        }
    }

    /// Add a resistor of `ohms` between nodes `a` and `b`.
    pub fn add(&mut self, a: usize, b: usize, ohms: f64) {
        self.branches.push((a, b, ohms));
    }

    /// The same network with `nodes` linked (a board's link bar, of no resistance).
    pub fn linked(&self, nodes: &[usize]) -> Network {
        let mut n = self.clone();
        if let Some(&first) = nodes.first() {
            let to = n.find(first);
            for &x in nodes {
                let from = n.find(x);
                for r in &mut n.rep {
                    if *r == from {
                        *r = to;
                    }
                }
            }
        }
        n
    }

    fn find(&self, x: usize) -> usize {
        self.rep[x]
    }

    /// Ohms between nodes `a` and `b`: 0 when they are linked, `None` when no path of
    /// finite, positive resistances joins them. A resistor of 0 Ω (or not finite) counts as
    /// open, not as a link: links are made with [`Network::linked`].
    pub fn between(&self, a: usize, b: usize) -> Option<f64> {
        let (a, b) = (self.find(a), self.find(b));
        if a == b {
            return Some(0.0);
        }
        let live: Vec<(usize, usize, f64)> = self
            .branches
            .iter()
            .map(|&(x, y, r)| (self.find(x), self.find(y), r))
            .filter(|&(x, y, r)| x != y && r.is_finite() && r > 0.0)
            .collect();
        // The nodes joined to b: only they take part (a floating part has no potential).
        let n = self.rep.len();
        let mut reach = vec![false; n];
        reach[b] = true;
        let mut grown = true;
        while grown {
            grown = false;
            for &(x, y, _) in &live {
                if reach[x] != reach[y] {
                    reach[x] = true;
                    reach[y] = true;
                    grown = true;
                }
            }
        }
        if !reach[a] {
            return None;
        }
        // Unknown potentials: every reached node but b.
        let nodes: Vec<usize> = (0..n).filter(|&x| reach[x] && x != b).collect();
        let index = |x: usize| nodes.iter().position(|&y| y == x);
        let k = nodes.len();
        let mut g = vec![vec![0.0; k + 1]; k];
        for &(x, y, r) in &live {
            let c = 1.0 / r;
            let (ix, iy) = (index(x), index(y));
            if let Some(i) = ix {
                g[i][i] += c;
            }
            if let Some(j) = iy {
                g[j][j] += c;
            }
            if let (Some(i), Some(j)) = (ix, iy) {
                g[i][j] -= c;
                g[j][i] -= c;
            }
        }
        let ia = index(a)?;
        g[ia][k] = 1.0;
        // Gaussian elimination with partial pivoting; the matrix is a grounded Laplacian
        // of a connected network, so it is positive definite. A pivot below 1e-12 of the
        // largest conductance is taken as singular.
        let scale = live.iter().map(|&(_, _, r)| 1.0 / r).fold(0.0, f64::max);
        for col in 0..k {
            let piv = (col..k).max_by(|&x, &y| g[x][col].abs().total_cmp(&g[y][col].abs()))?;
            if g[piv][col].abs() <= 1e-12 * scale || g[piv][col].is_nan() {
                return None;
            }
            g.swap(col, piv);
            let (top, below) = g.split_at_mut(col + 1);
            let pivot = &top[col];
            for row in below.iter_mut() {
                let f = row[col] / pivot[col];
                if f != 0.0 {
                    for (x, p) in row[col..].iter_mut().zip(&pivot[col..]) {
                        *x -= f * p;
                    }
                }
            }
        }
        let mut v = vec![0.0; k];
        for r in (0..k).rev() {
            let s: f64 = (r + 1..k).map(|c| g[r][c] * v[c]).sum();
            v[r] = (g[r][k] - s) / g[r][r];
        }
        Some(v[ia])
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64) {
        assert!((a - b).abs() < 1e-12 * b.abs().max(1.0), "{a} vs {b}");
    }

    #[test]
    fn series_and_parallel() {
        // Series and parallel resistors (any circuits text).
        let mut n = Network::new(3);
        n.add(0, 1, 2.0);
        n.add(1, 2, 3.0);
        close(n.between(0, 2).unwrap(), 5.0);
        n.add(0, 2, 5.0);
        close(n.between(0, 2).unwrap(), 2.5);
    }

    #[test]
    fn a_delta_reads_two_thirds_of_a_phase_between_corners() {
        // Delta of equal phases R: R ∥ 2R = 2R/3 (any circuits text).
        let mut n = Network::new(3);
        for p in 0..3 {
            n.add(p, (p + 1) % 3, 6.0);
        }
        close(n.between(0, 1).unwrap(), 4.0);
    }

    #[test]
    fn the_balanced_wheatstone_bridge_carries_nothing_across() {
        // A balanced bridge: the detector arm changes nothing (Wheatstone's bridge, any
        // circuits text): (1+2) ∥ (1+2) = 1.5 with or without the 7 Ω arm.
        let mut n = Network::new(4);
        n.add(0, 1, 1.0);
        n.add(1, 3, 2.0);
        n.add(0, 2, 1.0);
        n.add(2, 3, 2.0);
        close(n.between(0, 3).unwrap(), 1.5);
        n.add(1, 2, 7.0);
        close(n.between(0, 3).unwrap(), 1.5);
    }

    #[test]
    fn links_and_open_ends() {
        let mut n = Network::new(4);
        n.add(0, 1, 4.0);
        n.add(2, 3, 4.0);
        assert_eq!(n.between(0, 3), None);
        let l = n.linked(&[1, 2]);
        close(l.between(0, 3).unwrap(), 8.0);
        assert_eq!(l.between(1, 2), Some(0.0));
        // A floating part beside the path changes nothing.
        let mut m = Network::new(5);
        m.add(0, 1, 1.0);
        m.add(3, 4, 9.0);
        close(m.between(0, 1).unwrap(), 1.0);
    }
}

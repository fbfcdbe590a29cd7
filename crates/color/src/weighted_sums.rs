//! Many spectra, each dotted with the same few weight vectors: the inner loop
//! of colorimetry over sample sets (TCS, CES) and of camera signals (three
//! channels and three colour-matching functions per subject).
//!
//! `out[i][k] = Σ_λ row_i(λ) · weight_k(λ)`. The loop is vectorised over
//! wavelength with the widest instructions the processor has, chosen at run
//! time through `pulp` (AVX2 with fused multiply–add where present, SSE2 or
//! scalar otherwise; safe code only), with several rows per pass so that
//! independent sums hide the latency of the multiply–adds and each weight
//! vector is loaded once for several rows. Results differ from a plain
//! left-to-right sum by rounding only (≈ 1e-16 relative): summation order
//! is fixed for a given processor, so the same input gives the same output.

/// Dot every row with each of three weight vectors.
///
/// Rows and weights are read over the shortest common length.
#[must_use]
pub fn weighted_sums_3(rows: &[&[f64]], weights: [&[f64]; 3]) -> Vec<[f64; 3]> {
    let mut out = vec![[0.0; 3]; rows.len()];
    pulp::Arch::new().dispatch(Sums::<3, 3> {
        rows,
        weights,
        out: &mut out,
    });
    out
}

/// Dot every row with each of six weight vectors.
///
/// Rows and weights are read over the shortest common length.
#[must_use]
pub fn weighted_sums_6(rows: &[&[f64]], weights: [&[f64]; 6]) -> Vec<[f64; 6]> {
    // Two passes of three weights (three rows at a time): six weights and
    // two rows at once need more vector registers than AVX2 has, and the
    // spilled sums then cost far more than reading the rows twice.
    let first = weighted_sums_3(rows, [weights[0], weights[1], weights[2]]);
    let second = weighted_sums_3(rows, [weights[3], weights[4], weights[5]]);
    first
        .into_iter()
        .zip(second)
        .map(|([a, b, c], [d, e, f])| [a, b, c, d, e, f])
        .collect()
}

/// `K` weight vectors, `R` rows a pass.
struct Sums<'a, 'r, const K: usize, const R: usize> {
    rows: &'a [&'r [f64]],
    weights: [&'a [f64]; K],
    out: &'a mut [[f64; K]],
}

impl<const K: usize, const R: usize> pulp::WithSimd for Sums<'_, '_, K, R> {
    type Output = ();

    // pulp compiles this body once per instruction set; it must inline into
    // the dispatcher's feature-enabled function to get those instructions.
    #[allow(clippy::inline_always)]
    #[inline(always)]
    fn with_simd<S: pulp::Simd>(self, simd: S) {
        let Sums { rows, weights, out } = self;
        let len = rows
            .iter()
            .map(|r| r.len())
            .chain(weights.iter().map(|w| w.len()))
            .min()
            .unwrap_or(0);
        let w = weights.map(|c| S::as_simd_f64s(&c[..len]));
        let n = w.first().map_or(0, |(head, _)| head.len());
        let tail_start = w.first().map_or(len, |(_, tail)| len - tail.len());
        let heads: [&[S::f64s]; K] = w.map(|(head, _)| &head[..n]);
        let zero = simd.splat_f64s(0.0);
        for (rows, outs) in rows.chunks(R).zip(out.chunks_mut(R)) {
            let count = rows.len();
            // A short last pass repeats its last row; the extra sums are dropped.
            let r: [&[f64]; R] = std::array::from_fn(|j| &rows[j.min(count - 1)][..len]);
            let v: [&[S::f64s]; R] = r.map(|x| &S::as_simd_f64s(x).0[..n]);
            let mut acc = [[zero; K]; R];
            for i in 0..n {
                for (a, row) in acc.iter_mut().zip(&v) {
                    let x = row[i];
                    for (ak, wk) in a.iter_mut().zip(&heads) {
                        *ak = simd.mul_add_e_f64s(x, wk[i], *ak);
                    }
                }
            }
            for ((o, a), row) in outs.iter_mut().zip(acc).zip(r) {
                for k in 0..K {
                    o[k] = simd.reduce_sum_f64s(a[k])
                        + row[tail_start..]
                            .iter()
                            .zip(&weights[k][tail_start..len])
                            .map(|(x, c)| x * c)
                            .sum::<f64>();
                }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn direct(row: &[f64], w: &[f64]) -> f64 {
        row.iter().zip(w).map(|(a, b)| a * b).sum()
    }

    #[test]
    fn sums_equal_plain_dot_products() {
        // Lengths that are no multiple of any vector width, and row counts
        // that leave short last passes.
        for len in [0i32, 1, 3, 7, 401, 471] {
            let rows: Vec<Vec<f64>> = (0..7i32)
                .map(|i| {
                    (0..len)
                        .map(|j| f64::from((i * 31 + j * 7) % 13) / 13.0)
                        .collect()
                })
                .collect();
            let weights: Vec<Vec<f64>> = (0..6i32)
                .map(|k| {
                    (0..len)
                        .map(|j| (f64::from(j) * 0.01 + f64::from(k)).sin())
                        .collect()
                })
                .collect();
            for count in 0..=rows.len() {
                let refs: Vec<&[f64]> = rows[..count].iter().map(Vec::as_slice).collect();
                let three = weighted_sums_3(&refs, [&weights[0], &weights[1], &weights[2]]);
                let six = weighted_sums_6(
                    &refs,
                    [
                        &weights[0],
                        &weights[1],
                        &weights[2],
                        &weights[3],
                        &weights[4],
                        &weights[5],
                    ],
                );
                assert_eq!((three.len(), six.len()), (count, count));
                for (i, row) in refs.iter().enumerate() {
                    for k in 0..6 {
                        let want = direct(row, &weights[k]);
                        assert!((six[i][k] - want).abs() < 1e-12 * (1.0 + want.abs()));
                        if k < 3 {
                            assert!((three[i][k] - want).abs() < 1e-12 * (1.0 + want.abs()));
                        }
                    }
                }
            }
        }
    }

    #[test]
    fn unequal_lengths_use_the_shortest() {
        let row = [1.0, 2.0, 3.0, 4.0, 5.0];
        let w = [1.0; 3];
        let got = weighted_sums_3(&[&row], [&w, &w, &w[..2]]);
        assert!((got[0][0] - 3.0).abs() < 1e-12);
    }
}

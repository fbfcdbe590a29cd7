//! The linear part of a light's quality figures, kept apart so that mixes of
//! lights cost almost nothing.
//!
//! Everything CCT, CRI, TM-30 and SSI take from a spectrum is a weighted sum
//! over wavelength: the light's tristimulus values, the tristimulus values of
//! the 14 CIE 13.3 test colour samples and of the 99 CIE 224 colour
//! evaluation samples under it, and the ten-nanometre bins of SSI. Sums are
//! linear in the light, so the sums of `Σ wᵢ·Sᵢ` are `Σ wᵢ·sums(Sᵢ)`: a
//! lighting plan computes them once per source and mixes them for every level
//! it tries. What follows the sums (CCT search, reference side, von Kries,
//! CAM02-UCS, bins) is done per mix by [`LightSums::quality`].
//!
//! A mix's sums equal the sums of the mixed spectrum up to rounding
//! (≈ 1e-16 relative; see the tests).

use crate::cct::{CctDuv, CctMethod, cct_duv};
use crate::cri::{Cri, cri_of_sums, tcs_set};
use crate::error::{ColorError, Result};
use crate::observer::Observer;
use crate::spaces::Uv1960;
use crate::spectral_weights::SampleXyz;
use crate::spectrum::RelativeSpd;
use crate::ssi::{RawBins, Ssi, raw_bins_of, ssi_of_raw_bins};
use crate::tm30::{Tm30, ces_set, tm30_of_sums};
use crate::tristimulus::{Xyz, xyz_sums};

/// The weighted sums of one light (or of a mix) that its quality figures need.
#[derive(Debug, Clone)]
pub struct LightSums {
    /// `Σ S·x̄, Σ S·ȳ, Σ S·z̄` (CIE 1931 2°, 360–830 nm, unnormalised).
    xyz: Xyz,
    /// The CIE 13.3 test colour samples (and the white) under the light.
    tcs: SampleXyz,
    /// The CIE 224 colour evaluation samples (and the white) under the light.
    ces: SampleXyz,
    /// SSI's ten-nanometre bins, unnormalised.
    ssi_bins: RawBins,
}

/// CRI, TM-30 and SSI of a light at its CCT; each may fail on its own.
#[derive(Debug, Clone)]
pub struct LightQuality {
    /// CIE 13.3 colour rendering.
    pub cri: Result<Cri>,
    /// ANSI/IES TM-30-20 (CIE 224).
    pub tm30: Result<Tm30>,
    /// Academy SSI against the default reference at the CCT.
    pub ssi: Result<Ssi>,
}

impl LightSums {
    /// The sums of `spd`. Errors only when the standard sample tables
    /// cannot be loaded.
    pub fn of(spd: &RelativeSpd) -> Result<LightSums> {
        let values = spd.values();
        Ok(LightSums {
            xyz: xyz_sums(values, Observer::cie1931_2deg()),
            tcs: tcs_set()?.xyz_one(values),
            ces: ces_set()?.xyz_one(values),
            ssi_bins: raw_bins_of(spd),
        })
    }

    /// The sums of `Σ wᵢ·lightᵢ` from the sums of the lights. `None` for an
    /// empty list.
    #[must_use]
    pub fn mix(parts: &[(f64, &LightSums)]) -> Option<LightSums> {
        let first = parts.first()?.1;
        let mut xyz = Xyz::new(0.0, 0.0, 0.0);
        let mut ssi_bins = [0.0; 30];
        for (w, p) in parts {
            xyz.x += w * p.xyz.x;
            xyz.y += w * p.xyz.y;
            xyz.z += w * p.xyz.z;
            for (b, v) in ssi_bins.iter_mut().zip(&p.ssi_bins) {
                *b += w * v;
            }
        }
        let tcs: Vec<(f64, &SampleXyz)> = parts.iter().map(|(w, p)| (*w, &p.tcs)).collect();
        let ces: Vec<(f64, &SampleXyz)> = parts.iter().map(|(w, p)| (*w, &p.ces)).collect();
        debug_assert!(
            parts
                .iter()
                .all(|(_, p)| p.ces.samples.len() == first.ces.samples.len())
        );
        Some(LightSums {
            xyz,
            tcs: SampleXyz::combine(&tcs),
            ces: SampleXyz::combine(&ces),
            ssi_bins,
        })
    }

    /// Tristimulus values of the light (CIE 1931 2°, unnormalised).
    #[must_use]
    pub fn xyz(&self) -> Xyz {
        self.xyz
    }

    /// CCT and Duv (Ohno 2014) of the light; an error when it has no
    /// chromaticity or no CCT (|Duv| > 0.05, outside 1000–20 000 K).
    pub fn cct(&self) -> Result<CctDuv> {
        let x = self.xyz;
        let sum = x.x + x.y + x.z;
        if !(x.y > 0.0 && sum > 0.0 && sum.is_finite()) {
            return Err(ColorError::NotColorimetric {
                what: "light".into(),
                reason: "it has no visible power".into(),
            });
        }
        cct_duv(Uv1960::from_xyz(x), CctMethod::Ohno2014)
    }

    /// CRI, TM-30 and SSI with references at `cct` (the light's own, from
    /// [`LightSums::cct`]). The light must already have passed
    /// [`crate::spectrum::Curve::check_colorimetric`].
    #[must_use]
    pub fn quality(&self, cct: CctDuv) -> LightQuality {
        LightQuality {
            cri: cri_of_sums(&self.tcs, cct),
            tm30: tm30_of_sums(&self.ces, cct),
            ssi: ssi_of_raw_bins(&self.ssi_bins, cct.cct_k),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::cct::cct_duv_of_spd;
    use crate::illuminant::StandardIlluminant;

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol * b.abs().max(1.0)
    }

    #[test]
    fn a_mix_of_sums_is_the_sums_of_the_mix() {
        let f2 = StandardIlluminant::F(2).spd().unwrap();
        let a = StandardIlluminant::A.spd().unwrap();
        let led = RelativeSpd::from_fn(|wl| {
            (-((wl - 450.0) / 12.0).powi(2)).exp() + 0.8 * (-((wl - 590.0) / 60.0).powi(2)).exp()
        });
        let parts = [(0.7, &f2), (1.3, &a), (25.0, &led)];
        let mixed = RelativeSpd::weighted_sum(parts.iter().map(|(w, s)| (*w, *s)));
        let sums: Vec<LightSums> = parts
            .iter()
            .map(|(_, s)| LightSums::of(s).unwrap())
            .collect();
        let weighted: Vec<(f64, &LightSums)> =
            parts.iter().zip(&sums).map(|((w, _), s)| (*w, s)).collect();
        let mix = LightSums::mix(&weighted).unwrap();
        let direct = LightSums::of(&mixed).unwrap();
        assert!(close(mix.xyz.y, direct.xyz.y, 1e-13));
        for (m, d) in mix.ces.samples.iter().zip(&direct.ces.samples) {
            assert!(close(m.z, d.z, 1e-12), "{} {}", m.z, d.z);
        }
        for (m, d) in mix.ssi_bins.iter().zip(&direct.ssi_bins) {
            assert!(close(*m, *d, 1e-12));
        }
        // The figures agree with the spectrum's own to far below print precision.
        let cct = mix.cct().unwrap();
        let want = cct_duv_of_spd(&mixed, CctMethod::Ohno2014).unwrap();
        assert!((cct.cct_k - want.cct_k).abs() < 1e-6);
        let q = mix.quality(cct);
        let cri = crate::cri::cri_with_cct(&mixed, want).unwrap();
        let tm = crate::tm30::tm30_with_cct(&mixed, want).unwrap();
        let ssi = crate::ssi::ssi_at_cct(&mixed, want.cct_k).unwrap();
        assert!((q.cri.unwrap().ra - cri.ra).abs() < 1e-9);
        let q_tm = q.tm30.unwrap();
        assert!((q_tm.rf - tm.rf).abs() < 1e-9 && (q_tm.rg - tm.rg).abs() < 1e-9);
        assert!((q.ssi.unwrap().unrounded - ssi.unrounded).abs() < 1e-9);
        assert!(LightSums::mix(&[]).is_none());
    }

    #[test]
    fn dark_light_has_no_cct() {
        let dark = LightSums::of(&RelativeSpd::from_fn(|_| 0.0)).unwrap();
        assert!(dark.cct().is_err());
    }
}

import { scaleDisagreement, type AlignmentFit } from '../../../shared/viewer/alignment';
import { formatLength } from '../../../shared/viewer/units';

/** Above this relative difference from what the pixel sizes say, the summary asks for a check. */
const SCALE_WARNING = 0.05;

/** An alignment in words for the card: what was fitted, how well the points agree, the scale. */
export interface AlignmentSummary {
  what: string;
  agreement: string;
  scale: string;
  /** Set when the fitted scale and the pixel sizes disagree by more than 5 %. */
  warning: string;
}

/** Pure: the fit, and the pixel sizes of the main and the compared image (µm/px, null when uncalibrated). */
export function summariseAlignment(fit: AlignmentFit, mainUmPerPx: number | null, otherUmPerPx: number | null): AlignmentSummary {
  const n = fit.residualsPx.length;
  const what = fit.kind === 'similarity' ? `Scale, rotation and shift from ${n} point pairs` : `Affine fit (scale, rotation, shear, shift) through ${n} point pairs`;
  const length = (px: number) => (mainUmPerPx ? formatLength(px * mainUmPerPx) : `${Number(px.toPrecision(3))} px`);
  const agreement =
    fit.kind === 'similarity' && n === 2
      ? 'Two pairs fit exactly; a third pair shows how well the points agree.'
      : `Off by, with scale, rotation and shift only: ${fit.similarityResidualsPx.map((r, i) => `${i + 1}: ${length(r)}`).join(' · ')}`;
  const [big, small] = fit.scales;
  const drawn = Math.abs(big - small) < 1e-3 * big ? `${big.toFixed(3)} ×` : `${big.toFixed(3)} × by ${small.toFixed(3)} ×`;
  const turn = `${fit.rotationDeg.toFixed(1)}°`;
  const off = scaleDisagreement(fit, mainUmPerPx, otherUmPerPx);
  const expected = off === null ? '' : `; the pixel sizes say ${(otherUmPerPx! / mainUmPerPx!).toFixed(3)} × (${(off * 100).toFixed(1)} % apart)`;
  return {
    what,
    agreement,
    scale: `Compared image drawn at ${drawn}, turned ${turn}${expected}`,
    warning: off !== null && Math.abs(off) > SCALE_WARNING ? 'The fitted scale and the pixel sizes disagree by more than 5 %: check the points or the calibration.' : '',
  };
}

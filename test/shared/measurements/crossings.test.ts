import { expect } from 'chai';
import sharp from 'sharp';
import { findSteps, findValleys, noiseLevel, smooth } from '../../../shared/measurements/crossings';
import { etchedMicrograph, labelChangesAlongRow, orientationMap, voronoiLabels } from '../../support/synthetic-micrograph';

const W = 900;
const H = 600;
const ROWS = Array.from({ length: 11 }, (_, k) => 25 + k * 55);

/** Mean intercept (px) over the test rows: total line length / total intersections. */
const meanIntercept = (counts: number[]) => (ROWS.length * W) / counts.reduce((a, b) => a + b, 0);

describe('measurements: suggested crossings on synthetic micrographs', function () {
  this.timeout(60_000);
  // Grains from a seeded random tessellation (common practice for testing grain-size software, no source);
  // the truth is the count of label changes along the same rows of the label image.
  const labels = voronoiLabels(W, H, 260, 7);
  const truth = meanIntercept(ROWS.map((y) => labelChangesAlongRow(labels, W, y)));

  it('finds dark boundary valleys of an etched micrograph: l̄ within 5 % of the truth', async () => {
    const { data } = await sharp(await etchedMicrograph(labels, W, H, 7)).extractChannel(0).raw().toBuffer({ resolveWithObject: true });
    const counts = ROWS.map((y) => findValleys(Array.from(data.subarray(y * W, (y + 1) * W))).length);
    expect(meanIntercept(counts)).to.be.closeTo(truth, truth * 0.05);
  });

  it('finds colour steps of a flat-colour orientation map: l̄ within 5 % of the truth', async () => {
    const { data } = await sharp(await orientationMap(labels, W, H, 7)).raw().toBuffer({ resolveWithObject: true });
    const counts = ROWS.map((y) => {
      const row = (c: number) => Array.from({ length: W }, (_, x) => data[(y * W + x) * 3 + c]!);
      return findSteps([row(0), row(1), row(2)]).length;
    });
    expect(meanIntercept(counts)).to.be.closeTo(truth, truth * 0.05);
  });

  it('finds nothing on a flat noisy profile', () => {
    const flat = Array.from({ length: 500 }, (_, i) => 180 + 5 * Math.sin(i * 12.9898) * Math.cos(i * 78.233));
    expect(findValleys(flat)).to.deep.equal([]);
  });

  it('estimates Gaussian noise from first differences and smooths without shifting a valley', () => {
    const profile = Array.from({ length: 101 }, (_, i) => (i === 50 ? 0 : 100));
    const s = smooth(profile, 1.5);
    expect(s.indexOf(Math.min(...s))).to.equal(50);
    expect(noiseLevel([1, 1, 1, 1])).to.equal(0);
  });
});

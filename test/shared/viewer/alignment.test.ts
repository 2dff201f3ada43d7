import { expect } from 'chai';
import jStat from 'jstat';
import {
  alignmentProblem,
  apply,
  compose,
  fitAffine,
  fitAlignment,
  fitSimilarity,
  invert,
  principalScales,
  residuals,
  rotationDegrees,
  scaleDisagreement,
  swapPairs,
  type Affine,
  type PointPair,
  type Vec2,
} from '../../../shared/viewer/alignment';

const pair = (image: Vec2, other: Vec2): PointPair => ({ image, other });

function expectAffine(actual: Affine, expected: Affine, tolerance = 1e-9): void {
  for (const k of ['a', 'b', 'c', 'd', 'e', 'f'] as const) expect(actual[k], `${k} of ${JSON.stringify(actual)}`).to.be.closeTo(expected[k], tolerance);
}

/**
 * Independent reference: ordinary least squares β = (AᵀA)⁻¹Aᵀy with jStat's general matrix routines,
 * one row per coordinate of each pair. Similarity parameters [p, q, e, f] (x' = p·x − q·y + e,
 * y' = q·x + p·y + f); affine parameters [a, c, e, b, d, f].
 */
function jstatLeastSquares(rows: number[][], targets: number[]): number[] {
  const A = rows;
  const At = jStat.transpose(A);
  const beta = jStat.multiply(jStat.multiply(jStat.inv(jStat.multiply(At, A)), At), targets.map((t) => [t]));
  return beta.map((r) => r[0]!);
}

function referenceSimilarity(pairs: PointPair[]): Affine {
  const rows = pairs.flatMap(({ other: [x, y] }) => [[x, -y, 1, 0], [y, x, 0, 1]]);
  const [p, q, e, f] = jstatLeastSquares(rows, pairs.flatMap(({ image }) => [image[0], image[1]]));
  return { a: p!, b: q!, c: -q!, d: p!, e: e!, f: f! };
}

function referenceAffine(pairs: PointPair[]): Affine {
  const rows = pairs.flatMap(({ other: [x, y] }) => [[x, y, 1, 0, 0, 0], [0, 0, 0, x, y, 1]]);
  const [a, c, e, b, d, f] = jstatLeastSquares(rows, pairs.flatMap(({ image }) => [image[0], image[1]]));
  return { a: a!, b: b!, c: c!, d: d!, e: e!, f: f! };
}

/** A small seeded generator (Park–Miller), so the reference cases are the same every run. */
function seeded(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

describe('viewer: alignment of co-located images from point pairs', () => {
  it('two pairs give the similarity through both: scale 2, a quarter turn, shift (10, 20)', () => {
    // Hand-computed: the other image's segment (0,0)→(100,0) lands on (10,20)→(10,220), so it is twice as long
    // and turned from +x to +y (90°, clockwise on screen); s = (0 + 200i) / 100 = 2i, t = (10, 20).
    const pairs = [pair([10, 20], [0, 0]), pair([10, 220], [100, 0])];
    const fit = fitAlignment(pairs);
    expect(fit.kind).to.equal('similarity');
    expectAffine(fit.transform, { a: 0, b: 2, c: -2, d: 0, e: 10, f: 20 });
    expect(fit.rotationDeg).to.be.closeTo(90, 1e-9);
    expect(fit.scales[0]).to.be.closeTo(2, 1e-12);
    expect(fit.scales[1]).to.be.closeTo(2, 1e-12);
    // Hand-computed: (0, 50) → (0·0 − 2·50 + 10, 2·0 + 0·50 + 20) = (−90, 20).
    expect(apply(fit.transform, [0, 50])).to.deep.equal([-90, 20]);
    expect(fit.residualsPx.every((r) => r < 1e-9)).to.equal(true);
  });

  it('three pairs give the affine through all three', () => {
    // Hand-computed: built from a = 3, b = 1, c = 0.5, d = 2, e = 5, f = 7 applied to (0,0), (10,0), (0,10):
    // (5,7), (35,17), (10,27); the fit must recover those six numbers.
    const pairs = [pair([5, 7], [0, 0]), pair([35, 17], [10, 0]), pair([10, 27], [0, 10])];
    const fit = fitAlignment(pairs);
    expect(fit.kind).to.equal('affine');
    expectAffine(fit.transform, { a: 3, b: 1, c: 0.5, d: 2, e: 5, f: 7 });
    expect(fit.residualsPx.every((r) => r < 1e-9)).to.equal(true);
  });

  it('with three pairs, the similarity residuals show what a rotation and scale alone cannot explain', () => {
    // Hand-computed: other (0,0), (10,0), (0,10) on main (0,0), (10,0), (0,12). Centroids (10/3, 10/3) and (10/3, 4);
    // Σ conj(z)·w = 440/3 − 20/3·i and Σ|z|² = 400/3 after centring, so s = 1.1 − 0.05i and t = (−0.5, 0.5).
    // Residuals: (0,0) → (−0.5, 0.5), 0.5·√2 off; (10,0) → (10.5, 0), 0.5 off; (0,10) → (0, 11.5), 0.5 off.
    const pairs = [pair([0, 0], [0, 0]), pair([10, 0], [10, 0]), pair([0, 12], [0, 10])];
    expectAffine(fitSimilarity(pairs), { a: 1.1, b: -0.05, c: 0.05, d: 1.1, e: -0.5, f: 0.5 });
    const fit = fitAlignment(pairs);
    expectAffine(fit.transform, { a: 1, b: 0, c: 0, d: 1.2, e: 0, f: 0 });
    expect(fit.similarityResidualsPx[0]).to.be.closeTo(Math.SQRT1_2, 1e-12);
    expect(fit.similarityResidualsPx[1]).to.be.closeTo(0.5, 1e-12);
    expect(fit.similarityResidualsPx[2]).to.be.closeTo(0.5, 1e-12);
    // Hand-computed: the principal scales of diag(1, 1.2) are its diagonal.
    expect(fit.scales[0]).to.be.closeTo(1.2, 1e-12);
    expect(fit.scales[1]).to.be.closeTo(1, 1e-12);
  });

  it('inverting undoes the transform, and composing a transform with its inverse gives the identity', () => {
    const t: Affine = { a: 3, b: 1, c: 0.5, d: 2, e: 5, f: 7 };
    const inv = invert(t);
    // Hand-computed: det = 3·2 − 1·0.5 = 5.5, so the linear part is [2 −0.5; −1 3] / 5.5.
    expectAffine(inv, { a: 2 / 5.5, b: -1 / 5.5, c: -0.5 / 5.5, d: 3 / 5.5, e: -(2 * 5 - 0.5 * 7) / 5.5, f: -(-1 * 5 + 3 * 7) / 5.5 });
    const back = apply(inv, [35, 17]);
    expect(back[0]).to.be.closeTo(10, 1e-12);
    expect(back[1]).to.be.closeTo(0, 1e-12);
    expectAffine(compose(inv, t), { a: 1, b: 0, c: 0, d: 1, e: 0, f: 0 }, 1e-12);
    expect(() => invert({ a: 1, b: 2, c: 2, d: 4, e: 0, f: 0 })).to.throw(RangeError);
  });

  it('seen from the other image, the swapped pairs fit the inverse transform', () => {
    const pairs = [pair([5, 7], [0, 0]), pair([35, 17], [10, 0]), pair([10, 27], [0, 10])];
    expectAffine(fitAlignment(swapPairs(pairs)).transform, invert(fitAlignment(pairs).transform), 1e-9);
    const two = [pair([10, 20], [0, 0]), pair([10, 220], [100, 0])];
    expectAffine(fitAlignment(swapPairs(two)).transform, invert(fitAlignment(two).transform), 1e-12);
  });

  it('principal scales and rotation read a turned, scaled transform', () => {
    // Hand-computed: 2 × a rotation by 30° has both principal scales 2 and rotation 30°.
    const r = (30 * Math.PI) / 180;
    const t: Affine = { a: 2 * Math.cos(r), b: 2 * Math.sin(r), c: -2 * Math.sin(r), d: 2 * Math.cos(r), e: 0, f: 0 };
    const [s1, s2] = principalScales(t);
    expect(s1).to.be.closeTo(2, 1e-12);
    expect(s2).to.be.closeTo(2, 1e-12);
    expect(rotationDegrees(t)).to.be.closeTo(30, 1e-12);
  });

  it('the fitted scale is compared with what the pixel sizes say', () => {
    const fit = { scales: [2, 2] as [number, number] };
    // Hand-computed: 1.0 µm/px over 0.5 µm/px expects 2 main px per other px, as fitted: 0 % apart.
    expect(scaleDisagreement(fit, 0.5, 1)).to.be.closeTo(0, 1e-12);
    // Hand-computed: 0.98 / 0.5 = 1.96 expected, 2 fitted: 2 / 1.96 − 1 = 0.0204.
    expect(scaleDisagreement(fit, 0.5, 0.98)).to.be.closeTo(0.020408, 1e-6);
    expect(scaleDisagreement(fit, null, 0.98)).to.equal(null);
  });

  it('least-squares fits of noisy pairs agree with a general least-squares solve (jStat)', () => {
    const random = seeded(20261201);
    const truth: Affine = { a: 1.9, b: 0.4, c: -0.35, d: 2.05, e: 120, f: -40 };
    for (let round = 0; round < 20; round++) {
      const n = 2 + Math.floor(random() * 5);
      const pairs = Array.from({ length: Math.max(3, n) }, () => {
        const other: Vec2 = [random() * 2000, random() * 1500];
        const [x, y] = apply(truth, other);
        return pair([x + (random() - 0.5) * 6, y + (random() - 0.5) * 6], other);
      });
      expectAffine(fitSimilarity(pairs), referenceSimilarity(pairs), 1e-6);
      expectAffine(fitAffine(pairs), referenceAffine(pairs), 1e-6);
      const t = fitAffine(pairs);
      const r = residuals(t, pairs);
      expect(r.every((d) => d >= 0 && d < 10), `residuals ${r}`).to.equal(true);
    }
  });

  describe('refuses input that cannot give an alignment, saying why', () => {
    const cases: [string, PointPair[], RegExp][] = [
      ['one pair', [pair([0, 0], [0, 0])], /Pick 2 or 3 pairs/],
      ['four pairs', [pair([0, 0], [0, 0]), pair([50, 0], [50, 0]), pair([0, 50], [0, 50]), pair([50, 50], [50, 50])], /Pick 2 or 3 pairs/],
      // Hand-computed: (0,0) and (1,1) are √2 ≈ 1.4 px apart, under the 3 px minimum.
      ['two clicks on one spot of the compared image', [pair([0, 0], [0, 0]), pair([100, 0], [1, 1])], /Points 1 and 2 on the compared image are the same place \(1\.4 px apart\)/],
      ['two clicks on one spot of the main image', [pair([40, 40], [0, 0]), pair([40, 40], [100, 0])], /Points 1 and 2 on the main image are the same place \(0\.0 px apart\)/],
      // Hand-computed: twice the area is |100·3 − 200·0| = 300, the longest side 200.02 px: 300 / 200.02² = 0.0075 < 0.05.
      ['three nearly collinear points', [pair([0, 0], [0, 0]), pair([100, 0], [100, 0]), pair([200, 3], [200, 3])], /three points on the main image lie on one line/],
      // Hand-computed: 1000 px on the compared image onto 5 px on the main one is a scale of 0.005 < 1/100.
      ['an absurd scale', [pair([0, 0], [0, 0]), pair([5, 0], [1000, 0])], /0\.0050 × the size of the main one/],
      ['a mirror', [pair([0, 0], [0, 0]), pair([0, 100], [100, 0]), pair([100, 0], [0, 100])], /mirrored/],
      // Hand-computed: diag(10, 1) stretches x ten times more than y, above the limit of 5.
      ['a tenfold stretch', [pair([0, 0], [0, 0]), pair([1000, 0], [100, 0]), pair([0, 100], [0, 100])], /stretch the compared image 10\.0 times/],
    ];
    for (const [what, pairs, message] of cases) {
      it(`${what}`, () => {
        expect(alignmentProblem(pairs)).to.match(message);
        expect(() => fitAlignment(pairs)).to.throw(RangeError, message);
      });
    }

    it('but accepts three points well off one line', () => {
      // Hand-computed: twice the area 100·30 = 3000 over 200² + 30² = 40900 is 0.073 ≥ 0.05.
      expect(alignmentProblem([pair([0, 0], [0, 0]), pair([100, 0], [100, 0]), pair([200, 30], [200, 30])])).to.equal(null);
    });
  });
});

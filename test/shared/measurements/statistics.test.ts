import { expect } from 'chai';
import jStat from 'jstat';
import { pointFraction, volumeFraction } from '../../../shared/measurements/point-count';
import { fieldStatistics, studentTCdf, studentTQuantile } from '../../../shared/measurements/statistics';

// jStat's CommonJS build exposes itself as the default export and again as `.jStat`.
const reference = (jStat as unknown as { jStat?: typeof jStat }).jStat ?? jStat;

describe('measurements: field statistics', () => {
  it('matches the Student t quantiles of the jStat package for 1-120 degrees of freedom', () => {
    // Reference: jStat (general-purpose statistics package from npm), studentt.inv.
    for (let df = 1; df <= 120; df++) {
      expect(studentTQuantile(0.975, df), `df ${df}`).to.be.closeTo(reference.studentt.inv(0.975, df), 1e-7);
    }
    for (const p of [0.9, 0.95, 0.995]) expect(studentTQuantile(p, 7)).to.be.closeTo(reference.studentt.inv(p, 7), 1e-7);
  });

  it('gives the primer’s t = 2.776 for 5 fields and 2.262 for 10', () => {
    // TRADE primer, E112 statistics [C]; the same values stand in any Student t table.
    expect(studentTQuantile(0.975, 4)).to.be.closeTo(2.776, 0.0005);
    expect(studentTQuantile(0.975, 9)).to.be.closeTo(2.262, 0.0005);
  });

  it('has a CDF that agrees with the closed forms for 1-3 degrees of freedom and with jStat', () => {
    // Closed forms of the t distribution function for ν = 1, 2, 3 (standard results, e.g. Abramowitz & Stegun 26.7.3-4) [S];
    // jStat's own incomplete beta is good to ~1e-8, so it is held to that.
    const exact: Record<number, (t: number) => number> = {
      1: (t) => 0.5 + Math.atan(t) / Math.PI,
      2: (t) => 0.5 + t / (2 * Math.sqrt(2 + t * t)),
      3: (t) => 0.5 + (t / Math.sqrt(3) / (1 + (t * t) / 3) + Math.atan(t / Math.sqrt(3))) / Math.PI,
    };
    for (const df of [1, 2, 3]) for (const t of [-3, -0.7, 0.1, 0.5, 1, 2, 5]) expect(studentTCdf(t, df)).to.be.closeTo(exact[df]!(t), 5e-9);
    for (const [t, df] of [[0.5, 3], [-1.2, 10], [2.5, 30]] as const) {
      expect(studentTCdf(t, df)).to.be.closeTo(reference.studentt.cdf(t, df), 1e-8);
    }
  });

  it('computes mean, s (n − 1), 95 % CI and %RA for field values', () => {
    const l = [21.3, 19.8, 22.5, 20.1, 18.9];
    const st = fieldStatistics(l);
    // Reference: jStat mean and sample standard deviation; CI = t·s/√n and %RA = CI/mean·100 (E112 statistics, TRADE primer).
    expect(st.mean).to.be.closeTo(reference.mean(l), 1e-12);
    expect(st.s).to.be.closeTo(reference.stdev(l, true), 1e-12);
    expect(st.ci95).to.be.closeTo((reference.studentt.inv(0.975, 4) * st.s) / Math.sqrt(5), 1e-6);
    expect(st.relativeAccuracyPct).to.be.closeTo((st.ci95 / st.mean) * 100, 1e-12);
  });

  it('refuses a single field', () => {
    expect(() => fieldStatistics([20])).to.throw(RangeError);
  });
});

describe('measurements: ASTM E562 point count', () => {
  it('counts boundary points as one half', () => {
    // E562 §3 (TRADE primer [S]): a point on a boundary counts ½. 100 points, 12 inside, 3 on the boundary ⇒ 13.5/100.
    expect(pointFraction({ gridPoints: 100, inside: 12, onBoundary: 3 })).to.equal(0.135);
  });

  it('averages P_p across fields with its confidence interval', () => {
    const fields = [10, 14, 12, 9, 15].map((inside) => ({ gridPoints: 100, inside, onBoundary: 0 }));
    const v = volumeFraction(fields);
    // Mean of 0.10, 0.14, 0.12, 0.09, 0.15 = 0.12 (hand-computed); s and CI per jStat as above.
    expect(v.mean).to.be.closeTo(0.12, 1e-12);
    expect(v.s).to.be.closeTo(reference.stdev([0.1, 0.14, 0.12, 0.09, 0.15], true), 1e-12);
  });

  it('refuses more hits than points', () => {
    expect(() => pointFraction({ gridPoints: 10, inside: 9, onBoundary: 3 })).to.throw(RangeError);
  });
});

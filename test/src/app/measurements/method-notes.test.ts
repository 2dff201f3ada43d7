import { expect } from 'chai';
import type { CountRules } from '../../../../shared/measurements/e112';
import type { Measurement } from '../../../../shared/measurements/measurement-records';
import type { PatternSpec } from '../../../../shared/measurements/patterns';
import { describePattern, methodNotes } from '../../../../src/app/measurements/method-notes';

const NB = '\u00a0';

/** Only what methodNotes reads: definition.kind/pattern, result.kind/rules/twinsExcluded, pixelSize. */
const interceptM = (pattern: PatternSpec, rules: CountRules, umPerPx: number, source: string, twinsExcluded = true): Measurement =>
  ({
    definition: { kind: 'intercept', pattern },
    result: { kind: 'intercept', rules, twinsExcluded },
    pixelSize: { umPerPx, source },
  }) as unknown as Measurement;
const pointCountM = (): Measurement =>
  ({ definition: { kind: 'point_count' }, result: { kind: 'point_count' }, pixelSize: { umPerPx: 9, source: 'typed' } }) as unknown as Measurement;

const P_LINES: CountRules = { count: 'intersections', triplePoint: 1.5 };
const P_CIRCLES: CountRules = { count: 'intersections', triplePoint: 2 };

describe('client: method notes, patterns in words', () => {
  it('describes circles by their diameter', () => {
    expect(describePattern({ type: 'circle', diameterUm: 200 })).to.equal('one circle, 200 µm across');
    expect(describePattern({ type: 'three_circles', largestDiameterUm: 250 })).to.equal('three concentric circles, largest 250 µm across');
  });

  it('describes parallel lines by number, direction and spacing', () => {
    expect(describePattern({ type: 'lines', direction: 'horizontal', spacingUm: 50, count: 5 })).to.equal('5 parallel lines horizontal, 50 µm apart');
    expect(describePattern({ type: 'lines', direction: 'both', spacingUm: 40, count: 4 })).to.equal('4 parallel lines horizontal and vertical, 40 µm apart');
    expect(describePattern({ type: 'lines', direction: 'angle', angleDeg: 30, spacingUm: 40, count: 4 })).to.equal('4 parallel lines at 30°, 40 µm apart');
  });
});

describe('client: method notes, the method statement of a specimen', () => {
  it('lists each distinct pattern, rule set and pixel size once', () => {
    const lines = { type: 'lines', direction: 'horizontal', spacingUm: 50, count: 5 } as const;
    const notes = methodNotes([
      interceptM(lines, P_LINES, 100 / 412, 'stage micrometer'),
      interceptM(lines, P_LINES, 100 / 412, 'stage micrometer'),
      interceptM({ type: 'three_circles', largestDiameterUm: 250 }, P_CIRCLES, 0.5, 'typed'),
    ]);

    expect(notes.patterns).to.deep.equal(['5 parallel lines horizontal, 50 µm apart', 'three concentric circles, largest 250 µm across']);
    expect(notes.rules).to.deep.equal(['intersections P, triple point 1.5', 'intersections P, triple point 2']);
    // TRADE primer [C]: 100 µm over 412 px = 0.2427 µm/px.
    expect(notes.calibration).to.deep.equal([`0.2427${NB}µm/px (stage micrometer)`, `0.5${NB}µm/px (typed)`]);
  });

  it('names intercept counts N', () => {
    const notes = methodNotes([interceptM({ type: 'circle', diameterUm: 200 }, { count: 'intercepts', triplePoint: 2 }, 1, 'typed')]);

    expect(notes.rules).to.deep.equal(['intercepts N, triple point 2']);
  });

  it('leaves point counts and thickness out of the intercept method', () => {
    const notes = methodNotes([pointCountM()]);

    expect(notes.patterns).to.deep.equal([]);
    expect(notes.calibration).to.deep.equal([]);
  });

  it('says twins were left out only when every field left them out', () => {
    // TRADE primer [C]: annealing twin boundaries are not grain boundaries for E112.
    const circle = { type: 'circle', diameterUm: 200 } as const;
    const allOut = methodNotes([interceptM(circle, P_CIRCLES, 1, 'typed'), interceptM(circle, P_CIRCLES, 1, 'typed')]);
    const oneIn = methodNotes([interceptM(circle, P_CIRCLES, 1, 'typed'), interceptM(circle, P_CIRCLES, 1, 'typed', false)]);

    expect(allOut.twins).to.match(/not counted/);
    expect(oneIn.twins).to.match(/Some fields counted/);
  });
});

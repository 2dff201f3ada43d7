import Mocha from 'mocha';

const { Spec } = Mocha.reporters;
const { EVENT_RUN_END } = Mocha.Runner.constants;

/** Mocha's spec reporter, closing with the plain `N passed, N failed` line CI reads. */
export default class SummaryReporter extends Spec {
  constructor(runner: Mocha.Runner, options?: Mocha.MochaOptions) {
    super(runner, options);
    runner.once(EVENT_RUN_END, () => {
      const { passes = 0, failures = 0 } = runner.stats ?? {};
      console.log(`${passes} passed, ${failures} failed`);
    });
  }
}

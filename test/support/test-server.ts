import type { RunningServer } from '../../server/main';

let shared: RunningServer | undefined;

export function setRunningServer(server: RunningServer): void {
  shared = server;
}

/** The app started for this run; tests use its context (data source, mailer) and its URL. */
export function runningServer(): RunningServer {
  if (!shared) throw new Error('The test server is not running; run tests through mocha with .mocharc.json.');
  return shared;
}

import path from 'node:path';
import { loadConfig, PROJECT_ROOT } from '../../server/config';

/**
 * The configuration every test uses: its own database, ports and storage, beside a running `npm start`.
 * EF_TEST_* variables let two test runs share one machine.
 */
export const testConfig = loadConfig({
  ...process.env,
  EF_MODE: 'local',
  EF_DB_NAME: process.env['EF_TEST_DB_NAME'] ?? 'etchfile_test',
  EF_PORT: process.env['EF_TEST_PORT'] ?? '8181',
  EF_SMTP_PORT: process.env['EF_TEST_SMTP_PORT'] ?? '2526',
  EF_STORAGE_DIR: path.join(PROJECT_ROOT, 'storage', process.env['EF_TEST_DB_NAME'] ?? 'etchfile_test'),
  EF_CLIENT_DIR: process.env['EF_TEST_CLIENT_DIR'] ?? path.join(PROJECT_ROOT, 'dist', 'client', 'browser'),
  EF_LOG_LEVEL: process.env['EF_TEST_LOG_LEVEL'] ?? 'silent',
  // Notification mail retried after about a second (then 2, 4… s), so an outage test finishes quickly.
  EF_MAIL_RETRY_SECONDS: '1',
});

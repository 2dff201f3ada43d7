import type { DemoAccount } from '../../shared/auth';

/**
 * The invented demo people, one per role. Their passwords are public on purpose:
 * they are shown on the sign-in page in local mode only, and in the README.
 */
export const DEMO_ACCOUNTS: DemoAccount[] = [
  { email: 'admin@lab.etchfile.test', password: 'demo-admin-pass', role: 'site admin' },
  { email: 'lead@lab.etchfile.test', password: 'demo-lead-pass', role: 'project lead' },
  { email: 'researcher@lab.etchfile.test', password: 'demo-researcher-pass', role: 'researcher' },
  { email: 'reviewer@lab.etchfile.test', password: 'demo-reviewer-pass', role: 'reviewer' },
  { email: 'guest@lab.etchfile.test', password: 'demo-guest-pass', role: 'guest' },
];

import { In } from 'typeorm';
import { DEMO_ACCOUNTS } from '../../../server/demo/demo-accounts';
import { User } from '../../../server/auth/user.entity';
import { ProjectMembership } from '../../../server/projects/project-membership.entity';
import { Project } from '../../../server/projects/project.entity';
import type { ProjectStatus } from '../../../shared/projects';
import { runningServer } from '../../support/test-server';

export type DemoRole = 'admin' | 'lead' | 'researcher' | 'reviewer' | 'guest';

export interface DemoPerson {
  email: string;
  password: string;
  displayName: string;
}

/** The names the demo scenario gives its people (README, "Demo accounts"). */
const NAMES: Record<DemoRole, string> = {
  admin: 'Oda Lindqvar',
  lead: 'Dr. Maren Tallis',
  researcher: 'Joaquim Veldterra',
  reviewer: 'Dr. Sefa Orunmade',
  guest: 'Ilka Pranterow',
};

/** One demo account, with the public password the sign-in page offers in local mode. */
export function demo(role: DemoRole): DemoPerson {
  const email = `${role}@lab.etchfile.test`;
  const account = DEMO_ACCOUNTS.find((a) => a.email === email);
  if (!account) throw new Error(`no demo account ${email}`);
  return { email, password: account.password, displayName: NAMES[role] };
}

/** The demo laminate project every demo member belongs to. */
export const LAMINATE = { code: 'KV-LAM-24', name: 'Twinning / transforming steel laminates by repeated roll bonding' };
export const OXIDES = { code: 'KV-OXI-25', name: 'Interface oxides after wire brushing' };
export const PILOT = { code: 'KV-PILOT-23', name: 'Pilot: two-ply clad strip' };

/**
 * Codes of the projects `email` belongs to, read from the database, sorted. Other tests add
 * projects and members as they run, so the expected list is read at the moment of checking.
 */
export async function projectCodesOf(email: string, status: ProjectStatus): Promise<string[]> {
  const ds = runningServer().ctx.dataSource;
  const user = await ds.getRepository(User).findOneByOrFail({ email });
  const memberships = await ds.getRepository(ProjectMembership).find({ where: { userId: user.id }, relations: { project: true } });
  return memberships
    .map((m) => m.project)
    .filter((p) => p.status === status)
    .map((p) => p.code)
    .sort();
}

/** How many projects exist with one of the given statuses. */
export async function projectCount(statuses: ProjectStatus[]): Promise<number> {
  return runningServer().ctx.dataSource.getRepository(Project).countBy({ status: In(statuses) });
}

export async function projectIdOf(code: string): Promise<string> {
  return (await runningServer().ctx.dataSource.getRepository(Project).findOneByOrFail({ code })).id;
}

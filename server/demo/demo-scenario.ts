import type { DataSource } from 'typeorm';
import type { Logger } from 'pino';
import type { ProjectRole, SiteRole } from '../../shared/roles';
import { addDefaultAnnotationClasses } from '../annotations/default-classes';
import { hashPassword } from '../auth/password-hash';
import { User } from '../auth/user.entity';
import { ProjectMembership } from '../projects/project-membership.entity';
import { Project } from '../projects/project.entity';
import { DEMO_ACCOUNTS } from './demo-accounts';
import { loadDemoArchive } from './demo-archive';

// An invented lab: the Kestrel Valley Institute's laminate metallurgy group. No real people, labs or alloys.
const PEOPLE: { email: string; displayName: string; siteRole: SiteRole }[] = [
  { email: 'admin@lab.etchfile.test', displayName: 'Oda Lindqvar', siteRole: 'admin' },
  { email: 'lead@lab.etchfile.test', displayName: 'Dr. Maren Tallis', siteRole: 'member' },
  { email: 'researcher@lab.etchfile.test', displayName: 'Joaquim Veldterra', siteRole: 'member' },
  { email: 'reviewer@lab.etchfile.test', displayName: 'Dr. Sefa Orunmade', siteRole: 'member' },
  { email: 'guest@lab.etchfile.test', displayName: 'Ilka Pranterow', siteRole: 'member' },
];

const PROJECTS: { code: string; name: string; description: string; status: 'active' | 'archived'; members: [string, ProjectRole][] }[] = [
  {
    code: 'KV-LAM-24',
    name: 'Twinning / transforming steel laminates by repeated roll bonding',
    description:
      'Two austenitic grades, KV-T22 (twinning) and KV-M9 (transforming), stacked and roll-bonded at 50 % per pass with anneals between passes. ' +
      'Grain size per layer and near the bond interfaces, layer thickness, oxide chains along the interfaces.',
    status: 'active',
    members: [
      ['lead', 'lead'],
      ['researcher', 'researcher'],
      ['reviewer', 'reviewer'],
      ['guest', 'guest'],
    ],
  },
  {
    code: 'KV-OXI-25',
    name: 'Interface oxides after wire brushing',
    description: 'How brushing depth and anneal atmosphere change oxide particle fraction along bond interfaces of KV-T22 laminates.',
    status: 'active',
    members: [
      ['researcher', 'lead'],
      ['lead', 'reviewer'],
    ],
  },
  {
    code: 'KV-PILOT-23',
    name: 'Pilot: two-ply clad strip',
    description: 'The first bonding trials of the group; kept for reference.',
    status: 'archived',
    members: [['lead', 'lead']],
  },
];

const MARKER = 'demo_scenario';

/** Loads the demo scenario into an empty database once; later runs leave everything as users left it. */
export async function loadDemoScenarioOnce(ds: DataSource, logger: Logger): Promise<void> {
  const done = await ds.query('SELECT 1 FROM app_state WHERE key = $1', [MARKER]);
  if (done.length > 0) return;
  const hashes = new Map(await Promise.all(DEMO_ACCOUNTS.map(async (a) => [a.email, await hashPassword(a.password)] as const)));
  await ds.transaction(async (m) => {
    const ids = new Map<string, string>();
    for (const person of PEOPLE) {
      const existing = await m.findOneBy(User, { email: person.email });
      const user = existing ?? (await m.save(m.create(User, { ...person, passwordHash: hashes.get(person.email) ?? null })));
      ids.set(person.email.split('@')[0]!, user.id);
    }
    for (const { members, ...fields } of PROJECTS) {
      if (await m.existsBy(Project, { code: fields.code })) continue;
      const project = await m.save(m.create(Project, fields));
      for (const [who, role] of members) await m.insert(ProjectMembership, { projectId: project.id, userId: ids.get(who)!, role });
      await addDefaultAnnotationClasses(m, project.id);
      if (project.code === 'KV-LAM-24') await loadDemoArchive(m, project.id);
    }
    await m.query('INSERT INTO app_state (key, value) VALUES ($1, $2)', [MARKER, JSON.stringify({ loadedAt: new Date().toISOString() })]);
  });
  logger.info('demo scenario loaded');
}

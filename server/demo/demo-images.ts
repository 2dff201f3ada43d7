import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import { CSRF_HEADER } from '../../shared/auth-constants';
import type { Config } from '../config';
import { DEMO_ACCOUNTS } from './demo-accounts';
import { etchedLaminate, laminateLabels, orientationLaminate } from './demo-micrographs';

const MARKER = 'demo_images';

interface DemoPicture {
  name: string;
  specimen: string;
  location: string;
  fields: Record<string, string>;
  make(): Promise<Buffer>;
}

/**
 * Files invented micrographs of the demo laminate through the real upload API as the demo
 * researcher, once, so a first `npm start` has pictures to view, measure and review.
 * Runs after the server listens; a failure is logged and leaves the rest of the demo usable.
 */
export async function loadDemoImagesOnce(config: Config, ds: DataSource, logger: Logger): Promise<void> {
  if ((await ds.query('SELECT 1 FROM app_state WHERE key = $1', [MARKER])).length > 0) return;
  const [W, H] = [1600, 1200];
  const labels = laminateLabels(W, H, 24);
  const pictures: DemoPicture[] = [
    {
      name: 'ARB-3-P1-L_interface1_500x.tif',
      specimen: 'ARB-3-P1-L',
      location: 'interface 1, centre',
      fields: { modality: 'lom_bright_field', instrument: 'KV upright microscope 2', magnification: '500', tags: 'nital,interface', notes: 'Fine KV-T22 grains above the bond interface, coarser KV-M9 below; oxide particles along the interface.' },
      make: () => etchedLaminate(labels, W, H, 24, 0.25),
    },
    {
      name: 'ARB-3-P1-L_interface1_orientation.png',
      specimen: 'ARB-3-P1-L',
      location: 'interface 1, centre',
      fields: { modality: 'ebsd_orientation', instrument: 'KV field-emission SEM', acceleratingVoltageKv: '20', pixelSizeUm: '0.25', tags: 'ebsd,interface', notes: 'Same field as the 500x micrograph; orientation colours.' },
      make: () => orientationLaminate(labels, W, H, 24),
    },
    {
      name: 'ARB-3-P1-L_edge_500x.tif',
      specimen: 'ARB-3-P1-L',
      location: 'interface 1, edge',
      fields: { modality: 'lom_bright_field', instrument: 'KV upright microscope 2', magnification: '500', tags: 'nital,interface' },
      make: () => etchedLaminate(laminateLabels(W, H, 31), W, H, 31, 0.25),
    },
  ];
  try {
    const api = await signedInApi(config.publicUrl);
    const [project] = await ds.query(`SELECT id FROM projects WHERE code = 'KV-LAM-24'`);
    if (!project) return;
    for (const p of pictures) {
      const [place] = await ds.query(
        `SELECT s.id AS specimen_id, l.id AS location_id FROM specimens s JOIN specimen_locations l ON l.specimen_id = s.id
          WHERE s.project_id = $1 AND s.code = $2 AND l.name = $3`,
        [project.id, p.specimen, p.location],
      );
      const form = new FormData();
      form.set('specimenId', place.specimen_id);
      form.set('locationId', place.location_id);
      for (const [k, v] of Object.entries(p.fields)) form.set(k, v);
      form.set('file', new Blob([new Uint8Array(await p.make())]), p.name);
      const res = await api(`/api/projects/${project.id}/images`, { method: 'POST', body: form });
      if (res.status !== 201 && res.status !== 409) throw new Error(`upload of ${p.name} answered ${res.status}: ${await res.text()}`);
    }
    await ds.query('INSERT INTO app_state (key, value) VALUES ($1, $2)', [MARKER, JSON.stringify({ loadedAt: new Date().toISOString() })]);
    logger.info(`demo micrographs filed (${pictures.length}); their tiles are being made in the background`);
  } catch (err) {
    // Catches anything in the demo upload: the demo stays usable without its pictures, and the next start tries again.
    logger.warn({ err }, 'demo micrographs could not be filed');
  }
}

/** A fetch bound to a signed-in session of the demo researcher (cookie and CSRF token kept). */
async function signedInApi(base: string): Promise<(path: string, init: RequestInit) => Promise<Response>> {
  const account = DEMO_ACCOUNTS.find((a) => a.role === 'researcher')!;
  let cookie = '';
  let token = '';
  const call = async (path: string, init: RequestInit = {}) => {
    const res = await fetch(base + path, { ...init, headers: { ...(init.headers as Record<string, string>), cookie, [CSRF_HEADER]: token } });
    const set = res.headers.getSetCookie().find((c) => c.startsWith('etchfile.sid='));
    if (set) cookie = set.split(';')[0]!;
    return res;
  };
  token = ((await (await call('/api/auth/session')).json()) as { csrfToken: string }).csrfToken;
  const signIn = await call('/api/auth/sign-in', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: account.email, password: account.password }) });
  if (!signIn.ok) throw new Error(`demo sign-in answered ${signIn.status}`);
  token = ((await signIn.json()) as { csrfToken: string }).csrfToken;
  return call;
}

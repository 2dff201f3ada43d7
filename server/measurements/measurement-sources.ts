import type { EntityManager } from 'typeorm';
import type { PointCountSource } from '../../shared/measurements/measurement-records';
import { BOND_INTERFACE_CLASS, type MeasurementBody } from '../../shared/measurements/measurements';

/**
 * Which shapes and saved measurements a result was computed from (ids and versions at the time), and
 * what has become of them since. Annotations carry a version that every edit bumps, so comparing
 * versions tells a redrawn line from an untouched one without any hook in the annotations feature.
 */

/** An annotation a result used, as it was then. */
export interface AnnotationSource {
  id: string;
  version: number;
  role: 'bond_interface' | 'region';
  /** How a person recognises it: its label, or its place in band order ("2"). */
  name: string;
}

/** What a stored measurement depends on besides its definition (kept in its layout). */
export interface MeasurementSources {
  /** The annotations whose geometry the result depends on. */
  annotations: AnnotationSource[];
  /** Whether newly drawn bond interfaces would change the result (bands, sub-bands, thickness). */
  followsInterfaces: boolean;
  /** Two-phase: the point count V_V was taken from. */
  pointCount: PointCountSource | null;
}

/** The current state of an image's shapes and point counts, read once per request. */
export interface CurrentShapes {
  annotations: Map<string, { version: number; kind: string; className: string; imageId: string }>;
  pointCounts: Map<string, { version: number }>;
}

/** Reads the annotations and point counts of these images (one query each). */
export async function currentShapes(m: EntityManager, imageIds: readonly string[]): Promise<CurrentShapes> {
  const ids = [...new Set(imageIds)];
  if (ids.length === 0) return { annotations: new Map(), pointCounts: new Map() };
  const rows: { id: string; version: number; kind: string; class_name: string; image_id: string }[] = await m.query(
    `SELECT a.id, a.version, a.kind, a.image_id, c.name AS class_name FROM annotations a JOIN annotation_classes c ON c.id = a.class_id WHERE a.image_id = ANY($1::uuid[])`,
    [ids],
  );
  const counts: { id: string; version: number }[] = await m.query(`SELECT id, version FROM measurements WHERE image_id = ANY($1::uuid[]) AND kind = 'point_count'`, [ids]);
  return {
    annotations: new Map(rows.map((r) => [r.id, { version: r.version, kind: r.kind, className: r.class_name, imageId: r.image_id }])),
    pointCounts: new Map(counts.map((c) => [c.id, { version: c.version }])),
  };
}

/** Whether the result depends on where the bond interfaces lie (not only on the direction they give "along"). */
export function followsInterfaces(def: MeasurementBody): boolean {
  return def.where.type === 'band' || def.kind === 'thickness' || (def.kind === 'intercept' && def.distanceBinsUm !== null);
}

/** Of the annotations read for a frame, those the definition's result depends on. */
export function usedAnnotations(def: MeasurementBody, read: readonly AnnotationSource[]): AnnotationSource[] {
  return read.filter((a) => (a.role === 'region' ? def.where.type === 'region' : followsInterfaces(def)));
}

const ROLE_WORDS: Record<AnnotationSource['role'], string> = { bond_interface: 'Bond interface', region: 'The region outline' };

/** One sentence per change since the result was computed; empty when nothing it used has changed. Pure. */
export function sourceChanges(sources: MeasurementSources | undefined, imageId: string, now: CurrentShapes): string[] {
  if (!sources) return []; // saved before sources were recorded: only the pixel size can be checked
  const out: string[] = [];
  for (const a of sources.annotations) {
    const current = now.annotations.get(a.id);
    const who = `${ROLE_WORDS[a.role]} ${a.name}`;
    if (!current || current.imageId !== imageId) out.push(`${who} was deleted.`);
    else if (current.version !== a.version) out.push(`${who} was redrawn or changed (version ${a.version}, now ${current.version}).`);
    else if (a.role === 'bond_interface' && current.className !== BOND_INTERFACE_CLASS) out.push(`${who} is no longer in the “${BOND_INTERFACE_CLASS}” class.`);
  }
  if (sources.followsInterfaces) {
    const used = new Set(sources.annotations.filter((a) => a.role === 'bond_interface').map((a) => a.id));
    const added = [...now.annotations.entries()].filter(([id, a]) => a.imageId === imageId && a.kind === 'polyline' && a.className === BOND_INTERFACE_CLASS && !used.has(id)).length;
    if (added > 0) out.push(`${added === 1 ? 'A bond interface was' : `${added} bond interfaces were`} drawn since, so the bands have moved.`);
  }
  const pc = sources.pointCount;
  if (pc) {
    const current = now.pointCounts.get(pc.id);
    if (!current) out.push(`The point count of “${pc.phaseName}” that gave V_V was deleted.`);
    else if (current.version !== pc.version) out.push(`The point count of “${pc.phaseName}” that gave V_V was changed (version ${pc.version}, now ${current.version}).`);
  }
  return out;
}

/** How a bond interface is named in a sentence: its label, or its place in band order. */
export function interfaceName(label: string, index: number): string {
  return label ? `“${label}”` : String(index + 1);
}

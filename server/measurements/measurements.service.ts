import type { EntityManager } from 'typeorm';
import type { FieldProblem } from '../../shared/api-error';
import type { Measurement as MeasurementDto, MeasurementDetail, MeasurementHistoryEntry } from '../../shared/measurements/measurement-records';
import { measurementBody, type MeasurementBody, type UpdateMeasurementBody } from '../../shared/measurements/measurements';
import { recordActivity } from '../activity/record-activity';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { Image } from '../images/image.entity';
import { returnToDraftIfCleared } from '../reviews/return-to-draft';
import { checkBins, checkMarks, compute, invalid, layOut, pixelSizeOf, readFrame, resolvePhase, withSources, type Computed, type FrameSnapshot } from './measurement-build';
import { whereLabel } from './field-geometry';
import { currentShapes, sourceChanges } from './measurement-sources';
import { MeasurementHistory } from './measurement-history.entity';
import { describeResult, formatUmPerPx, KIND_WORDS, staleness, toHistoryEntry, toMeasurementDto } from './measurement.mapper';
import { Measurement, type MeasurementLayout } from './measurement.entity';

/**
 * Measurements on an image. Every save recomputes the result on the server; every change bumps
 * `version` (a writer holding an older one gets 409) and appends the replaced result to the history.
 */
export class MeasurementsService {
  constructor(private readonly ctx: AppContext) {}

  async list(projectId: string, imageId: string): Promise<MeasurementDto[]> {
    const m = this.ctx.dataSource.manager;
    await this.image(m, projectId, imageId);
    const rows = await m.find(Measurement, { where: { imageId }, relations: { author: true, image: true }, order: { createdAt: 'ASC' } });
    const now = await currentShapes(m, [imageId]);
    return rows.map((row) => toMeasurementDto(row, now));
  }

  async detail(projectId: string, imageId: string, id: string): Promise<MeasurementDetail> {
    const m = this.ctx.dataSource.manager;
    await this.image(m, projectId, imageId);
    const current = await this.find(m, imageId, id);
    const history = await m.find(MeasurementHistory, { where: { measurementId: id }, relations: { replacer: true }, order: { seq: 'DESC' } });
    return { ...toMeasurementDto(current, await currentShapes(m, [imageId])), history: history.map(toHistoryEntry) };
  }

  async create(user: Express.User, projectId: string, imageId: string, body: MeasurementBody): Promise<MeasurementDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      const umPerPx = pixelSizeOf(image);
      const frame = await readFrame(m, image, body.where);
      checkBins(body, frame);
      const { def, pointCount } = await resolvePhase(m, imageId, body, whereLabel(body.where, frame.regionLabel));
      const layout = layOut(def, withSources(frame, def, pointCount), umPerPx);
      const computed = compute(def, layout, umPerPx);
      checkMarks(def, layout, computed, umPerPx);
      const saved = await m.save(
        m.create(Measurement, {
          projectId, imageId, kind: def.kind, definition: def, layout: withCounted(layout, computed), result: computed.result,
          whereLabel: computed.whereLabel, umPerPx, pixelSizeSource: image.pixelSizeSource, authorId: user.id, updatedBy: user.id,
        }),
      );
      const summary = `measured ${KIND_WORDS[body.kind]} on ${computed.whereLabel}: ${describeResult(computed.result)}`;
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'measurement.created', summary, details: { measurementId: saved.id } });
      // A cleared image is no longer what was cleared: back to draft, in this transaction.
      await returnToDraftIfCleared(m, imageId, user.id, 'the measurements');
      return this.reload(m, saved.id);
    });
  }

  /** Merges the changes into the stored definition and recomputes at the measurement's own pixel size (recompute adopts a new one). */
  async update(user: Express.User, projectId: string, imageId: string, id: string, body: UpdateMeasurementBody): Promise<MeasurementDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      const current = await this.find(m, imageId, id);
      if (current.version !== body.version) await this.conflict(m, current, body.version);
      const { version, ...changes } = body;
      const merged = parseMerged(current.definition, changes);
      const { laid, gridSpacingPx, counted, ...kept } = current.layout;
      // A new where or new sub-bands read the annotations again (interfaces may have been redrawn); otherwise the stored frame stands.
      const reread = 'where' in changes || differs(current.definition, merged, 'distanceBinsUm');
      const read: FrameSnapshot = reread ? await readFrame(m, image, merged.where) : kept;
      checkBins(merged, read);
      // A changed phase is resolved again (its point count may be another); otherwise the stored V_V and its source stand.
      const rephase = reread || differs(current.definition, merged, 'phase');
      const phase = rephase ? await resolvePhase(m, imageId, merged, whereLabel(merged.where, read.regionLabel)) : { def: keepVolumeFraction(merged, current.definition), pointCount: kept.sources?.pointCount ?? null };
      const def = phase.def;
      const frame = reread || rephase ? withSources(read, def, phase.pointCount) : read;
      const relay = 'pattern' in changes || 'placement' in changes || 'grid' in changes;
      const layout: MeasurementLayout = relay ? layOut(def, frame, current.umPerPx) : { ...frame, laid, gridSpacingPx, counted };
      const computed = compute(def, layout, current.umPerPx);
      checkMarks(def, layout, computed, current.umPerPx);
      await this.replace(m, user, current, version, 'edited', {
        definition: def, layout: withCounted(layout, computed), result: computed.result, whereLabel: computed.whereLabel,
      });
      const summary = `changed a measurement of ${KIND_WORDS[def.kind]} on ${computed.whereLabel}: ${describeResult(computed.result)}`;
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'measurement.updated', summary, details: { measurementId: id, version: version + 1 } });
      await returnToDraftIfCleared(m, imageId, user.id, 'the measurements');
      return this.reload(m, id);
    });
  }

  /** A new result at the image's current pixel size, from the same layout and marks; the old one goes to the history. */
  async recompute(user: Express.User, projectId: string, imageId: string, id: string, version: number): Promise<MeasurementDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      const current = await this.find(m, imageId, id);
      if (current.version !== version) await this.conflict(m, current, version);
      const umPerPx = pixelSizeOf(image);
      const changes = sourceChanges(current.layout.sources, imageId, await currentShapes(m, [imageId]));
      // Nothing changed since it was computed: answer it as it is, without a history row.
      if (staleness(current.umPerPx, image.pixelSizeUm, changes) === null) return this.reload(m, id);
      let { definition: def, layout } = current;
      if (changes.length > 0) {
        // The shapes (or the point count) changed: read them as they are now; the pattern stays laid where its marks are.
        const { laid, gridSpacingPx, counted } = layout;
        const frame = await readFrame(m, image, def.where, 'where');
        checkBins(def, frame);
        const phase = await resolvePhase(m, imageId, def, whereLabel(def.where, frame.regionLabel));
        def = phase.def;
        layout = { ...withSources(frame, def, phase.pointCount), laid, gridSpacingPx, counted };
      }
      const computed = compute(def, layout, umPerPx);
      await this.replace(m, user, current, version, 'recomputed', {
        definition: def, layout: withCounted(layout, computed), result: computed.result, whereLabel: computed.whereLabel,
        umPerPx, pixelSizeSource: image.pixelSizeSource, computedAt: new Date(),
      });
      const why = changes.length > 0 ? `after ${changes.length} change${changes.length > 1 ? 's' : ''} to what it used` : `at ${formatUmPerPx(umPerPx)} µm/px (was ${formatUmPerPx(current.umPerPx)})`;
      const summary = `recomputed a measurement ${why}: ${describeResult(computed.result)}`;
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'measurement.updated', summary, details: { measurementId: id, version: version + 1 } });
      await returnToDraftIfCleared(m, imageId, user.id, 'the measurements');
      return this.reload(m, id);
    });
  }

  async remove(user: Express.User, projectId: string, imageId: string, id: string, version: number): Promise<void> {
    await this.ctx.dataSource.transaction(async (m) => {
      await this.image(m, projectId, imageId);
      const current = await this.find(m, imageId, id);
      if (current.version !== version) await this.conflict(m, current, version);
      await m.insert(MeasurementHistory, historyRow(current, user, 'deleted'));
      const result = await m.delete(Measurement, { id, version });
      if (result.affected !== 1) await this.conflict(m, current, version);
      const summary = `deleted a measurement of ${KIND_WORDS[current.kind]} on ${current.whereLabel} (${describeResult(current.result)})`;
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'measurement.deleted', summary, details: { measurementId: id } });
      await returnToDraftIfCleared(m, imageId, user.id, 'the measurements');
    });
  }

  /** The image in this project, or 404. */
  async image(m: EntityManager, projectId: string, imageId: string): Promise<Image> {
    const image = await m.findOneBy(Image, { id: imageId, projectId });
    if (!image) throw AppError.notFound('The image');
    return image;
  }

  private async replace(m: EntityManager, user: Express.User, current: Measurement, version: number, reason: MeasurementHistoryEntry['reason'], changes: Partial<Measurement>): Promise<void> {
    await m.insert(MeasurementHistory, historyRow(current, user, reason));
    const result = await m
      .createQueryBuilder()
      .update(Measurement)
      .set({ ...changes, computedAt: new Date(), updatedAt: new Date(), updatedBy: user.id, version: () => 'version + 1' })
      .where('id = :id AND version = :version', { id: current.id, version })
      .execute();
    // Someone saved between our read and this write: the transaction rolls back with the history row.
    if (result.affected !== 1) await this.conflict(m, current, version);
  }

  private async find(m: EntityManager, imageId: string, id: string): Promise<Measurement> {
    const row = await m.findOne(Measurement, { where: { id, imageId }, relations: { author: true, image: true } });
    if (!row) throw AppError.notFound('The measurement');
    return row;
  }

  private async reload(m: EntityManager, id: string): Promise<MeasurementDto> {
    const row = await m.findOneOrFail(Measurement, { where: { id }, relations: { author: true, image: true } });
    return toMeasurementDto(row, await currentShapes(m, [row.imageId]));
  }

  private async conflict(m: EntityManager, before: Measurement, sentVersion: number): Promise<never> {
    const now = await m.findOne(Measurement, { where: { id: before.id }, relations: { author: true } });
    const [who] = now ? await m.query('SELECT display_name FROM users WHERE id = $1', [now.updatedBy]) : [];
    throw AppError.conflict(
      now
        ? `${who?.display_name ?? 'Someone'} changed this measurement after you loaded it (you had version ${sentVersion}, it is now ${now.version}). Reload it, then make your change again.`
        : 'Someone deleted this measurement after you loaded it.',
    );
  }
}

/** Whether a definition field differs between the stored and the merged definition (as JSON). */
function differs(stored: MeasurementBody, merged: MeasurementBody, key: 'distanceBinsUm' | 'phase'): boolean {
  const value = (d: MeasurementBody) => JSON.stringify(d.kind === 'intercept' ? withoutFilledFraction(d, key) : null);
  return value(stored) !== value(merged);
}

/** The phase as a person chose it: a V_V the server filled in from a point count is not part of the choice. */
function withoutFilledFraction(d: Extract<MeasurementBody, { kind: 'intercept' }>, key: 'distanceBinsUm' | 'phase'): unknown {
  if (key === 'distanceBinsUm') return d.distanceBinsUm;
  return d.phase?.pointCountId ? { name: d.phase.name, pointCountId: d.phase.pointCountId } : d.phase;
}

/** An unchanged point-count phase keeps the V_V it was resolved to. */
function keepVolumeFraction(merged: MeasurementBody, stored: MeasurementBody): MeasurementBody {
  if (merged.kind !== 'intercept' || stored.kind !== 'intercept' || !merged.phase?.pointCountId || !stored.phase) return merged;
  return { ...merged, phase: { ...merged.phase, volumeFraction: stored.phase.volumeFraction } };
}

function withCounted(layout: MeasurementLayout, computed: Computed): MeasurementLayout {
  return { ...layout, counted: { testLines: computed.testLines, grid: computed.grid } };
}

function historyRow(current: Measurement, user: Express.User, reason: MeasurementHistoryEntry['reason']): Partial<MeasurementHistory> {
  return {
    measurementId: current.id, projectId: current.projectId, imageId: current.imageId, version: current.version, reason,
    definition: current.definition, result: current.result, umPerPx: current.umPerPx, pixelSizeSource: current.pixelSizeSource, replacedBy: user.id,
  };
}

/** The stored definition with the changes laid over it, checked as a whole like a new one (so every rule still holds). */
function parseMerged(stored: MeasurementBody, changes: Omit<UpdateMeasurementBody, 'version'>): MeasurementBody {
  const parsed = measurementBody.safeParse({ ...stored, ...changes });
  if (parsed.success) return parsed.data;
  const details: FieldProblem[] = parsed.error.issues.map((issue) =>
    issue.code === 'unrecognized_keys'
      ? { field: ['body', ...issue.path.map(String), issue.keys[0]!].join('.'), message: `This ${stored.kind.replace('_', ' ')} measurement has no field ${issue.keys.join(', ')}.` }
      : { field: ['body', ...issue.path.map(String)].join('.'), message: issue.message },
  );
  throw invalid(details);
}

import type { ImageRecord, ImageSummary } from '../../shared/images';
import type { Image } from './image.entity';
import { TILE_SIZE } from '../../shared/tile-pyramid';

/** Expects `specimen.sample`, `location` and `uploader` loaded. */
export function toImageSummary(i: Image): ImageSummary {
  return {
    id: i.id,
    projectId: i.projectId,
    originalName: i.originalName,
    modality: i.modality,
    element: i.element,
    specimenId: i.specimenId,
    specimenCode: i.specimen.code,
    sampleId: i.specimen.sampleId,
    sampleCode: i.specimen.sample.code,
    locationId: i.locationId,
    locationName: i.location?.name ?? null,
    magnification: i.magnification,
    pixelSize: { xUm: i.pixelSizeUm, yUm: i.pixelSizeYUm, source: i.pixelSizeSource, confirmed: i.pixelSizeConfirmed, note: i.pixelSizeNote },
    width: i.width,
    height: i.height,
    bitDepth: i.bitDepth,
    channels: i.channels,
    format: i.format,
    tags: i.tags,
    acquiredAt: i.acquiredAt?.toISOString() ?? null,
    uploadedAt: i.uploadedAt.toISOString(),
    uploaderId: i.uploaderId,
    uploaderName: i.uploader.displayName,
    processing: { state: i.state, progress: i.progress, failureReason: i.failureReason, attempts: i.attempts },
  };
}

export function toImageRecord(i: Image): ImageRecord {
  return {
    ...toImageSummary(i),
    instrument: i.instrument,
    acceleratingVoltageKv: i.acceleratingVoltageKv,
    workingDistanceMm: i.workingDistanceMm,
    detector: i.detector,
    notes: i.notes,
    sha256: i.sha256,
    byteSize: Number(i.byteSize),
    pageCount: i.pageCount,
    pyramid: i.state === 'ready' && i.pyramidLevels ? { levels: i.pyramidLevels, tileSize: TILE_SIZE, format: 'jpeg' } : null,
    updatedAt: i.updatedAt.toISOString(),
  };
}

import type { RouteState } from '../../../shared/archive/process-route';
import { formatThickness } from './quantities';

/** A layer as the stack picture needs it. */
export interface PictureLayer {
  materialId: string;
  designation: string;
  thicknessMm: number;
}

/** One drawn band of the picture, in SVG units (y grows downwards). */
export interface StackBand {
  /** Position in the stack, 0 = bottom. */
  position: number;
  materialId: string;
  designation: string;
  /** Index into the material colours, by first appearance in the stack. */
  colourIndex: number;
  y: number;
  height: number;
  /** "1.50 mm". */
  thickness: string;
  /** "1.50 mm" when the band is tall enough to carry it, else null. */
  label: string | null;
  /** Always there, for a tooltip: "layer 2 of 8: KV-M9, 0.375 mm". */
  title: string;
}

export interface LegendEntry {
  materialId: string;
  designation: string;
  colourIndex: number;
  layerCount: number;
  /** Sum of its layers. */
  totalThickness: string;
}

export interface StackPicture {
  bands: StackBand[];
  legend: LegendEntry[];
  totalThickness: string;
  layerCount: number;
  /** More layers than can be drawn one by one; the view says so instead. */
  tooMany: boolean;
}

/** Above this many layers the picture is no longer readable band by band. */
export const MAX_DRAWN_LAYERS = 512;
/** A band shorter than this (SVG units) carries no thickness label. */
export const MIN_LABELLED_HEIGHT = 14;

/**
 * Geometry of the layer-stack picture: bands from the bottom of a box of
 * `height` units to its top, each as tall as its share of the total thickness,
 * coloured per material (in order of first appearance) with a legend.
 */
export function stackPicture(layers: readonly PictureLayer[], height: number): StackPicture {
  const colourOf = new Map<string, number>();
  for (const layer of layers) if (!colourOf.has(layer.materialId)) colourOf.set(layer.materialId, colourOf.size);
  const total = layers.reduce((sum, l) => sum + Math.max(0, l.thicknessMm), 0);
  const legend = [...colourOf.entries()].map(([materialId, colourIndex]) => {
    const own = layers.filter((l) => l.materialId === materialId);
    return {
      materialId,
      designation: own[0]!.designation,
      colourIndex,
      layerCount: own.length,
      totalThickness: formatThickness(own.reduce((sum, l) => sum + l.thicknessMm, 0)),
    };
  });
  const base = { legend, totalThickness: formatThickness(total), layerCount: layers.length };
  if (layers.length > MAX_DRAWN_LAYERS || total <= 0) return { ...base, bands: [], tooMany: layers.length > MAX_DRAWN_LAYERS };

  let bottom = height;
  const bands = layers.map((layer, position): StackBand => {
    const bandHeight = (Math.max(0, layer.thicknessMm) / total) * height;
    bottom -= bandHeight;
    const thickness = formatThickness(layer.thicknessMm);
    return {
      position,
      materialId: layer.materialId,
      designation: layer.designation,
      colourIndex: colourOf.get(layer.materialId)!,
      y: bottom,
      height: bandHeight,
      thickness,
      label: bandHeight >= MIN_LABELLED_HEIGHT ? thickness : null,
      title: `layer ${position + 1} of ${layers.length}: ${layer.designation}, ${thickness}`,
    };
  });
  return { ...base, bands, tooMany: false };
}

/**
 * The stack a route state implies: the recorded layers, thinned to the state's
 * thicknesses and repeated as often as cut-and-stack steps multiplied them.
 * Returns [] when the state asks for more layers than can be drawn.
 */
export function impliedStack(layers: readonly Omit<PictureLayer, 'thicknessMm'>[], state: RouteState): PictureLayer[] {
  if (layers.length === 0 || state.layerCount > MAX_DRAWN_LAYERS) return [];
  const copies = Math.round(state.layerCount / layers.length);
  const one = layers.map((l, i) => ({ ...l, thicknessMm: state.originalLayerThicknessMm[i] ?? 0 }));
  return Array.from({ length: copies }, () => one).flat();
}

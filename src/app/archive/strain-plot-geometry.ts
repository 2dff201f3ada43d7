import type { RouteState } from '../../../shared/archive/process-route';
import { formatStrain } from './quantities';

/** The drawing area: the whole SVG and the margins kept for axis labels. */
export interface PlotBox {
  width: number;
  height: number;
  left: number;
  right: number;
  top: number;
  bottom: number;
}

export interface PlotPoint {
  /** 0 = as stacked, i = after step i. */
  index: number;
  x: number;
  strainY: number;
  layersY: number;
  strain: number;
  layerCount: number;
}

export interface AxisTick {
  /** Position along the axis (y for value axes, x for the step axis). */
  at: number;
  label: string;
}

export interface StrainPlot {
  points: PlotPoint[];
  /** SVG path data: ε as a polyline, layer count as steps (it changes at a step, not between steps). */
  strainPath: string;
  layersPath: string;
  strainTicks: AxisTick[];
  layerTicks: AxisTick[];
  stepTicks: AxisTick[];
  /** Whether the layer axis is in powers of two (log scale). */
  logLayers: boolean;
}

/** A "nice" upper bound for the ε axis: 1, 2, 2.5 or 5 × 10^k at or above the largest value. */
export function niceCeiling(value: number): number {
  if (!(value > 0)) return 1;
  const power = 10 ** Math.floor(Math.log10(value));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * power >= value - 1e-12) return m * power;
  return 10 * power;
}

const round = (v: number) => Math.round(v * 100) / 100;

/**
 * Geometry of the small plot of von Mises strain and layer count against the
 * step number. ε is linear from 0; the layer count uses a log2 axis once it
 * passes 8, since cut-and-stack doubles it.
 */
export function strainPlot(states: readonly RouteState[], box: PlotBox): StrainPlot {
  const innerW = box.width - box.left - box.right;
  const innerH = box.height - box.top - box.bottom;
  const steps = Math.max(1, states.length - 1);
  const maxStrain = niceCeiling(Math.max(0, ...states.map((s) => s.vonMisesStrain)));
  const maxLayers = Math.max(1, ...states.map((s) => s.layerCount));
  const logLayers = maxLayers > 8;
  const layerTop = logLayers ? 2 ** Math.ceil(Math.log2(maxLayers)) : Math.max(2, maxLayers);
  const layerScale = (n: number) => (logLayers ? Math.log2(Math.max(1, n)) / Math.log2(layerTop) : n / layerTop);

  const x = (i: number) => round(box.left + (i / steps) * innerW);
  const yOf = (fraction: number) => round(box.top + innerH * (1 - fraction));
  const points = states.map((s, index) => ({
    index,
    x: x(index),
    strainY: yOf(s.vonMisesStrain / maxStrain),
    layersY: yOf(layerScale(s.layerCount)),
    strain: s.vonMisesStrain,
    layerCount: s.layerCount,
  }));

  const strainPath = points.map((p, i) => `${i === 0 ? 'M' : 'L'}${p.x} ${p.strainY}`).join(' ');
  const layersPath = points
    .map((p, i) => (i === 0 ? `M${p.x} ${p.layersY}` : `H${p.x} V${p.layersY}`))
    .join(' ');

  const strainTicks = [0, 0.5, 1].map((f) => ({ at: yOf(f), label: formatStrain(f * maxStrain) }));
  const layerValues = logLayers
    ? Array.from({ length: Math.log2(layerTop) + 1 }, (_, k) => 2 ** k).filter((_, k, all) => all.length <= 6 || k % 2 === 0 || k === all.length - 1)
    : [0, layerTop / 2, layerTop].filter((v) => Number.isInteger(v));
  const layerTicks = layerValues.map((v) => ({ at: yOf(layerScale(v)), label: String(v) }));
  const every = Math.max(1, Math.ceil(states.length / 12));
  const stepTicks = points
    .filter((p) => p.index % every === 0 || p.index === states.length - 1)
    .map((p) => ({ at: p.x, label: p.index === 0 ? '0' : String(p.index) }));

  return { points, strainPath, layersPath, strainTicks, layerTicks, stepTicks, logLayers };
}

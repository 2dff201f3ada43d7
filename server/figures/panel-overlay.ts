import { ANNOTATION_COLOURS, type AnnotationColour, type AnnotationKind, type Coordinates } from '../../shared/annotations/annotations';
import type { PanelBox, PanelSpec } from '../../shared/figures';
import { scaleLabel } from '../../shared/viewer/scale-bar';

export interface OverlayShape {
  kind: AnnotationKind;
  points: Coordinates;
  label: string;
  colour: AnnotationColour;
}

export interface OverlayInput {
  panel: PanelSpec;
  box: PanelBox;
  pxPerMm: number;
  shapes: OverlayShape[];
  legend: { name: string; colour: AnnotationColour }[];
  /** Bar length and its colour after the auto-contrast choice; null for no bar. */
  bar: { lengthUm: number; umPerImagePx: number; colour: 'white' | 'black' } | null;
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/**
 * The vector layer of one panel — annotations, scale bar, letter, legend — as SVG in the panel's
 * output pixels. Sizes are set in mm on the printed figure, so they read the same at any dpi.
 */
export function panelOverlaySvg({ panel, box, pxPerMm, shapes, legend, bar }: OverlayInput): string {
  const s = box.width / panel.region.width; // output px per image px
  const at = ([x, y]: [number, number]) => `${((x - panel.region.x) * s).toFixed(2)},${((y - panel.region.y) * s).toFixed(2)}`;
  const stroke = Math.max(1, 0.3 * pxPerMm);
  const font = Math.max(8, 2.6 * pxPerMm);
  const parts: string[] = [];
  for (const shape of shapes) {
    const colour = ANNOTATION_COLOURS[shape.colour];
    const pts = shape.points.map(at).join(' ');
    if (shape.kind === 'point') {
      const [cx, cy] = at(shape.points[0]!).split(',');
      parts.push(`<circle cx="${cx}" cy="${cy}" r="${(0.7 * pxPerMm).toFixed(2)}" fill="${colour}" stroke="#000" stroke-width="${(stroke / 3).toFixed(2)}"/>`);
    } else if (shape.kind === 'text') {
      const [x, y] = at(shape.points[0]!).split(',');
      parts.push(`<text x="${x}" y="${y}" font-family="DejaVu Sans" font-size="${font.toFixed(1)}" fill="${colour}" stroke="#000" stroke-width="${(stroke / 4).toFixed(2)}">${esc(shape.label)}</text>`);
    } else if (shape.kind === 'polygon' || shape.kind === 'rectangle') {
      parts.push(`<polygon points="${pts}" fill="none" stroke="${colour}" stroke-width="${stroke.toFixed(2)}" stroke-linejoin="round"/>`);
    } else {
      parts.push(`<polyline points="${pts}" fill="none" stroke="${colour}" stroke-width="${stroke.toFixed(2)}" stroke-linejoin="round" stroke-linecap="round"/>`);
    }
  }
  const margin = 2 * pxPerMm;
  if (bar) {
    const length = (bar.lengthUm / bar.umPerImagePx) * s;
    const height = Math.max(2, 0.8 * pxPerMm);
    const right = panel.scaleBar.position.endsWith('right');
    const bottom = panel.scaleBar.position.startsWith('bottom');
    const x = right ? box.width - margin - length : margin;
    const y = bottom ? box.height - margin - height : margin + font * 1.3;
    const fill = bar.colour === 'white' ? '#fff' : '#000';
    const halo = bar.colour === 'white' ? '#000' : '#fff';
    parts.push(`<rect x="${x.toFixed(2)}" y="${y.toFixed(2)}" width="${length.toFixed(2)}" height="${height.toFixed(2)}" fill="${fill}" stroke="${halo}" stroke-width="${(stroke / 3).toFixed(2)}"/>`);
    parts.push(
      `<text x="${(x + length / 2).toFixed(2)}" y="${(y - font * 0.35).toFixed(2)}" text-anchor="middle" font-family="DejaVu Sans" font-weight="bold" font-size="${font.toFixed(1)}" fill="${fill}" stroke="${halo}" stroke-width="${(stroke / 4).toFixed(2)}" paint-order="stroke">${esc(scaleLabel(bar.lengthUm))}</text>`,
    );
  }
  if (panel.letter) {
    const size = font * 1.5;
    parts.push(`<rect x="0" y="0" width="${(size * 1.3).toFixed(2)}" height="${(size * 1.35).toFixed(2)}" fill="#fff"/>`);
    parts.push(`<text x="${(size * 0.65).toFixed(2)}" y="${(size * 1.05).toFixed(2)}" text-anchor="middle" font-family="DejaVu Sans" font-weight="bold" font-size="${size.toFixed(1)}" fill="#000">${esc(panel.letter)}</text>`);
  }
  if (panel.legend && legend.length > 0) {
    const line = font * 1.3;
    // The letter takes the top-left corner and the bar its own: the legend goes to the first corner left free.
    const corner = (['top-right', 'bottom-left', 'bottom-right'] as const).find((c) => c !== panel.scaleBar.position)!;
    const top = corner.startsWith('top') ? margin : box.height - margin - line * legend.length;
    const left = corner.endsWith('left') ? margin : box.width - margin - font * 12;
    parts.push(`<rect x="${(left - font * 0.4).toFixed(2)}" y="${(top - font * 0.2).toFixed(2)}" width="${(font * 12).toFixed(2)}" height="${(line * legend.length + font * 0.4).toFixed(2)}" fill="#fff" fill-opacity="0.8"/>`);
    legend.forEach((entry, i) => {
      const y = top + i * line;
      parts.push(`<rect x="${left.toFixed(2)}" y="${(y + font * 0.15).toFixed(2)}" width="${font.toFixed(2)}" height="${(font * 0.8).toFixed(2)}" fill="${ANNOTATION_COLOURS[entry.colour]}"/>`);
      parts.push(`<text x="${(left + font * 1.4).toFixed(2)}" y="${(y + font * 0.9).toFixed(2)}" font-family="DejaVu Sans" font-size="${font.toFixed(1)}" fill="#000">${esc(entry.name)}</text>`);
    });
  }
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${box.width}" height="${box.height}">${parts.join('')}</svg>`;
}

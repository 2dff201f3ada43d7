import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { TestPath } from '../../../shared/measurements/measurement-records';
import { markGlyph, pathPolylines, type DrawnMark } from './mark-glyphs';

/**
 * The laid test lines (as the server counted them) and the marks on them, drawn into an SVG whose
 * viewBox is the image in pixels. Placed on a `<g>` inside that SVG, by the measuring page and by the
 * field figures of the grain size summary, so both draw a measurement the same way.
 */
@Component({
  selector: 'g[ef-pattern-marks]',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @for (line of polylines(); track $index) {
      <svg:polyline class="test-line counted" [attr.points]="line" />
    }
    @for (g of glyphs(); track $index) {
      @switch (g.shape) {
        @case ('rect') {
          <svg:rect [attr.class]="g.cls" [attr.x]="g.x" [attr.y]="g.y" [attr.width]="g.width" [attr.height]="g.height" />
        }
        @case ('polygon') {
          <svg:polygon [attr.class]="g.cls" [attr.points]="g.points" />
        }
        @default {
          <svg:circle [attr.class]="g.cls" [attr.cx]="g.cx" [attr.cy]="g.cy" [attr.r]="g.r" />
        }
      }
    }
  `,
  styles: `
    .test-line { stroke: #2ad4c0; stroke-width: 2.5; fill: none; vector-effect: non-scaling-stroke; pointer-events: none; }
    .mark { fill: #ffb000; stroke: #201400; stroke-width: 1; vector-effect: non-scaling-stroke; }
    .mark.triple { fill: #ff5fa2; }
    .mark.end { fill: #b7f34a; }
    .suggestion { fill: none; stroke: #ffffff; stroke-width: 2; stroke-dasharray: 3 2; vector-effect: non-scaling-stroke; }
    .suggestion.selected { stroke: #ffb000; stroke-width: 3; }
  `,
})
export class PatternMarks {
  /** Counted pieces of the laid lines; empty while a new pattern is only previewed. */
  readonly paths = input<readonly TestPath[]>([]);
  readonly marks = input<readonly DrawnMark[]>([]);
  /** Mark radius in image px (see markRadiusFor). */
  readonly radius = input.required<number>();
  /** Index of the suggestion being moved, or -1. */
  readonly selected = input(-1);

  protected readonly polylines = computed(() => pathPolylines(this.paths()));
  /** Narrowed per shape so the template binds only the attributes each shape has. */
  protected readonly glyphs = computed(() => this.marks().map((m, i) => markGlyph(m, this.radius(), i === this.selected())) as GlyphView[]);
}

/** A glyph with every attribute optional, so the template's @switch can read them without narrowing. */
type GlyphView = { shape: string; cls: string; x?: number; y?: number; width?: number; height?: number; points?: string; cx?: number; cy?: number; r?: number };

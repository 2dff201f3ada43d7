import { ChangeDetectionStrategy, Component, computed, input, model, output } from '@angular/core';
import { MatIconButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatTooltip } from '@angular/material/tooltip';
import type { AnnotationKind } from '../../../shared/annotations/annotations';
import { KIND_OF_TOOL } from './shape-draft';
import { TOOL_KEYS, type ViewerTool } from './shortcuts';

interface ToolButton {
  tool: ViewerTool;
  name: string;
  icon: string;
}

const DRAWING: ToolButton[] = [
  { tool: 'polyline', name: 'Polyline tool', icon: 'timeline' },
  { tool: 'polygon', name: 'Polygon tool', icon: 'change_history' },
  { tool: 'freehand', name: 'Freehand outline tool', icon: 'gesture' },
  { tool: 'rectangle', name: 'Rectangle tool', icon: 'crop_square' },
  { tool: 'point', name: 'Point tool', icon: 'scatter_plot' },
  { tool: 'ruler', name: 'Ruler tool', icon: 'straighten' },
  { tool: 'angle', name: 'Angle tool', icon: 'architecture' },
  { tool: 'text', name: 'Note tool', icon: 'sticky_note_2' },
];

const KEY_OF = Object.fromEntries(Object.entries(TOOL_KEYS).map(([k, t]) => [t, k.toUpperCase()])) as Record<ViewerTool, string>;

/**
 * The tools down the left edge: select, the drawing tools (for those who may annotate; the ones
 * the chosen class cannot take are disabled), calibrate, and the view buttons.
 */
@Component({
  selector: 'ef-tool-rail',
  imports: [MatIcon, MatIconButton, MatTooltip],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="group" role="toolbar" aria-label="Tools" aria-orientation="vertical">
      <button mat-icon-button type="button" aria-label="Select tool" [attr.aria-pressed]="tool() === 'select'" [class.on]="tool() === 'select'" matTooltip="Select (V)" matTooltipPosition="right" (click)="tool.set('select')">
        <mat-icon>near_me</mat-icon>
      </button>
      @if (canAnnotate()) {
        @for (b of drawing; track b.tool) {
          <button
            mat-icon-button
            type="button"
            [attr.aria-label]="b.name"
            [attr.aria-pressed]="tool() === b.tool"
            [class.on]="tool() === b.tool"
            [disabled]="!fits(b.tool)"
            [matTooltip]="tip(b)"
            matTooltipPosition="right"
            (click)="tool.set(b.tool)"
          >
            <mat-icon>{{ b.icon }}</mat-icon>
          </button>
        }
      }
      @if (canCalibrate()) {
        <span class="divider"></span>
        <button mat-icon-button type="button" aria-label="Calibrate" [attr.aria-pressed]="tool() === 'calibrate'" [class.on]="tool() === 'calibrate'" matTooltip="Calibrate: drag along a scale of known length (K)" matTooltipPosition="right" (click)="tool.set('calibrate')">
          <mat-icon>square_foot</mat-icon>
        </button>
      }
      @if (canComment()) {
        <span class="divider"></span>
        <button mat-icon-button type="button" aria-label="Comment pin" [attr.aria-pressed]="tool() === 'pin'" [class.on]="tool() === 'pin'" matTooltip="Pin a comment: click a point or drag a box (C)" matTooltipPosition="right" (click)="tool.set('pin')">
          <mat-icon>add_comment</mat-icon>
        </button>
      }
    </div>
    <div class="group" role="group" aria-label="View">
      <button mat-icon-button type="button" aria-label="Zoom in" matTooltip="Zoom in (+)" matTooltipPosition="right" (click)="zoomIn.emit()">
        <mat-icon>add</mat-icon>
      </button>
      <button mat-icon-button type="button" aria-label="Zoom out" matTooltip="Zoom out (−)" matTooltipPosition="right" (click)="zoomOut.emit()">
        <mat-icon>remove</mat-icon>
      </button>
      <button mat-icon-button type="button" aria-label="Fit" matTooltip="Fit the whole image (0)" matTooltipPosition="right" (click)="fit.emit()">
        <mat-icon>fit_screen</mat-icon>
      </button>
      <button mat-icon-button type="button" aria-label="Actual pixels" matTooltip="Actual pixels, 1:1 (1)" matTooltipPosition="right" (click)="actualPixels.emit()">
        <span class="one-to-one" aria-hidden="true">1:1</span>
      </button>
    </div>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      justify-content: space-between;
      gap: 8px;
      padding: 8px 4px;
      background: var(--mat-sys-surface-container);
      border-right: 1px solid var(--mat-sys-outline-variant);
      overflow-y: auto;
    }
    .group {
      display: flex;
      flex-direction: column;
      align-items: center;
      gap: 2px;
    }
    .on {
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    .divider {
      width: 28px;
      height: 1px;
      margin: 4px 0;
      background: var(--mat-sys-outline-variant);
    }
    .one-to-one {
      font: 600 13px/1 var(--ef-mono);
    }
  `,
})
export class ToolRail {
  readonly tool = model.required<ViewerTool>();
  readonly canAnnotate = input.required<boolean>();
  readonly canCalibrate = input.required<boolean>();
  /** Reviewers, researchers and leads pin comment threads on the image. */
  readonly canComment = input(false);
  /** Shape kinds the chosen class accepts. */
  readonly kinds = input.required<readonly AnnotationKind[]>();
  readonly zoomIn = output<void>();
  readonly zoomOut = output<void>();
  readonly fit = output<void>();
  readonly actualPixels = output<void>();

  protected readonly drawing = DRAWING;
  private readonly kindSet = computed(() => new Set(this.kinds()));

  protected fits(tool: ViewerTool): boolean {
    if (tool === 'select' || tool === 'calibrate' || tool === 'pin') return true;
    const kind = KIND_OF_TOOL[tool];
    return kind !== null && this.kindSet().has(kind);
  }

  protected tip(b: ToolButton): string {
    const base = `${b.name.replace(/ tool$/, '')} (${KEY_OF[b.tool]})`;
    return this.fits(b.tool) ? base : `${base}: the chosen class does not take this shape`;
  }
}

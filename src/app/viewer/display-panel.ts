import { ChangeDetectionStrategy, Component, computed, model } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatSlider, MatSliderThumb } from '@angular/material/slider';
import { isNeutralTone, NEUTRAL_TONE, TONE_LIMITS, type Tone } from './tone';

/** Brightness, contrast and gamma of the display only; the stored image never changes. */
@Component({
  selector: 'ef-display-panel',
  imports: [MatButton, MatSlider, MatSliderThumb],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="hint">These change only what you see on screen. The archived image, exports and measurements are not affected.</p>
    @for (row of rows; track row.name) {
      <div class="row">
        <label [for]="'tone-' + row.name">{{ row.label }}</label>
        <output>{{ row.format(tone()[row.name]) }}</output>
        <mat-slider [min]="row.limits.min" [max]="row.limits.max" [step]="row.limits.step">
          <input
            matSliderThumb
            [id]="'tone-' + row.name"
            [attr.aria-label]="row.label"
            [value]="tone()[row.name]"
            (valueChange)="set(row.name, $event)"
          />
        </mat-slider>
      </div>
    }
    <button mat-stroked-button type="button" [disabled]="neutral()" (click)="reset()">Reset display</button>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 8px;
      padding: 12px 16px;
    }
    .hint {
      margin: 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
    .row {
      display: grid;
      grid-template-columns: 1fr auto;
      align-items: center;
    }
    label {
      font: var(--mat-sys-label-large);
    }
    output {
      font-family: var(--ef-mono);
      font-size: 12px;
    }
    mat-slider {
      grid-column: 1 / -1;
      margin: 0 8px;
    }
    button {
      align-self: flex-start;
    }
  `,
})
export class DisplayPanel {
  readonly tone = model.required<Tone>();

  protected readonly neutral = computed(() => isNeutralTone(this.tone()));
  protected readonly rows = [
    { name: 'brightness' as const, label: 'Brightness', limits: TONE_LIMITS.brightness, format: (v: number) => (v > 0 ? `+${v.toFixed(2)}` : v.toFixed(2)) },
    { name: 'contrast' as const, label: 'Contrast', limits: TONE_LIMITS.contrast, format: (v: number) => `×${v.toFixed(2)}` },
    { name: 'gamma' as const, label: 'Gamma', limits: TONE_LIMITS.gamma, format: (v: number) => v.toFixed(2) },
  ];

  protected set(name: keyof Tone, value: number): void {
    this.tone.update((t) => ({ ...t, [name]: value }));
  }

  protected reset(): void {
    this.tone.set(NEUTRAL_TONE);
  }
}

import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import { ANNOTATION_COLOURS, type AnnotationClass } from '../../../shared/annotations/annotations';
import { BAR_POSITIONS, scaleLabel, type BarPosition, type PanelSpec } from '../../../shared/figures';
import type { ImageSummary } from '../../../shared/images';
import { ImageApi } from '../archive/image-api';
import { regionFits, regionSizeUm, sizeUmText, wholeImage, type Region } from './figure-geometry';
import { ImageChooser } from './image-chooser';
import { RegionPicker } from './region-picker';

const POSITION_LABELS: Record<BarPosition, string> = {
  'bottom-right': 'Bottom right',
  'bottom-left': 'Bottom left',
  'top-right': 'Top right',
  'top-left': 'Top left',
};

/** One panel of a figure: its image and region, the classes drawn, letter, legend and scale bar. */
@Component({
  selector: 'ef-panel-editor',
  imports: [ImageChooser, MatButton, MatCheckbox, MatFormField, MatHint, MatIcon, MatIconButton, MatInput, MatLabel, MatOption, MatSelect, RegionPicker],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './panel-editor.html',
  styleUrl: './panel-editor.scss',
})
export class PanelEditor {
  private readonly images = inject(ImageApi);

  readonly projectId = input.required<string>();
  readonly panel = input.required<PanelSpec>();
  /** 0-based; people read it 1-based. */
  readonly index = input.required<number>();
  readonly count = input.required<number>();
  readonly image = input<ImageSummary | null>(null);
  readonly classes = input<readonly AnnotationClass[]>([]);
  readonly problems = input<readonly string[]>([]);
  /** The bar length the export will draw, or null for none. */
  readonly barLengthUm = input<number | null>(null);
  readonly panelChange = output<PanelSpec>();
  readonly imagePicked = output<ImageSummary>();
  readonly moved = output<-1 | 1>();
  readonly removed = output<void>();

  protected readonly positions = BAR_POSITIONS.map((value) => ({ value, label: POSITION_LABELS[value] }));
  protected readonly swatches = ANNOTATION_COLOURS;
  protected readonly choosing = signal(false);
  protected readonly n = computed(() => this.index() + 1);
  protected readonly showChooser = computed(() => this.choosing() || !this.image());
  protected readonly previewUrl = computed(() => {
    const image = this.image();
    return image ? this.images.previewUrl(this.projectId(), image.id) : '';
  });
  protected readonly regionText = computed(() => {
    const r = this.panel().region;
    const px = `${Math.round(r.width)} × ${Math.round(r.height)} px from (${Math.round(r.x)}, ${Math.round(r.y)})`;
    const image = this.image();
    const um = image ? regionSizeUm(r, image.pixelSize.xUm, image.pixelSize.yUm) : null;
    return um ? `${px} · ${sizeUmText(um)}` : `${px} · no pixel size, so no scale bar`;
  });
  protected readonly regionProblem = computed(() => {
    const image = this.image();
    if (!image || regionFits(this.panel().region, image.width, image.height)) return null;
    return `The region must lie inside the image (${image.width} × ${image.height} px) and be at least 16 px on each side.`;
  });
  protected readonly barText = computed(() => {
    const length = this.barLengthUm();
    if (!this.panel().scaleBar.show) return 'No scale bar on this panel.';
    if (length === null) return 'This image has no pixel size: no scale bar can be drawn.';
    return `The bar will read ${scaleLabel(length)}.`;
  });

  protected pickImage(image: ImageSummary): void {
    this.choosing.set(false);
    this.imagePicked.emit(image);
  }

  protected setRegion(region: Region): void {
    this.update({ region });
  }

  protected useWholeImage(): void {
    const image = this.image();
    if (image) this.update({ region: wholeImage(image.width, image.height) });
  }

  protected setRegionField(field: keyof Region, text: string): void {
    const value = Number(text);
    if (text.trim() === '' || !Number.isFinite(value)) return;
    this.update({ region: { ...this.panel().region, [field]: Math.max(0, Math.round(value)) } });
  }

  protected toggleClass(classId: string, on: boolean): void {
    const ids = this.panel().classIds.filter((id) => id !== classId);
    this.update({ classIds: on ? [...ids, classId] : ids });
  }

  protected setLetter(letter: string): void {
    this.update({ letter });
  }

  protected setLegend(legend: boolean): void {
    this.update({ legend });
  }

  protected setBarLength(text: string): void {
    const value = Number(text.replace(',', '.'));
    const lengthUm = text.trim() === '' || !Number.isFinite(value) ? null : value;
    this.update({ scaleBar: { ...this.panel().scaleBar, lengthUm } });
  }

  protected setBar(change: Partial<PanelSpec['scaleBar']>): void {
    this.update({ scaleBar: { ...this.panel().scaleBar, ...change } });
  }

  protected hasClass(classId: string): boolean {
    return this.panel().classIds.includes(classId);
  }

  private update(change: Partial<PanelSpec>): void {
    this.panelChange.emit({ ...this.panel(), ...change });
  }
}

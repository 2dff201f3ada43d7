import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatTab, MatTabContent, MatTabGroup } from '@angular/material/tabs';
import type { ProjectDetail } from '../../../shared/projects';
import { MaterialList } from './material-list';
import { SampleList } from './sample-list';

/** The project's catalogue on its page: samples and the materials they are made of. */
@Component({
  selector: 'ef-project-archive',
  imports: [MatTab, MatTabContent, MatTabGroup, MaterialList, SampleList],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 class="ef-visually-hidden">Archive</h2>
    <mat-tab-group mat-stretch-tabs="false" mat-align-tabs="start" animationDuration="0ms" aria-label="Archive">
      <mat-tab label="Samples">
        <ng-template matTabContent>
          <ef-sample-list class="tab-body" [project]="project()" />
        </ng-template>
      </mat-tab>
      <mat-tab label="Materials">
        <ng-template matTabContent>
          <ef-material-list class="tab-body" [project]="project()" />
        </ng-template>
      </mat-tab>
    </mat-tab-group>
  `,
  styles: `
    :host {
      display: block;
    }
    .tab-body {
      padding-top: 16px;
    }
  `,
})
export class ProjectArchive {
  readonly project = input.required<ProjectDetail>();
}

import { ActivityTimeline } from '../activity/activity-timeline';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatAnchor } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatTab, MatTabContent, MatTabGroup } from '@angular/material/tabs';
import { RouterLink } from '@angular/router';
import type { ProjectDetail } from '../../../shared/projects';
import { MaterialList } from './material-list';
import { SampleList } from './sample-list';

/** The project's catalogue on its page: samples and the materials they are made of, and the way to its images. */
@Component({
  selector: 'ef-project-archive',
  imports: [ActivityTimeline, MatAnchor, MatIcon, MatTab, MatTabContent, MatTabGroup, MaterialList, RouterLink, SampleList],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="archive-head">
      <h2>Archive</h2>
      <div class="archive-links">
      <a mat-stroked-button [routerLink]="['/projects', project().id, 'images']">
        <mat-icon>photo_library</mat-icon>
        Search images
      </a>
      <a mat-stroked-button [routerLink]="['/projects', project().id, 'figures']">
        <mat-icon>view_quilt</mat-icon>
        Figures
      </a>
      <a mat-stroked-button [href]="'/api/projects/' + project().id + '/export.zip'" download>
        <mat-icon>archive</mat-icon>
        Supplementary data (ZIP)
      </a>
      </div>
    </div>
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
      <mat-tab label="History">
        <ng-template matTabContent>
          <ef-activity-timeline class="tab-body" [projectId]="project().id" />
        </ng-template>
      </mat-tab>
    </mat-tab-group>
  `,
  styles: `
    :host {
      display: block;
    }
    .archive-head {
      display: flex;
      align-items: center;
      justify-content: space-between;
      gap: 12px;
    }
    .archive-links {
      display: flex;
      gap: 8px;
    }
    h2 {
      margin: 0;
      font: var(--mat-sys-title-large);
    }
    .tab-body {
      padding-top: 16px;
    }
  `,
})
export class ProjectArchive {
  readonly project = input.required<ProjectDetail>();
}

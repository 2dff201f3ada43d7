import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatActionList, MatListItem, MatListItemLine, MatListItemTitle } from '@angular/material/list';
import { MatProgressBar } from '@angular/material/progress-bar';
import { of } from 'rxjs';
import type { KeptMail } from '../../../shared/admin';
import { remote } from '../core/remote';
import { SessionStore } from '../core/session-store';
import { AdminApi } from './admin-api';
import { splitLinks } from './mail-links';

/**
 * Local mode keeps every message the server "sends" instead of delivering it,
 * so invitations and reset links can be followed without a mail account.
 */
@Component({
  selector: 'ef-mail-outbox',
  imports: [DatePipe, MatActionList, MatButton, MatIcon, MatListItem, MatListItemLine, MatListItemTitle, MatProgressBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './mail-outbox.html',
  styleUrl: './mail-outbox.scss',
})
export default class MailOutbox {
  private readonly api = inject(AdminApi);
  private readonly session = inject(SessionStore);

  protected readonly isLocalMode = this.session.isLocalMode;
  protected readonly mail = remote(this.isLocalMode, (local) => (local ? this.api.listMail() : of<KeptMail[]>([])));
  protected readonly messages = computed(() =>
    [...(this.mail.value() ?? [])].sort((a, b) => Date.parse(b.receivedAt) - Date.parse(a.receivedAt)),
  );
  protected readonly isEmpty = computed(() => !this.mail.loading() && !this.mail.error() && this.messages().length === 0);
  protected readonly selectedId = signal<string | null>(null);
  protected readonly selected = computed(() => this.messages().find((m) => m.id === this.selectedId()) ?? null);
  protected readonly selectedParts = computed(() => splitLinks(this.selected()?.text ?? ''));

  protected openMessage(message: KeptMail): void {
    this.selectedId.set(message.id);
  }

  protected refresh(): void {
    this.mail.reload();
  }
}

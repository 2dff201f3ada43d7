import type { NotificationSettings, NotificationSettingsBody } from '../../shared/notifications';
import type { AppContext } from '../app-context';
import { NotificationSetting } from './notification-setting.entity';

/** Each person's own choice of immediate mail, a daily digest, or none. */
export class NotificationSettingsService {
  constructor(private readonly ctx: AppContext) {}

  async get(userId: string): Promise<NotificationSettings> {
    const row = await this.ctx.dataSource.getRepository(NotificationSetting).findOneBy({ userId });
    return this.toDto(row);
  }

  /**
   * Takes effect for what happens from now on. Notifications already waiting for a digest still go
   * out in it, unless the choice is now "off": the digest then drops them.
   */
  async put(userId: string, body: NotificationSettingsBody): Promise<NotificationSettings> {
    const repo = this.ctx.dataSource.getRepository(NotificationSetting);
    await repo.upsert({ userId, delivery: body.delivery, updatedAt: new Date() }, ['userId']);
    return this.toDto(await repo.findOneByOrFail({ userId }));
  }

  private toDto(row: NotificationSetting | null): NotificationSettings {
    return {
      delivery: row?.delivery ?? 'immediate',
      digestHourUtc: this.ctx.config.notifications.digestHourUtc,
      updatedAt: row?.updatedAt.toISOString() ?? null,
    };
  }
}

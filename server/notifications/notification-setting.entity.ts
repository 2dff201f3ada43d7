import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { DeliveryMode } from '../../shared/notifications';

/** A person's choice of how to receive notifications; no row means immediate. */
@Entity({ name: 'notification_settings' })
export class NotificationSetting {
  @PrimaryColumn({ name: 'user_id', type: 'uuid' })
  userId!: string;

  @Column({ type: 'text' })
  delivery!: DeliveryMode;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'now()' })
  updatedAt!: Date;
}

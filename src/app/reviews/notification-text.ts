import type { DeliveryMode } from '../../../shared/notifications';

/** Words for the notification settings. Plain functions, no Angular. */

/** "07:00 UTC" for hour 7. */
export function digestTime(hourUtc: number): string {
  return `${String(Math.max(0, Math.min(23, Math.trunc(hourUtc)))).padStart(2, '0')}:00 UTC`;
}

/** What the chosen mode means, as the confirmation after saving. */
export function deliveryExplanation(mode: DeliveryMode, digestHourUtc: number): string {
  switch (mode) {
    case 'immediate':
      return 'You get an e-mail each time something needs you.';
    case 'daily':
      return `You get one e-mail a day, at ${digestTime(digestHourUtc)}, when something happened.`;
    case 'off':
      return 'You get no e-mail; check the review queue and the threads yourself.';
  }
}

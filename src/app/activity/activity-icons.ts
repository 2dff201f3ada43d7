import type { ActivityAction } from '../../../shared/activity';

/** A Material icon name per kind of event, so the timeline can be skimmed. Pure. */
export function activityIcon(action: ActivityAction | string): string {
  const [group] = action.split('.');
  switch (group) {
    case 'project':
      return 'folder';
    case 'member':
      return 'group';
    case 'catalogue':
      return 'inventory_2';
    case 'image':
      return action === 'image.pixel_size_changed' ? 'straighten' : 'image';
    case 'annotation':
    case 'annotations':
      return 'draw';
    case 'alignment':
      return 'layers';
    case 'measurement':
      return 'analytics';
    case 'review':
      return 'rule';
    case 'comment':
      return 'chat';
    default:
      return 'history';
  }
}

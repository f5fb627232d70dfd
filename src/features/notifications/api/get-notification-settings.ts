import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationSettings } from '../../../../shared/api/notifications.js';
import { api } from '../../../lib/api-client.js';
import { notificationKeys } from './keys.js';

/** `GET /api/me/notifications`. */
export function getNotificationSettings(signal?: AbortSignal): Promise<NotificationSettings> {
  return api.get<NotificationSettings>('/api/me/notifications', signal);
}

export function notificationSettingsQueryOptions() {
  return queryOptions({ queryKey: notificationKeys.settings(), queryFn: ({ signal }) => getNotificationSettings(signal) });
}

export function useNotificationSettings() {
  return useQuery(notificationSettingsQueryOptions());
}

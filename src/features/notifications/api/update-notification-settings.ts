import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NotificationSettings, UpdateNotificationSettingsBody } from '../../../../shared/api/notifications.js';
import { api } from '../../../lib/api-client.js';
import { notificationKeys } from './keys.js';

/** `PUT /api/me/notifications`: kinds not named keep their setting. */
export function updateNotificationSettings(body: UpdateNotificationSettingsBody): Promise<NotificationSettings> {
  return api.put<NotificationSettings>('/api/me/notifications', body);
}

export function useUpdateNotificationSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateNotificationSettings,
    onSuccess: (settings) => queryClient.setQueryData(notificationKeys.settings(), settings),
  });
}

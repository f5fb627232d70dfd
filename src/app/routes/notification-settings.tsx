import type { QueryClient } from '@tanstack/react-query';
import { Card, CardHeader } from '../../components/ui/card.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { QueryView } from '../../components/ui/query-view.js';
import { notificationSettingsQueryOptions, useNotificationSettings } from '../../features/notifications/api/get-notification-settings.js';
import { NotificationSettingsForm } from '../../features/notifications/components/notification-settings-form.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';

export function makeLoader(queryClient: QueryClient) {
  return async () => {
    await Promise.allSettled([queryClient.ensureQueryData(notificationSettingsQueryOptions())]);
    return null;
  };
}

export function Component() {
  useDocumentTitle('Notifications');
  const settings = useNotificationSettings();
  const { data: me } = useMe();
  return (
    <div className="max-w-2xl space-y-8">
      <PageHeader eyebrow="Settings" title="Notifications" description={me ? `E-mails go to ${me.email}.` : undefined} />
      <Card aria-labelledby="notifications-heading">
        <CardHeader id="notifications-heading" title="E-mails to receive" description="Turn off what you do not want. Invitations and password resets are always sent." />
        <QueryView query={settings} loadingLabel="Loading your settings…" errorTitle="Your settings could not be loaded">
          {(data) => <NotificationSettingsForm settings={data} />}
        </QueryView>
      </Card>
    </div>
  );
}

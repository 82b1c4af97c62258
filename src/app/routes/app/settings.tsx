import { useOutletContext } from 'react-router-dom';
import { can } from '@shared/permissions';
import type { MeDto } from '@shared/types/api';
import { AlertPreferencesCard } from '@/features/alerts/components/alert-preferences-card';
import { CalendarFeedCard } from '@/features/alerts/components/calendar-feed-card';
import { MailFailuresCard } from '@/features/alerts/components/mail-failures-card';
import { SettingsPage } from '@/features/settings/components/settings-page';
import { activeMembership } from '@/lib/session';

export default function SettingsRoute() {
  const me = useOutletContext<MeDto>();
  return (
    <SettingsPage me={me}>
      <AlertPreferencesCard />
      <CalendarFeedCard />
      {can(activeMembership(me)?.role, 'mail-failures:manage') ? <MailFailuresCard /> : null}
    </SettingsPage>
  );
}

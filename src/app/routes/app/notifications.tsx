import { NotificationsPage } from '@/features/alerts/components/notifications-page';

export default function NotificationsRoute() {
  return <NotificationsPage />;
}

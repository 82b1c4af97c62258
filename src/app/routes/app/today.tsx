import { OpenAlerts } from '@/features/alerts/components/open-alerts';
import { TodayPage } from '@/features/today/components/today-page';

export default function TodayRoute() {
  return <TodayPage alerts={<OpenAlerts />} />;
}

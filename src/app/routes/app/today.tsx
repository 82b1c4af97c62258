import { TodayPage } from '@/features/today/components/today-page';

export default function TodayRoute() {
  return <TodayPage />;
}

import { ChangeLogPage } from '@/features/audit/components/change-log-page';

export default function RecordsChangesRoute() {
  return <ChangeLogPage />;
}

import { RecordsPage } from '@/features/records/components/records-page';

export default function RecordsRoute() {
  return <RecordsPage />;
}

import { useParams } from 'react-router-dom';
import { RecordPage } from '@/features/records/components/record-page';

export default function RecordRoute() {
  const { lotId = '' } = useParams();
  return <RecordPage key={lotId} lotId={lotId} />;
}

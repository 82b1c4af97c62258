import { useParams } from 'react-router-dom';
import { LotPage } from '@/features/cellar/components/lot-page';

export default function LotRoute() {
  const { lotId = '' } = useParams();
  return <LotPage key={lotId} lotId={lotId} />;
}

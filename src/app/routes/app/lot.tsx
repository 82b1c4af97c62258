import { useParams } from 'react-router-dom';
import { HistoryPanel } from '@/features/audit/components/history-panel';
import { LotPage } from '@/features/cellar/components/lot-page';

export default function LotRoute() {
  const { lotId = '' } = useParams();
  return (
    <div className="flex flex-col gap-6">
      <LotPage key={lotId} lotId={lotId} />
      <HistoryPanel kind="lot" recordId={lotId} />
    </div>
  );
}

import { useParams } from 'react-router-dom';
import { HistoryPanel } from '@/features/audit/components/history-panel';
import { PlanPage } from '@/features/plans/components/plan-page';

export default function PlanRoute() {
  const { planId = '' } = useParams();
  return (
    <div className="flex flex-col gap-6">
      <PlanPage key={planId} planId={planId} />
      <HistoryPanel kind="plan" recordId={planId} />
    </div>
  );
}

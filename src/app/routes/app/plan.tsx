import { useParams } from 'react-router-dom';
import { PlanPage } from '@/features/plans/components/plan-page';

export default function PlanRoute() {
  const { planId = '' } = useParams();
  return <PlanPage key={planId} planId={planId} />;
}

import { PlansPage } from '@/features/plans/components/plans-page';

export default function PlansRoute() {
  return <PlansPage />;
}

import { RunsPage } from '@/features/runs/components/runs-page';

export default function RunsRoute() {
  return <RunsPage />;
}

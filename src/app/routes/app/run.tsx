import { useParams } from 'react-router-dom';
import { RunPage } from '@/features/runs/components/run-page';

export default function RunRoute() {
  const { runId = '' } = useParams();
  return <RunPage key={runId} runId={runId} />;
}

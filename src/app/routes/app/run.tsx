import { useParams } from 'react-router-dom';
import { HistoryPanel } from '@/features/audit/components/history-panel';
import { RunPage } from '@/features/runs/components/run-page';

export default function RunRoute() {
  const { runId = '' } = useParams();
  return (
    <div className="flex flex-col gap-6">
      <RunPage key={runId} runId={runId} />
      <HistoryPanel kind="run" recordId={runId} />
    </div>
  );
}

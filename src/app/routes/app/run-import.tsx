import { useQueryClient } from '@tanstack/react-query';
import { useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { LoggerImportPage } from '@/features/logger/components/logger-import-page';
import { useRun } from '@/features/runs/api/get-run';
import { runKeys } from '@/features/runs/api/keys';
import { errorMessage } from '@/lib/api-client';

export default function RunImportRoute() {
  const { runId = '' } = useParams();
  const [search] = useSearchParams();
  const run = useRun(runId);
  const qc = useQueryClient();
  const navigate = useNavigate();
  if (run.isPending) return <LoadingState />;
  if (run.isError && !run.data) return <ErrorState title="This run could not be loaded" message={errorMessage(run.error)} onRetry={() => void run.refetch()} />;
  const r = run.data;
  const wanted = Number(search.get('stage') ?? 0);
  const initialStage = r.stages.some((s) => s.index === wanted) ? wanted : (r.stages[0]?.index ?? 0);
  return (
    <LoggerImportPage
      key={runId}
      runId={runId}
      runTitle={`${r.lotCode} · ${r.lotName}`}
      running={r.status === 'running'}
      stages={r.stages.map((s) => ({ index: s.index, name: s.name }))}
      initialStage={initialStage}
      backTo={paths.run(runId)}
      onImported={() => {
        void qc.invalidateQueries({ queryKey: runKeys.detail(runId) });
        void qc.invalidateQueries({ queryKey: runKeys.readings(runId) });
        void qc.invalidateQueries({ queryKey: runKeys.list() });
        navigate(paths.run(runId));
      }}
    />
  );
}

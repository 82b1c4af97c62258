import { EmptyState } from '@/components/ui/empty-state';

export default function Route() {
  return <EmptyState title="Coming soon">This section is being built.</EmptyState>;
}

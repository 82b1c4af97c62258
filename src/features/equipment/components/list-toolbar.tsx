import { Search } from 'lucide-react';
import { useState } from 'react';
import type { SortingState } from '@/components/ui/data-table';
import { Input } from '@/components/ui/input';
import { useSearchText } from '@/lib/use-search-text';
import { PAGE_SIZE_DEFAULT } from '@shared/schemas/list';

/** Search, sort and page state of one server-side list (the search waits for a pause in typing). */
export function useListState<S extends string>(defaultSort: S) {
  const [sort, setSort] = useState<S>(defaultSort);
  const [order, setOrder] = useState<'asc' | 'desc'>('asc');
  const [page, setPage] = useState(1);
  const [showArchived, setShowArchivedState] = useState(false);
  const setShowArchived = (v: boolean) => {
    setShowArchivedState(v);
    setPage(1);
  };

  const { text, setText, q } = useSearchText(() => setPage(1));

  const sorting: SortingState = [{ id: sort, desc: order === 'desc' }];
  const onSortingChange = (next: SortingState) => {
    const first = next[0];
    setSort((first?.id as S | undefined) ?? defaultSort);
    setOrder(first?.desc ? 'desc' : 'asc');
    setPage(1);
  };
  return {
    text,
    setText,
    params: { q: q || undefined, sort, order, page, pageSize: PAGE_SIZE_DEFAULT, archived: showArchived ? ('true' as const) : undefined },
    showArchived,
    setShowArchived,
    sorting,
    onSortingChange,
    setPage,
  };
}

export function SearchBox({ id, label, value, onChange }: { id: string; label: string; value: string; onChange: (v: string) => void }) {
  return (
    <div className="relative w-full sm:max-w-xs">
      <label htmlFor={id} className="sr-only">
        {label}
      </label>
      <Search aria-hidden="true" className="pointer-events-none absolute top-1/2 left-3 size-4 -translate-y-1/2 text-ink-500" />
      <Input id={id} type="search" placeholder={label} value={value} onChange={(e) => onChange(e.target.value)} className="pl-9" />
    </div>
  );
}

import { Pencil, Trash2 } from 'lucide-react';
import { Button } from '@/components/ui/button';

/** A table row's Edit (and, for those who may, Delete) buttons, each named for the record it acts on. */
export function RowActions({ name, mayDelete, onEdit, onDelete }: { name: string; mayDelete: boolean; onEdit: () => void; onDelete: () => void }) {
  return (
    <div className="flex justify-end gap-1">
      <Button variant="ghost" size="sm" icon={<Pencil />} aria-label={`Edit ${name}`} onClick={onEdit}>
        Edit
      </Button>
      {mayDelete ? (
        <Button variant="ghost" size="sm" icon={<Trash2 />} aria-label={`Delete ${name}`} onClick={onDelete}>
          Delete
        </Button>
      ) : null}
    </div>
  );
}

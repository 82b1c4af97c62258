import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { ArchiveOffer, isInRecord, type ArchivableKind } from '@/components/records/archive-offer';
import { errorMessage } from '@/lib/api-client';

/** Asks before deleting; a refusal from the server (e.g. cartridges still installed) is shown in the dialog. */
export function ConfirmDeleteDialog({
  open,
  name,
  what,
  onClose,
  onConfirm,
  pending,
  archive,
}: {
  /** When given, a refusal because the row is in a record offers to archive it instead. */
  archive?: { kind: ArchivableKind; id: string };
  open: boolean;
  name: string;
  what: string;
  onClose: () => void;
  onConfirm: () => Promise<unknown>;
  pending: boolean;
}) {
  const toast = useToast();
  const [refusal, setRefusal] = useState<string | null>(null);
  const [inRecord, setInRecord] = useState(false);
  const close = () => {
    setRefusal(null);
    setInRecord(false);
    onClose();
  };
  return (
    <Dialog
      open={open}
      onClose={close}
      size="sm"
      title={`Delete ${name}?`}
      description={`The ${what} is removed from this winery's equipment.`}
      footer={
        <>
          <Button variant="secondary" onClick={close}>
            Keep
          </Button>
          {refusal && inRecord && archive ? <ArchiveOffer kind={archive.kind} id={archive.id} name={name} onDone={close} /> : null}
          {refusal ? null : (
            <Button
              variant="danger"
              loading={pending}
              onClick={async () => {
                try {
                  await onConfirm();
                  toast.success('Deleted', name);
                  close();
                } catch (error) {
                  setRefusal(errorMessage(error));
                  setInRecord(isInRecord(error));
                }
              }}
            >
              Delete {what}
            </Button>
          )}
        </>
      }
    >
      <FormMessage message={refusal} />
    </Dialog>
  );
}

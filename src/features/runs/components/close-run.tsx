import { Lock } from 'lucide-react';
import { useState } from 'react';
import type { RunDetailDto } from '@shared/types/runs';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useUnits } from '@/lib/units';
import { useCloseRun } from '../api/close-run';

/** Close the run, at the end of the page, behind a confirmation that says what it adds where. */
export function CloseRun({ run, waiting }: { run: RunDetailDto; waiting: number }) {
  const [open, setOpen] = useState(false);
  const [notes, setNotes] = useState('');
  const close = useCloseRun();
  const toast = useToast();
  const units = useUnits();
  const housings = [...new Set(run.stages.map((s) => s.housingName))];
  return (
    <>
      <Button variant="secondary" size="lg" onClick={() => setOpen(true)}>
        <Lock aria-hidden="true" className="size-5" /> Close run
      </Button>
      <Dialog
        open={open}
        onClose={() => setOpen(false)}
        title="Close this run?"
        description={`${units.format('volume', run.currentVolumeL)} through the train in ${housings.join(', ')}. Each cartridge is credited with the litres it carried while it was in. No more readings can be logged.`}
        footer={
          <>
            <Button variant="ghost" onClick={() => setOpen(false)}>
              Keep running
            </Button>
            <Button
              disabled={close.isPending}
              onClick={() =>
                close.mutate(
                  { runId: run.id, input: notes.trim() ? { notes } : {} },
                  {
                    onSuccess: () => {
                      setOpen(false);
                      toast.success('Run closed');
                    },
                    onError: (e) => toast.error(errorMessage(e)),
                  },
                )
              }
            >
              Close run
            </Button>
          </>
        }
      >
        {waiting > 0 ? (
          <p role="alert" className="text-base font-semibold text-stop-700">
            {waiting} reading{waiting === 1 ? ' is' : 's are'} still waiting to send from this device. Closing now would refuse {waiting === 1 ? 'it' : 'them'}: wait for the
            connection first.
          </p>
        ) : null}
        <FormField label="Closing notes (optional)" htmlFor="close-notes" hint="Printed on the lot’s record.">
          <Textarea id="close-notes" rows={3} maxLength={2000} value={notes} onChange={(e) => setNotes(e.target.value)} />
        </FormField>
      </Dialog>
    </>
  );
}

import { LogOut } from 'lucide-react';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { useOutbox } from '@/lib/offline/outbox-runtime';
import { useSignOut } from '@/lib/session';

/** Sign out; with entries still kept on this device it warns first. */
export function SignOutButton() {
  const signOut = useSignOut();
  const kept = useOutbox();
  const [asking, setAsking] = useState(false);
  const go = () => signOut.mutate();
  const n = kept.length;
  const refused = kept.filter((e) => e.status === 'refused').length;
  const who = refused === n ? (n === 1 ? 'It was' : 'All were') : `${String(refused)} of them ${refused === 1 ? 'was' : 'were'}`;
  const refusedNote = refused === 0 ? '' : ` ${who} refused by the server and ${refused === 1 ? 'waits' : 'wait'} on the Waiting page for you to fix, move or discard.`;
  return (
    <>
      <Button variant="ghost" size="sm" icon={<LogOut aria-hidden="true" className="size-4" />} loading={signOut.isPending} onClick={() => (n > 0 ? setAsking(true) : go())}>
        Sign out
      </Button>
      <Dialog
        open={asking}
        onClose={() => setAsking(false)}
        title={`${String(n)} ${n === 1 ? 'entry has' : 'entries have'} not been sent`}
        description={`They stay on this device and are sent only when you sign in here again. Anyone else who signs in on this device will not send them. Stay signed in until they are sent if you can.${refusedNote}`}
        footer={
          <>
            <Button variant="ghost" onClick={() => setAsking(false)}>
              Stay signed in
            </Button>
            <Button
              variant="danger"
              onClick={() => {
                setAsking(false);
                go();
              }}
            >
              Sign out anyway
            </Button>
          </>
        }
      />
    </>
  );
}

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Input } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useRotateCalendarFeed } from '../api/rotate-calendar-feed';

/** The person's private calendar feed of approved bottling days: create, copy, replace. */
export function CalendarFeedCard() {
  const rotate = useRotateCalendarFeed();
  const toast = useToast();
  const [url, setUrl] = useState<string | null>(null);
  const make = () =>
    rotate.mutate(undefined, {
      onSuccess: (r) => setUrl(r.url),
      onError: (e) => toast.error('No link made', errorMessage(e)),
    });
  return (
    <Card
      title="Bottling days in your calendar"
      description="A private link your calendar program can subscribe to: every approved bottling day of your wineries, step by step. Anyone with the link can read it. Making a link replaces the one made before, which then stops working."
    >
      <div className="flex flex-col gap-3">
        {url ? (
          <>
            <label htmlFor="calendar-feed-url" className="text-sm font-semibold text-ink-800">
              Your calendar link (shown once; copy it now)
            </label>
            <Input id="calendar-feed-url" readOnly value={url} onFocus={(e) => e.currentTarget.select()} />
          </>
        ) : null}
        <div>
          <Button variant="secondary" loading={rotate.isPending} onClick={make}>
            {url ? 'Replace the link' : 'Make a calendar link'}
          </Button>
        </div>
      </div>
    </Card>
  );
}

import { useEffect, useState } from 'react';
import { ALERT_CHANNELS, type AlertChannel, type AlertKind } from '@shared/engine';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useAlertPreferences } from '../api/get-alert-preferences';
import { useUpdateAlertPreferences } from '../api/update-alert-preferences';

const channelLabels: Record<AlertChannel, string> = { app: 'In the app', email: 'E-mail at once', digest: 'Daily digest', off: 'Off' };

/** For each kind of alert: in the app, e-mail at once, in the daily digest, or off. */
export function AlertPreferencesCard() {
  const prefs = useAlertPreferences();
  const update = useUpdateAlertPreferences();
  const toast = useToast();
  const [choice, setChoice] = useState<Partial<Record<AlertKind, AlertChannel>>>({});
  useEffect(() => {
    if (prefs.data) setChoice(Object.fromEntries(prefs.data.items.map((i) => [i.kind, i.channel])));
  }, [prefs.data]);
  const dirty = prefs.data?.items.some((i) => choice[i.kind] !== i.channel) ?? false;

  const save = async () => {
    try {
      await update.mutateAsync({ items: Object.entries(choice).map(([kind, channel]) => ({ kind: kind as AlertKind, channel: channel as AlertChannel })) });
      toast.success('Alert preferences saved');
    } catch (error) {
      toast.error('Not saved', errorMessage(error));
    }
  };

  return (
    <Card
      id="alert-preferences"
      title="Alerts for you"
      description="How each kind of alert reaches you in this winery. In-app alerts show under the bell; the daily digest goes at 07:00 in the winery's time zone. Defaults follow your role."
    >
      {prefs.isPending ? (
        <LoadingState />
      ) : prefs.isError ? (
        <ErrorState message={errorMessage(prefs.error)} onRetry={() => prefs.refetch()} />
      ) : (
        <div className="flex flex-col gap-4">
          <ul className="divide-y divide-ink-100">
            {prefs.data.items.map((item) => (
              <li key={item.kind} className="flex flex-col gap-1 py-2 sm:flex-row sm:items-center sm:justify-between">
                <label htmlFor={`pref-${item.kind}`} className="text-ink-900">
                  {item.label}
                  <span className="block text-xs text-ink-500">Role default: {channelLabels[item.roleDefault].toLowerCase()}</span>
                </label>
                <Select
                  id={`pref-${item.kind}`}
                  wrapperClassName="sm:w-52"
                  value={choice[item.kind] ?? item.channel}
                  onChange={(e) => setChoice((c) => ({ ...c, [item.kind]: e.target.value as AlertChannel }))}
                  options={ALERT_CHANNELS.map((c) => ({ value: c, label: channelLabels[c] }))}
                />
              </li>
            ))}
          </ul>
          <div>
            <Button onClick={save} loading={update.isPending} disabled={!dirty}>
              Save alert preferences
            </Button>
          </div>
        </div>
      )}
    </Card>
  );
}

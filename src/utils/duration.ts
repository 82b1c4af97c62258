/**
 * A time span in words a person cannot mistake for a clock time: "21 min", "2 h 05 min",
 * "3 h". Under a minute reads "under 1 min"; negative or non-finite spans read "—".
 */
export function formatDuration(t: { hours: number; minutes: number }): string {
  const { hours, minutes } = t;
  if (!Number.isFinite(hours) || !Number.isFinite(minutes) || hours < 0 || minutes < 0) return '—';
  if (hours === 0) return minutes === 0 ? 'under 1 min' : `${String(minutes)} min`;
  if (minutes === 0) return `${hours.toLocaleString('en')} h`;
  return `${hours.toLocaleString('en')} h ${String(minutes).padStart(2, '0')} min`;
}

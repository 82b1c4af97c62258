import { Download } from 'lucide-react';
import { buttonClasses } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { useCan } from '@/lib/session';

/** The owner's download of the whole winery: one zip of CSVs, the attached files and a manifest. */
export function WineryExportCard() {
  if (!useCan('winery:export')) return null;
  return (
    <Card
      title="Export the whole winery"
      description="One zip file: a CSV per kind of record (tanks, lots, lab results, equipment, cartridges and their history, care, plans, runs and readings, the change log), every attached file, and a manifest with the row counts and each file’s SHA-256 fingerprint."
    >
      <div className="flex flex-col gap-2 sm:flex-row sm:items-center sm:justify-between">
        <p className="text-sm text-ink-600">Keep a copy outside Porewise, or hand it to an auditor. A large winery takes a while; the download starts at once.</p>
        <a href="/api/export/winery" download className={buttonClasses('secondary', 'md', 'shrink-0')}>
          <Download aria-hidden="true" className="size-4" />
          Download the export (zip)
        </a>
      </div>
    </Card>
  );
}

import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { SetupRecord } from '@shared/schemas/setup-record';
import { computeSetup } from '@shared/setup/computed';
import { setupToCsv } from '@shared/setup/csv';
import { PageHeader } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { SetupRecordForm } from '@/features/setups/components/setup-record-form';
import { useCurrentUser } from '@/features/auth/api/auth';
import { motorQueries } from '@/features/motors/api/motors';

function downloadLink(text: string, type: string) {
  return URL.createObjectURL(new Blob([text], { type }));
}

export function SetupsNewPage() {
  const me = useCurrentUser();
  const motors = useQuery({ ...motorQueries.list(), enabled: !!me.data });
  const [record, setRecord] = useState<SetupRecord | null>(null);
  const [links, setLinks] = useState<{ json: string; csv: string } | null>(null);
  const handleSubmit = (r: SetupRecord) => {
    if (links) {
      URL.revokeObjectURL(links.json);
      URL.revokeObjectURL(links.csv);
    }
    setRecord(r);
    setLinks({ json: downloadLink(JSON.stringify(r, null, 2) + '\n', 'application/json'), csv: downloadLink(setupToCsv(r, computeSetup(r)), 'text/csv') });
  };
  return (
    <>
      <PageHeader eyebrow="Setup library" title="Build a setup record">
        Fill in your car as it is, or start from a downloaded baseline. Nothing leaves your browser until you upload the file on the setup library page.
      </PageHeader>
      {record && links && (
        <Notice tone="ok" title="Your setup record is ready" className="mb-4">
          <p className="flex flex-wrap gap-4">
            <a href={links.json} download="my-setup.tunewright.json">
              Download JSON
            </a>
            <a href={links.csv} download="my-setup.tunewright.csv">
              Download CSV
            </a>
          </p>
        </Notice>
      )}
      <SetupRecordForm
        onSubmit={handleSubmit}
        submitLabel="Make the setup file"
        motors={me.data ? (motors.data ?? []).map((m) => ({ id: m.id, label: m.label })) : undefined}
      />
    </>
  );
}

import { PageHeader } from '@/components/ui/card';
import { Mailbox } from '@/features/dev-mail/components/mailbox';

export function DevMailPage() {
  return (
    <>
      <PageHeader eyebrow="Local demo" title="Captured mail">
        Mail sent by this local copy of Tunewright lands here instead of a real mailbox. Production sends through the configured SMTP server and has no such
        page.
      </PageHeader>
      <Mailbox />
    </>
  );
}

import { useParams } from 'react-router-dom';
import { PrintSheet } from '@/features/setups/components/print-sheet';

/** Stands outside the app layout, so neither the screen view nor the printout carries the site's navigation. */
export function GuideSetupPrintPage() {
  const { slug = '' } = useParams();
  return (
    <main id="main" className="min-h-screen bg-white">
      <PrintSheet slug={slug} />
    </main>
  );
}

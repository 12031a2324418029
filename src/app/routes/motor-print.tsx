import { useParams } from 'react-router-dom';
import { MotorPrintSheet } from '@/features/motors/components/print-sheet';

/** Stands outside the app layout, like the setup sheet, so the printout carries no site navigation. */
export function MotorPrintPage() {
  const { id = '' } = useParams();
  return (
    <main id="main" className="min-h-screen bg-white">
      <MotorPrintSheet id={id} />
    </main>
  );
}

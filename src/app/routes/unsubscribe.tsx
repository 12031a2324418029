import { useSearchParams } from 'react-router-dom';
import { UnsubscribePanel } from '@/features/watches/components/unsubscribe-panel';

/** /unsubscribe?token=… from a watch mail. */
export function UnsubscribePage() {
  const [params] = useSearchParams();
  return (
    <div className="mx-auto max-w-xl">
      <UnsubscribePanel token={params.get('token') ?? ''} />
    </div>
  );
}

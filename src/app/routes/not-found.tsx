import { Link } from 'react-router-dom';
import { Card } from '@/components/ui/card';

export function NotFoundPage() {
  return (
    <Card className="mx-auto max-w-lg p-8 text-center">
      <p className="text-xs font-semibold tracking-[0.14em] text-copper uppercase">404</p>
      <h1 className="mt-1 font-serif text-2xl font-bold">No page here</h1>
      <p className="mt-2 text-ink-soft">The page may have moved, or the link has a typo. Try the search box above, or start from the parameter library.</p>
      <div className="mt-5 flex justify-center gap-4">
        <Link to="/">Start page</Link>
        <Link to="/parameters">Parameter library</Link>
      </div>
    </Card>
  );
}

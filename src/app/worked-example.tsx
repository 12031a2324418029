import type { ReactNode } from 'react';
import { WorkedExampleCard } from '@/features/calculators/components/worked-example-card';

/**
 * How guide pages, parameter pages and the editor preview render ```worked-example blocks: the live
 * calculator card. One place, so the reader and the author see the same thing.
 */
export function renderWorkedExample(body: string, index: number): ReactNode {
  return <WorkedExampleCard key={index} body={body} />;
}

import type { ReactNode } from 'react';
import { WorkedExampleListing } from '@/components/worked-example-listing';

/**
 * How guide pages and the editor preview render ```worked-example blocks. One place, so the reader
 * and the author see the same thing; the live calculator card is composed here once it is in main.
 */
export function renderWorkedExample(body: string, index: number): ReactNode {
  return <WorkedExampleListing key={index} body={body} />;
}

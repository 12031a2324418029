import { useQuery } from '@tanstack/react-query';
import { useSearchParams } from 'react-router-dom';
import { CLASSES } from '@shared/constants';
import { PageHeader, Spinner } from '@/components/ui/card';
import { SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { Button } from '@/components/ui/button';
import { changeQueries } from '@/features/changes/api/changes';
import { ChangesList } from '@/features/changes/components/changes-list';

/** /changes: every new live version, restore and hide, newest first, with filters and an Atom feed. */
export function ChangesPage() {
  const [params, setParams] = useSearchParams();
  const filters = { kind: params.get('kind') ?? undefined, class: params.get('class') ?? undefined, author: params.get('author') ?? undefined };
  const authorName = params.get('authorName');
  const list = useQuery(changeQueries.list(filters));
  const set = (key: string, value: string | null, extra: Record<string, string | null> = {}) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries({ [key]: value, ...extra })) {
      if (v) next.set(k, v);
      else next.delete(k);
    }
    setParams(next, { replace: true });
  };
  const feedQuery = new URLSearchParams(Object.entries(filters).filter((e): e is [string, string] => !!e[1])).toString();
  return (
    <>
      <PageHeader
        eyebrow="The library"
        title="Recent changes"
        actions={
          <a href={`/changes.atom${feedQuery ? `?${feedQuery}` : ''}`} className="text-sm" type="application/atom+xml">
            Atom feed of this list
          </a>
        }
      >
        New versions that went live, older texts restored, and pages taken out of view. Every edit was reviewed by a moderator first.
      </PageHeader>
      <form
        className="mb-4 grid gap-3 sm:grid-cols-[15rem_minmax(0,18rem)_1fr] sm:items-end"
        onSubmit={(e) => e.preventDefault()}
        aria-label="Filter the changes"
      >
        <SelectField
          label="Kind"
          value={filters.kind ?? ''}
          onChange={(e) => set('kind', e.target.value || null, e.target.value === 'parameter' ? { class: null } : {})}
        >
          <option value="">Guides and parameters</option>
          <option value="guide">Guides</option>
          <option value="parameter">Parameter entries</option>
        </SelectField>
        <SelectField label="Class" value={filters.class ?? ''} onChange={(e) => set('class', e.target.value || null)} disabled={filters.kind === 'parameter'}>
          <option value="">Every class</option>
          {CLASSES.map((c) => (
            <option key={c.slug} value={c.slug}>
              {c.name}
            </option>
          ))}
        </SelectField>
        {filters.author && (
          <div className="flex items-center gap-2 text-sm">
            <span>
              Author: <strong>{authorName ?? 'one author'}</strong>
            </span>
            <Button variant="ghost" size="sm" onClick={() => set('author', null, { authorName: null })}>
              Every author
            </Button>
          </div>
        )}
      </form>
      {list.isPending ? (
        <Spinner label="Loading the changes…" />
      ) : list.isError ? (
        <Notice tone="danger" title="The changes could not be loaded">
          {list.error.message}
        </Notice>
      ) : (
        <ChangesList changes={list.data.data} onAuthor={(a) => set('author', a.id, { authorName: a.displayName })} />
      )}
    </>
  );
}

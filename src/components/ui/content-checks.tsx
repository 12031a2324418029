import type { ContentCheckItem } from '@shared/schemas/content-check';
import { checkPathLabel } from '@shared/content-checks/path-label';
import { Notice } from './notice';

/**
 * The content checks' findings (shared/content-checks) as the editor and the review screen list them:
 * errors, which stop a submission, then warnings, each with the setting or example it concerns.
 */
export function ContentChecks({ checks, audience }: { checks: ContentCheckItem[]; audience: 'author' | 'moderator' }) {
  const errors = checks.filter((c) => c.severity === 'error');
  const warnings = checks.filter((c) => c.severity !== 'error');
  if (checks.length === 0) {
    return (
      <p className="text-sm text-ink-soft" data-testid="content-checks">
        The automatic checks find nothing: worked examples agree with the baseline, stated values match it, and cautions sit beside the examples that need them.
      </p>
    );
  }
  const list = (items: ContentCheckItem[]) => (
    <ul className="mt-1 flex list-none flex-col gap-2 p-0">
      {items.map((c, i) => (
        <li key={`${c.rule}-${c.path}-${i}`}>
          <span className="font-semibold">{checkPathLabel(c.path)}:</span> {c.message}
        </li>
      ))}
    </ul>
  );
  return (
    <div className="flex flex-col gap-3" data-testid="content-checks">
      {errors.length > 0 && (
        <Notice
          tone="danger"
          title={audience === 'author' ? `${errors.length} to fix before you can submit` : `${errors.length} error${errors.length === 1 ? '' : 's'}`}
        >
          {list(errors)}
        </Notice>
      )}
      {warnings.length > 0 && (
        <Notice tone="caution" title={`${warnings.length} warning${warnings.length === 1 ? '' : 's'}${audience === 'author' ? ' (you can still submit)' : ''}`}>
          {list(warnings)}
        </Notice>
      )}
    </div>
  );
}

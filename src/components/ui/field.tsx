import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

type FieldShellProps = { label: ReactNode; error?: string; hint?: ReactNode; id: string; children: ReactNode; count?: { length: number; limit: number } };

/**
 * "23 / 140 characters" under a field with a length limit, updated as the person types; past the limit
 * it says by how much, in the danger colour. The field itself never cuts text off (the server refuses
 * what is too long, and says so); screen readers hear it only once the limit is close.
 */
function LengthCount({ id, length, limit }: { id: string; length: number; limit: number }) {
  const over = length - limit;
  const close = length >= limit * 0.9;
  return (
    <p
      id={id}
      className={`text-xs tabular-nums ${over > 0 ? 'font-medium text-danger' : close ? 'text-caution' : 'text-ink-muted'}`}
      aria-live={close ? 'polite' : 'off'}
    >
      {over > 0 ? `${length} / ${limit} characters: ${over} too many` : `${length} / ${limit} characters`}
    </p>
  );
}

function FieldShell({ label, error, hint, id, children, count }: FieldShellProps) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      {children}
      {count && <LengthCount id={`${id}-count`} length={count.length} limit={count.limit} />}
      {hint && !error && (
        <p id={`${id}-hint`} className="text-xs text-ink-muted">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} role="alert" className="text-sm text-danger">
          {error}
        </p>
      )}
    </div>
  );
}

const control = 'w-full rounded-md border bg-white/80 px-3 py-2 text-ink shadow-inner placeholder:text-ink-faint focus:border-copper';

/** The ids a field's description comes from: its count, then its error or hint. */
function describedBy(fieldId: string, error: string | undefined, hint: ReactNode, limit: number | undefined) {
  const ids = [limit !== undefined ? `${fieldId}-count` : null, error ? `${fieldId}-error` : hint ? `${fieldId}-hint` : null].filter(Boolean);
  return ids.length ? ids.join(' ') : undefined;
}

// Counted as the server's limits count (string length, spaces at either end aside).
const lengthOf = (value: unknown) => (typeof value === 'string' ? value.trim().length : 0);

/** `limit`: show a live character count against it (the field does not cut text off). */
type TextFieldProps = InputHTMLAttributes<HTMLInputElement> & { label: ReactNode; error?: string; hint?: ReactNode; limit?: number };

/** A labelled input with inline error and hint, wired for react-hook-form's register(). */
export const TextField = forwardRef<HTMLInputElement, TextFieldProps>(function TextField({ label, error, hint, id, limit, className = '', ...rest }, ref) {
  const auto = useId();
  const fieldId = id ?? auto;
  return (
    <FieldShell label={label} error={error} hint={hint} id={fieldId} count={limit !== undefined ? { length: lengthOf(rest.value), limit } : undefined}>
      <input
        ref={ref}
        id={fieldId}
        aria-invalid={error || (limit !== undefined && lengthOf(rest.value) > limit) ? true : undefined}
        aria-describedby={describedBy(fieldId, error, hint, limit)}
        className={`${control} ${error ? 'border-danger' : 'border-ink/25'} ${className}`}
        {...rest}
      />
    </FieldShell>
  );
});

type SelectFieldProps = SelectHTMLAttributes<HTMLSelectElement> & { label: ReactNode; error?: string; hint?: ReactNode };

export const SelectField = forwardRef<HTMLSelectElement, SelectFieldProps>(function SelectField(
  { label, error, hint, id, className = '', children, ...rest },
  ref,
) {
  const auto = useId();
  const fieldId = id ?? auto;
  return (
    <FieldShell label={label} error={error} hint={hint} id={fieldId}>
      <select
        ref={ref}
        id={fieldId}
        aria-invalid={error ? true : undefined}
        className={`${control} ${error ? 'border-danger' : 'border-ink/25'} ${className}`}
        {...rest}
      >
        {children}
      </select>
    </FieldShell>
  );
});

type TextAreaFieldProps = TextareaHTMLAttributes<HTMLTextAreaElement> & { label: ReactNode; error?: string; hint?: ReactNode; limit?: number };

export const TextAreaField = forwardRef<HTMLTextAreaElement, TextAreaFieldProps>(function TextAreaField(
  { label, error, hint, id, limit, className = '', ...rest },
  ref,
) {
  const auto = useId();
  const fieldId = id ?? auto;
  return (
    <FieldShell label={label} error={error} hint={hint} id={fieldId} count={limit !== undefined ? { length: lengthOf(rest.value), limit } : undefined}>
      <textarea
        ref={ref}
        id={fieldId}
        aria-invalid={error || (limit !== undefined && lengthOf(rest.value) > limit) ? true : undefined}
        aria-describedby={describedBy(fieldId, error, hint, limit)}
        className={`${control} ${error ? 'border-danger' : 'border-ink/25'} ${className}`}
        {...rest}
      />
    </FieldShell>
  );
});

import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';
import { useQuery } from '@tanstack/react-query';
import { useLocation, useNavigate } from 'react-router-dom';
import { LIMITS } from '@shared/constants';
import { useDebouncedValue } from '@/lib/use-debounced-value';
import { searchQueries } from '../api/search';
import { TypeBadge } from './type-badge';

/**
 * The header search box: suggestions as you type (debounced), following the ARIA combobox pattern.
 * Arrows move through the list, Enter opens the highlighted page (or the full results), Escape
 * closes the list and, pressed again, clears the box.
 */
export function SearchBox() {
  const navigate = useNavigate();
  const location = useLocation();
  const [value, setValue] = useState('');
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(-1);
  const debounced = useDebouncedValue(value.trim(), 150);
  const listId = useId();
  const inputRef = useRef<HTMLInputElement>(null);
  const suggest = useQuery({ ...searchQueries.suggest(debounced), enabled: open && debounced.length > 0 });
  const items = suggest.data ?? [];
  // The last row always offers the full results page.
  const rows = value.trim()
    ? [
        ...items.map((s) => ({ key: `${s.type}:${s.slug}`, url: s.url, suggestion: s })),
        { key: 'all', url: `/search?q=${encodeURIComponent(value.trim())}`, suggestion: null },
      ]
    : [];
  const expanded = open && rows.length > 0;

  useEffect(() => {
    setOpen(false);
    setActive(-1);
  }, [location.pathname, location.search]);
  useEffect(() => setActive(-1), [debounced]);

  const go = (url: string) => {
    setOpen(false);
    setActive(-1);
    inputRef.current?.blur();
    navigate(url);
  };

  const handleKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'ArrowDown') {
      e.preventDefault();
      if (!open) setOpen(true);
      setActive((a) => (rows.length ? (a + 1) % rows.length : -1));
    } else if (e.key === 'ArrowUp') {
      e.preventDefault();
      setActive((a) => (rows.length ? (a <= 0 ? rows.length - 1 : a - 1) : -1));
    } else if (e.key === 'Enter' && expanded && active >= 0 && rows[active]) {
      // A highlighted suggestion opens its page; otherwise Enter submits the form (the full results).
      e.preventDefault();
      go(rows[active].url);
    } else if (e.key === 'Escape') {
      if (expanded) {
        e.preventDefault();
        setOpen(false);
        setActive(-1);
      } else if (value) {
        e.preventDefault();
        setValue('');
      }
    }
  };

  return (
    // A real GET form: before the app has started on a server-drawn page (or without script), Enter
    // still opens the results page.
    <form
      role="search"
      action="/search"
      method="get"
      onSubmit={(e) => {
        e.preventDefault();
        if (value.trim()) go(`/search?q=${encodeURIComponent(value.trim())}`);
      }}
      className="relative w-full sm:w-72 lg:w-40 xl:w-48"
    >
      <label className="sr-only" htmlFor={`${listId}-input`}>
        Search settings, guides and setups
      </label>
      <input
        ref={inputRef}
        id={`${listId}-input`}
        name="q"
        type="text"
        role="combobox"
        aria-expanded={expanded}
        aria-controls={listId}
        aria-autocomplete="list"
        aria-activedescendant={expanded && active >= 0 ? `${listId}-opt-${active}` : undefined}
        autoComplete="off"
        spellCheck={false}
        maxLength={LIMITS.searchQueryMax}
        value={value}
        onChange={(e) => {
          setValue(e.target.value);
          setOpen(true);
        }}
        onFocus={() => value && setOpen(true)}
        onBlur={() => setOpen(false)}
        onKeyDown={handleKeyDown}
        placeholder="Search: drag brake, 17.5T…"
        className="w-full rounded-md border border-ink/20 bg-white/80 px-3 py-1.5 text-sm placeholder:text-ink-faint focus:border-copper"
      />
      <ul
        id={listId}
        role="listbox"
        aria-label="Suggestions"
        hidden={!expanded}
        className="absolute top-full right-0 left-0 z-40 mt-1 max-h-[70vh] overflow-auto rounded-md border border-paper-line bg-paper-card py-1 shadow-lg sm:left-auto sm:w-[26rem]"
      >
        {rows.map((row, i) => (
          <li
            key={row.key}
            id={`${listId}-opt-${i}`}
            role="option"
            aria-selected={i === active}
            // Keep focus in the input: choose on mousedown, before the input's blur closes the list.
            onMouseDown={(e) => {
              e.preventDefault();
              go(row.url);
            }}
            onMouseEnter={() => setActive(i)}
            className={`flex cursor-pointer items-center gap-2 px-3 py-2 text-sm ${i === active ? 'bg-paper-deep' : ''} ${row.suggestion ? '' : 'border-t border-paper-line text-copper-dark'}`}
          >
            {row.suggestion ? (
              <>
                <TypeBadge type={row.suggestion.type} />
                <span className="min-w-0 truncate text-ink">{row.suggestion.title}</span>
              </>
            ) : (
              <span>
                All results for “<span className="font-medium">{value.trim()}</span>”
              </span>
            )}
          </li>
        ))}
      </ul>
      <p className="sr-only" aria-live="polite">
        {expanded && debounced ? `${items.length} suggestion${items.length === 1 ? '' : 's'}` : ''}
      </p>
    </form>
  );
}

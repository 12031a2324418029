import { useState, type FormEvent } from 'react';
import { Link, NavLink, Outlet, useLocation, useNavigate } from 'react-router-dom';
import { SavedCopyNotice, UpdateNotice } from './offline-notices';
import { InPageToasts, toast } from '@/lib/toast';
import { hasRole, type Role } from '@shared/constants';
import { isAuthPath } from '@shared/safe-next';
import type { User } from '@shared/schemas/user';
import { useCurrentUser, useSignOut } from '@/features/auth/api/auth';
import { firstName } from '@/lib/names';
import { navExtras } from './nav-extras';
import { NotebookMenu } from './notebook-menu';
import { DisplayMenu } from './display-menu';

type NavItem = { to: string; label: string; min?: Role };
/** `notebook` stands for the Notebook entry (setups, run logs, motors), drawn by {@link NotebookMenu}. */
const NOTEBOOK = 'notebook';
const NAV: NavItem[] = [
  { to: '/parameters', label: 'Parameters' },
  { to: '/guides', label: 'Guides' },
  { to: NOTEBOOK, label: 'Notebook' },
  { to: '/calculators', label: 'Calculators' },
  { to: '/me/revisions', label: 'Workbench', min: 'member' },
  { to: '/review', label: 'Review', min: 'moderator' },
  { to: '/admin/users', label: 'Admin', min: 'admin' },
];

export function canSee(user: User | null | undefined, min?: Role) {
  if (!min) return true;
  return hasRole(user, min);
}

function Brand() {
  return (
    <Link to="/" className="flex items-center gap-2 text-ink no-underline" aria-label="Tunewright home">
      <svg viewBox="0 0 32 32" className="h-8 w-8" aria-hidden>
        <rect width="32" height="32" rx="7" fill="#1d2a44" />
        <circle cx="16" cy="16" r="9" fill="none" stroke="#d98f5f" strokeWidth="3" />
        <path d="M16 16 L22 10" stroke="#f6f0e4" strokeWidth="3" strokeLinecap="round" />
      </svg>
      <span className="font-serif text-xl font-bold tracking-tight">Tunewright</span>
    </Link>
  );
}

function HeaderSearch() {
  const navigate = useNavigate();
  const SearchBox = navExtras.SearchBox;
  const [q, setQ] = useState('');
  if (SearchBox) return <SearchBox />;
  const handleSubmit = (e: FormEvent) => {
    e.preventDefault();
    if (q.trim()) navigate(`/search?q=${encodeURIComponent(q.trim())}`);
  };
  return (
    <form role="search" action="/search" method="get" onSubmit={handleSubmit} className="w-full sm:w-72 lg:w-40 xl:w-48">
      <label className="sr-only" htmlFor="header-search">
        Search settings and guides
      </label>
      <input
        id="header-search"
        name="q"
        type="search"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        placeholder="Search: drag brake, 17.5T…"
        className="w-full rounded-md border border-ink/20 bg-white/80 px-3 py-1.5 text-sm placeholder:text-ink-faint"
      />
    </form>
  );
}

/** `shown`: on a phone the account links live in the menu; from md up they are always in the header. */
function AccountMenu({ user, shown }: { user: User | null | undefined; shown: boolean }) {
  const place = `${shown ? 'flex' : 'hidden'} md:flex items-center gap-2 text-sm`;
  const signOut = useSignOut();
  const navigate = useNavigate();
  const location = useLocation();
  if (!user) {
    // Back to the page the person was on, unless it is itself a sign-in page (or a spent confirmation link).
    const next = isAuthPath(location.pathname) ? '' : `?next=${encodeURIComponent(location.pathname + location.search + location.hash)}`;
    return (
      <div className={place}>
        <Link to={`/sign-in${next}`} className="rounded-md px-2 py-1 font-medium text-ink no-underline hover:bg-paper-deep">
          Sign in
        </Link>
        <Link to="/sign-up" className="rounded-md bg-copper px-3 py-1.5 font-medium text-white no-underline hover:bg-copper-dark">
          Join
        </Link>
      </div>
    );
  }
  const handleSignOut = async () => {
    await signOut.mutateAsync();
    toast.success('Signed out');
    navigate('/');
  };
  return (
    <div className={place}>
      {/* The first name keeps the header on one row; the whole name is the link's name and its tooltip. */}
      <Link
        to="/account"
        aria-label={`${user.displayName}, your account`}
        title={`${user.displayName} — your account`}
        className="max-w-[10rem] truncate rounded-md px-2 py-1 font-medium text-ink no-underline hover:bg-paper-deep"
      >
        {firstName(user.displayName)}
      </Link>
      <button type="button" onClick={handleSignOut} className="rounded-md border border-ink/20 px-2.5 py-1 hover:bg-paper-deep">
        Sign out
      </button>
    </div>
  );
}

export function AppLayout() {
  const me = useCurrentUser();
  const [menuOpen, setMenuOpen] = useState(false);
  const user = me.data;
  const items = NAV.filter((n) => canSee(user, n.min));
  const Badge = navExtras.ReviewBadge;
  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-ink focus:px-3 focus:py-2 focus:text-paper"
      >
        Skip to content
      </a>
      <header className="no-print border-b border-paper-line bg-paper/95 backdrop-blur">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-4 gap-y-3 px-4 py-3">
          <Brand />
          {/* On a phone the Display switch sits beside Menu; from md up it sits beside the search box. */}
          <div className="ml-auto flex items-center gap-2 md:hidden">
            <DisplayMenu />
            <button
              type="button"
              className="rounded-md border border-ink/20 px-3 py-1.5 text-sm"
              aria-expanded={menuOpen}
              aria-controls="main-nav"
              onClick={() => setMenuOpen((o) => !o)}
            >
              Menu
            </button>
          </div>
          <nav
            id="main-nav"
            aria-label="Main"
            className={`${menuOpen ? 'flex' : 'hidden'} w-full flex-col gap-1 md:flex md:w-auto md:flex-row md:items-center`}
          >
            {items.map((n) =>
              n.to === NOTEBOOK ? (
                <NotebookMenu key={n.to} onNavigate={() => setMenuOpen(false)} />
              ) : (
                <NavLink
                  key={n.to}
                  to={n.to}
                  onClick={() => setMenuOpen(false)}
                  className={({ isActive }) =>
                    `rounded-md px-2 py-1.5 text-sm font-medium no-underline md:px-1 ${isActive ? 'bg-ink text-paper' : 'text-ink hover:bg-paper-deep'}`
                  }
                >
                  {n.label}
                  {n.to === '/review' && Badge && <Badge />}
                </NavLink>
              ),
            )}
          </nav>
          {/* The search box stays in view on a phone (one tap away on every page); the account links fold into the menu. */}
          <div className="flex w-full flex-col gap-3 sm:flex-row sm:items-center md:ml-auto md:w-auto">
            <HeaderSearch />
            <div className="hidden md:block">
              <DisplayMenu />
            </div>
            <AccountMenu user={user} shown={menuOpen} />
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-8">
        <InPageToasts />
        <UpdateNotice />
        <SavedCopyNotice />
        <Outlet />
      </main>
      <footer className="no-print border-t border-paper-line bg-paper-deep/60">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-4 py-5 text-xs text-ink-muted">
          <p>Tunewright — the moderated tuning notebook of the Tidewater RC Club. Every live edit was reviewed by a moderator.</p>
          <p>Settings are starting points. Your equipment maker's instructions and your track's and sanctioning body's rules come first.</p>
        </div>
      </footer>
    </div>
  );
}

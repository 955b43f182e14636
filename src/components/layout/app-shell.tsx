import type { ReactNode } from 'react';
import { Link, NavLink } from 'react-router-dom';
import { capitalise } from '../../lib/format';
import { paths } from '../../lib/paths';
import { useTheme } from '../../lib/theme';
import { useDisclosure } from '../../lib/use-disclosure';
import { LiveIndicator } from './live-indicator';
import { ParapetMark } from './parapet-mark';

export interface NavItem {
  to: string;
  label: string;
  end?: boolean;
}

interface AppShellProps {
  user: { name: string; role: string };
  navItems: NavItem[];
  onSignOut: () => void;
  signingOut: boolean;
  children: ReactNode;
}

function ThemeToggle({ className = '' }: { className?: string }) {
  const { theme, toggle } = useTheme();
  const next = theme === 'dark' ? 'light' : 'dark';
  return (
    <button
      type="button"
      onClick={toggle}
      aria-label={`Use the ${next} theme`}
      title={`Use the ${next} theme`}
      className={`shrink-0 rounded-md p-2 text-muted hover:bg-sunken hover:text-ink ${className}`}
    >
      <svg width="18" height="18" viewBox="0 0 16 16" aria-hidden="true">
        {theme === 'dark' ? (
          <g fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round">
            <circle cx="8" cy="8" r="3" />
            <path d="M8 1v1.5M8 13.5V15M1 8h1.5M13.5 8H15M3 3l1 1M12 12l1 1M3 13l1-1M12 4l1-1" />
          </g>
        ) : (
          <path d="M13.5 10A6 6 0 0 1 6 2.5a6 6 0 1 0 7.5 7.5z" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" />
        )}
      </svg>
    </button>
  );
}

const linkClass = ({ isActive }: { isActive: boolean }) =>
  `block rounded-md px-3 py-2 text-sm font-medium lg:py-1.5 ${isActive ? 'bg-accent-soft text-ink' : 'text-muted hover:bg-sunken hover:text-ink'}`;

const menuLinkClass = ({ isActive }: { isActive: boolean }) =>
  `block rounded-md px-3 py-2 text-sm ${isActive ? 'bg-accent-soft font-medium text-ink' : 'text-ink hover:bg-sunken'}`;

/** The signed-in person's own pages, behind their name: a drop-down that never has to squeeze into the header. */
function PersonMenu({ user, onSignOut, signingOut }: Pick<AppShellProps, 'user' | 'onSignOut' | 'signingOut'>) {
  const menu = useDisclosure<HTMLButtonElement, HTMLDivElement>();
  const items = [
    { to: paths.account.to(), label: 'Account' },
    { to: paths.preferences.to(), label: 'Mail settings' },
    ...(user.role === 'admin'
      ? [
          { to: paths.outbox.to(), label: 'Outbox' },
          { to: paths.history.to(), label: 'History' },
        ]
      : []),
  ];
  return (
    <div data-testid="user-menu" className="relative flex min-w-0 items-center gap-2">
      <button
        type="button"
        {...menu.buttonProps}
        onClick={menu.toggle}
        className="flex min-w-0 items-center gap-1.5 rounded-md px-2 py-1 text-left leading-tight hover:bg-sunken"
      >
        <span className="min-w-0">
          <span className="block max-w-[9rem] truncate text-sm font-medium sm:max-w-[14rem]">{user.name}</span>
          <span className="block truncate text-xs text-muted">{capitalise(user.role)}</span>
        </span>
        <span className="sr-only">: your pages</span>
        <svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true" className={`shrink-0 transition-transform ${menu.open ? 'rotate-180' : ''}`}>
          <path d="M2.5 4.5L6 8l3.5-3.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
      </button>
      <div
        {...menu.panelProps}
        hidden={!menu.open}
        className="absolute top-full right-0 z-50 mt-2 w-48 rounded-md border border-line bg-surface p-1.5 shadow-lg"
      >
        <ul className="flex flex-col gap-0.5">
          {items.map((item) => (
            <li key={item.to}>
              <NavLink to={item.to} className={menuLinkClass} onClick={() => menu.close(false)}>
                {item.label}
              </NavLink>
            </li>
          ))}
        </ul>
      </div>
      <button
        type="button"
        onClick={onSignOut}
        disabled={signingOut}
        title="Sign out"
        className="inline-flex shrink-0 items-center rounded-md border border-line-strong px-2 py-1.5 text-sm hover:bg-sunken md:px-2.5 md:py-1"
      >
        <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" className="md:hidden">
          <path d="M6 2.5H3v11h3M10 5l3 3-3 3M13 8H6" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
        <span className="max-md:sr-only">{signingOut ? 'Signing out…' : 'Sign out'}</span>
      </button>
    </div>
  );
}

export function AppShell({ user, navItems, onSignOut, signingOut, children }: AppShellProps) {
  const menu = useDisclosure<HTMLButtonElement, HTMLElement>();

  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-surface focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="relative border-b border-line bg-surface">
        <div className="mx-auto flex h-14 max-w-6xl items-center gap-3 px-4">
          <Link to="/" className="flex shrink-0 items-center gap-2 rounded-md font-semibold tracking-tight">
            <ParapetMark />
            <span className="text-lg">Parapet</span>
          </Link>
          {/* The menu button comes right before the links it shows, so Tab goes from it into them; on a phone it sits at the end of the bar. */}
          <button
            type="button"
            className="shrink-0 rounded-md border border-line-strong p-2 max-lg:order-last lg:hidden"
            {...menu.buttonProps}
            onClick={menu.toggle}
          >
            <span className="sr-only">Menu</span>
            <svg width="18" height="18" viewBox="0 0 16 16" aria-hidden="true">
              <path d={menu.open ? 'M3.5 3.5l9 9M12.5 3.5l-9 9' : 'M2 4h12M2 8h12M2 12h12'} stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
            </svg>
          </button>
          <nav
            {...menu.panelProps}
            data-testid="nav"
            aria-label="Main"
            className={
              `${menu.open ? 'max-lg:block' : 'max-lg:hidden'} z-40 lg:ml-4 ` +
              'max-lg:absolute max-lg:inset-x-0 max-lg:top-14 max-lg:border-b max-lg:border-line max-lg:bg-surface max-lg:p-3 max-lg:shadow-md'
            }
          >
            <ul className="flex flex-col gap-1 lg:flex-row">
              {navItems.map((item) => (
                <li key={item.to}>
                  <NavLink to={item.to} end={item.end} className={linkClass}>
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
          <div className="ml-auto flex min-w-0 items-center gap-2">
            <LiveIndicator />
            <PersonMenu user={user} onSignOut={onSignOut} signingOut={signingOut} />
            <ThemeToggle />
          </div>
        </div>
      </header>
      <main id="main" tabIndex={-1} className="mx-auto w-full max-w-6xl flex-1 px-4 py-6 focus:outline-none">
        {children}
      </main>
    </div>
  );
}

import { Suspense, useEffect, useState } from 'react';
import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import { Form, NavLink, Outlet, useLocation, useMatches, useNavigation, type LoaderFunctionArgs } from 'react-router-dom';
import { navSectionsFor, NAV_LABELS, ROLE_LABELS, type NavSection } from '../../../shared/auth/roles';
import type { UserDto } from '../../../shared/schemas/users';
import { Badge } from '../../components/ui/badge';
import { Button } from '../../components/ui/button';
import { LoadingState } from '../../components/ui/spinner';
import { Wordmark } from '../../components/ui/wordmark';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { cn } from '../../lib/cn';
import { NavIcon } from '../nav-icons';
import { paths, sectionPaths } from '../paths';
import { requireUser } from '../route-guards';
import { SafetyNote } from './safety-note';

/** Every signed-in page needs the user: no session → sign-in (with `?next=`). */
export const appLayoutLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireUser(queryClient, request);
    return null;
  };

const WORK_SECTIONS: NavSection[] = ['cases', 'drive-library', 'bearings', 'capture-planner'];

function NavGroup({ label, sections }: { label: string; sections: NavSection[] }) {
  if (sections.length === 0) return null;
  return (
    <div>
      <p className="px-3 pb-1 text-[0.7rem] font-semibold uppercase tracking-wider text-muted-foreground/80">{label}</p>
      <ul className="grid gap-0.5">
        {sections.map((section) => (
          <li key={section}>
            <NavLink
              to={sectionPaths[section]}
              className={({ isActive }) =>
                cn(
                  'flex items-center gap-2.5 whitespace-nowrap rounded-md px-3 py-2.5 text-base text-foreground/80 transition-colors hover:bg-card hover:text-foreground md:py-1.5 md:text-sm',
                  'focus-visible:outline-2 focus-visible:outline-ring',
                  isActive && 'bg-card font-medium text-foreground shadow-xs ring-1 ring-border',
                )
              }
            >
              <NavIcon section={section} />
              {NAV_LABELS[section]}
            </NavLink>
          </li>
        ))}
      </ul>
    </div>
  );
}

function SignOutButton({ className }: { className?: string }) {
  const navigation = useNavigation();
  const signingOut = navigation.state !== 'idle' && navigation.formAction === paths.signOut;
  return (
    <Form method="post" action={paths.signOut} className={className}>
      <Button type="submit" variant="outline" size="sm" className="w-full" pending={signingOut}>
        Sign out
      </Button>
    </Form>
  );
}

function UserBlock({ user }: { user: UserDto }) {
  return (
    <div className="grid gap-2 border-t border-border pt-4">
      <div className="px-1">
        <p className="truncate text-sm font-medium" title={user.email}>
          {user.name}
        </p>
        <p className="text-xs text-muted-foreground">{ROLE_LABELS[user.role]}</p>
      </div>
      <SignOutButton />
    </div>
  );
}

/** The signed-in frame: sidebar navigation (only what the role may use), the page, the safety note. */
export function AppLayout() {
  const { data } = useSuspenseQuery(meQueryOptions());
  const user = data.user;
  const sections = navSectionsFor(user.role);
  const work = sections.filter((s) => WORK_SECTIONS.includes(s));
  const shop = sections.filter((s) => !WORK_SECTIONS.includes(s));
  const navigation = useNavigation();
  // A page that shows the full cautions itself (route handle `fullSafetyNote`) needs no footer copy.
  const showsFullSafetyNote = useMatches().some((m) => (m.handle as { fullSafetyNote?: boolean } | undefined)?.fullSafetyNote);
  // On a phone the sections sit behind a Menu button (every one reachable, none off-screen); it closes on navigation.
  const [menuOpen, setMenuOpen] = useState(false);
  const { pathname } = useLocation();
  useEffect(() => setMenuOpen(false), [pathname]);
  return (
    <div className="flex min-h-screen flex-col md:flex-row">
      <aside className="shrink-0 print:hidden border-b border-border bg-sidebar md:w-60 md:border-r md:border-b-0">
        <div className="flex flex-col gap-3 px-3 py-3 md:sticky md:top-0 md:h-screen md:gap-5 md:py-4">
          <div className="flex items-start justify-between gap-3 px-2">
            <div className="min-w-0">
              <Wordmark />
              <div className="mt-1.5 flex flex-wrap items-center gap-1.5 text-xs text-muted-foreground">
                <span className="truncate">{user.shop.name}</span>
                {user.shop.isDemo ? <Badge variant="warning">Demo shop</Badge> : null}
              </div>
            </div>
            <Button type="button" variant="outline" size="sm" className="md:hidden" aria-expanded={menuOpen} aria-controls="main-nav"
              onClick={() => setMenuOpen((o) => !o)}>
              {menuOpen ? 'Close menu' : 'Menu'}
            </Button>
          </div>
          <nav id="main-nav" aria-label="Main" className={cn('gap-4 md:grid', menuOpen ? 'grid' : 'hidden')}>
            <NavGroup label="Workbench" sections={work} />
            <NavGroup label="Shop" sections={shop} />
            <div className="md:hidden">
              <UserBlock user={user} />
            </div>
          </nav>
          <div className="mt-auto hidden md:block">
            <UserBlock user={user} />
          </div>
        </div>
      </aside>
      <div className="flex min-w-0 flex-1 flex-col">
        <div
          aria-hidden
          className={cn('h-0.5 bg-chart-pickup transition-opacity', navigation.state === 'loading' ? 'animate-pulse opacity-100' : 'opacity-0')}
        />
        <main className="mx-auto w-full max-w-6xl flex-1 px-4 py-6 sm:px-8 sm:py-8">
          <Suspense fallback={<LoadingState />}>
            <Outlet />
          </Suspense>
        </main>
        {showsFullSafetyNote ? null : (
          <footer className="mx-auto w-full max-w-6xl px-4 pb-6 sm:px-8 print:hidden">
            <SafetyNote compact />
          </footer>
        )}
      </div>
    </div>
  );
}

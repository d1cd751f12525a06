import { NavLink, Outlet, ScrollRestoration, useLocation } from "react-router-dom";
import { Suspense, useEffect, useRef, useState, type ReactNode } from "react";
import { Menu, X } from "lucide-react";
import { cn } from "@/lib/cn";
import { paths } from "@/config/paths";
import { Spinner } from "@/components/ui";

const navItems = [
  { to: paths.home(), label: "Home", end: true },
  { to: paths.map(), label: "Digester map", end: false },
  { to: paths.plan(), label: "Plan a digester", end: false },
];

function navClass({ isActive }: { isActive: boolean }) {
  return cn(
    "inline-flex min-h-11 items-center rounded-md px-3 font-bold no-underline text-primary-foreground hover:bg-primary-foreground/15",
    isActive && "underline decoration-2 underline-offset-8",
  );
}

export type NavItem = { to: string; label: string; end?: boolean };

export type AppShellProps = {
  /** Links for the signed-in person's roles, after the public ones. */
  extraNavItems?: NavItem[];
  /** Right end of the header: who is signed in, sign in / sign out. */
  accountArea?: ReactNode;
  /** Page-wide overlays such as the session-expiry dialog. */
  children?: ReactNode;
};

/** Skip link, header with navigation, the page, and a footer. */
export function AppShell({ extraNavItems = [], accountArea, children }: AppShellProps = {}) {
  // On phones the links fold behind a "Menu" button, so each page starts on the first screen.
  const [menuOpen, setMenuOpen] = useState(false);
  const menuButton = useRef<HTMLButtonElement>(null);
  const { pathname } = useLocation();
  useEffect(() => setMenuOpen(false), [pathname]);
  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href="#main"
        className="sr-only z-50 rounded-md bg-surface p-3 font-bold text-primary focus:not-sr-only focus:fixed focus:top-2 focus:left-2"
      >
        Skip to main content
      </a>
      <header className="bg-primary text-primary-foreground" data-print-hide>
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-2 px-4 py-2">
          <NavLink
            to={paths.home()}
            className="inline-flex min-h-11 items-center gap-2 text-xl font-bold no-underline text-primary-foreground"
          >
            <img src="/favicon.svg" alt="" width={28} height={28} />
            Hearthloop
          </NavLink>
          <button
            ref={menuButton}
            type="button"
            className="inline-flex min-h-11 items-center gap-2 rounded-md border border-primary-foreground/50 px-3 font-bold text-primary-foreground hover:bg-primary-foreground/15 md:hidden"
            aria-expanded={menuOpen}
            aria-controls="main-nav"
            onClick={() => setMenuOpen((open) => !open)}
          >
            {menuOpen ? <X aria-hidden size={20} /> : <Menu aria-hidden size={20} />}
            Menu
          </button>
          <nav
            id="main-nav"
            aria-label="Main"
            className={cn("w-full md:block md:w-auto", menuOpen ? "block" : "hidden")}
            onKeyDown={(e) => {
              if (e.key === "Escape" && menuOpen) {
                setMenuOpen(false);
                menuButton.current?.focus();
              }
            }}
          >
            <ul className="flex flex-col gap-1 md:flex-row md:flex-wrap">
              {[...navItems, ...extraNavItems].map((item) => (
                <li key={item.to}>
                  <NavLink to={item.to} end={item.end} className={navClass}>
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
          {accountArea}
        </div>
      </header>
      <main id="main" tabIndex={-1} className="mx-auto w-full max-w-6xl flex-1 px-4 py-6 focus:outline-none">
        <Suspense fallback={<Spinner label="Loading the page" />}>
          <Outlet />
        </Suspense>
      </main>
      <footer className="border-t border-border bg-surface-muted" data-print-hide>
        <div className="mx-auto max-w-6xl px-4 py-4 text-base text-muted">
          Hearthloop gives estimates. Local gas, building and waste rules and licensed practitioners decide.
        </div>
      </footer>
      {children}
      <ScrollRestoration />
    </div>
  );
}

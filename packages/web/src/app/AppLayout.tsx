import {
  Alignment,
  AnchorButton,
  Button,
  Navbar,
  NavbarDivider,
  NavbarGroup,
  NavbarHeading,
  Spinner,
  Tag,
} from '@blueprintjs/core';
import { NavLink, Outlet, ScrollRestoration, useLocation } from 'react-router-dom';
import { CairnMark } from '../components/CairnMark';
import { useAbout } from '../features/landing/api/about';
import { roleLabels } from '../lib/roles';
import { useMe } from '../lib/session';
import { NavMenu } from './NavMenu';
import { alsoActive, navigationLayout } from './navigation';
import { useTheme } from './theme';
import './AppLayout.css';

export function AppLayout() {
  const me = useMe();
  const about = useAbout();
  const { theme, toggle } = useTheme();
  const entries = navigationLayout(me.data);
  const { pathname } = useLocation();

  return (
    <div className="cairn-shell">
      <a className="cairn-skip-link" href="#main">
        Skip to content
      </a>
      <header>
        <Navbar className="cairn-navbar">
          <NavbarGroup align={Alignment.START}>
            <NavLink to="/" className="cairn-brand" aria-label="Cairn home">
              <CairnMark size={28} />
              <NavbarHeading className="cairn-brand-name">Cairn</NavbarHeading>
            </NavLink>
            {about.data?.regionName ? (
              <span className="cairn-region">{about.data.regionName}</span>
            ) : null}
            {entries.length > 0 ? <NavbarDivider /> : null}
            <nav aria-label="Main" className="cairn-nav">
              {entries.map((entry) =>
                entry.kind === 'group' ? (
                  <NavMenu key={entry.label} label={entry.label} items={entry.items} />
                ) : (
                  <NavLink
                    key={entry.item.to}
                    to={entry.item.to}
                    end={entry.item.to === '/'}
                    className={({ isActive }) =>
                      `cairn-nav-link${isActive || alsoActive(entry.item, pathname) ? ' active' : ''}`
                    }
                  >
                    {entry.item.label}
                  </NavLink>
                ),
              )}
            </nav>
          </NavbarGroup>
          <NavbarGroup align={Alignment.END}>
            <Button
              variant="minimal"
              icon={theme === 'dark' ? 'flash' : 'moon'}
              aria-label={theme === 'dark' ? 'Use the light theme' : 'Use the dark theme'}
              title={theme === 'dark' ? 'Light theme' : 'Dark theme'}
              onClick={toggle}
            />
            <NavbarDivider />
            {me.isPending ? (
              <Spinner size={16} aria-label="Checking sign-in" />
            ) : me.data ? (
              <>
                <NavLink to="/profile" className="cairn-user" title="Your profile and mail">
                  {me.data.displayName} <Tag minimal>{roleLabels[me.data.role]}</Tag>
                </NavLink>
                <AnchorButton variant="minimal" icon="log-out" href="/sign-out">
                  Sign out
                </AnchorButton>
              </>
            ) : pathname.startsWith('/sign-in') ? null : (
              // Not on the sign-in page itself, which is all about signing in.
              <AnchorButton intent="primary" icon="log-in" href="/sign-in">
                Sign in
              </AnchorButton>
            )}
          </NavbarGroup>
        </Navbar>
      </header>
      <main id="main" className="cairn-main" tabIndex={-1}>
        <Outlet />
      </main>
      {/* The clinical caution is shown once, on the screens where it matters (ClinicalCaution). */}
      <footer className="cairn-footer">
        <p className="cairn-footer-meta">
          Cairn {about.data?.version ? `v${about.data.version}` : ''} ·{' '}
          <a href="/api/docs">API documentation</a>
        </p>
      </footer>
      <ScrollRestoration />
    </div>
  );
}

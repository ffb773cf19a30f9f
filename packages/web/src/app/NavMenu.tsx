import { Icon } from '@blueprintjs/core';
import { useEffect, useId, useRef, useState } from 'react';
import { Link, useLocation } from 'react-router-dom';
import { isCurrent, type NavItem } from './navigation';

/**
 * A menu of the navigation bar that gathers several links (a disclosure: a button that shows and
 * hides a list of links). The button says whether the list is open; Tab moves through the links;
 * Escape closes it and returns to the button; it closes on leaving it and on following a link.
 * The button is marked as the current section when one of its links is.
 */
export function NavMenu({ label, items }: { label: string; items: NavItem[] }) {
  const [open, setOpen] = useState(false);
  const { pathname } = useLocation();
  const listId = useId();
  const root = useRef<HTMLDivElement>(null);
  const button = useRef<HTMLButtonElement>(null);
  const current = items.some((item) => isCurrent(item, pathname));

  // Following a link (or any navigation) closes the menu.
  useEffect(() => setOpen(false), [pathname]);
  useEffect(() => {
    if (!open) return;
    const away = (e: MouseEvent | FocusEvent) => {
      if (root.current && e.target instanceof Node && !root.current.contains(e.target))
        setOpen(false);
    };
    document.addEventListener('mousedown', away);
    document.addEventListener('focusin', away);
    return () => {
      document.removeEventListener('mousedown', away);
      document.removeEventListener('focusin', away);
    };
  }, [open]);

  return (
    <div
      ref={root}
      className="cairn-nav-menu"
      onKeyDown={(e) => {
        if (e.key === 'Escape' && open) {
          e.preventDefault();
          setOpen(false);
          button.current?.focus();
        }
      }}
    >
      <button
        ref={button}
        type="button"
        className={`cairn-nav-link cairn-nav-menu-button${current ? ' active' : ''}`}
        aria-expanded={open}
        aria-controls={listId}
        onClick={() => setOpen((o) => !o)}
      >
        {label}
        <Icon icon={open ? 'caret-up' : 'caret-down'} size={14} aria-hidden />
      </button>
      <ul id={listId} className="cairn-nav-menu-list" hidden={!open}>
        {items.map((item) => (
          <li key={item.to}>
            <Link
              to={item.to}
              className={`cairn-nav-menu-link${isCurrent(item, pathname) ? ' active' : ''}`}
              aria-current={isCurrent(item, pathname) ? 'page' : undefined}
              onClick={() => setOpen(false)}
            >
              <Icon icon={item.icon} size={14} aria-hidden />
              {item.label}
            </Link>
          </li>
        ))}
      </ul>
    </div>
  );
}

import { useEffect, useRef, useState } from 'react';
import { Outlet, useLocation } from 'react-router-dom';

const SETTLE_MS = 100;
const MAX_TRIES = 30;

/**
 * After moving to another page, put focus on its main heading and say its name, as a full page
 * load would: otherwise a screen-reader user hears nothing and keyboard focus stays on a link
 * that may no longer exist. The first load is left alone (the browser already announces it).
 */
function RouteAnnouncer() {
  const { pathname } = useLocation();
  const [message, setMessage] = useState('');
  const firstLoad = useRef(true);

  useEffect(() => {
    if (firstLoad.current) {
      firstLoad.current = false;
      return;
    }
    let tries = 0;
    let timer: number;
    // Pages load their data after they mount, so wait (briefly) for the heading to appear.
    const settle = () => {
      const heading = document.querySelector<HTMLElement>('main h1') ?? document.querySelector<HTMLElement>('h1');
      if (!heading && ++tries < MAX_TRIES) {
        timer = window.setTimeout(settle, SETTLE_MS);
        return;
      }
      const target = heading ?? document.getElementById('main');
      if (target && !target.hasAttribute('tabindex')) target.setAttribute('tabindex', '-1');
      // A form field the person already moved into keeps its focus.
      const active = document.activeElement;
      if (!active || active === document.body || !active.isConnected || active.closest('header, nav')) target?.focus({ preventScroll: true });
      setMessage(heading?.textContent?.trim() || document.title);
    };
    timer = window.setTimeout(settle, 0);
    return () => window.clearTimeout(timer);
  }, [pathname]);

  return (
    <div data-testid="route-announcer" role="status" aria-live="polite" aria-atomic="true" className="sr-only">
      {message}
    </div>
  );
}

/** Every page sits inside this: the page itself, and the voice that names it after a move. */
export function RootLayout() {
  return (
    <>
      <Outlet />
      <RouteAnnouncer />
    </>
  );
}

import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './app/app';
import { pagesWithoutSession } from './app/pages';
import { prefetchSession } from './features/auth/api/session';
import { queryClient } from './lib/query-client';
import { applyTheme, storedTheme } from './lib/theme';
import './styles.css';

// Before the first paint, so a dark-theme visitor never sees a light flash.
applyTheme(storedTheme());

// Every page but the public status board and the host's recovery page asks who is signed in: start now.
if (!pagesWithoutSession.includes(window.location.pathname)) prefetchSession(queryClient);

const root = document.getElementById('root');
if (!root) throw new Error('index.html must contain <div id="root">');
createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);

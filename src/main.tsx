import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './app/app';
import { applyTheme, storedTheme } from './lib/theme';
import './styles.css';

// Before the first paint, so a dark-theme visitor never sees a light flash.
applyTheme(storedTheme());

const root = document.getElementById('root');
if (!root) throw new Error('index.html must contain <div id="root">');
createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);

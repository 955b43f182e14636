import { useCallback, useEffect, useId, useRef, useState } from 'react';
import { useLocation } from 'react-router-dom';

/**
 * A button that shows and hides a panel right after it (a menu, a drop-down): Escape or a click
 * outside closes it and puts focus back on the button, and moving to another page closes it.
 */
export function useDisclosure<B extends HTMLElement = HTMLButtonElement, P extends HTMLElement = HTMLElement>() {
  const [open, setOpen] = useState(false);
  const buttonRef = useRef<B>(null);
  const panelRef = useRef<P>(null);
  const panelId = useId();
  const location = useLocation();

  // Moving to another page closes it: adjusted while rendering, not in an effect, so no extra render shows it open.
  const [pathname, setPathname] = useState(location.pathname);
  if (pathname !== location.pathname) {
    setPathname(location.pathname);
    setOpen(false);
  }

  const close = useCallback((returnFocus: boolean) => {
    setOpen(false);
    if (returnFocus) buttonRef.current?.focus();
  }, []);

  useEffect(() => {
    if (!open) return;
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') {
        event.preventDefault();
        close(true);
      }
    };
    const onPointer = (event: PointerEvent) => {
      const target = event.target as Node;
      if (buttonRef.current?.contains(target) || panelRef.current?.contains(target)) return;
      close(false);
    };
    // Focus leaving both the button and the panel (Tab past the last item) closes it too.
    const onFocus = (event: FocusEvent) => {
      const target = event.target as Node;
      if (buttonRef.current?.contains(target) || panelRef.current?.contains(target)) return;
      setOpen(false);
    };
    document.addEventListener('keydown', onKey);
    document.addEventListener('pointerdown', onPointer);
    document.addEventListener('focusin', onFocus);
    return () => {
      document.removeEventListener('keydown', onKey);
      document.removeEventListener('pointerdown', onPointer);
      document.removeEventListener('focusin', onFocus);
    };
  }, [open, close]);

  return {
    open,
    toggle: () => setOpen((current) => !current),
    close,
    buttonProps: { ref: buttonRef, 'aria-expanded': open, 'aria-controls': panelId },
    panelProps: { ref: panelRef, id: panelId },
  };
}

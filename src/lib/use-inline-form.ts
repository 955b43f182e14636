import { useEffect, useRef, useState } from 'react';

/**
 * A form that opens in place of the button that asked for it ("Add node", "Edit site"): opening puts
 * focus on its first field, and closing (saved or cancelled) puts it back on that button, so a keyboard
 * or screen-reader user is never dropped at the top of the page.
 */
export function useInlineForm() {
  const [open, setOpen] = useState(false);
  const triggerRef = useRef<HTMLButtonElement>(null);
  const regionRef = useRef<HTMLDivElement>(null);
  const wasOpen = useRef(false);

  useEffect(() => {
    const opening = open;
    const closing = !open && wasOpen.current;
    wasOpen.current = open;
    if (closing) (triggerRef.current ?? document.getElementById('main'))?.focus();
    const region = regionRef.current;
    if (!opening || !region) return;
    const firstField = () => region.querySelector<HTMLElement>('input:not([type=hidden]), select, textarea');
    const field = firstField();
    if (field) return field.focus();
    // A form whose code loads on first use (React.lazy) has no field yet: focus its first one when it appears.
    const observer = new MutationObserver(() => {
      const appeared = firstField();
      if (!appeared) return;
      observer.disconnect();
      appeared.focus();
    });
    observer.observe(region, { childList: true, subtree: true });
    return () => observer.disconnect();
  }, [open]);

  // Spread on the elements (`{...form.triggerProps}`), as useDisclosure's props are: the refs are only read in the effect above.
  return { open, show: () => setOpen(true), hide: () => setOpen(false), triggerProps: { ref: triggerRef }, regionProps: { ref: regionRef } };
}

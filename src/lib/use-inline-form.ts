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
    if (open) regionRef.current?.querySelector<HTMLElement>('input:not([type=hidden]), select, textarea')?.focus();
    else if (wasOpen.current) (triggerRef.current ?? document.getElementById('main'))?.focus();
    wasOpen.current = open;
  }, [open]);

  // Spread on the elements (`{...form.triggerProps}`), as useDisclosure's props are: the refs are only read in the effect above.
  return { open, show: () => setOpen(true), hide: () => setOpen(false), triggerProps: { ref: triggerRef }, regionProps: { ref: regionRef } };
}

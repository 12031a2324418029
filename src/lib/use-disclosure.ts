import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';
import { useLocation } from 'react-router-dom';

/**
 * A header disclosure (a button that opens a small panel): closes on a page change and on a click or focus
 * outside its box; Escape closes it and puts focus back on the button. `onKey` handles Escape and returns
 * true when it did, so a caller can add its own keys after it.
 */
export function useDisclosure() {
  const [open, setOpen] = useState(false);
  const box = useRef<HTMLDivElement>(null);
  const button = useRef<HTMLButtonElement>(null);
  const panelId = useId();
  const location = useLocation();

  useEffect(() => setOpen(false), [location.pathname]);
  useEffect(() => {
    if (!open) return;
    const away = (e: Event) => {
      if (box.current && !box.current.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener('pointerdown', away);
    document.addEventListener('focusin', away);
    return () => {
      document.removeEventListener('pointerdown', away);
      document.removeEventListener('focusin', away);
    };
  }, [open]);

  const onKey = (e: KeyboardEvent): boolean => {
    if (e.key !== 'Escape' || !open) return false;
    e.preventDefault();
    e.stopPropagation();
    setOpen(false);
    button.current?.focus();
    return true;
  };

  return { open, setOpen, box, button, panelId, location, onKey };
}

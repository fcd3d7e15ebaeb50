import { useEffect, useRef } from 'react';

/**
 * Sends a search box's text once typing pauses for `ms` (while `pending`), unless a link is followed first.
 * A person who types and then taps a result has gone on: the router may keep the screen mounted while the
 * next one loads, and a late send would rewrite the address and bring them back to the list.
 */
export function useSendWhenTypingPauses(text: string, pending: boolean, send: (text: string) => void, ms: number) {
  const latest = useRef(send);
  latest.current = send;
  useEffect(() => {
    if (!pending) return;
    const t = setTimeout(() => latest.current(text), ms);
    const goneOn = (e: MouseEvent) => {
      if (e.target instanceof Element && e.target.closest('a[href]')) clearTimeout(t);
    };
    // Capture, so it runs before the router handles the click; Enter on a focused link is a click too.
    document.addEventListener('click', goneOn, true);
    return () => {
      clearTimeout(t);
      document.removeEventListener('click', goneOn, true);
    };
  }, [text, pending, ms]);
}

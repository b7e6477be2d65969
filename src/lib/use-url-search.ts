import { useEffect, useRef, useState } from 'react';
import { useLocation, useNavigation } from 'react-router-dom';

/**
 * The text of a list's search box, which reaches the URL (and so the server) after a short pause.
 * - The URL changing from outside (Back, a link) shows its search, unless it is what was typed.
 * - A pause that ends while another page is on its way (a row opened before the pause ended) does
 *   nothing: a late search would navigate back to the list and cancel the page the user chose.
 *   The list's own reloads do not count as leaving.
 */
export function useUrlSearch(q: string | undefined, apply: (q: string | undefined) => void, delayMs = 350): [string, (text: string) => void] {
  const [text, setText] = useState(q ?? '');
  const location = useLocation();
  const navigation = useNavigation();
  const leaving = useRef(false);
  leaving.current = navigation.location !== undefined && navigation.location.pathname !== location.pathname;
  const applyRef = useRef(apply);
  applyRef.current = apply;

  useEffect(() => {
    setText((current) => (current.trim() === (q ?? '') ? current : (q ?? '')));
  }, [q]);
  useEffect(() => {
    const next = text.trim();
    if (next === (q ?? '')) return;
    const timer = window.setTimeout(() => {
      if (!leaving.current) applyRef.current(next || undefined);
    }, delayMs);
    return () => window.clearTimeout(timer);
  }, [text]);
  return [text, setText];
}

import { useEffect, useRef, useState } from 'react';

/** How long a search waits for a pause in typing before it asks the server. */
export const SEARCH_PAUSE_MS = 250;

/**
 * A search box's text as typed and the query it asks for (trimmed), once the person pauses
 * typing; `onQuery` runs with each new query (a list goes back to its first page).
 */
export function useSearchText(onQuery: () => void) {
  const [text, setText] = useState('');
  const [q, setQ] = useState('');
  const latest = useRef(onQuery);
  latest.current = onQuery;
  useEffect(() => {
    const timer = setTimeout(() => {
      setQ(text.trim());
      latest.current();
    }, SEARCH_PAUSE_MS);
    return () => clearTimeout(timer);
  }, [text]);
  return { text, setText, q };
}

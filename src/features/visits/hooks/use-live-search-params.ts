import { useEffect, useState } from 'react';
import { useSearchParams } from 'react-router-dom';

/**
 * The page address's query as state that changes at once. A router navigation finishes a moment
 * later (it runs in a transition), and a controlled check box or select bound straight to the
 * address would flick back in between; this copy follows every change immediately, writes it to
 * the address (replacing the history entry), and takes up the address again on back/forward.
 */
export function useLiveSearchParams(): [URLSearchParams, (next: URLSearchParams) => void] {
  const [urlParams, setUrlParams] = useSearchParams();
  const urlKey = urlParams.toString();
  const [params, setParams] = useState(() => new URLSearchParams(urlKey));
  useEffect(() => setParams(new URLSearchParams(urlKey)), [urlKey]);
  const update = (next: URLSearchParams) => {
    setParams(next);
    setUrlParams(next, { replace: true });
  };
  return [params, update];
}

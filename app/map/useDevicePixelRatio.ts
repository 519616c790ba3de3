import { useSyncExternalStore } from 'react';

function currentRatio(): number {
  return window.devicePixelRatio || 1;
}

/**
 * Follows window.devicePixelRatio (page zoom, moving to another screen). A resolution media
 * query fires once when the ratio leaves its value, so it is renewed after each change.
 */
function subscribe(onChange: () => void): () => void {
  let query: MediaQueryList | null = null;
  const handle = (): void => {
    listen();
    onChange();
  };
  const listen = (): void => {
    query?.removeEventListener('change', handle);
    query = window.matchMedia(`(resolution: ${currentRatio()}dppx)`);
    query.addEventListener('change', handle);
  };
  listen();
  return () => query?.removeEventListener('change', handle);
}

/** Device pixels per CSS pixel, updated when it changes. */
export function useDevicePixelRatio(): number {
  return useSyncExternalStore(subscribe, currentRatio, () => 1);
}

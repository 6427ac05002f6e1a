/**
 * A thin bar at the top of the page for anything that takes over a second: page loads,
 * fetches and saves. Short operations never flash it.
 */
import { useIsFetching, useIsMutating } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useNavigation } from 'react-router-dom';

const DELAY_MS = 1000;

/** Shows itself when something has been in progress for over a second. */
export function ProgressBar() {
  const navigation = useNavigation();
  const fetching = useIsFetching();
  const mutating = useIsMutating();
  const busy = navigation.state !== 'idle' || fetching > 0 || mutating > 0;
  const [shown, setShown] = useState(false);
  useEffect(() => {
    if (!busy) {
      setShown(false);
      return;
    }
    const timer = setTimeout(() => setShown(true), DELAY_MS);
    return () => clearTimeout(timer);
  }, [busy]);
  if (!shown) return null;
  return (
    <div role="progressbar" aria-label="Working" className="fixed inset-x-0 top-0 z-50 h-1 overflow-hidden bg-accent-soft">
      <div className="h-full w-1/3 animate-[rolloff-progress_1.2s_ease-in-out_infinite] bg-accent" />
    </div>
  );
}

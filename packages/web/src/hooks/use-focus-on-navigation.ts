import { useEffect, useRef } from 'react';
import { useLocation } from 'react-router-dom';

/** How long to wait for a lazily loaded page to show its heading. */
const WAIT_FRAMES = 180;

/**
 * After a move to another page (not the first load), focus goes to the new page's heading, so
 * a screen reader announces it and Tab continues from there rather than from the old page's
 * link.
 */
export function useFocusOnNavigation(): void {
  const { pathname } = useLocation();
  const firstPage = useRef(true);
  useEffect(() => {
    if (firstPage.current) {
      firstPage.current = false;
      return;
    }
    let frame = 0;
    let frames = 0;
    const focusHeading = () => {
      const heading = document.querySelector<HTMLElement>('main h1');
      if (heading) {
        if (!heading.hasAttribute('tabindex')) heading.setAttribute('tabindex', '-1');
        heading.focus();
      } else if (frames++ < WAIT_FRAMES) {
        frame = requestAnimationFrame(focusHeading);
      }
    };
    focusHeading();
    return () => cancelAnimationFrame(frame);
  }, [pathname]);
}

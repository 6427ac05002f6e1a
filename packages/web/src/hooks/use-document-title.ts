import { useEffect } from 'react';

/** Names the page in the browser's tab and history: "Anti-alias filter · Rolloff". */
export function useDocumentTitle(...parts: (string | null | undefined | false)[]): void {
  const title = [...parts.filter((part): part is string => Boolean(part)), 'Rolloff'].join(' · ');
  useEffect(() => {
    document.title = title;
  }, [title]);
}

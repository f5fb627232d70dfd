import { useEffect } from 'react';

/** Sets the tab title to "<title> · Planewright". */
export function useDocumentTitle(title: string): void {
  useEffect(() => {
    document.title = title ? `${title} · Planewright` : 'Planewright';
  }, [title]);
}

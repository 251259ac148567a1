/**
 * Files dropped anywhere on the page: the browser's default (opening the file in place of the page, which
 * would lose the review) is prevented, and the files are opened as the start screen would (a decisions file
 * alone is imported into the current review).
 */
import { useEffect } from 'react';
import { filesFromDataTransfer } from '../start/collect-dropped.ts';
import { openFiles } from '../start/open-files.ts';

export function usePageDrop(): void {
  useEffect(() => {
    const onDragOver = (e: DragEvent) => {
      if (e.dataTransfer?.types.includes('Files')) e.preventDefault();
    };
    const onDrop = (e: DragEvent) => {
      if (e.defaultPrevented || !e.dataTransfer) return;
      e.preventDefault();
      void filesFromDataTransfer(e.dataTransfer).then((files) => openFiles(files));
    };
    window.addEventListener('dragover', onDragOver);
    window.addEventListener('drop', onDrop);
    return () => {
      window.removeEventListener('dragover', onDragOver);
      window.removeEventListener('drop', onDrop);
    };
  }, []);
}

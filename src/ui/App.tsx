/**
 * The workbench shell: top bar (title, research-use caution, privacy note, aim, screens, undo/redo,
 * export, help), then the current screen. Keyboard shortcuts are installed here once (see layout/review-keys.ts).
 */
import { useEffect, useState } from 'react';
import { useWorkbench, workbenchStore } from '../state/index.ts';
import { FocusView } from './focus/FocusView.tsx';
import { PreviewView } from './preview/PreviewView.tsx';
import { StartScreen } from './start/StartScreen.tsx';
import { Board } from './board/Board.tsx';
import { TopBar } from './layout/TopBar.tsx';
import { ProgressOverlay } from './layout/ProgressOverlay.tsx';
import { NoticeBar } from './layout/NoticeBar.tsx';
import { ResumeBanner } from './layout/ResumeBanner.tsx';
import { SaveStatus } from './layout/SaveStatus.tsx';
import { ConfirmDialog } from './layout/ConfirmDialog.tsx';
import { ExportPanel } from './layout/ExportPanel.tsx';
import { HelpPanel } from './help/HelpPanel.tsx';
import { ThresholdsPanelHost } from './thresholds/ThresholdsPanel.tsx';
import { useReviewKeys } from './layout/useReviewKeys.ts';
import { useAutosave } from './layout/useAutosave.ts';
import { usePageDrop } from './layout/usePageDrop.ts';
import { shouldOpenDemo } from './start/demo-url.ts';
import { StudyView } from './study/StudyView.tsx';
import { BackToStudy } from './study/StudyStart.tsx';
import { useStudy } from '../state/study-hooks.ts';

export function App() {
  const screen = useWorkbench((s) => s.screen);
  const inStudyParticipant = useStudy((s) => s.name !== null && s.current !== null);
  const [helpOpen, setHelpOpen] = useState(false);
  const [exportOpen, setExportOpen] = useState(false);
  useAutosave();
  usePageDrop();
  useReviewKeys({ toggleHelp: () => setHelpOpen((o) => !o), toggleExport: () => setExportOpen((o) => !o), helpOpen, exportOpen, closePanels: () => { setHelpOpen(false); setExportOpen(false); } });

  useEffect(() => {
    if (shouldOpenDemo(window.location.search, import.meta.env.DEV) && workbenchStore.getState().recording === null) {
      void workbenchStore.getState().loadDemo();
    }
  }, []);

  return (
    <div className="shell" data-screen={screen}>
      <TopBar onHelp={() => setHelpOpen((o) => !o)} onExport={() => setExportOpen((o) => !o)} exportOpen={exportOpen} helpOpen={helpOpen} />
      <NoticeBar />
      <SaveStatus />
      <ResumeBanner />
      <ConfirmDialog />
      <ProgressOverlay />
      {exportOpen && <ExportPanel onClose={() => setExportOpen(false)} />}
      {helpOpen && <HelpPanel onClose={() => setHelpOpen(false)} />}
      <ThresholdsPanelHost />
      {inStudyParticipant && screen !== 'study' && <BackToStudy />}
      <main className="review-area" aria-label="Review area">
        {screen === 'study' && <StudyView />}
        {screen === 'start' && <StartScreen />}
        {screen === 'board' && <Board />}
        {screen === 'focus' && <FocusView />}
        {screen === 'preview' && <PreviewView />}
      </main>
      <footer className="shell-footer">
        Research tool — not for clinical diagnosis. Dipole locations are approximate model estimates. Recordings are read in this
        browser and never leave this machine.
      </footer>
    </div>
  );
}

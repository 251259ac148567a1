/** The start screen's study entry: open a BIDS dataset folder, or the simulated four-participant demo study. */
import { studyStore, useStudy } from '../../state/study-hooks.ts';

export function StudyStart() {
  const message = useStudy((s) => (s.name === null ? s.message : null));
  return (
    <section className="drop-zone study-entry" aria-label="Open a study">
      <h2>Open a study</h2>
      <p>A BIDS dataset folder: every recording of every participant, reviewed one after another with the same criteria.</p>
      <div className="study-start">
        <label className="file-pick">
          Dataset folder:{' '}
          <input
            type="file"
            multiple
            ref={(el) => el?.setAttribute('webkitdirectory', '')}
            onChange={(e) => void studyStore.getState().openFolder([...(e.currentTarget.files ?? [])])}
            data-testid="study-folder"
          />
        </label>
        <button type="button" onClick={() => void studyStore.getState().openDemoStudy()} data-testid="open-demo-study">
          Open the demo study (4 simulated participants)
        </button>
      </div>
      {message && (
        <p className="study-message" role="status" data-testid="study-message">
          {message}
        </p>
      )}
    </section>
  );
}

/** Shown above a participant opened from a study: back to the study overview (the review is kept). */
export function BackToStudy() {
  return (
    <p className="back-to-study">
      <button type="button" onClick={() => studyStore.getState().backToStudy()} data-testid="back-to-study">
        ← Back to the study
      </button>
    </p>
  );
}

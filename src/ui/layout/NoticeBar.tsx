/** One message for the user (plain text, never HTML), dismissable. */
import { useWorkbench } from '../../state/index.ts';

export function NoticeBar() {
  const notice = useWorkbench((s) => s.notice);
  const setNotice = useWorkbench((s) => s.setNotice);
  if (!notice) return null;
  return (
    <div className={`notice notice-${notice.kind}`} role={notice.kind === 'error' ? 'alert' : 'status'} data-testid="notice">
      <span>{notice.kind === 'error' ? '⚠ ' : 'ℹ '}{notice.text}</span>
      <button type="button" onClick={() => setNotice(null)} aria-label="Dismiss message">Dismiss</button>
    </div>
  );
}

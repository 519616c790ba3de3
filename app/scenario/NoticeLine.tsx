import { useFourfold } from '../store/index';
import './scenarioBar.css';

/** The current notice about the setup, a file or the link, with a button to dismiss it. */
export function NoticeLine() {
  const notice = useFourfold((s) => s.view.notice);
  const setNotice = useFourfold((s) => s.setNotice);
  if (notice === null) return null;
  return (
    <div
      className={`notice-line notice-${notice.kind}`}
      role={notice.kind === 'error' ? 'alert' : 'status'}
      data-testid="notice"
      data-kind={notice.kind}
      data-fit-ignore
    >
      <span className="notice-text">{notice.text}</span>
      <button
        type="button"
        className="notice-dismiss"
        aria-label="Dismiss notice"
        title="Dismiss"
        data-testid="notice-dismiss"
        onClick={() => setNotice(null)}
      >
        <svg viewBox="0 0 12 12" width="12" height="12" aria-hidden="true">
          <path d="M2 2 10 10 M10 2 2 10" stroke="currentColor" strokeWidth="1.6" />
        </svg>
      </button>
    </div>
  );
}

/** Short notices in a live region: errors are announced at once (role=alert), the rest politely. */
import type { NoticeTone } from './frameContext';

export interface Notice {
  readonly id: number;
  readonly message: string;
  readonly tone: NoticeTone;
}

export function Notices({ notices, onDismiss }: { notices: readonly Notice[]; onDismiss(id: number): void }) {
  return (
    <div className="wb-notices" aria-label="Notices" role="region">
      <div role="status" aria-live="polite">
        {notices.filter((n) => n.tone !== 'error').map((n) => (
          <NoticeItem key={n.id} notice={n} onDismiss={onDismiss} />
        ))}
      </div>
      <div role="alert">
        {notices.filter((n) => n.tone === 'error').map((n) => (
          <NoticeItem key={n.id} notice={n} onDismiss={onDismiss} />
        ))}
      </div>
    </div>
  );
}

function NoticeItem({ notice, onDismiss }: { notice: Notice; onDismiss(id: number): void }) {
  return (
    <div className={`wb-notice wb-notice-${notice.tone}`}>
      <span>{notice.message}</span>
      <button type="button" className="wb-notice-close" aria-label="Dismiss notice" onClick={() => onDismiss(notice.id)}>×</button>
    </div>
  );
}

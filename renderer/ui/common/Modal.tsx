/**
 * A modal dialog on the native <dialog> element: the browser traps focus, Escape closes it
 * (reported through `onCancel`), and screen readers announce it by its title.
 */
import { useEffect, useId, useRef, type ReactNode } from 'react';
import './common.css';

export function Modal({ title, onCancel, children, describedBy }: {
  title: string;
  onCancel(): void;
  children: ReactNode;
  describedBy?: string;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const dialog = ref.current;
    if (dialog !== null && !dialog.open) dialog.showModal();
    return () => dialog?.close();
  }, []);
  return (
    <dialog
      ref={ref}
      className="wb-modal"
      aria-labelledby={titleId}
      aria-describedby={describedBy}
      onCancel={(e) => {
        e.preventDefault();
        onCancel();
      }}
    >
      <h2 id={titleId} className="wb-modal-title">{title}</h2>
      {children}
    </dialog>
  );
}

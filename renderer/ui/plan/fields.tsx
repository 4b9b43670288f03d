/**
 * Small labelled controls the Plan panels share: a text field that commits on Enter/blur, a
 * labelled select and a labelled checkbox. Labels may be visually hidden in tables (the column
 * header shows them) but are always there for assistive technology.
 */
import { useEffect, useId, useState, type ReactNode } from 'react';

export function TextCommitField({ label, value, onCommit, hideLabel, required = true, className }: {
  label: string;
  value: string;
  onCommit(value: string): void;
  hideLabel?: boolean;
  /** Refuse an empty value (the field says why). */
  required?: boolean;
  className?: string;
}) {
  const id = useId();
  const [text, setText] = useState(value);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    setText(value);
    setError(null);
  }, [value]);
  const commit = () => {
    if (required && text.trim() === '') {
      setError('Enter a name.');
      return;
    }
    setError(null);
    if (text !== value) onCommit(text);
  };
  return (
    <span className={`wb-text-field ${className ?? ''}`}>
      <label htmlFor={id} className={hideLabel === true ? 'wb-visually-hidden' : undefined}>{label}</label>
      <input
        id={id}
        type="text"
        value={text}
        aria-invalid={error !== null}
        aria-describedby={error !== null ? `${id}-error` : undefined}
        onChange={(e) => setText(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === 'Enter') commit();
          if (e.key === 'Escape') {
            setText(value);
            setError(null);
          }
        }}
      />
      {error !== null && <span id={`${id}-error`} className="wb-field-error" role="alert">{error}</span>}
    </span>
  );
}

export function SelectField<T extends string>({ label, value, options, onChange, hideLabel, className }: {
  label: string;
  value: T;
  options: readonly { value: T; label: string }[];
  onChange(value: T): void;
  hideLabel?: boolean;
  className?: string;
}) {
  const id = useId();
  return (
    <span className={`wb-select-field ${className ?? ''}`}>
      <label htmlFor={id} className={hideLabel === true ? 'wb-visually-hidden' : undefined}>{label}</label>
      <select id={id} value={value} onChange={(e) => onChange(e.target.value as T)}>
        {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
      </select>
    </span>
  );
}

export function CheckField({ label, checked, onChange, hideLabel }: { label: string; checked: boolean; onChange(checked: boolean): void; hideLabel?: boolean }) {
  const id = useId();
  return (
    <span className="wb-check-field">
      <input id={id} type="checkbox" checked={checked} onChange={(e) => onChange(e.target.checked)} />
      <label htmlFor={id} className={hideLabel === true ? 'wb-visually-hidden' : undefined}>{label}</label>
    </span>
  );
}

export function Panel({ id, title, children, description }: { id: string; title: string; description?: ReactNode; children: ReactNode }) {
  return (
    <section className="wb-plan-panel" aria-labelledby={`${id}-title`}>
      <h2 id={`${id}-title`}>{title}</h2>
      {description !== undefined && <p className="wb-plan-description">{description}</p>}
      {children}
    </section>
  );
}

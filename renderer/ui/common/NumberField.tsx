/**
 * A number input that commits on Enter or blur and refuses what is not a number in range,
 * saying why next to the field (never silently clamping, never turning a blank into 0).
 */
import { useEffect, useId, useState } from 'react';
import './common.css';

export interface NumberFieldProps {
  label: string;
  value: number | null;
  onCommit(value: number | null): void;
  min?: number;
  max?: number;
  /** Blank is allowed and commits null. */
  allowBlank?: boolean;
  /** Hide the label visually (it stays for screen readers). */
  hideLabel?: boolean;
  className?: string;
  /** Granularity hint, exposed to assistive tech and tests as data-step; parsing accepts any decimal. */
  step?: number | 'any';
}

/** The number typed, or an error sentence. Accepts a decimal comma ("7,5"), as instructors type it. */
export function parseNumberField(text: string, opts: { min?: number; max?: number; allowBlank?: boolean }): { ok: true; value: number | null } | { ok: false; message: string } {
  const t = text.trim();
  if (t === '') return opts.allowBlank === true ? { ok: true, value: null } : { ok: false, message: 'Enter a number.' };
  const normalised = /^[-+]?\d+,\d+$/.test(t) ? t.replace(',', '.') : t;
  const n = Number(normalised);
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(normalised) || !Number.isFinite(n)) return { ok: false, message: `"${t}" is not a number.` };
  if (opts.min !== undefined && n < opts.min) return { ok: false, message: `Enter ${opts.min} or more.` };
  if (opts.max !== undefined && n > opts.max) return { ok: false, message: `Enter ${opts.max} or less.` };
  return { ok: true, value: n };
}

export function NumberField({ label, value, onCommit, min, max, allowBlank, hideLabel, className, step = 'any' }: NumberFieldProps) {
  const id = useId();
  const [text, setText] = useState(value === null ? '' : String(value));
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    setText(value === null ? '' : String(value));
    setError(null);
  }, [value]);

  const commit = () => {
    const parsed = parseNumberField(text, { min, max, allowBlank });
    if (!parsed.ok) {
      setError(parsed.message);
      return;
    }
    setError(null);
    if (parsed.value !== value) onCommit(parsed.value);
  };

  return (
    <span className={`wb-number-field ${className ?? ''}`}>
      <label htmlFor={id} className={hideLabel === true ? 'wb-visually-hidden' : undefined}>{label}</label>
      <input
        id={id}
        type="text"
        inputMode="decimal"
        data-step={step}
        value={text}
        aria-invalid={error !== null}
        aria-describedby={error !== null ? `${id}-error` : undefined}
        onChange={(e) => setText(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === 'Enter') commit();
          if (e.key === 'Escape') {
            setText(value === null ? '' : String(value));
            setError(null);
          }
        }}
      />
      {error !== null && <span id={`${id}-error`} className="wb-field-error" role="alert">{error}</span>}
    </span>
  );
}

/** The app's button: a real <button>, type="button" unless told otherwise, in one of three weights. */
import type { ButtonHTMLAttributes } from 'react';
import './common.css';

export function Button({ tone = 'plain', className, type = 'button', ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: 'plain' | 'primary' | 'quiet' | 'danger' }) {
  return <button type={type} className={`wb-button wb-button-${tone} ${className ?? ''}`} {...rest} />;
}

// @vitest-environment jsdom
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { FindCopiesInput } from '@shared/api/find-copies';
import { FindCopiesForm } from '@/features/find-copies/components/find-copies-form';

afterEach(cleanup);

function renderForm() {
  const onSubmit = vi.fn<(input: FindCopiesInput) => void>();
  render(<FindCopiesForm onSubmit={onSubmit} />);
  return onSubmit;
}

const code = () => screen.getByLabelText('Code');
const threshold = () => screen.getByLabelText('Threshold');
const submit = () => fireEvent.click(screen.getByRole('button', { name: 'Find copies' }));

describe('FindCopiesForm', () => {
  it('refuses an empty snippet with the shared schema message and sends nothing', () => {
    const onSubmit = renderForm();
    submit();
    expect(screen.getByText('Paste some code.')).toBeTruthy();
    expect(code().getAttribute('aria-invalid')).toBe('true');
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('refuses a threshold below the one the index is built for, or above 1', () => {
    const onSubmit = renderForm();
    fireEvent.change(code(), { target: { value: 'def f(x):\n    return x' } });
    fireEvent.change(threshold(), { target: { value: '0.3' } });
    submit();
    expect(screen.getByText('The threshold is at least 0.6.')).toBeTruthy();
    fireEvent.change(threshold(), { target: { value: '1.2' } });
    submit();
    expect(screen.getByText('The threshold is at most 1.')).toBeTruthy();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('sends the language, the code as pasted and the threshold as a number', () => {
    const onSubmit = renderForm();
    const text = 'def fare(km):\n    return km * 2\n';
    fireEvent.change(screen.getByLabelText('Language'), { target: { value: 'python' } });
    fireEvent.change(code(), { target: { value: text } });
    fireEvent.change(threshold(), { target: { value: '0.85' } });
    submit();
    expect(onSubmit).toHaveBeenCalledExactlyOnceWith({ language: 'python', text, threshold: 0.85 });
  });

  it('starts the threshold at the default, 0.7, and sends it when left as it is', () => {
    const onSubmit = renderForm();
    expect((threshold() as HTMLInputElement).value).toBe('0.7');
    fireEvent.change(code(), { target: { value: 'function f() { return 1; }' } });
    submit();
    expect(onSubmit).toHaveBeenCalledExactlyOnceWith({ language: 'javascript', text: 'function f() { return 1; }', threshold: 0.7 });
  });

  describe('edge cases', () => {
    it('leaves the threshold out when the field is emptied, so the server default applies', () => {
      const onSubmit = renderForm();
      fireEvent.change(code(), { target: { value: 'function f() { return 1; }' } });
      fireEvent.change(threshold(), { target: { value: '' } });
      submit();
      expect(onSubmit).toHaveBeenCalledExactlyOnceWith({ language: 'javascript', text: 'function f() { return 1; }' });
    });

    it('clears the message once the snippet is there, and shows server field errors it is given', () => {
      const onSubmit = vi.fn();
      const { rerender } = render(<FindCopiesForm onSubmit={onSubmit} />);
      submit();
      expect(screen.getByText('Paste some code.')).toBeTruthy();
      fireEvent.change(code(), { target: { value: 'x = 1' } });
      submit();
      expect(screen.queryByText('Paste some code.')).toBeNull();
      rerender(<FindCopiesForm onSubmit={onSubmit} serverErrors={{ language: 'The language is one of javascript, python.' }} />);
      expect(screen.getByText('The language is one of javascript, python.')).toBeTruthy();
    });
  });
});

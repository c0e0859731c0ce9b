// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { SignInForm } from '@/features/auth/components/sign-in-form';

afterEach(cleanup);

function renderForm() {
  const client = new QueryClient();
  return render(
    <QueryClientProvider client={client}>
      <SignInForm />
    </QueryClientProvider>,
  );
}

describe('SignInForm', () => {
  it('shows the shared schema messages next to the fields and sends nothing', () => {
    renderForm();
    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'not an address' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(screen.getByText('Enter a valid e-mail address.')).toBeTruthy();
    expect(screen.getByText('Enter your password.')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
  });

  describe('edge cases', () => {
    it('clears a field message once the value is valid', () => {
      renderForm();
      fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
      expect(screen.getByText('Enter your password.')).toBeTruthy();
      fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'something' } });
      fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
      expect(screen.queryByText('Enter your password.')).toBeNull();
    });
  });
});

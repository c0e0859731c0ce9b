// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { SignInForm } from '../../../../web/src/features/auth/components/sign-in-form';

// tests/run.ts builds the client before vitest, and vite's build sets NODE_ENV=production in
// that process, which vitest inherits: React would load its production build, which has no act().
vi.hoisted(() => {
  process.env.NODE_ENV = 'test';
});

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

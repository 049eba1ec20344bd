import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, render, screen } from '@testing-library/react';
import { SignInPanel } from './sign-in-panel.tsx';
import { signInFailureMessages } from './sign-in-messages.ts';

afterEach(cleanup);

describe('SignInPanel', () => {
  it('links to the server sign-in with the page to return to', () => {
    render(<SignInPanel errorCode={null} returnTo="/labs/x?y=1" signedOut={false} />);
    const link = screen.getByRole('link', { name: "Continue with your institution's account" });
    expect(link.getAttribute('href')).toBe('/auth/sign-in?returnTo=%2Flabs%2Fx%3Fy%3D1');
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it.each(Object.entries(signInFailureMessages))('shows the message for %s', (code, message) => {
    render(<SignInPanel errorCode={code} returnTo={null} signedOut={false} />);
    expect(screen.getByRole('alert').textContent).toBe(message);
  });

  it('shows a generic message for an unknown code rather than nothing', () => {
    render(<SignInPanel errorCode="something_new" returnTo={null} signedOut={false} />);
    expect(screen.getByRole('alert').textContent).toBe('Sign-in did not complete. Please start again.');
  });
});

import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const signOut = () => api<{ redirectTo: string }>('/logout', { method: 'POST', root: '/auth' });

/** Ends the session here, then lets the identity provider end its own. */
export const useSignOut = () =>
  useMutation({
    mutationFn: signOut,
    onSuccess: ({ redirectTo }) => window.location.assign(redirectTo),
  });

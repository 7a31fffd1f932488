import { QueryClientProvider } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { signInUrl } from '../lib/auth';
import { createQueryClient } from '../lib/query-client';

const goToSignIn = () => window.location.assign(signInUrl());

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(() => createQueryClient(goToSignIn));
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}

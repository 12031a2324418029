import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { SignUpAccepted, SignUpInput, UpdateProfileInput, User } from '@shared/schemas/user';
import { api, resetCsrf, type Envelope } from '@/lib/api-client';
import { forgetPrivateData } from '@/lib/offline/worker';
import { meQuery } from '@/lib/session';

/** Query-option factories for the session (keys general → specific). */
export const authQueries = {
  all: () => ['auth'] as const,
  /** Defined in the client library (display preferences read it too); the key is ['auth', 'me']. */
  me: () => meQuery(),
};

export function useCurrentUser() {
  return useQuery(authQueries.me());
}

/**
 * Forgets everything cached for the previous session: the query cache, and what the service worker stored
 * for offline reading from signed-in answers (so the next person on this device cannot read it).
 */
function useSessionChanged() {
  const qc = useQueryClient();
  return async (user: User | null) => {
    resetCsrf();
    qc.removeQueries({ predicate: (q) => q.queryKey[0] !== 'auth' });
    qc.setQueryData(authQueries.me().queryKey, user);
    await forgetPrivateData();
  };
}

export function useSignIn() {
  const changed = useSessionChanged();
  return useMutation({
    mutationFn: async (input: { email: string; password: string }) => (await api.post<Envelope<{ user: User }>>('/api/auth/sign-in', input)).data.user,
    onSuccess: (user) => changed(user),
  });
}

export function useSignOut() {
  const changed = useSessionChanged();
  return useMutation({
    mutationFn: () => api.post<void>('/api/auth/sign-out'),
    onSuccess: () => changed(null),
    // Without a connection the server cannot be told, but what this device stored for the member goes anyway.
    onError: () => forgetPrivateData(),
  });
}

export function useSignUp() {
  return useMutation({
    mutationFn: async (input: SignUpInput) => (await api.post<Envelope<SignUpAccepted>>('/api/auth/sign-up', input)).data,
  });
}

/** Confirms the address; the server signs the person in with it (a new session), so the page carries on signed in. */
export function useVerifyEmail() {
  const changed = useSessionChanged();
  return useMutation({
    mutationFn: async (token: string) => (await api.post<Envelope<{ user: User; signedIn: boolean }>>('/api/auth/verify', { token })).data,
    onSuccess: async (data) => {
      if (data.signedIn) await changed(data.user);
    },
  });
}

export function useResendVerification() {
  return useMutation({ mutationFn: (email: string) => api.post('/api/auth/resend-verification', { email }) });
}

export function useForgotPassword() {
  return useMutation({ mutationFn: (email: string) => api.post('/api/auth/forgot-password', { email }) });
}

export function useResetPassword() {
  return useMutation({ mutationFn: (input: { token: string; password: string }) => api.post('/api/auth/reset-password', input) });
}

export function useUpdateProfile() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (input: UpdateProfileInput) => (await api.patch<Envelope<{ user: User }>>('/api/account', input)).data.user,
    onSuccess: (user) => qc.setQueryData(authQueries.me().queryKey, user),
  });
}

export function useChangePassword() {
  const changed = useSessionChanged();
  return useMutation({
    mutationFn: async (input: { currentPassword: string; newPassword: string }) =>
      (await api.post<Envelope<{ user: User }>>('/api/account/password', input)).data.user,
    onSuccess: (user) => changed(user),
  });
}

/** Deletes the signed-in account (its password confirms it); the session is gone afterwards, so forget it here too. */
export function useDeleteAccount() {
  const changed = useSessionChanged();
  return useMutation({
    mutationFn: (input: { currentPassword: string }) => api.delete<void>('/api/account', { body: input }),
    onSuccess: () => changed(null),
  });
}

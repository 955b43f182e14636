import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { InvitationCreate, MeDto } from '../../../../shared/schemas/account';
import type { UserDto } from '../../../../shared/schemas/user';
import { api } from '../../../lib/api';
import { accountKeys, peopleKeys, sessionKeys } from '../../../lib/query-keys';

type Message = { data: { message: string } };

export function useMe() {
  return useQuery({ queryKey: accountKeys.me(), queryFn: () => api.get<{ data: MeDto }>('/me').then((b) => b.data) });
}

export function useUpdateMe() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name?: string; phone?: string | null }) => api.patch<{ data: MeDto }>('/me', input).then((b) => b.data),
    onSuccess: async (data) => {
      queryClient.setQueryData(accountKeys.me(), data);
      await queryClient.invalidateQueries({ queryKey: sessionKeys.current() }); // the name in the header
    },
  });
}

export const useChangePassword = () =>
  useMutation({ mutationFn: (input: { currentPassword: string; newPassword: string }) => api.post<void>('/me/password', input) });

export const useRequestPasswordReset = () =>
  useMutation({ mutationFn: (email: string) => api.post<Message>('/password-resets', { email }).then((b) => b.data.message) });

export const useCompletePasswordReset = () =>
  useMutation({
    mutationFn: (input: { token: string; password: string }) => api.post<Message>('/password-resets/complete', input).then((b) => b.data.message),
  });

export const useAcceptInvitation = () =>
  useMutation({ mutationFn: (input: { token: string; password: string }) => api.post<Message>('/invitations/accept', input).then((b) => b.data.message) });

export function useInvite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvitationCreate) => api.post<{ data: UserDto & { invitationExpiresAt: string } }>('/invitations', input).then((b) => b.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.all }),
  });
}

export function useErasePerson(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ data: UserDto }>(`/users/${id}/erase`).then((b) => b.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.all }),
  });
}

/** The export is a plain GET the browser downloads with the session cookie. */
export const exportUrl = (id: number) => `/api/v1/users/${id}/export`;

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { LinkBudgetBody, RegulatoryBody } from '../../../../shared/schemas/planning';
import type {
  AddressAllocateBody,
  ChannelApplyBody,
  NetworkSettingsUpdate,
  NodeAddressPlanBody,
  PlannedLinkBody,
} from '../../../../shared/schemas/planningRecords';
import type { LinkDto } from '../../../../shared/schemas/link';
import { api, formWith, type UploadProgress } from '../../../lib/api';
import { linkKeys, radioKeys, topologyKeys } from '../../../lib/query-keys';
import { planningKeys } from './keys';
import type {
  AddressPlans,
  ChannelApplyResultDto,
  ChannelPlan,
  ChannelPlanHistoryEntryDto,
  LinkBudgetAnswer,
  LinkHealthDto,
  NetworkSettingsDto,
  ProvisioningSheet,
  RegulatoryAnswer,
  SecurityReview,
  SurveyUpload,
} from './types';

export function useNetworkSettings() {
  return useQuery({ queryKey: planningKeys.settings(), queryFn: () => api.get<{ data: NetworkSettingsDto }>('/settings/network').then((b) => b.data) });
}
export function useUpdateNetworkSettings() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: NetworkSettingsUpdate) => api.patch<{ data: NetworkSettingsDto }>('/settings/network', body).then((b) => b.data),
    onSuccess: () => qc.invalidateQueries({ queryKey: planningKeys.all }),
  });
}

export const useLinkBudget = () => useMutation({ mutationFn: (body: LinkBudgetBody) => api.post<LinkBudgetAnswer>('/planning/link-budget', body) });
export const useRegulatory = () => useMutation({ mutationFn: (body: RegulatoryBody) => api.post<RegulatoryAnswer>('/planning/regulatory', body) });

export function useSavePlannedLink() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: PlannedLinkBody) => api.post<{ data: LinkDto }>('/planning/planned-links', body).then((b) => b.data),
    onSuccess: () => Promise.all([linkKeys.all, radioKeys.all, topologyKeys.all].map((k) => qc.invalidateQueries({ queryKey: [...k] }))),
  });
}

export function useLinkHealth(linkId: number | null) {
  return useQuery({
    queryKey: planningKeys.linkHealth(linkId ?? 0),
    queryFn: () => api.get<{ data: LinkHealthDto }>(`/links/${linkId}/health`).then((b) => b.data),
    enabled: linkId !== null && linkId > 0,
  });
}

export function useChannelPlan(params: { neighbourhoodId?: number; band?: string }) {
  return useQuery({
    queryKey: planningKeys.channelPlan(params),
    queryFn: () => api.get<{ data: ChannelPlan }>('/planning/channel-plan', params).then((b) => b.data),
  });
}
export function useChannelHistory() {
  return useQuery({
    queryKey: planningKeys.channelHistory(),
    queryFn: () => api.get<{ data: ChannelPlanHistoryEntryDto[] }>('/planning/channel-plan/history').then((b) => b.data),
  });
}
export function useApplyChannelPlan() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ChannelApplyBody) => api.post<{ data: ChannelApplyResultDto }>('/planning/channel-plan/apply', body).then((b) => b.data),
    onSuccess: () => Promise.all([planningKeys.all, radioKeys.all, topologyKeys.all].map((k) => qc.invalidateQueries({ queryKey: [...k] }))),
  });
}

const uploadSurvey = (nodeId: number, file: File) => api.upload<SurveyUpload>(`/nodes/${nodeId}/site-surveys`, formWith('file', file));

export interface TerrainTile {
  name: string;
  south: number;
  west: number;
  samplesPerSide: number;
  createdAt: string;
}
export function useTerrainTiles() {
  return useQuery({ queryKey: planningKeys.terrainTiles(), queryFn: () => api.get<{ data: TerrainTile[]; abilities: { upload: boolean } }>('/terrain/tiles') });
}
/** A 1″ tile is about 25 MB, so the upload reports its progress (bytes sent) to `onProgress`. */
export function useUploadTerrainTile(onProgress?: (progress: UploadProgress) => void) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => api.upload<{ data: TerrainTile }>('/terrain/tiles', formWith('tile', file), onProgress).then((b) => b.data),
    onSuccess: () => qc.invalidateQueries({ queryKey: planningKeys.terrainTiles() }),
  });
}
export function useDeleteTerrainTile() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => api.delete(`/terrain/tiles/${name}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: planningKeys.terrainTiles() }),
  });
}
export function useUploadSurvey() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ nodeId, file }: { nodeId: number; file: File }) => uploadSurvey(nodeId, file),
    onSuccess: () => qc.invalidateQueries({ queryKey: planningKeys.all }),
  });
}

export function useAddressPlans() {
  return useQuery({ queryKey: planningKeys.addressPlans(), queryFn: () => api.get<{ data: AddressPlans }>('/address-plans').then((b) => b.data) });
}
function useAddressMutation<T>(fn: (input: T) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => qc.invalidateQueries({ queryKey: planningKeys.all }) });
}
export const useAllocateAddresses = () => useAddressMutation((body: AddressAllocateBody) => api.post('/address-plans/allocate', body));
export const useSaveAddressPlan = () =>
  useAddressMutation(({ nodeId, ...body }: NodeAddressPlanBody & { nodeId: number }) => api.put(`/address-plans/${nodeId}`, body));
export const useDeleteAddressPlan = () => useAddressMutation((nodeId: number) => api.delete(`/address-plans/${nodeId}`));

export function useSecurityReview() {
  return useQuery({ queryKey: planningKeys.security(), queryFn: () => api.get<{ data: SecurityReview }>('/security-review').then((b) => b.data) });
}

export function useProvisioning(nodeId: number | null) {
  return useQuery({
    queryKey: planningKeys.provisioning(nodeId ?? 0),
    queryFn: () => api.get<{ data: ProvisioningSheet }>(`/nodes/${nodeId}/provisioning`).then((b) => b.data),
    enabled: nodeId !== null,
    // The sheet may carry a key: do not keep it in the cache after the page closes.
    gcTime: 0,
  });
}

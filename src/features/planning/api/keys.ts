// Query keys of the planning pages; they live with the feature so other areas' keys stay untouched.
export const planningKeys = {
  all: ['planning'] as const,
  settings: () => ['planning', 'settings'] as const,
  channelPlan: (params: Record<string, string | number | undefined>) => ['planning', 'channel-plan', params] as const,
  channelHistory: () => ['planning', 'channel-plan', 'history'] as const,
  surveys: (nodeId: number) => ['planning', 'surveys', nodeId] as const,
  addressPlans: () => ['planning', 'address-plans'] as const,
  security: () => ['planning', 'security-review'] as const,
  linkHealth: (linkId: number) => ['planning', 'link-health', linkId] as const,
  provisioning: (nodeId: number) => ['planning', 'provisioning', nodeId] as const,
  terrainTiles: () => ['planning', 'terrain-tiles'] as const,
};

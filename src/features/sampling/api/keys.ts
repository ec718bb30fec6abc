export const samplingKeys = {
  all: ['sampling'] as const,
  lotPlan: (lotId: number) => [...samplingKeys.all, 'lot-plan', lotId] as const,
};

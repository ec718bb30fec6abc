export const dispositionKeys = {
  all: ['disposition'] as const,
  lot: (lotId: number) => [...dispositionKeys.all, lotId] as const,
};

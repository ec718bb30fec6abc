export const biasKeys = {
  all: ['bias'] as const,
  sources: () => [...biasKeys.all, 'sources'] as const,
};

export const mailKeys = {
  all: ['mail'] as const,
  outbox: (f: { page: number; status?: string }) => [...mailKeys.all, 'outbox', f] as const,
  sink: (page: number) => [...mailKeys.all, 'sink', page] as const,
};

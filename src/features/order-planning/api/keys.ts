export const orderPlanKeys = {
  all: ['order-plans'] as const,
  detail: (id: string) => [...orderPlanKeys.all, id] as const,
};

export const scannerSettingsKeys = {
  all: ['scanner-settings'] as const,
};

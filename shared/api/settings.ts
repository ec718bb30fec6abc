/** Separator substitutes a site's keyboard-wedge scanners send, added to the built-in ones. */
export interface ScannerSettings {
  gs: string[];
  rs: string[];
  eot: string[];
  /** Regular expression (case-insensitive) for purchase-order numbers scanned as plain codes; null = built-in. */
  purchaseOrderPattern: string | null;
}

export interface ScannerSettingsResponse {
  configured: ScannerSettings;
  defaults: { gs: string[]; rs: string[]; eot: string[]; purchaseOrderPattern: string };
  updatedAt: string | null;
  updatedBy: string | null;
}

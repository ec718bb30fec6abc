import type { Role } from '../shared/api/roles.ts';

/** Invented demo sign-ins of the Harrow Point Audio Works scenario. Demo only. */
export const DEMO_PASSWORD = 'binwright-demo';

export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'inspector@harrowpoint.test', name: 'Ines Okafor', role: 'inspector' },
  { email: 'quality@harrowpoint.test', name: 'Quentin Marsh', role: 'quality' },
  { email: 'buyer@harrowpoint.test', name: 'Bea Lindqvist', role: 'buyer' },
  { email: 'assembler@harrowpoint.test', name: 'Arun Patel', role: 'assembler' },
];

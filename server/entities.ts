import { AuditEntry } from './modules/audit/audit-entry.entity.ts';
import { User } from './modules/users/user.entity.ts';

/** Every entity class, registered with the DataSource explicitly (no globs). */
export const entities = [User, AuditEntry];

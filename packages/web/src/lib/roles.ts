/** Roles in words (the role names themselves come from the API's generated types). */
import type { Role } from './api/types';

export const roleLabels: Record<Role, string> = {
  regional_lead: 'Regional lead',
  practice_lead: 'Practice lead',
  auditor: 'Auditor',
};

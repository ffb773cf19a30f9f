/** Cairn's three roles (see product.md) and the states of a user. */
export const ROLES = ['regional_lead', 'practice_lead', 'auditor'] as const;
export type Role = (typeof ROLES)[number];

export const USER_STATUSES = ['active', 'deactivated'] as const;
export type UserStatus = (typeof USER_STATUSES)[number];

export const ROLES = ['owner', 'photographer', 'retoucher', 'guest'] as const;
export type Role = (typeof ROLES)[number];

/** What each role may do (PRODUCT.md, "Roles"). The server enforces these on every route. */
export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  photographer: 'Photographer',
  retoucher: 'Retoucher',
  guest: 'Guest',
};

export const CAN_EDIT_WORK: readonly Role[] = ['owner', 'photographer'];
export const ALL_MEMBERS: readonly Role[] = ROLES;

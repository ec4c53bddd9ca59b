import { ROLES, type Role } from '../schemas/auth';

/** How each role is named and explained on screen (the values stay those of schemas/auth.ts). */
export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  engineer: 'Engineer',
  reviewer: 'Reviewer',
  viewer: 'Viewer',
};

export const ROLE_SUMMARIES: Record<Role, string> = {
  owner: 'Manages who belongs to the workspace and their roles, and can do all an engineer can.',
  engineer: 'Enters compensators, compares discretizations, sets word length and scaling, and submits versions for review.',
  reviewer: 'Checks pole drift, frequency response and margins, then approves a version or sends it back.',
  viewer: 'Reads designs, reviews and released versions without changing them.',
};

export const ROLE_OPTIONS: readonly { value: Role; label: string }[] = ROLES.map((value) => ({ value, label: ROLE_LABELS[value] }));

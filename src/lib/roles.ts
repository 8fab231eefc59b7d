// The roles a person can hold, in display order; the schema and the pages both use this list.
export const roles = ['learner', 'mentor', 'author', 'admin'] as const;
export type Role = (typeof roles)[number];

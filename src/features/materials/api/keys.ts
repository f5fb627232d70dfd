/** Query keys of the material catalogue: all → lists() → list(). */
export const materialKeys = {
  all: ['materials'] as const,
  lists: () => [...materialKeys.all, 'list'] as const,
  list: () => [...materialKeys.lists(), {}] as const,
};

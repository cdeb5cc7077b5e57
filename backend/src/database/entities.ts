// Every entity the ORM knows, listed explicitly so discovery works the same compiled and under Vitest.
export const ALL_ENTITIES = [] as const;

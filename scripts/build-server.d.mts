/** Compiles server, migrations and the migrate command into <root>/dist/server; returns that folder. */
export function buildServer(projectRoot?: string): Promise<string>;

export const workspaceRoles = ['viewer', 'analyst', 'owner'] as const;
export type WorkspaceRole = (typeof workspaceRoles)[number];

const rank: Record<WorkspaceRole, number> = { viewer: 1, analyst: 2, owner: 3 };

/** Owner can do all an analyst can, an analyst all a viewer can. */
export function roleAtLeast(role: WorkspaceRole, minimum: WorkspaceRole): boolean {
	return rank[role] >= rank[minimum];
}

export function isWorkspaceRole(value: unknown): value is WorkspaceRole {
	return typeof value === 'string' && (workspaceRoles as readonly string[]).includes(value);
}

export const roleDescriptions: Record<WorkspaceRole, string> = {
	owner: 'Manages members and the plan, and can do everything an analyst can.',
	analyst: 'Creates and edits projects and scenarios.',
	viewer: 'Reads projects, scenarios and results; changes nothing.'
};

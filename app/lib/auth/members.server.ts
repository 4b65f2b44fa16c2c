// The viewer's workshop's members and invitations (the Workshop page), scoped to that workshop;
// who may change them is decided by the route's guard (manage:members). Data through repo/.
import type { Role } from "../db/types";
import { db } from "../db/db.server";
import { cancelInvitation, changeRole, invite, listInvitations, listMembers, removeMember } from "../repo/users.server";
import type { Viewer } from "./auth.server";

export const membersOf = (v: Viewer) => listMembers(db(), v.workshop.id);
export const invitationsOf = (v: Viewer) => listInvitations(db(), v.workshop.id);
export const inviteTo = (v: Viewer, target: { githubLogin?: string; email?: string }, role: Role) => invite(db(), v.workshop.id, v.user.id, target, role);
export const changeRoleOf = (v: Viewer, userId: string, role: Role) => changeRole(db(), v.workshop.id, userId, role);
export const removeMemberOf = (v: Viewer, userId: string) => removeMember(db(), v.workshop.id, userId);
/** False when the workshop has no such open invitation. */
export const cancelInvitationOf = (v: Viewer, invitationId: string) => cancelInvitation(db(), v.workshop.id, invitationId);

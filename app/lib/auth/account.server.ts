// The signed-in person's own API tokens (the Account page), scoped to them; data through repo/.
import type { Viewer } from "./auth.server";
import { db } from "../db/db.server";
import { createToken, listTokens, revokeToken } from "../repo/tokens.server";

export const tokensOf = (v: Viewer) => listTokens(db(), v.user.id);
/** A new token; its secret is shown once and only its hash is kept. */
export const createTokenFor = (v: Viewer, name: string) => createToken(db(), v.user.id, name);
/** False when the viewer has no such active token. */
export const revokeTokenOf = (v: Viewer, tokenId: string) => revokeToken(db(), v.user.id, tokenId);

export { authHandle } from './config';
export {
	assertWritable,
	getActor,
	requireRole,
	requireUser,
	writers,
	WORKSPACE_COOKIE
} from './guards';
export type { Actor, WorkspaceActor, WorkspaceMembership } from './guards';
export { auditFailedSignIn, safeNext } from './failures';
export { attemptAllowed, recordAttempt, retryMessage } from './rate-limit';
export { endSession, sendSignInLink, startPasswordSession } from './session';
export { auditForUser } from './audit-user';
export { requireApiCaller, type ApiCaller } from './api-keys';

// The audit trail through the API: the same query as the Audit trail screen.
import type { AuditFilter } from '$lib/schemas/audit';
import { listAuditEvents, PAGE_SIZE } from '../audit';
import { presentAuditPage } from './present';

export async function auditPage(workspaceId: string, filter: AuditFilter) {
	return presentAuditPage(await listAuditEvents(workspaceId, filter), filter.page, PAGE_SIZE);
}

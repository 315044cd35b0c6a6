// The app's screens and which roles see them. Only screens that exist are listed.
export type Role = 'admin' | 'officer' | 'analyst' | 'reviewer';
export type NavItem = {
	href:
		| '/app'
		| '/app/loans'
		| '/app/deals'
		| '/app/audit'
		| '/app/settings/team'
		| '/app/settings/billing'
		| '/app/settings/api-keys'
		| '/app/settings/account'
		| '/app/api';
	label: string;
	roles: Role[];
};

const everyone: Role[] = ['admin', 'officer', 'analyst', 'reviewer'];

export const navItems: NavItem[] = [
	{ href: '/app', label: 'Desk', roles: everyone },
	{ href: '/app/loans', label: 'Loans', roles: everyone },
	{ href: '/app/deals', label: 'Deals', roles: everyone },
	{ href: '/app/audit', label: 'Audit trail', roles: ['admin', 'reviewer'] },
	{ href: '/app/settings/team', label: 'Team', roles: ['admin'] },
	{ href: '/app/settings/billing', label: 'Billing and seats', roles: ['admin'] },
	{ href: '/app/settings/api-keys', label: 'API keys', roles: ['admin'] },
	{ href: '/app/settings/account', label: 'Account', roles: everyone },
	{ href: '/app/api', label: 'API reference', roles: everyone }
];

export const roleNames: Record<Role, string> = {
	admin: 'admin',
	officer: 'loan officer',
	analyst: 'treasury analyst',
	reviewer: 'reviewer (read-only)'
};

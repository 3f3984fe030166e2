export interface SessionUser {
	id: string;
	email: string;
	name: string;
	role: 'admin' | 'member';
}
export interface SessionInfo {
	id: string;
	expiresAt: Date;
}

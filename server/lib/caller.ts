/** The signed-in person as every service sees them (reloaded from the database on each request). */
export interface Caller {
  id: number;
  email: string;
  name: string;
  roles: string[];
  stewardOf: number[];
  householdId: number | null;
}

/** Who is asking and from where, for the security log. */
export interface RequestContext {
  requestId: string;
  ip: string;
}

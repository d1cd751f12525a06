/**
 * People: the module that owns `people`, `invitations` and `sessions` (a person's sign-ins end
 * with their password or their account). Other modules call what is exported here, never
 * people.repository.ts.
 */
export {
  attachPerson,
  availableVolunteers,
  countMembers,
  deleteSessionsOf,
  emailTaken,
  findActiveCaller,
  findByEmail,
  findById,
  findMembers,
  insertInvitation,
  insertInvitedPerson,
  lockInvitationAddress,
  lockPerson,
  lockPersonHousehold,
  residentsOf,
  setEmail,
  setName,
  setPassword,
  type MemberRecord,
  type SignInRecord,
  type Volunteer,
} from "./people.repository";
export { INVITATION_TTL_MS } from "./people.service";

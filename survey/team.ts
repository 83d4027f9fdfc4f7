// Shapes exchanged about teams, members, invites and sites' people; shared by the app and the server.
import * as v from "valibot";
import { ROLES, TEAM_ROLES } from "./policy";

const AnEmail = v.pipe(v.string(), v.email());

export const EmailSchema = v.pipe(
  v.string("Enter an e-mail address."),
  v.trim(),
  v.toLowerCase(),
  v.nonEmpty("Enter an e-mail address."),
  v.maxLength(254, "That e-mail address is too long."),
  // An empty field gets one message, "Enter an e-mail address.", not that one and this one too.
  v.check((s) => s === "" || v.is(AnEmail, s), "That does not look like an e-mail address."),
);

export const PersonNameSchema = v.pipe(
  v.string("Enter a name."),
  v.trim(),
  v.nonEmpty("Enter a name."),
  v.maxLength(120, "Keep the name under 120 characters."),
);

export const PasswordSchema = v.pipe(
  v.string("Enter a password."),
  v.minLength(10, "Use at least 10 characters for the password."),
  v.maxLength(200, "Keep the password under 200 characters."),
);

export const RoleSchema = v.picklist(ROLES, "Choose a role: admin, designer, surveyor or client.");
export const TeamRoleSchema = v.picklist(TEAM_ROLES, "Choose a role: admin, designer or surveyor.");

export const InviteMemberSchema = v.object({ email: EmailSchema, role: TeamRoleSchema });
export type InviteMemberInput = v.InferOutput<typeof InviteMemberSchema>;

export const AcceptInviteSchema = v.object({ name: PersonNameSchema, password: PasswordSchema });
export type AcceptInviteInput = v.InferOutput<typeof AcceptInviteSchema>;

export const ChangeRoleSchema = v.object({ role: TeamRoleSchema });

export const UpdateMeSchema = v.object({ name: PersonNameSchema });

export const InviteClientSchema = v.object({ email: EmailSchema, name: PersonNameSchema });
export type InviteClientInput = v.InferOutput<typeof InviteClientSchema>;

export const SiteStatusSchema = v.picklist(
  ["surveying", "planning", "out_for_sign_off", "signed", "changes_asked"],
  "Choose a status: surveying, planning, out for sign-off, signed or changes asked.",
);

export const SITE_STATUS_LABELS: Record<v.InferOutput<typeof SiteStatusSchema>, string> = {
  surveying: "surveying",
  planning: "planning",
  out_for_sign_off: "out for sign-off",
  signed: "signed",
  changes_asked: "changes asked",
};

export const CreateSiteSchema = v.object({
  name: v.pipe(v.string("Give the site a name."), v.trim(), v.nonEmpty("Give the site a name."), v.maxLength(120, "Keep the name under 120 characters.")),
  address: v.optional(v.pipe(v.string(), v.trim(), v.maxLength(240, "Keep the address under 240 characters.")), ""),
  units: v.optional(v.picklist(["metric", "imperial"], "Units are metric or imperial."), "metric"),
});
export type CreateSiteInput = v.InferOutput<typeof CreateSiteSchema>;

export const UpdateSiteSchema = v.partial(
  v.object({
    name: CreateSiteSchema.entries.name,
    address: v.pipe(v.string(), v.trim(), v.maxLength(240, "Keep the address under 240 characters.")),
    status: SiteStatusSchema,
  }),
);

export const AssignSurveyorsSchema = v.object({
  surveyorIds: v.pipe(v.array(v.pipe(v.string(), v.nonEmpty()), "List the surveyors' ids."), v.maxLength(50, "Assign at most 50 surveyors.")),
});

export const SignInSchema = v.object({ email: EmailSchema, password: v.pipe(v.string("Enter your password."), v.nonEmpty("Enter your password.")) });

import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { nextCookies } from "better-auth/next-js";
import { organization } from "better-auth/plugins";
import { createAccessControl } from "better-auth/plugins/access";
import { defaultStatements, ownerAc } from "better-auth/plugins/organization/access";
import { and, asc, eq } from "drizzle-orm";

import { db } from "@/db";
import * as schema from "@/db/schema";
import { isRole, ROLE_LABELS } from "@/lib/domain/roles";
import { serverEnv } from "@/lib/env";
import { sendMail } from "@/lib/mail";

const env = serverEnv();
const ac = createAccessControl(defaultStatements);
// Only the owner manages the shop through better-auth's own endpoints; the rest have no rights there.
const roles = {
  owner: ac.newRole(ownerAc.statements),
  tuner: ac.newRole({}),
  counter: ac.newRole({}),
  customer: ac.newRole({}),
};

const origin = new URL(env.APP_URL);
const port = origin.port || "3000";

export const auth = betterAuth({
  appName: "Fuelwright",
  baseURL: env.APP_URL,
  secret: env.BETTER_AUTH_SECRET,
  trustedOrigins: [`http://localhost:${port}`, `http://127.0.0.1:${port}`, env.APP_URL],
  database: drizzleAdapter(db, { provider: "pg", schema }),
  emailAndPassword: {
    enabled: true,
    requireEmailVerification: true,
    minPasswordLength: 10,
    maxPasswordLength: 128,
    resetPasswordTokenExpiresIn: 60 * 60,
    sendResetPassword: async ({ user, url }) => {
      await sendMail({
        to: user.email,
        subject: "Reset your Fuelwright password",
        text: `Someone asked to reset the password of ${user.email}.\n\nSet a new password here (the link works once, for an hour):\n${url}\n\nIf it was not you, ignore this message.`,
      });
    },
  },
  emailVerification: {
    sendOnSignUp: true,
    autoSignInAfterVerification: true,
    sendVerificationEmail: async ({ user, url }) => {
      // An invited person proves the address by the invitation link; no second e-mail.
      const [pending] = await db
        .select({ id: schema.invitation.id })
        .from(schema.invitation)
        .where(
          and(eq(schema.invitation.email, user.email), eq(schema.invitation.status, "pending")),
        )
        .limit(1);
      if (pending) return;
      await sendMail({
        to: user.email,
        subject: "Confirm your e-mail for Fuelwright",
        text: `Welcome to Fuelwright, ${user.name}.\n\nConfirm your e-mail address to sign in:\n${url}\n`,
      });
    },
  },
  rateLimit: {
    enabled: env.AUTH_RATE_LIMIT === "on",
    window: 10,
    max: 100,
    customRules: { "/sign-in/email": { window: 10, max: 3 } },
  },
  databaseHooks: {
    session: {
      create: {
        // A new session starts in the member's first shop.
        before: async (s) => {
          const [m] = await db
            .select({ organizationId: schema.member.organizationId })
            .from(schema.member)
            .where(eq(schema.member.userId, s.userId))
            .orderBy(asc(schema.member.createdAt))
            .limit(1);
          return { data: { ...s, activeOrganizationId: m?.organizationId ?? null } };
        },
      },
    },
  },
  plugins: [
    organization({
      ac,
      roles,
      creatorRole: "owner",
      allowUserToCreateOrganization: false,
      invitationExpiresIn: 7 * 24 * 60 * 60,
      sendInvitationEmail: async (data) => {
        const url = `${env.APP_URL}/accept-invitation/${data.id}`;
        const role = isRole(data.role) ? ROLE_LABELS[data.role] : data.role;
        await sendMail({
          to: data.email,
          subject: `${data.organization.name} invites you to Fuelwright`,
          text: `${data.inviter.user.name} invites you to join ${data.organization.name} on Fuelwright as ${role}.\n\nSet your password and join here (valid for 7 days):\n${url}\n`,
        });
      },
    }),
    nextCookies(),
  ],
});

export type Session = typeof auth.$Infer.Session;

/** Is this user a member of the shop? (Used by the session hook and the invitation flow.) */
export async function membershipOf(userId: string, shopId: string) {
  const [m] = await db
    .select()
    .from(schema.member)
    .where(and(eq(schema.member.userId, userId), eq(schema.member.organizationId, shopId)))
    .limit(1);
  return m;
}

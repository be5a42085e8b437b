import { betterAuth } from "better-auth";
import { nextCookies } from "better-auth/next-js";
import { organization } from "better-auth/plugins";
import { createAccessControl } from "better-auth/plugins/access";
import { defaultStatements, ownerAc } from "better-auth/plugins/organization/access";

import { authAdapter } from "@/db/auth-adapter";
import { firstShopOf, hasPendingInvitation } from "@/db/queries/members";
import { serverEnv } from "@/lib/env";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-address";
import { allowedOrigins } from "@/lib/http/same-origin";
import { sendMail } from "@/lib/mail";
import { INVITATION_DAYS, invitationMail } from "@/lib/members/invitation-mail";

import { afterAuthHook, beforeAuthHook } from "./auth-hooks";
import { rateLimitStorage } from "./rate-limit-commands";

const env = serverEnv();
const ac = createAccessControl(defaultStatements);
// Only the owner manages the shop through better-auth's own endpoints; the rest have no rights there.
const roles = {
  owner: ac.newRole(ownerAc.statements),
  tuner: ac.newRole({}),
  counter: ac.newRole({}),
  customer: ac.newRole({}),
};

export const auth = betterAuth({
  appName: "Fuelwright",
  baseURL: env.APP_URL,
  secret: env.BETTER_AUTH_SECRET,
  trustedOrigins: [...allowedOrigins()],
  database: authAdapter,
  emailAndPassword: {
    enabled: true,
    requireEmailVerification: true,
    minPasswordLength: 10,
    maxPasswordLength: 128,
    resetPasswordTokenExpiresIn: 60 * 60,
    // A new password ends every session the old one opened.
    revokeSessionsOnPasswordReset: true,
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
      if (await hasPendingInvitation(user.email)) return;
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
    // Sign-in and sign-up are limited in the hooks (lib/auth/auth-hooks.ts): by address and
    // account, and for the sign-up page's server action as for the endpoint.
    customRules: { "/sign-in/email": false, "/sign-up/email": false },
    // In PostgreSQL: every instance counts against the same counters.
    customStorage: rateLimitStorage,
  },
  advanced: {
    // The address the server noted from the socket (or the trusted proxy's header), never a
    // header a client chose (lib/http/client-address.ts).
    ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
  },
  hooks: { before: beforeAuthHook, after: afterAuthHook },
  databaseHooks: {
    session: {
      create: {
        // A new session starts in the member's first shop.
        before: async (s) => ({
          data: { ...s, activeOrganizationId: await firstShopOf(s.userId) },
        }),
      },
    },
  },
  plugins: [
    organization({
      ac,
      roles,
      creatorRole: "owner",
      allowUserToCreateOrganization: false,
      invitationExpiresIn: INVITATION_DAYS * 24 * 60 * 60,
      // The same e-mail as the settings page's invitations (lib/members/member-commands.ts).
      sendInvitationEmail: async (data) => {
        await sendMail(
          invitationMail({
            id: data.id,
            email: data.email,
            role: data.role,
            shopName: data.organization.name,
            inviterName: data.inviter.user.name,
          }),
        );
      },
    }),
    nextCookies(),
  ],
});

export type Session = typeof auth.$Infer.Session;

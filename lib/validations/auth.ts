import { z } from "zod";

export const EmailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email("Enter a valid e-mail address"));
export const PasswordSchema = z
  .string()
  .min(10, "Use at least 10 characters")
  .max(128, "Use at most 128 characters");

export const SignUpSchema = z.object({
  name: z.string().trim().min(1, "Enter your name").max(120, "Name is too long"),
  shopName: z.string().trim().min(2, "Enter your shop's name").max(120, "Shop name is too long"),
  email: EmailSchema,
  password: PasswordSchema,
});

export const SignInSchema = z.object({
  email: EmailSchema,
  password: z.string().min(1, "Enter your password").max(128),
});
export const ForgotPasswordSchema = z.object({ email: EmailSchema });
export const ResetPasswordSchema = z.object({
  token: z.string().min(1, "The reset link is incomplete"),
  password: PasswordSchema,
});
export const AcceptInvitationSchema = z.object({
  invitationId: z.string().min(1),
  name: z.string().trim().min(1, "Enter your name").max(120, "Name is too long"),
  password: PasswordSchema,
});

/**
 * Portal invitations are written by the customer commands; this module keeps the old import
 * path for the quote e-mail's invitation link.
 */
export { portalInviteLink } from "@/lib/customers/customer-commands";

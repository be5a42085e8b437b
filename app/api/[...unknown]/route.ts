import { unknownRoute } from "@/lib/http/unknown-route";

export const dynamic = "force-dynamic";

/** Any /api address no route answers: a JSON 404 (lib/http/unknown-route.ts). */
export const GET = unknownRoute;
export const POST = unknownRoute;
export const PUT = unknownRoute;
export const PATCH = unknownRoute;
export const DELETE = unknownRoute;

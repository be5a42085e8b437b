import { z } from "zod";

import { controlCharacterIssue } from "@/lib/http/text";

/** A search box's text: at most 100 characters, none of them a control character (such as NUL). */
export const searchText = () =>
  z
    .string()
    .trim()
    .max(100, "Search is too long")
    .refine((q) => !controlCharacterIssue(q, "q"), "Remove the control characters from the search");

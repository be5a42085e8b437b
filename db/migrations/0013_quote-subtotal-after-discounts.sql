-- A quote's subtotal is the sum of its line totals after their discounts (issue 19): tax is
-- charged on it and every surface prints it, so nothing reads as taken off twice. Rows written
-- before stored the sum before discounts.
UPDATE "quotes" SET "subtotal_minor" = "subtotal_minor" - "discount_minor" WHERE "discount_minor" <> 0;

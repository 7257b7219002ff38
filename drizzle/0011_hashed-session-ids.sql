-- Session ids are now the SHA-256 of the cookie's token (src/server/auth/lucia.ts), so the ids
-- stored so far (the tokens themselves) no longer match any cookie, and keeping them would keep
-- readable tokens in the table. End every session: everyone signs in once more (README, Upgrading).
DELETE FROM "sessions";

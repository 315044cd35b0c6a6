-- A solve's request (about 15 kB as json for a 30-year loan) is TOASTed and compressed on every
-- insert. lz4 (PostgreSQL 14 and later, built into Debian's server) compresses it faster than
-- the default pglz: `npm run bench:api` measured PostgreSQL's CPU per API solve at about
-- 0.66 ms with pglz and 0.57 ms with lz4. Rows already stored keep the compression they have.
ALTER TABLE "solves" ALTER COLUMN "request" SET COMPRESSION lz4;

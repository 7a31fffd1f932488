-- Rate-limit counters are worth nothing after a crash, so they skip the write-ahead log: a request
-- spends its point without waiting for a durable commit (a transaction that wrote only unlogged
-- tables commits asynchronously). A clean restart keeps them; crash recovery empties the table,
-- which forgives at most one window's count.
ALTER TABLE "rate_limits" SET UNLOGGED;

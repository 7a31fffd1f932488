import { describe, expect, it } from 'vitest';
import { commonToAll, parseParameters, parseStatementLog } from './capture';

describe('statements read from the PostgreSQL log', () => {
  it('reads bind parameters, quotes and NULLs included', () => {
    expect(parseParameters(`$1 = 'a', $2 = NULL, $3 = 'it''s, fine'`)).toEqual(['a', null, "it's, fine"]);
  });

  it('joins continuation lines and pairs each statement with its parameters', () => {
    const log = [
      '@@bench 41@@ LOG:  execute <unnamed>: select "tanks"."id"',
      '\tfrom "tanks" where "tanks"."id" = $1',
      "@@bench 41@@ DETAIL:  parameters: $1 = '2b1c'",
      '@@bench 42@@ LOG:  statement: BEGIN',
      '@@bench 42@@ LOG:  duration: 0.1 ms',
    ].join('\n');
    expect(parseStatementLog(log)).toEqual([
      { pid: 41, text: 'select "tanks"."id"\nfrom "tanks" where "tanks"."id" = $1', values: ['2b1c'] },
      { pid: 42, text: 'BEGIN', values: [] },
    ]);
  });
});

describe('statements common to every capture', () => {
  it('drops what background work sent during one capture only', () => {
    const request = (pid: number) => [
      { pid, text: 'select sess from "session" where sid = $1', values: ['s1'] },
      { pid, text: 'select  "tanks"."id"\nfrom "tanks"', values: [] },
    ];
    const fanOut = { pid: 9, text: 'insert into "notifications" ("id") values ($1)', values: ['n'] };
    expect(commonToAll([[...request(1), fanOut], request(2), request(3)])).toEqual(request(1));
  });
});

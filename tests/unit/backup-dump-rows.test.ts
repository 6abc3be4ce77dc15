import { describe, expect, it } from 'vitest';
import { countValueGroups, rowsPerTable } from '~/lib/backup/dump-rows';
import { migrationFault, rowFaults } from '~/lib/backup/manifest';

// Source: MariaDB Knowledge Base, "String Literals" — a quote inside a string is written doubled
// ('') or escaped with a backslash (\'), and mariadb-dump writes strings with backslash escapes
// (\\, \', \n, \0); --hex-blob writes binary columns as 0x… literals. The dumps below are written
// by hand in that form, one row per group of parentheses.
describe('rows in a mariadb-dump file', () => {
  it('counts the groups of a VALUES list, whatever the strings hold', () => {
    expect(countValueGroups("(1,'plain'),(2,'b');")).toBe(2);
    expect(countValueGroups("(1,'it\\'s (quoted), really'),(2,'a),(b'),(3,'back\\\\'),(4,NULL);")).toBe(4);
    expect(countValueGroups("(1,'doubled '' quote ('),(2,0x28290a);")).toBe(2);
    expect(countValueGroups("(1,'line\\nbreak ✦ (ok)');")).toBe(1);
  });

  it('refuses a line cut short inside a row', () => {
    expect(() => countValueGroups("(1,'unfinished")).toThrow(/cut short/);
    expect(() => countValueGroups('(1,(2')).toThrow(/cut short/);
  });

  it('reads a statement with one group a line, as MariaDB 10.11 writes it', () => {
    // Source: the output of mariadb-dump 10.11.19 (Debian's package) for a two-row table, observed: VALUES, then a row a line.
    const dump = [
      'CREATE TABLE `t` (',
      '  `id` int',
      ');',
      'INSERT INTO `t` VALUES',
      "(1,'a'),",
      "(2,'b\\nc (x),(y)'),",
      "(3,'it''s;');",
      'UNLOCK TABLES;',
    ].join('\n');
    expect(rowsPerTable(dump)).toEqual({ t: 3 });
    expect(() => rowsPerTable("INSERT INTO `t` VALUES\n(1,'a'),")).toThrow(/cut short/);
  });

  it('adds rows per table over several INSERT lines and keeps empty tables', () => {
    const dump = [
      '-- MariaDB dump',
      'DROP TABLE IF EXISTS `coupons`;',
      'CREATE TABLE `coupons` (',
      '  `id` int NOT NULL,',
      '  `notes` text',
      ') ENGINE=InnoDB;',
      "INSERT INTO `coupons` VALUES (1,'a'),(2,'INSERT INTO `coupons` VALUES (9,9);');",
      "INSERT INTO `coupons` VALUES (3,'c');",
      'CREATE TABLE `empty_one` (`id` int) ENGINE=InnoDB;',
      'CREATE TABLE `odd``name` (`id` int) ENGINE=InnoDB;',
      'INSERT INTO `odd``name` VALUES (1);',
    ].join('\n');
    expect(rowsPerTable(dump)).toEqual({ coupons: 3, empty_one: 0, 'odd`name': 1 });
  });
});

describe('checking a restore against its manifest', () => {
  it('names each table whose rows differ, and a table that is missing', () => {
    expect(rowFaults({ a: 1, b: 2 }, { a: 1, b: 2 })).toEqual([]);
    expect(rowFaults({ a: 1, b: 2 }, { a: 1, b: 3, c: 0 }).map((fault) => fault.what)).toEqual([
      'table b: 3 rows, the manifest says 2',
      'table c: 0 rows, the manifest says no such table',
    ]);
    expect(rowFaults({ a: 1 }, {})[0].what).toBe('table a: missing rows, the manifest says 1');
  });

  it('refuses a backup from a migration this install does not have', () => {
    expect(migrationFault('0002_b', ['0000_a', '0001_c', '0002_b'])).toBeUndefined();
    expect(migrationFault(null, [])).toBeUndefined();
    expect(migrationFault('0009_new', ['0000_a'])?.what).toMatch(/0009_new/);
  });
});

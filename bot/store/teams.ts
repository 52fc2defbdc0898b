import type Database from 'better-sqlite3';
import { parseJsonColumn } from './json-column.js';
import type { Member, Role, Team } from './types.js';

interface TeamDbRow {
  id: string;
  name: string | null;
  time_zone: string;
  digest_time: string | null;
  digest_days: string | null;
  digest_channel: string | null;
  demo: number;
  created_at: number;
}

interface MemberDbRow {
  team_id: string;
  user_id: string;
  name: string | null;
  role: Role;
  created_at: number;
}

export type TeamPatch = Partial<
  Pick<Team, 'name' | 'timeZone' | 'digestTime' | 'digestDays' | 'digestChannel'>
>;

export interface TeamsRepo {
  get(teamId: string): Team | undefined;
  /** Creates the team on first sight (zone 'UTC' unless given); returns it either way. */
  ensure(teamId: string, at: number, defaults?: { name?: string; timeZone?: string; demo?: boolean }): Team;
  update(teamId: string, patch: TeamPatch): Team | undefined;
  /** Every team id: the scheduler walks them. */
  list(): Team[];
  getMember(teamId: string, userId: string): Member | undefined;
  /** Adds the user on first sight: the team's first member becomes its admin, later ones members. */
  ensureMember(teamId: string, userId: string, name: string | null, at: number): Member;
  setRole(teamId: string, userId: string, role: Role): boolean;
  members(teamId: string): Member[];
}

const toTeam = (r: TeamDbRow): Team => ({
  id: r.id,
  name: r.name,
  timeZone: r.time_zone,
  digestTime: r.digest_time,
  digestDays: parseJsonColumn<number[]>(r.digest_days, []),
  digestChannel: r.digest_channel,
  demo: r.demo === 1,
  createdAt: r.created_at,
});

const toMember = (r: MemberDbRow): Member => ({
  teamId: r.team_id,
  userId: r.user_id,
  name: r.name,
  role: r.role,
  createdAt: r.created_at,
});

export function teamsRepo(db: Database.Database): TeamsRepo {
  const getTeam = db.prepare<[string], TeamDbRow>('SELECT * FROM teams WHERE id = ?');
  const insertTeam = db.prepare(
    'INSERT OR IGNORE INTO teams (id, name, time_zone, demo, created_at) VALUES (?, ?, ?, ?, ?)',
  );
  const listTeams = db.prepare<[], TeamDbRow>('SELECT * FROM teams ORDER BY id');
  const getMember = db.prepare<[string, string], MemberDbRow>(
    'SELECT * FROM members WHERE team_id = ? AND user_id = ?',
  );
  const countAdmins = db.prepare<[string], { n: number }>(
    "SELECT COUNT(*) AS n FROM members WHERE team_id = ? AND role = 'admin'",
  );
  const insertMember = db.prepare(
    'INSERT OR IGNORE INTO members (team_id, user_id, name, role, created_at) VALUES (?, ?, ?, ?, ?)',
  );
  const updateName = db.prepare('UPDATE members SET name = ? WHERE team_id = ? AND user_id = ?');
  const updateRole = db.prepare('UPDATE members SET role = ? WHERE team_id = ? AND user_id = ?');
  const listMembers = db.prepare<[string], MemberDbRow>(
    'SELECT * FROM members WHERE team_id = ? ORDER BY created_at, user_id',
  );

  const repo: TeamsRepo = {
    get: (teamId) => {
      const row = getTeam.get(teamId);
      return row ? toTeam(row) : undefined;
    },
    ensure: (teamId, at, defaults = {}) => {
      // Read first: a question should not take the write lock just to learn the team exists.
      const existing = getTeam.get(teamId);
      if (existing) return toTeam(existing);
      insertTeam.run(teamId, defaults.name ?? null, defaults.timeZone ?? 'UTC', defaults.demo ? 1 : 0, at);
      return toTeam(getTeam.get(teamId)!);
    },
    update: (teamId, patch) => {
      const sets: string[] = [];
      const values: (string | null)[] = [];
      const column = (name: string, value: string | null) => {
        sets.push(`${name} = ?`);
        values.push(value);
      };
      if (patch.name !== undefined) column('name', patch.name);
      if (patch.timeZone !== undefined) column('time_zone', patch.timeZone);
      if (patch.digestTime !== undefined) column('digest_time', patch.digestTime);
      if (patch.digestDays !== undefined) column('digest_days', JSON.stringify(patch.digestDays));
      if (patch.digestChannel !== undefined) column('digest_channel', patch.digestChannel);
      if (sets.length > 0)
        db.prepare(`UPDATE teams SET ${sets.join(', ')} WHERE id = ?`).run(...values, teamId);
      return repo.get(teamId);
    },
    list: () => listTeams.all().map(toTeam),
    getMember: (teamId, userId) => {
      const row = getMember.get(teamId, userId);
      return row ? toMember(row) : undefined;
    },
    ensureMember: (teamId, userId, name, at) => {
      const existing = getMember.get(teamId, userId);
      if (existing) {
        if (name !== null && name !== existing.name) updateName.run(name, teamId, userId);
        return toMember({ ...existing, name: name ?? existing.name });
      }
      const role: Role = countAdmins.get(teamId)!.n === 0 ? 'admin' : 'member';
      insertMember.run(teamId, userId, name, role, at);
      return toMember(getMember.get(teamId, userId)!);
    },
    setRole: (teamId, userId, role) => updateRole.run(role, teamId, userId).changes === 1,
    members: (teamId) => listMembers.all(teamId).map(toMember),
  };
  return repo;
}

/**
 * People's names for other modules' screens: they record who acted by e-mail address (an
 * Actor's label), and show the person's name. A module of its own that needs only the database
 * connection, so that any module (and the command line's contexts) can import it.
 */
import { Inject, Injectable, Module } from '@nestjs/common';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';

@Injectable()
export class PeopleNames {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  /** The names of the people of a region with these e-mail addresses; unknown ones are left out. */
  async byEmail(
    regionId: number,
    emails: readonly (string | null)[],
  ): Promise<Map<string, string>> {
    const wanted = [...new Set(emails.filter((e): e is string => !!e && e.includes('@')))];
    if (wanted.length === 0) return new Map();
    const rows = await this.sequelize.query<{ email: string; display_name: string }>(
      'SELECT email, display_name FROM users WHERE region_id = ? AND email IN (?)',
      { replacements: [regionId, wanted], type: QueryTypes.SELECT },
    );
    return new Map(rows.map((u) => [u.email, u.display_name]));
  }
}

@Module({ providers: [PeopleNames], exports: [PeopleNames] })
export class PeopleNamesModule {}

/**
 * The invented demo region. Every name here is made up for Cairn's demo:
 * region, localities, practices and people. To our knowledge none is a real
 * place, organisation or person (checked from memory, no look-up); e-mail
 * addresses use the reserved .example domain (RFC 2606).
 *
 * `profile` tells the extract generator how a practice behaves over the
 * eight demo quarters (see generate.ts).
 */

export type PracticeProfile =
  | 'typical'
  | 'improving' // completion rises quarter on quarter
  | 'persistently-low' // completion stays well below peers
  | 'implausible' // values outside plausible ranges, caught by validation
  | 'not-submitted'; // nothing submitted for the latest quarter

export interface DemoPractice {
  code: string;
  name: string;
  locality: string;
  /** Registered list size; people with diabetes are about 7 % of it */
  listSize: number;
  profile: PracticeProfile;
}

export const region = { code: 'OSV', name: 'Ostrevale' } as const;

export const localities = [
  { code: 'HRN', name: 'Harnleigh Fold' },
  { code: 'CND', name: 'Cindermere' },
  { code: 'LWB', name: 'Lowbrace' },
  { code: 'TSK', name: 'Thaskerby' },
] as const;

export const practices: DemoPractice[] = [
  {
    code: 'OV101',
    name: 'Wrenfield Health Centre',
    locality: 'HRN',
    listSize: 14200,
    profile: 'typical',
  },
  {
    code: 'OV102',
    name: 'Quarrybank Surgery',
    locality: 'HRN',
    listSize: 6100,
    profile: 'improving',
  },
  {
    code: 'OV103',
    name: 'Harnleigh Old Mill Practice',
    locality: 'HRN',
    listSize: 9800,
    profile: 'typical',
  },
  {
    code: 'OV104',
    name: 'Fellgate Family Practice',
    locality: 'HRN',
    listSize: 2300,
    profile: 'typical',
  },
  {
    code: 'OV105',
    name: 'Stonecrop Medical Group',
    locality: 'HRN',
    listSize: 21500,
    profile: 'typical',
  },
  {
    code: 'OV106',
    name: 'Brindle Row Surgery',
    locality: 'HRN',
    listSize: 4400,
    profile: 'typical',
  },
  {
    code: 'OV107',
    name: 'Moss Hollow Practice',
    locality: 'HRN',
    listSize: 1700,
    profile: 'typical',
  },
  {
    code: 'OV108',
    name: 'Yarrowby Health Centre',
    locality: 'HRN',
    listSize: 11900,
    profile: 'typical',
  },
  {
    code: 'OV201',
    name: 'Cindermere Lakeside Surgery',
    locality: 'CND',
    listSize: 7600,
    profile: 'persistently-low',
  },
  {
    code: 'OV202',
    name: 'Pellow Street Practice',
    locality: 'CND',
    listSize: 3900,
    profile: 'typical',
  },
  {
    code: 'OV203',
    name: 'Marlstone Medical Centre',
    locality: 'CND',
    listSize: 16800,
    profile: 'typical',
  },
  {
    code: 'OV204',
    name: 'Osier Bank Surgery',
    locality: 'CND',
    listSize: 5200,
    profile: 'typical',
  },
  {
    code: 'OV205',
    name: 'Hobthrush Lane Practice',
    locality: 'CND',
    listSize: 2900,
    profile: 'implausible',
  },
  {
    code: 'OV206',
    name: 'Glimmerford Health Centre',
    locality: 'CND',
    listSize: 12600,
    profile: 'typical',
  },
  { code: 'OV207', name: 'Saltcote Surgery', locality: 'CND', listSize: 8300, profile: 'typical' },
  {
    code: 'OV301',
    name: 'Lowbrace Green Practice',
    locality: 'LWB',
    listSize: 10400,
    profile: 'typical',
  },
  {
    code: 'OV302',
    name: 'Tarnside Medical Group',
    locality: 'LWB',
    listSize: 18900,
    profile: 'typical',
  },
  {
    code: 'OV303',
    name: 'Wickerby Road Surgery',
    locality: 'LWB',
    listSize: 3300,
    profile: 'not-submitted',
  },
  {
    code: 'OV304',
    name: 'Kettleholm Practice',
    locality: 'LWB',
    listSize: 6800,
    profile: 'typical',
  },
  {
    code: 'OV305',
    name: 'Ravensbrook Surgery',
    locality: 'LWB',
    listSize: 2100,
    profile: 'typical',
  },
  {
    code: 'OV306',
    name: 'Ambervale Health Centre',
    locality: 'LWB',
    listSize: 13700,
    profile: 'typical',
  },
  {
    code: 'OV307',
    name: 'Drystone Court Practice',
    locality: 'LWB',
    listSize: 5600,
    profile: 'typical',
  },
  { code: 'OV308', name: 'Lintwhite Surgery', locality: 'LWB', listSize: 8900, profile: 'typical' },
  {
    code: 'OV401',
    name: 'Thaskerby Market Surgery',
    locality: 'TSK',
    listSize: 9100,
    profile: 'typical',
  },
  {
    code: 'OV402',
    name: 'Coldharbour Fields Practice',
    locality: 'TSK',
    listSize: 4800,
    profile: 'typical',
  },
  {
    code: 'OV403',
    name: 'Merrow Beck Health Centre',
    locality: 'TSK',
    listSize: 15300,
    profile: 'typical',
  },
  {
    code: 'OV404',
    name: 'Sorrel Hill Surgery',
    locality: 'TSK',
    listSize: 1900,
    profile: 'typical',
  },
  {
    code: 'OV405',
    name: 'Ingleby Thorn Practice',
    locality: 'TSK',
    listSize: 7200,
    profile: 'typical',
  },
  {
    code: 'OV406',
    name: 'Hazelgarth Medical Centre',
    locality: 'TSK',
    listSize: 11200,
    profile: 'typical',
  },
  {
    code: 'OV407',
    name: 'Pinfold Yard Surgery',
    locality: 'TSK',
    listSize: 3600,
    profile: 'typical',
  },
];

export interface DemoUser {
  email: string;
  displayName: string;
  role: 'regional_lead' | 'practice_lead' | 'auditor';
  status?: 'active' | 'deactivated';
  practices?: string[];
}

/** People known to Cairn. The fake sign-in page offers them as personas. */
export const users: DemoUser[] = [
  { email: 'imogen.varley@ostrevale.example', displayName: 'Imogen Varley', role: 'regional_lead' },
  { email: 'tobias.renwick@ostrevale.example', displayName: 'Tobias Renwick', role: 'auditor' },
  {
    email: 'priya.calloway@quarrybank.example',
    displayName: 'Priya Calloway',
    role: 'practice_lead',
    practices: ['OV102'],
  },
  {
    email: 'daniel.oyelaran@harnleigh.example',
    displayName: 'Daniel Oyelaran',
    role: 'practice_lead',
    practices: ['OV103', 'OV101'],
  },
  {
    email: 'ruth.penhallow@cindermere.example',
    displayName: 'Ruth Penhallow',
    role: 'practice_lead',
    practices: ['OV201'],
  },
  {
    email: 'hester.quill@ostrevale.example',
    displayName: 'Hester Quill',
    role: 'practice_lead',
    status: 'deactivated',
    practices: ['OV205'],
  },
];

import { timeZonesNames, tzdbVersion } from '@vvo/tzdb';

/**
 * The time zones a profile can choose: the current IANA names (Asia/Kolkata, Europe/Kyiv…) from
 * @vvo/tzdb, which follows the IANA tz database (`tzdbVersion`), plus UTC, the default of a new
 * account. Node 20's and browsers' `Intl.supportedValuesOf('timeZone')` still answer some outdated
 * names (Asia/Calcutta, Europe/Kiev), so the list does not come from Intl.
 */
export const TIME_ZONES: readonly string[] = ['UTC', ...timeZonesNames];
export const TIME_ZONE_DATA_VERSION = tzdbVersion;

const LISTED = new Set(TIME_ZONES);

/**
 * Outdated and alternative names still sent by older clients or stored before issue 17, each with
 * the listed name of the same place. Source: the IANA tz database's `backward` file (its Link lines,
 * release 2025b as compiled in tzdata.zi); where a 2022+ merge points a link at another country's
 * zone (Iceland → Africa/Abidjan), the name of the same place that CLDR/ICU keeps as the alias
 * (Iceland → Atlantic/Reykjavik) is used instead. A unit test checks every pair shows the same clock.
 */
export const TIME_ZONE_ALIASES: Readonly<Record<string, string>> = {
  'Africa/Asmera': 'Africa/Asmara',
  'Africa/Timbuktu': 'Africa/Bamako',
  'America/Argentina/ComodRivadavia': 'America/Argentina/Catamarca',
  'America/Atka': 'America/Adak',
  'America/Buenos_Aires': 'America/Argentina/Buenos_Aires',
  'America/Catamarca': 'America/Argentina/Catamarca',
  'America/Coral_Harbour': 'America/Atikokan',
  'America/Cordoba': 'America/Argentina/Cordoba',
  'America/Ensenada': 'America/Tijuana',
  'America/Fort_Wayne': 'America/Indiana/Indianapolis',
  'America/Godthab': 'America/Nuuk',
  'America/Indianapolis': 'America/Indiana/Indianapolis',
  'America/Jujuy': 'America/Argentina/Jujuy',
  'America/Knox_IN': 'America/Indiana/Knox',
  'America/Louisville': 'America/Kentucky/Louisville',
  'America/Mendoza': 'America/Argentina/Mendoza',
  'America/Montreal': 'America/Toronto',
  'America/Nipigon': 'America/Toronto',
  'America/Pangnirtung': 'America/Iqaluit',
  'America/Porto_Acre': 'America/Rio_Branco',
  'America/Rainy_River': 'America/Winnipeg',
  'America/Rosario': 'America/Argentina/Cordoba',
  'America/Santa_Isabel': 'America/Tijuana',
  'America/Shiprock': 'America/Denver',
  'America/Thunder_Bay': 'America/Toronto',
  'America/Virgin': 'America/St_Thomas',
  'America/Yellowknife': 'America/Edmonton',
  'Antarctica/South_Pole': 'Antarctica/McMurdo',
  'Asia/Ashkhabad': 'Asia/Ashgabat',
  'Asia/Calcutta': 'Asia/Kolkata',
  'Asia/Choibalsan': 'Asia/Ulaanbaatar',
  'Asia/Chongqing': 'Asia/Shanghai',
  'Asia/Chungking': 'Asia/Shanghai',
  'Asia/Dacca': 'Asia/Dhaka',
  'Asia/Harbin': 'Asia/Shanghai',
  'Asia/Istanbul': 'Europe/Istanbul',
  'Asia/Kashgar': 'Asia/Urumqi',
  'Asia/Katmandu': 'Asia/Kathmandu',
  'Asia/Macao': 'Asia/Macau',
  'Asia/Rangoon': 'Asia/Yangon',
  'Asia/Saigon': 'Asia/Ho_Chi_Minh',
  'Asia/Tel_Aviv': 'Asia/Jerusalem',
  'Asia/Thimbu': 'Asia/Thimphu',
  'Asia/Ujung_Pandang': 'Asia/Makassar',
  'Asia/Ulan_Bator': 'Asia/Ulaanbaatar',
  'Atlantic/Faeroe': 'Atlantic/Faroe',
  'Atlantic/Jan_Mayen': 'Arctic/Longyearbyen',
  'Australia/ACT': 'Australia/Sydney',
  'Australia/Canberra': 'Australia/Sydney',
  'Australia/Currie': 'Australia/Hobart',
  'Australia/LHI': 'Australia/Lord_Howe',
  'Australia/NSW': 'Australia/Sydney',
  'Australia/North': 'Australia/Darwin',
  'Australia/Queensland': 'Australia/Brisbane',
  'Australia/South': 'Australia/Adelaide',
  'Australia/Tasmania': 'Australia/Hobart',
  'Australia/Victoria': 'Australia/Melbourne',
  'Australia/West': 'Australia/Perth',
  'Australia/Yancowinna': 'Australia/Broken_Hill',
  'Brazil/Acre': 'America/Rio_Branco',
  'Brazil/DeNoronha': 'America/Noronha',
  'Brazil/East': 'America/Sao_Paulo',
  'Brazil/West': 'America/Manaus',
  CET: 'Europe/Brussels',
  CST6CDT: 'America/Chicago',
  'Canada/Atlantic': 'America/Halifax',
  'Canada/Central': 'America/Winnipeg',
  'Canada/Eastern': 'America/Toronto',
  'Canada/Mountain': 'America/Edmonton',
  'Canada/Newfoundland': 'America/St_Johns',
  'Canada/Pacific': 'America/Vancouver',
  'Canada/Saskatchewan': 'America/Regina',
  'Canada/Yukon': 'America/Whitehorse',
  'Chile/Continental': 'America/Santiago',
  'Chile/EasterIsland': 'Pacific/Easter',
  Cuba: 'America/Havana',
  EET: 'Europe/Athens',
  EST: 'America/Panama',
  EST5EDT: 'America/New_York',
  Egypt: 'Africa/Cairo',
  Eire: 'Europe/Dublin',
  'Etc/GMT': 'UTC',
  'Etc/GMT+0': 'UTC',
  'Etc/GMT-0': 'UTC',
  'Etc/GMT0': 'UTC',
  'Etc/Greenwich': 'UTC',
  'Etc/UCT': 'UTC',
  'Etc/UTC': 'UTC',
  'Etc/Universal': 'UTC',
  'Etc/Zulu': 'UTC',
  'Europe/Belfast': 'Europe/London',
  'Europe/Kiev': 'Europe/Kyiv',
  'Europe/Nicosia': 'Asia/Nicosia',
  'Europe/Tiraspol': 'Europe/Chisinau',
  'Europe/Uzhgorod': 'Europe/Kyiv',
  'Europe/Zaporozhye': 'Europe/Kyiv',
  GB: 'Europe/London',
  'GB-Eire': 'Europe/London',
  GMT: 'UTC',
  'GMT+0': 'UTC',
  'GMT-0': 'UTC',
  GMT0: 'UTC',
  Greenwich: 'UTC',
  HST: 'Pacific/Honolulu',
  Hongkong: 'Asia/Hong_Kong',
  Iceland: 'Atlantic/Reykjavik',
  Iran: 'Asia/Tehran',
  Israel: 'Asia/Jerusalem',
  Jamaica: 'America/Jamaica',
  Japan: 'Asia/Tokyo',
  Kwajalein: 'Pacific/Kwajalein',
  Libya: 'Africa/Tripoli',
  MET: 'Europe/Brussels',
  MST: 'America/Phoenix',
  MST7MDT: 'America/Denver',
  'Mexico/BajaNorte': 'America/Tijuana',
  'Mexico/BajaSur': 'America/Mazatlan',
  'Mexico/General': 'America/Mexico_City',
  NZ: 'Pacific/Auckland',
  'NZ-CHAT': 'Pacific/Chatham',
  Navajo: 'America/Denver',
  PRC: 'Asia/Shanghai',
  PST8PDT: 'America/Los_Angeles',
  'Pacific/Enderbury': 'Pacific/Kanton',
  'Pacific/Johnston': 'Pacific/Honolulu',
  'Pacific/Ponape': 'Pacific/Pohnpei',
  'Pacific/Samoa': 'Pacific/Pago_Pago',
  'Pacific/Truk': 'Pacific/Chuuk',
  'Pacific/Yap': 'Pacific/Chuuk',
  Poland: 'Europe/Warsaw',
  Portugal: 'Europe/Lisbon',
  ROC: 'Asia/Taipei',
  ROK: 'Asia/Seoul',
  Singapore: 'Asia/Singapore',
  Turkey: 'Europe/Istanbul',
  UCT: 'UTC',
  'US/Alaska': 'America/Anchorage',
  'US/Aleutian': 'America/Adak',
  'US/Arizona': 'America/Phoenix',
  'US/Central': 'America/Chicago',
  'US/East-Indiana': 'America/Indiana/Indianapolis',
  'US/Eastern': 'America/New_York',
  'US/Hawaii': 'Pacific/Honolulu',
  'US/Indiana-Starke': 'America/Indiana/Knox',
  'US/Michigan': 'America/Detroit',
  'US/Mountain': 'America/Denver',
  'US/Pacific': 'America/Los_Angeles',
  'US/Samoa': 'Pacific/Pago_Pago',
  Universal: 'UTC',
  'W-SU': 'Europe/Moscow',
  WET: 'Europe/Lisbon',
  Zulu: 'UTC',
};

/** Fixed-offset zones (Etc/GMT+5 is five hours behind UTC): current IANA names, kept valid though not listed. */
const FIXED_OFFSET = /^Etc\/GMT[+-](?:[0-9]|1[0-4])$/;

/**
 * The name a time zone is stored and shown under: a listed name as it is, an outdated one as its
 * current name (Asia/Calcutta → Asia/Kolkata), or null for a name that is no time zone.
 */
export function canonicalTimeZone(name: string): string | null {
  if (LISTED.has(name)) return name;
  const alias = Object.hasOwn(TIME_ZONE_ALIASES, name) ? TIME_ZONE_ALIASES[name] : undefined;
  if (alias) return alias;
  if (FIXED_OFFSET.test(name)) {
    try {
      new Intl.DateTimeFormat('en', { timeZone: name });
      return name;
    } catch {
      return null;
    }
  }
  return null;
}

/**
 * Word lists the normalizers use. All entries are folded (lowercase, no dots). The lists are
 * common practice for English-language records of the late 19th and early 20th century:
 * honorifics and ranks, generational suffixes, clerks' abbreviations of given names, legal forms
 * of firms, and place-name abbreviations.
 */

/**
 * A word list as a lookup table without a prototype, so that a word such as "constructor" or
 * "tostring" looks up nothing (in a plain object it finds Object's own members: "Pell
 * Constructor" once normalized to "pell function Object() { [native code] }").
 */
function table<T>(entries: Record<string, T>): Readonly<Record<string, T>> {
  return Object.freeze(Object.assign(Object.create(null) as Record<string, T>, entries));
}

/** Titles, ranks and courtesy words that precede a person's name and are not part of it. */
export const HONORIFICS: ReadonlySet<string> = new Set([
  "mr",
  "mrs",
  "miss",
  "ms",
  "mssrs",
  "messrs",
  "master",
  "madam",
  "mme",
  "mlle",
  "dr",
  "doctor",
  "rev",
  "revd",
  "reverend",
  "fr",
  "father",
  "canon",
  "bishop",
  "capt",
  "captain",
  "cpt",
  "col",
  "colonel",
  "maj",
  "major",
  "gen",
  "general",
  "lt",
  "lieut",
  "lieutenant",
  "sgt",
  "sergeant",
  "cmdr",
  "commander",
  "adm",
  "admiral",
  "cdr",
  "hon",
  "honourable",
  "honorable",
  "sir",
  "dame",
  "lady",
  "lord",
  "prof",
  "professor",
  "esq",
  "esquire",
  "alderman",
  "ald",
  "judge",
  "justice",
  "supt",
  "superintendent",
  "insp",
  "inspector",
  "mayor",
  "widow",
  "the",
  "late",
]);

/**
 * Letters written after a person's name for a service, office, honour or degree ("Capt. W.
 * Harland, R.N.", "Thos. Pell, J.P.", "E. Moorhouse, M.D.", "Sir J. Kell, Bart."), folded without
 * their dots: not part of the name. Common practice of period directories, gazettes and lists;
 * the list from memory.
 */
export const POST_NOMINALS: ReadonlySet<string> = new Set([
  // services
  "rn",
  "rnr",
  "rm",
  "ra",
  "re",
  // offices
  "mp",
  "jp",
  "dl",
  "kc",
  "qc",
  "ws",
  // honours and ranks of the peerage and orders
  "bart",
  "bt",
  "kg",
  "kt",
  "vc",
  "cb",
  "kcb",
  "gcb",
  "cmg",
  "kcmg",
  "cbe",
  "obe",
  "mbe",
  "dso",
  "mc",
  // degrees and professional bodies
  "ba",
  "ma",
  "bsc",
  "msc",
  "dsc",
  "phd",
  "lld",
  "dd",
  "md",
  "mb",
  "frs",
  "fsa",
  "frcs",
  "mrcs",
  "lrcp",
  "mrcp",
  "mice",
  "riba",
  "fras",
  "frgs",
]);

/** Honorifics that say the person named is a woman ("Mrs. Lumb", "Miss Tattersall", "Widow Kell"). */
export const FEMALE_HONORIFICS: ReadonlySet<string> = new Set([
  "mrs",
  "miss",
  "ms",
  "madam",
  "mme",
  "mlle",
  "dame",
  "lady",
  "widow",
]);

/** Honorifics that say the person named is a man ("Mr. Lumb", "Sir J. Kell"). */
export const MALE_HONORIFICS: ReadonlySet<string> = new Set(["mr", "sir", "lord", "master"]);

/**
 * Common English given names of men and of women in records of 1800-1930, folded, the clerks'
 * short forms expanded (see GIVEN_NAME_ABBREVIATIONS): enough to tell that "Mrs. Lumb" is not
 * James Thomas Lumb but may be Ada Lumb. Names given to both (Frances/Francis aside, "Sidney",
 * "Cecil", "Leslie") are in neither list. From memory; common practice of record linkage of
 * the period, which compares sexes where the records give them.
 */
export const MALE_GIVEN_NAMES: ReadonlySet<string> = new Set(
  (
    "john william thomas james george charles joseph henry robert edward samuel richard frederick " +
    "arthur alfred walter albert harry francis ernest herbert david daniel benjamin isaac peter " +
    "matthew michael stephen edwin frank fred tom jack jacob josiah ezra tobias abraham enoch jonas " +
    "amos hugh ralph roger philip lewis louis alexander andrew patrick christopher nathaniel elijah " +
    "edmund harold percy horace leonard reginald wilfred willie jim ben sam dick bill ned ted nathan " +
    "simon oliver jonathan timothy anthony mark luke paul silas seth eli caleb moses aaron adam owen " +
    "evan ebenezer jabez jeremiah zachariah job noah levi reuben joshua gilbert bernard victor"
  ).split(" "),
);
export const FEMALE_GIVEN_NAMES: ReadonlySet<string> = new Set(
  (
    "mary elizabeth sarah ann anne annie jane margaret ellen emma alice martha hannah eliza emily " +
    "ada edith florence agnes catherine kate susan harriet charlotte lucy ruth rose clara louisa " +
    "fanny frances isabella maria esther rachel rebecca dorothy grace ethel lilian lily maud mabel " +
    "gertrude amelia caroline matilda julia helen betsy nancy jessie janet bridget phoebe hester " +
    "priscilla louise minnie nellie winifred beatrice violet ivy elsie doris sophia jemima keziah " +
    "mercy patience prudence lydia marian marion alma bertha ida olive"
  ).split(" "),
);

/**
 * Pet forms of English given names and the names they stand for ("Tom" Thomas, "Polly" Mary,
 * "Hal" Henry): two given names so related are one person's. From memory; common practice of
 * record linkage of the period.
 */
export const PET_NAMES: Readonly<Record<string, readonly string[]>> = table({
  tom: ["thomas"],
  tommy: ["thomas"],
  harry: ["henry", "harold"],
  hal: ["henry"],
  hen: ["henry"],
  jack: ["john"],
  johnny: ["john"],
  bill: ["william"],
  billy: ["william"],
  will: ["william"],
  willie: ["william"],
  ned: ["edward", "edmund", "edwin"],
  ted: ["edward", "theodore"],
  ed: ["edward", "edmund", "edwin"],
  dick: ["richard"],
  bob: ["robert"],
  rob: ["robert"],
  bert: ["albert", "herbert", "bertram"],
  jim: ["james"],
  jimmy: ["james"],
  jem: ["james", "jeremiah"],
  joe: ["joseph"],
  sam: ["samuel"],
  ben: ["benjamin"],
  fred: ["frederick", "alfred"],
  alf: ["alfred"],
  charlie: ["charles"],
  dan: ["daniel"],
  dave: ["david"],
  frank: ["francis"],
  nat: ["nathaniel"],
  kit: ["christopher", "catherine"],
  polly: ["mary"],
  molly: ["mary"],
  mamie: ["mary"],
  betsy: ["elizabeth"],
  betty: ["elizabeth"],
  bess: ["elizabeth"],
  lizzie: ["elizabeth"],
  eliza: ["elizabeth"],
  kate: ["catherine", "katherine"],
  kitty: ["catherine", "katherine"],
  nan: ["ann", "anne"],
  nancy: ["ann", "anne"],
  annie: ["ann", "anne"],
  sally: ["sarah"],
  peggy: ["margaret"],
  maggie: ["margaret"],
  meg: ["margaret"],
  nell: ["ellen", "helen", "eleanor"],
  nellie: ["ellen", "helen", "eleanor"],
  fanny: ["frances"],
  patty: ["martha"],
  patsy: ["martha"],
  jenny: ["jane", "janet"],
  sukey: ["susan", "susannah"],
  sue: ["susan", "susannah"],
  hetty: ["hester", "henrietta"],
  dolly: ["dorothy"],
  jemmy: ["james"],
});

/** Generational suffixes: removed from the matching key, kept as a separate field. */
export const GENERATIONAL: Readonly<Record<string, string>> = table({
  jr: "jr",
  jnr: "jr",
  junior: "jr",
  jun: "jr",
  junr: "jr",
  sr: "sr",
  snr: "sr",
  senior: "sr",
  sen: "sr",
  senr: "sr",
  ii: "ii",
  iii: "iii",
  iv: "iv",
  elder: "sr",
  younger: "jr",
});

/** Period clerks' abbreviations of given names ("Jno." for John, "Wm." for William). */
export const GIVEN_NAME_ABBREVIATIONS: Readonly<Record<string, string>> = table({
  jno: "john",
  jn: "john",
  wm: "william",
  willm: "william",
  chas: "charles",
  thos: "thomas",
  geo: "george",
  jas: "james",
  robt: "robert",
  edw: "edward",
  edwd: "edward",
  benj: "benjamin",
  saml: "samuel",
  richd: "richard",
  hy: "henry",
  jos: "joseph",
  danl: "daniel",
  alexr: "alexander",
  alex: "alexander",
  fredk: "frederick",
  fred: "frederick",
  nathl: "nathaniel",
  theo: "theodore",
  abm: "abraham",
  eliz: "elizabeth",
  margt: "margaret",
  mary: "mary",
});

/**
 * Legal-form and firm-structure words. Each maps to a canonical spelling; all are removed from the
 * matching key of an organization (after its first word) and kept (canonical) in its full form.
 * Besides the English ones, the forms registers and filings of other countries give after a firm's
 * name (from memory; common practice of company-name matching): German GmbH, AG, KG, OHG, UG;
 * French SARL, SAS, SASU, EURL; Spanish and Portuguese S.L., S.L.U., S.A.U., Ltda., Cía.; Italian
 * S.p.A., S.r.l.; Dutch and Belgian N.V., B.V., BVBA; Nordic AB, Oy, Oyj, ASA, hf.; Czech and
 * Slovak s.r.o., a.s.; Hungarian Kft., Zrt., Nyrt.; Balkan d.o.o., d.d., OOD, EOOD; Baltic SIA,
 * UAB; Russian and neighbouring OOO, OAO, ZAO, PAO, JSC and its variants; Malaysian Bhd.,
 * Indonesian Tbk., Japanese K.K.; Australian, Singaporean and Indian Pty, Pte, Pvt.; Gulf Q.S.C.,
 * Q.C.S.C., B.S.C., K.S.C., K.S.C.P., S.A.O.G., S.A.O.C., W.L.L., Jordanian P.S.C. And words of a
 * firm's structure that registers add to the name in use: "Group", "Holding(s)" ("Qatar Airways
 * Group Q.C.S.C." for Qatar Airways; common practice of company-name matching).
 */
export const LEGAL_FORMS: Readonly<Record<string, string>> = table({
  co: "co",
  coy: "co",
  company: "co",
  cos: "co",
  ltd: "ltd",
  limited: "ltd",
  lim: "ltd",
  inc: "inc",
  incorporated: "inc",
  corp: "corp",
  corporation: "corp",
  plc: "plc",
  llc: "llc",
  llp: "llp",
  sons: "sons",
  son: "son",
  bros: "bros",
  brothers: "bros",
  bro: "bros",
  cie: "co",
  gmbh: "gmbh",
  ag: "ag",
  sa: "sa",
  nv: "nv",
  bv: "bv",
  lp: "lp",
  pllc: "pllc",
  pty: "pty",
  pvt: "pvt",
  kg: "kg",
  ohg: "ohg",
  ug: "ug",
  sarl: "sarl",
  sas: "sas",
  sasu: "sasu",
  eurl: "eurl",
  sl: "sl",
  slu: "slu",
  sau: "sau",
  ltda: "ltda",
  cia: "co",
  spa: "spa",
  srl: "srl",
  bvba: "bvba",
  ab: "ab",
  abp: "abp",
  oy: "oy",
  oyj: "oyj",
  asa: "asa",
  hf: "hf",
  ehf: "ehf",
  sro: "sro",
  kft: "kft",
  zrt: "zrt",
  nyrt: "nyrt",
  doo: "doo",
  dd: "dd",
  ood: "ood",
  eood: "eood",
  sia: "sia",
  uab: "uab",
  ooo: "ooo",
  oao: "oao",
  zao: "zao",
  pao: "pao",
  jsc: "jsc",
  ojsc: "ojsc",
  cjsc: "cjsc",
  pjsc: "pjsc",
  bhd: "bhd",
  tbk: "tbk",
  kk: "kk",
  ltee: "ltd",
  qsc: "qsc",
  qcsc: "qcsc",
  bsc: "bsc",
  ksc: "ksc",
  kscp: "kscp",
  saog: "saog",
  saoc: "saoc",
  wll: "wll",
  psc: "psc",
  group: "group",
  holding: "holding",
  holdings: "holding",
  and: "and",
});

/**
 * Legal forms that are also words or abbreviations of another sense, read as legal forms only as
 * a firm name's last words: Danish and Norwegian A/S and AS, Czech and Slovak a.s. (all "as" once
 * folded: "Air Greenland A/S", "Smartwings, a.s."), Indonesian PT written after the name
 * ("Sriwijaya Air PT"; before a name "Pt." is Port). From memory; common practice of
 * company-name matching.
 */
export const CLOSING_LEGAL_FORMS: Readonly<Record<string, string>> = table({
  as: "as",
  pt: "pt",
});

/**
 * Legal forms of several words as a name's tokens spell them once folded ("Sp. z o.o." ->
 * "sp zoo", "S.A. de C.V." -> "sa de cv", "Sdn. Bhd."), each with its canonical form: removed
 * from an organization's key after its first word, as LEGAL_FORMS are. "Pte" is read as a legal
 * form only so, before "Ltd" (elsewhere it is "Pointe").
 */
export const LEGAL_FORM_PHRASES: ReadonlyArray<readonly [readonly string[], string]> = [
  [["sa", "de", "cv"], "sadecv"],
  [["de", "cv"], "cv"],
  [["s", "de", "rl"], "sderl"],
  [["sp", "zoo"], "spzoo"],
  [["spol", "sro"], "sro"],
  [["sh", "pk"], "shpk"],
  [["bsc", "c"], "bsc"],
  [["sdn", "bhd"], "sdnbhd"],
  [["pte", "ltd"], "pte"],
  [["pte", "limited"], "pte"],
  [["gmbh", "co", "kg"], "gmbhcokg"],
  [["open", "joint", "stock", "company"], "ojsc"],
  [["closed", "joint", "stock", "company"], "cjsc"],
  [["public", "joint", "stock", "company"], "pjsc"],
  [["joint", "stock", "company"], "jsc"],
  [["limited", "liability", "company"], "llc"],
  [["public", "limited", "company"], "plc"],
];

/**
 * Legal forms written before a firm's name (Russian and neighbouring registers: OJSC "Tajik Air",
 * OOO "Romashka"; the phrases spelled out): removed from the key when a name follows.
 */
export const LEADING_LEGAL_FORMS: ReadonlySet<string> = new Set([
  "ooo",
  "oao",
  "zao",
  "pao",
  "jsc",
  "ojsc",
  "cjsc",
  "pjsc",
]);

/** Place-name abbreviations, expanded for locations (and for organizations named after places). */
export const PLACE_ABBREVIATIONS: Readonly<Record<string, string>> = table({
  st: "saint",
  ste: "sainte",
  ft: "fort",
  pt: "port",
  mt: "mount",
  mtn: "mountain",
  pte: "pointe",
  hts: "heights",
  jct: "junction",
  isl: "island",
  riv: "river",
  upr: "upper",
  lwr: "lower",
});

/**
 * Head words of a place designator: the "Republic of" in "Republic of Korea", the "City of" in
 * "City of Thornford". A leading "<head> of [the]" phrase is set aside from a place's key (and
 * kept in its full form), as legal forms are from a firm's: official and short names then share a
 * key. Common practice of gazetteers and country lists. (In "United States of America" and
 * "United Kingdom of..." the designator is the name people use: see designatorLength.)
 */
export const PLACE_DESIGNATOR_HEADS: ReadonlySet<string> = new Set([
  "republic",
  "kingdom",
  "state",
  "commonwealth",
  "principality",
  "duchy",
  "sultanate",
  "emirate",
  "territory",
  "city",
  "town",
  "township",
  "borough",
  "village",
  "county",
  "parish",
  "province",
  "district",
  "municipality",
  "states",
  "federation",
  "union",
  "nation",
  "dominion",
  "colony",
  "protectorate",
  "canton",
  "department",
  "collectivity",
  "bailiwick",
]);

/**
 * Words that may precede a designator head inside the phrase ("Federal Republic of",
 * "Democratic People's Republic of", "Grand Duchy of", "Independent State of").
 */
export const PLACE_DESIGNATOR_MODIFIERS: ReadonlySet<string> = new Set([
  "democratic",
  "peoples",
  "federal",
  "federative",
  "federated",
  "united",
  "socialist",
  "islamic",
  "arab",
  "plurinational",
  "bolivarian",
  "oriental",
  "independent",
  "sovereign",
  "cooperative",
  "co",
  "operative",
  "hashemite",
  "grand",
  "royal",
  "free",
  "and",
]);

/**
 * Words that give the kind of an administrative area after its name ("Bhola District", "Ivanovo
 * Oblast", "Najaf Governorate"), in English and as English texts carry them over from other
 * languages (oblast, krai, okrug, raion/rayon, voivodeship: from memory).
 * Not "city" or "town", which end names ("Mexico City", "Cape Town"). Common practice of
 * gazetteers, which list the name and give the kind apart. Read by the "kind" match of
 * src/score/features.ts, for places whose record gives no kind of its own.
 */
export const PLACE_KIND_WORDS: ReadonlySet<string> = new Set([
  "district",
  "province",
  "county",
  "parish",
  "municipality",
  "department",
  "governorate",
  "prefecture",
  "region",
  "state",
  "territory",
  "canton",
  "commune",
  "division",
  "zone",
  "emirate",
  "oblast",
  "krai",
  "kray",
  "okrug",
  "raion",
  "rayon",
  "voivodeship",
]);

/**
 * Words for a particular kind of place: PLACE_KIND_WORDS and the kinds of settlements and lands.
 * A place whose record gives one of them (its type "town", its category "Province") has a kind
 * of its own, and takes no other from PLACE_KIND_WORDS.
 */
export const PARTICULAR_PLACE_KINDS: ReadonlySet<string> = new Set([
  ...PLACE_KIND_WORDS,
  "city",
  "town",
  "village",
  "hamlet",
  "township",
  "settlement",
  "borough",
  "country",
  "nation",
  "island",
  "port",
  "capital",
]);

/**
 * Table types that name no particular kind of place: a table of "region" or "subdivision" rows
 * holds districts and provinces alike, so such a type says nothing of a row's kind.
 */
export const GENERIC_PLACE_TYPES: ReadonlySet<string> = new Set([
  "region",
  "place",
  "location",
  "loc",
  "gpe",
  "geo",
  "area",
  "subdivision",
  "division",
  "territory",
  "administrative",
  "admin",
  "unit",
]);

/**
 * Heads of a trailing place designator, the "Federation" of "Russian Federation" and the
 * "Republic" of "Czech Republic": set aside like a leading one, so "Russia" meets "russian" and
 * "Czechia" meets "czech" by similarity. Only these three: a trailing "Kingdom" or "States" is
 * the name itself ("United Kingdom").
 */
export const TRAILING_DESIGNATOR_HEADS: ReadonlySet<string> = new Set([
  "republic",
  "federation",
  "confederation",
]);

/** Modifiers that may precede a trailing head ("Arab Republic", "People's Democratic Republic"). */
export const TRAILING_DESIGNATOR_MODIFIERS: ReadonlySet<string> = new Set([
  "democratic",
  "peoples",
  "federal",
  "socialist",
  "islamic",
  "arab",
  "cooperative",
  "popular",
]);

/**
 * Abbreviated designator words, read as the word inside a designator phrase only ("Rep. of
 * Korea", "Fed. Rep. of Germany", "Twp. of Marsh"); elsewhere they stay as written.
 */
export const DESIGNATOR_ABBREVIATIONS: Readonly<Record<string, string>> = table({
  rep: "republic",
  repub: "republic",
  fed: "federal",
  dem: "democratic",
  twp: "township",
  prov: "province",
  terr: "territory",
  boro: "borough",
  dept: "department",
  dist: "district",
});

/** Joiner words skipped when forming an acronym ("Bank of the Delta" -> "bd"). */
export const ACRONYM_SKIP: ReadonlySet<string> = new Set([
  "and",
  "of",
  "the",
  "de",
  "la",
  "du",
  "von",
  "van",
  "for",
  "&",
]);

/**
 * Prefixes of vessel names (steamship, paddle steamer, screw steamer, steam yacht, motor vessel,
 * His/Her Majesty's Ship, Royal Mail Ship...), removed from the key of "other" entities.
 */
export const VESSEL_PREFIXES: ReadonlySet<string> = new Set([
  "ss",
  "ps",
  "ts",
  "tss",
  "sy",
  "mv",
  "ms",
  "hms",
  "hmy",
  "rms",
  "smy",
  "sv",
  "schooner",
  "barque",
  "brig",
  "ketch",
  "barge",
  "steamer",
  "tug",
  "yacht",
]);

/**
 * Words that set a name against another that differs from it by a word of the same kind: a
 * compass point ("Matabeleland South" / "Matabeleland North", "Sud-Est" / "Sud-Ouest"), a level
 * ("Upper" / "Lower", "Haut-Rhin" / "Bas-Rhin", "Alta" / "Baja Verapaz"), a size ("Great" /
 * "Little Ashcombe"), an age ("Old" / "New"), "Inner" / "Outer". Such names are two places or
 * two bodies, never a slip of one for the other. Each word maps to its kind and its value, so that
 * spellings of one value ("Centre", "Central") do not contrast. English and the words English
 * texts carry over from French, Spanish, Portuguese, Italian and German place names (from
 * memory); French "sur" (on) is left out.
 */
export const CONTRASTING_WORDS: Readonly<Record<string, readonly [string, string]>> = (() => {
  const out: Record<string, readonly [string, string]> = {};
  const put = (kind: string, value: string, words: string[]) => {
    for (const w of words) out[w] = [kind, value];
  };
  put("compass", "n", ["north", "northern", "nord", "norte", "norden", "settentrionale"]);
  put("compass", "s", ["south", "southern", "sud", "meridionale"]);
  put("compass", "e", ["east", "eastern", "est", "este", "oriental", "orientale", "ost"]);
  put("compass", "w", ["west", "western", "ouest", "oeste", "occidental", "occidentale"]);
  put("compass", "c", ["central", "centre", "center", "centro", "middle", "mid"]);
  put("compass", "ne", ["northeast", "northeastern"]);
  put("compass", "nw", ["northwest", "northwestern"]);
  put("compass", "se", ["southeast", "southeastern"]);
  put("compass", "sw", ["southwest", "southwestern"]);
  put("level", "upper", ["upper", "haut", "haute", "alta", "alto", "superior", "ober"]);
  put("level", "lower", ["lower", "bas", "basse", "baja", "bajo", "inferior", "unter", "nieder"]);
  put("size", "great", ["great", "greater", "grand", "grande", "big"]);
  put("size", "little", ["little", "lesser", "petit", "petite", "small"]);
  put("age", "old", ["old"]);
  put("age", "new", ["new", "nouveau", "nouvelle", "nuevo", "nueva", "neu", "novo", "nova"]);
  put("ring", "inner", ["inner"]);
  put("ring", "outer", ["outer"]);
  return table(out);
})();

/**
 * What a lone initial stands for before a word written short in a place's name: a compass point,
 * or "New" ("N. Dak." North Dakota, "W. Va." West Virginia, "N. Mex." New Mexico). Common practice
 * of press and postal abbreviations (from memory). Read only beside a word cut off by a period.
 */
export const COMPASS_INITIALS: Readonly<Record<string, readonly string[]>> = table({
  n: ["north", "new"],
  s: ["south"],
  e: ["east"],
  w: ["west"],
});

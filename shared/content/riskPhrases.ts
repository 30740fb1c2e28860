/**
 * Words and phrases that suggest thoughts of suicide or self-harm, in English, used to offer a calm card with Help now and
 * the safety plan (DESIGN.md, Safety). The card never blocks, so a rare false hit costs little and a miss costs more.
 *
 * Source: no published list is used. The phrases follow common practice in screening free text (direct statements of
 * wanting to die or to hurt oneself, common euphemisms, plain self-harm terms), with guards against everyday idioms such as
 * "killing it at work" or "shot myself in the foot". The list must be reviewed with clinicians before it ships, and
 * again whenever it changes. It finds words, not risk: it can neither confirm nor rule out that someone is unsafe.
 */

/** Date the list was last changed; a clinician review should be recorded beside it. */
export const riskPhrasesChangedOn = '2026-12-01'

export interface RiskPattern {
  /** What the pattern looks for, in plain words, for reviewers. */
  label: string
  /** Matched against normaliseRiskText output: lower case words split by single spaces, "." between sentences. */
  pattern: RegExp
}

const notAnIdiom = '(?! (laughing|with laughter|of laughter|of embarrassment|from embarrassment|of boredom|happy))'
// Only words of wanting or planning: "I might hurt myself on that ladder" is an accident, not intent.
const intent =
  '(want|wants|wanted|wanting|urge|urges|tempted|plan|planning|planned|thinking about|thinking of|thought about|thoughts of|feel like|felt like|feeling like|wish i could|tried|trying)'
const sentenceEnd = '(?= \\.|$)'

export const riskPatterns: readonly RiskPattern[] = [
  { label: 'suicide', pattern: /\bsuicid(e|es|al|ality)\b(?! squad)/ },
  { label: 'kill myself', pattern: new RegExp(`\\b(kill|killing|killed) myself\\b${notAnIdiom}`) },
  { label: 'unalive myself', pattern: /\bunalive myself\b/ },
  { label: 'end my life', pattern: /\b(end|ending|ended|take|taking|took|taken) my (own )?life\b(?! (back|into|in hand))/ },
  { label: 'end it all', pattern: /\b(end|ending) it all\b/ },
  { label: 'ending things', pattern: /\b(think|thinking|thought|thoughts)( about| of)? (end|ending) (things|everything)\b(?! (with|between|off))/ },
  { label: 'want to die', pattern: new RegExp(`\\b(want|wanted|wanting|wish i could|deserve) to die\\b${notAnIdiom}`) },
  { label: 'wish I was dead', pattern: /\bwish (i was|i were|i could be|to be) (dead|not alive)\b/ },
  { label: 'want to be dead', pattern: /\b(want|wanted) to be dead\b/ },
  { label: 'wish I had never been born', pattern: /\bwish i (had|d) never been born\b/ },
  { label: 'better off dead', pattern: /\bbetter off dead\b/ },
  { label: 'better off without me', pattern: /\bbetter off without me\b|\b(everyone|they|the world|my family) would be (better|happier) without me\b/ },
  { label: 'no reason to live', pattern: /\bno (reason|point) (to live|in living|living|to go on|in going on)\b(?! (in|near|with|at|there|here|on|by|abroad))/ },
  { label: 'nothing to live for', pattern: /\bnothing (left )?to live for\b/ },
  { label: 'not worth living', pattern: /\b(not|isnt|no longer|never) (really )?worth living\b|\b(doesnt|does not) (feel|seem) worth living\b/ },
  { label: 'not want to be here anymore', pattern: /\b(dont|do not|didnt|did not) want to (be here|be around|exist|be alive|go on) (anymore|any more|no more)\b/ },
  { label: 'not want to be alive', pattern: /\b(dont|do not) want to (be alive|exist)\b/ },
  { label: 'not want to live', pattern: new RegExp(`\\b(dont|do not) want to live( anymore| any more| no more)?${sentenceEnd}`) },
  { label: 'not want to live anymore', pattern: /\b(dont|do not) want to live (anymore|any more|no more)\b/ },
  { label: 'not want to wake up', pattern: /\b(dont|do not) want to wake up(?= \.|$| again| anymore| any more| ever)/ },
  { label: 'never wake up', pattern: /\b(wish i (would|could|wouldnt|didnt)( just)?( go to sleep and| sleep and| fall asleep and)? (not|never) wake up|hope i (dont|do not|never) wake up)\b/ },
  { label: 'cannot go on living', pattern: /\b(cant|cannot|can not) (go on|keep) (living|anymore|any more)\b/ },
  { label: 'hurt myself (intent)', pattern: new RegExp(`\\b${intent}( to)? (hurt|hurting|harm|harming|burn|burning) myself\\b`) },
  { label: 'cut myself (intent)', pattern: new RegExp(`\\b${intent}( to)? (cut|cutting) myself\\b(?! (a|an|some|off|free|loose|short|slack))`) },
  { label: 'harm myself', pattern: /\bharm(ing|ed)? myself\b/ },
  { label: 'hurt myself on purpose', pattern: /\b(hurt|hurting|cut|cutting|burnt|burned|burn|burning|hit|hitting) myself (on purpose|deliberately)\b/ },
  {
    label: 'cutting myself',
    pattern: /\bcutting myself\b(?! (shaving|while|when|on|by accident|accidentally|chopping|cooking|slicing|off|some|a|slack|short|free|loose|out))/,
  },
  { label: 'cutting again', pattern: /\b(been|started|start|starting|am|im|was|keep|back to) cutting again\b/ },
  { label: 'self-harm', pattern: /\bself ?(harm|harming|harmed|injury|injuring|injure|mutilation)\b/ },
  { label: 'slit my wrists', pattern: /\b(slit|slitting|cut|cutting|slash|slashing) my wrists?\b/ },
  { label: 'hang myself', pattern: /\b(hang|hanging|hanged) myself\b/ },
  { label: 'shoot myself', pattern: /\b(shoot|shooting) myself\b(?! in the (foot|feet))/ },
  {
    label: 'overdose',
    pattern:
      /\b((take|taking|took|taken|have|had|thinking of|thought of|thinking about) an overdose|overdos(e|ed|ing) on (my )?(pills|tablets|meds|medication|medicine|painkillers|paracetamol|sleeping pills))\b/,
  },
  { label: 'in front of a train', pattern: /\b((throw|throwing) myself|jump|jumping) in front of (a |the )?(train|bus|car|lorry|truck|traffic)\b/ },
  { label: 'jump off', pattern: /\b(jump|jumping|throw myself) off (a |the )?(bridge|building|roof|balcony)\b/ },
]

/**
 * Lower-cases and tidies text for matching: curly and straight apostrophes are dropped ("don't" → "dont"), "wanna" and
 * "gonna" are spelt out, "my self" is joined, sentence punctuation becomes " . ", any other symbol a space, and runs of
 * spaces one space.
 */
export function normaliseRiskText(text: string): string {
  return text
    .normalize('NFKC')
    .toLowerCase()
    .replace(/[\u2019\u2018\u02bc'`´]/g, '')
    .replace(/\bwanna\b/g, 'want to')
    .replace(/\bgonna\b/g, 'going to')
    .replace(/\bmy self\b/g, 'myself')
    .replace(/[.!?;:\n\r]+/g, ' . ')
    .replace(/[^\p{L}\p{N}.]+/gu, ' ')
    .replace(/\s+/g, ' ')
    .trim()
}

/**
 * Looks for risk language in a piece of writing. Returns whether any phrase matched and the matched words (normalised,
 * each once), so the app can offer Help now and the safety plan. Never stores or sends the text.
 */
export function findRiskLanguage(text: string): { matched: boolean; phrases: string[] } {
  const clean = normaliseRiskText(text)
  const phrases: string[] = []
  for (const { pattern } of riskPatterns) {
    const hit = pattern.exec(clean)
    if (hit && !phrases.includes(hit[0])) phrases.push(hit[0])
  }
  return { matched: phrases.length > 0, phrases }
}

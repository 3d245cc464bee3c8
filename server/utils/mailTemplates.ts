// Plain-text messages. Names are interpolated as text; nothing is rendered as HTML.

const signature = '\n\nClear skies,\nShadowline\n'

// A message with a link is worth sending only while the link works (server/utils/tokens.ts); the others are
// worth sending however late.
const HOUR_MS = 60 * 60 * 1000

export function verificationMail(name: string, link: string) {
  return {
    subject: 'Confirm your Shadowline e-mail address',
    usefulForMs: 48 * HOUR_MS,
    text: `Hello ${name},\n\nPlease confirm this address to start logging and sketching observations:\n\n${link}\n\nThe link works once and expires in 48 hours. If you did not sign up, ignore this message.${signature}`,
  }
}

export function existingAccountMail(name: string, resetLink: string) {
  return {
    subject: 'Someone tried to sign up with your address',
    usefulForMs: HOUR_MS,
    text: `Hello ${name},\n\nSomeone tried to create a Shadowline account with this e-mail address, which already has one. If it was you, sign in instead, or choose a new password here:\n\n${resetLink}\n\nIf it was not you, nothing has changed and you can ignore this message.${signature}`,
  }
}

export function passwordResetMail(name: string, link: string) {
  return {
    subject: 'Choose a new Shadowline password',
    usefulForMs: HOUR_MS,
    text: `Hello ${name},\n\nUse this link to choose a new password:\n\n${link}\n\nThe link works once and expires in one hour. If you did not ask for it, ignore this message; your password stays as it is.${signature}`,
  }
}

export function passwordChangedMail(name: string) {
  return {
    subject: 'Your Shadowline password was changed',
    text: `Hello ${name},\n\nThe password of your Shadowline account was just changed. If this was not you, reset it at once and tell your group's moderator.${signature}`,
  }
}

const DECISION_WORDS = {
  approve: { subject: 'Your sketch is in the atlas', lead: 'A moderator approved your sketch; it is now in the shared atlas.' },
  return: { subject: 'Your sketch was returned with comments', lead: 'A moderator returned your sketch with comments. Improve it and submit it again when you are ready.' },
  withdraw: { subject: 'Your sketch was withdrawn from the atlas', lead: 'A moderator withdrew your sketch from the atlas.' },
} as const

/** `atlasLink` is the published atlas page, given for an approval. */
export function decisionMail(name: string, decision: keyof typeof DECISION_WORDS, observedOn: string, comment: string, link: string, atlasLink?: string) {
  const words = DECISION_WORDS[decision]
  const said = comment.trim() ? `\n\nThe moderator wrote:\n\n${comment.trim()}` : ''
  const published = atlasLink ? `\n\nSee it in the atlas: ${atlasLink}` : ''
  return {
    subject: words.subject,
    text: `Hello ${name},\n\n${words.lead} (observation of ${observedOn})${said}${published}\n\nSee your entries: ${link}${signature}`,
  }
}

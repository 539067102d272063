/** What a person with a wrong, cut-off or used invitation link reads (one wording for every case). */
export const INVALID_INVITATION = 'This invitation link is not valid. Ask an administrator for a new one.';

/** Plain-text and HTML bodies of the account e-mails. */
function escapeHtml(s: string) {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

function layout(paragraphs: string[], link: { href: string; label: string }) {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join("");
  return `<!doctype html><html><body style="font-family:sans-serif;color:#1f2933">${body}<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p><p style="color:#66788a;font-size:12px">Partproof</p></body></html>`;
}

export function invitationEmail({ inviterName, workspaceName, link, expiresHours }: { inviterName: string; workspaceName: string; link: string; expiresHours: number }) {
  const paragraphs = [
    `${inviterName} invited you to ${workspaceName} on Partproof, where the QC desk records inspections, grades and lot decisions.`,
    `Set your password with the link below. It works once and expires in ${expiresHours} hours.`,
  ];
  return {
    subject: `You're invited to ${workspaceName} on Partproof`,
    text: `${paragraphs.join("\n\n")}\n\n${link}\n`,
    html: layout(paragraphs, { href: link, label: "Set your password" }),
  };
}

export function passwordResetEmail({ link, expiresMinutes }: { link: string; expiresMinutes: number }) {
  const paragraphs = [
    "Someone asked to reset the password of your Partproof account. If it was you, choose a new password with the link below.",
    `The link works once and expires in ${expiresMinutes} minutes. If you did not ask for this, ignore this e-mail; your password stays as it is.`,
  ];
  return {
    subject: "Reset your Partproof password",
    text: `${paragraphs.join("\n\n")}\n\n${link}\n`,
    html: layout(paragraphs, { href: link, label: "Choose a new password" }),
  };
}

export function signUpConfirmationEmail({ companyName, link, expiresHours }: { companyName: string; link: string; expiresHours: number }) {
  const paragraphs = [
    `Someone asked to set up ${companyName} on Partproof with this e-mail address. If it was you, confirm the address and choose your password with the link below; the workspace is created then, with you as its QC lead.`,
    `The link works once and expires in ${expiresHours} hours. If you did not ask for this, ignore this e-mail; nothing is created.`,
  ];
  return {
    subject: `Confirm your e-mail address for ${companyName} on Partproof`,
    text: `${paragraphs.join("\n\n")}\n\n${link}\n`,
    html: layout(paragraphs, { href: link, label: "Confirm and choose a password" }),
  };
}

/** Sent instead of a confirmation when the address already has an account (the sign-up answer is the same). */
export function existingAccountEmail({ signInLink }: { signInLink: string }) {
  const paragraphs = [
    "Someone asked to set up a new company on Partproof with this e-mail address, but it already has a Partproof account, so nothing was created.",
    "If it was you, sign in with the link below, or use “Forgot password” there if you do not remember your password. If you did not ask for this, ignore this e-mail.",
  ];
  return {
    subject: "You already have a Partproof account",
    text: `${paragraphs.join("\n\n")}\n\n${signInLink}\n`,
    html: layout(paragraphs, { href: signInLink, label: "Sign in" }),
  };
}

/** An invitation to an address that already has an account elsewhere (the lead's answer is the same). */
export function invitationToExistingAccountEmail({ inviterName, workspaceName }: { inviterName: string; workspaceName: string }) {
  const paragraphs = [
    `${inviterName} invited this e-mail address to ${workspaceName} on Partproof. The address already has a Partproof account in another company's workspace, and one address can only belong to one account, so this invitation cannot be accepted with it.`,
    `If you should join ${workspaceName}, ask ${inviterName} to invite another address of yours. If you did not expect this, ignore this e-mail.`,
  ];
  return {
    subject: `You're invited to ${workspaceName} on Partproof`,
    text: `${paragraphs.join("\n\n")}\n`,
    html: `<!doctype html><html><body style="font-family:sans-serif;color:#1f2933">${paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join("")}<p style="color:#66788a;font-size:12px">Partproof</p></body></html>`,
  };
}

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

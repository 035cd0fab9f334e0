import nodemailer, { type Transporter } from "nodemailer";
import { env } from "./env.server.ts";

let transport: Transporter | undefined;

export async function sendMail(message: { to: string; subject: string; text: string; html?: string }) {
  transport ??= nodemailer.createTransport(env().SMTP_URL);
  await transport.sendMail({ from: env().MAIL_FROM, ...message });
}

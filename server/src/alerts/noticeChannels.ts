/**
 * The channels the server's settings ask for (server/src/config/serverConfig.ts): the log
 * always, a webhook with MENISCUS_NOTICE_WEBHOOK_URL, e-mail with MENISCUS_SMTP_URL and
 * MENISCUS_NOTICE_FROM. The MQTT channel is added by the server once its broker is up.
 */
import type { Logger } from 'pino';
import type { NoticeSettings } from '../config/serverConfig.ts';
import { emailChannel } from './channels/emailChannel.ts';
import { logChannel } from './channels/logChannel.ts';
import type { NoticeChannel } from './channels/noticeChannel.ts';
import { webhookChannel } from './channels/webhookChannel.ts';

/** The log, webhook and e-mail channels of the settings (absent settings: the log only). */
export function noticeChannelsFromSettings(
  settings: NoticeSettings | undefined,
  logger: Pick<Logger, 'info' | 'warn'>,
): NoticeChannel[] {
  const channels: NoticeChannel[] = [logChannel(logger)];
  if (settings?.webhookUrl) channels.push(webhookChannel(settings.webhookUrl));
  if (settings?.smtpUrl && settings.from)
    channels.push(emailChannel(settings.smtpUrl, settings.from));
  return channels;
}

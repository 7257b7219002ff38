import type { Locator, Page } from 'playwright-core';

/**
 * On an open, hydrated class page: answers the exercise caution if it is asked, then starts the
 * video muted (headless Chromium only autoplays muted media). Answers the video.
 */
export async function startPlayingMuted(page: Page): Promise<Locator> {
  const caution = page.getByRole('button', { name: /I understand/ });
  if (await caution.isVisible()) await caution.click();
  const video = page.getByTestId('class-video');
  await video.evaluate((v: HTMLVideoElement) => {
    v.muted = true;
    void v.play();
  });
  return video;
}

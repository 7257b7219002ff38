import { signedIn } from './api-client';

/**
 * A demo account's remembered captions choice, held for one test file: `set` gives the file the
 * state it starts from, `restore` puts back what the account had before the file ran. Other test
 * files share the demo accounts, so none of them may depend on the state it finds.
 */
export async function holdCaptionsChoice(email: string) {
  const client = await signedIn(email);
  const res = await client.get('/api/me/player-preferences');
  if (res.status !== 200) throw new Error(`reading the captions choice answered ${res.status}`);
  const before = ((await res.json()) as { captionsOn: boolean }).captionsOn;
  const set = async (captionsOn: boolean) => {
    const put = await client.put('/api/me/player-preferences', { captionsOn });
    if (put.status !== 200) throw new Error(`setting the captions choice answered ${put.status}`);
  };
  return { before, set, restore: () => set(before) };
}

import { verifyRegister } from '~/lib/api/register';
import { handle } from '~/lib/http/handle';
import { verifyRegister as verify } from '~/lib/services/register';

export const GET = handle(verifyRegister, async () => verify());

// The most common passwords of public breach corpora (ASVS 5.0 6.2.4 asks to reject them).
// A short list of those that meet our length rule; the check is case-insensitive.
export const COMMON_PASSWORDS = new Set([
	'12345678', '123456789', '1234567890', '12345678910', '123123123', '11111111', '00000000',
	'87654321', '88888888', '99999999', '12341234', '11223344', '147258369', '987654321',
	'password', 'password1', 'password12', 'password123', 'passw0rd', 'p@ssw0rd', 'p@ssword',
	'qwertyuiop', 'qwerty123', 'qwerty12', 'qwertyui', 'qwerty1234', '1q2w3e4r', '1q2w3e4r5t',
	'1qaz2wsx', 'zaq12wsx', 'asdfghjkl', 'asdfasdf', 'abcd1234', 'abc12345', 'abcdefgh',
	'iloveyou', 'iloveyou1', 'sunshine', 'princess', 'football', 'baseball', 'welcome1',
	'welcome123', 'letmein1', 'trustno1', 'superman', 'starwars', 'whatever', 'computer',
	'michelle', 'jennifer', 'internet', 'corvette', 'mercedes', 'master123', 'dragon123',
	'monkey123', 'shadow123', 'changeme', 'changeme1', 'administrator', 'admin123', 'admin1234',
	'secret123', 'football1', 'basketball', 'liverpool', 'chocolate', 'butterfly', 'password!',
	'antenna1', 'qwertyqwerty', 'aaaaaaaa', 'asdf1234', 'zxcvbnm1', 'zxcvbnmm', 'q1w2e3r4',
	'q1w2e3r4t5', 'passport', 'samsung1', 'testtest', 'test1234', 'hello123', 'loveyou1'
]);
